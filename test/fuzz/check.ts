// One fuzz case through the real product path (the spec read from a grid by readSpecTables,
// the program file by readImplementation, then verifyImplementation), judged against the
// interpreter. A contradiction: an EQUAL the interpreter does not confirm, or a DIFFERS whose
// listed counterexample it does not confirm, or a valid program the reader rejects.
import { readMappingCsv, type NameMapping } from '../../src/impl/mapping.js';
import { readImplementation } from '../../src/impl/read.js';
import { verifyImplementation, type OutputVerdict } from '../../src/impl/verify.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { eachExpr, refsOf, type FuzzCase } from './generate.js';
import { expectedVerdicts, TooManyStates, type Expected } from './interpreter.js';
import { programFile } from './print.js';
import { combinationOf, inputValues, safeValues, specGrid } from './spec.js';

export type ContradictionKind = 'false-equal' | 'unconfirmed-differs' | 'rejected' | 'spec-not-read';

export interface Contradiction {
  readonly kind: ContradictionKind;
  /** The spec output concerned ('' for the whole program). */
  readonly output: string;
  readonly product: string;
  readonly interpreter: string;
}

export interface CaseResult {
  readonly contradictions: readonly Contradiction[];
  /** Product verdict per output (equal / differs / unchecked / not-found), for the tallies. */
  readonly verdicts: readonly string[];
  /** Outputs the product left unchecked although the interpreter knows their value. */
  readonly uncheckedKnown: number;
  /** Set aside: more state than the interpreter tries. */
  readonly skipped: boolean;
}

function describeExpected(e: Expected): string {
  if (e.verdict === 'equal') return 'EQUAL';
  if (e.verdict === 'state') return 'depends on state from earlier scans (only UNCHECKED may be said)';
  const [k, m] = [...e.mismatches][0]!;
  return `DIFFERS on ${e.mismatches.size} combination(s), first #${k}: spec ${m.expected}, program ${m.actual}`;
}

function describeProduct(v: OutputVerdict): string {
  const head = v.status.toUpperCase();
  if (v.status === 'differs') {
    const c = v.counterexamples[0];
    return c ? `${head} (${v.mismatchCount} mismatches, first inputs ${c.inputs.join('')}: expected ${c.expected}, actual ${c.actual})` : head;
  }
  return v.reasons.length > 0 ? `${head}: ${v.reasons.join('; ')}` : head;
}

/**
 * Whether the product's verdict on one output says more than the interpreter confirms: EQUAL
 * where it is not known to be equal, or DIFFERS with a claim (a counterexample, or a gap said
 * to be off its safe value) that is not a known disagreement with the same values, or whose
 * kind is wrong (unsafe exactly where the spec requires the safe value).
 */
export function contradictionOf(e: Expected, v: Pick<OutputVerdict, 'status' | 'counterexamples' | 'gaps'>): 'false-equal' | 'unconfirmed-differs' | undefined {
  if (v.status === 'equal') return e.verdict === 'equal' ? undefined : 'false-equal';
  if (v.status !== 'differs') return undefined;
  const claims = [
    ...v.counterexamples.map((x) => ({ k: combinationOf(x.inputs), expected: x.expected, actual: x.actual, unsafe: x.kind === 'unsafe' })),
    ...v.gaps.unsafeExamples.map((k) => ({ k: Number(k), expected: v.gaps.safe, actual: (1 - v.gaps.safe) as 0 | 1, unsafe: true })),
  ];
  const confirmed = claims.length > 0 && claims.every((x) => {
    const m = e.mismatches.get(x.k);
    return m !== undefined && m.expected === x.expected && m.actual === x.actual && x.unsafe === (m.expected === v.gaps.safe);
  });
  return confirmed ? undefined : 'unconfirmed-differs';
}

export function judge(c: FuzzCase): CaseResult {
  let expected: Expected[];
  try {
    expected = expectedVerdicts(c.program, c.spec);
  } catch (e) {
    if (e instanceof TooManyStates) return { contradictions: [], verdicts: [], uncheckedKnown: 0, skipped: true };
    throw e;
  }
  const read = readSpecTables(specGrid(c.spec), { safeValues: safeValues(c.spec) });
  const table = read.tables[0];
  const specErrors = table?.problems.filter((p) => p.severity === 'error') ?? [];
  if (!table || read.tables.length !== 1 || specErrors.length > 0) {
    const why = [...read.problems, ...specErrors].map((p) => `${p.cell}: ${p.message}`).join('; ');
    return { contradictions: [{ kind: 'spec-not-read', output: '', product: why || 'no table', interpreter: 'one table' }], verdicts: [], uncheckedKnown: 0, skipped: false };
  }
  const file = programFile(c.program);
  const impl = readImplementation(file.name, file.text);
  if (!impl.ok) {
    return { contradictions: [{ kind: 'rejected', output: '', product: impl.error.message, interpreter: 'a valid program' }], verdicts: [], uncheckedKnown: 0, skipped: false };
  }
  const report = verifyImplementation([table], impl.value, mappingOf(c));
  const contradictions: Contradiction[] = [];
  const verdicts: string[] = [];
  let uncheckedKnown = 0;
  c.spec.outputs.forEach((name, o) => {
    const v = report.outputs.find((x) => x.output.header === name);
    const e = expected[o]!;
    if (!v) throw new Error(`the product gave no verdict for ${name}`);
    verdicts.push(v.status);
    const kind = contradictionOf(e, v);
    if (kind) contradictions.push({ kind, output: name, product: describeProduct(v), interpreter: describeExpected(e) });
    else if ((v.status === 'unchecked' || v.status === 'not-found') && e.verdict !== 'state') uncheckedKnown++;
  });
  return { contradictions, verdicts, uncheckedKnown, skipped: false };
}

/** The mapping the generator's member and element inputs need: one pair per one the program reads. */
function mappingOf(c: FuzzCase): NameMapping | undefined {
  const read = new Set<string>();
  eachExpr(c.program.pous, (e) => (refsOf(e, read), e));
  const lines = Object.entries(c.program.inputPaths ?? {}).filter(([, path]) => [...read].some((r) => lowName(r) === lowName(path)));
  if (lines.length === 0) return undefined;
  const map = readMappingCsv('fuzz-map.csv', lines.map(([input, path]) => `${input},${path}`).join('\n'));
  if (!map.ok) throw new Error(`the fuzz wrote a mapping the product does not read: ${map.error.message}`);
  return map.value;
}

const lowName = (s: string): string => s.toLowerCase();

/**
 * Which construct a (shrunk) contradiction rests on, from what is left of the program. The
 * shrinker has already dropped what it does not need, so the first construct found is the cause.
 */
export function causeOf(c: FuzzCase, x: Contradiction, expected?: Expected): string {
  const p = c.program;
  const main = p.pous[p.pous.length - 1]!;
  const inputs = new Set(c.spec.inputs.map(lowName));
  if (p.format === 'xml' && p.xhtml === 'mixed') return 'mixed-content xhtml read out of order';
  if (main.actions.length > 0) return 'ACTION blocks not read';
  if (p.pous.some((pou) => pou.blocks.some((b) => b.section === 'VAR_IN_OUT'))) return 'VAR_IN_OUT write-back ignored';
  const named = main.blocks.filter((b) => b.section === 'VAR').flatMap((b) => b.decls.filter((d) => inputs.has(lowName(d.name))).map((d) => ({ d, constant: b.constant === true })));
  if (named.some((n) => n.constant)) return 'constant taken as the spec input of its name';
  if (named.some((n) => n.d.init !== undefined)) return 'initialised local taken as the spec input of its name';
  if (x.kind === 'rejected') return 'reader rejected a valid program';
  if (x.kind === 'false-equal' && expected && expected.mismatches.size > 0) {
    const o = c.spec.outputs.indexOf(x.output);
    const inGaps = [...expected.mismatches.keys()].every((k) => isGap(c, k));
    if (o >= 0 && inGaps) return 'gap not judged at the safe value';
  }
  return 'other';
}

function isGap(c: FuzzCase, k: number): boolean {
  const values = inputValues(c.spec.inputs.length, k);
  return !c.spec.rows.some((r) => r.inputs.every((cell, i) => cell === '-' || (cell === '1') === values[i]));
}
