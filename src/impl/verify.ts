// Implementation check of a whole program: each spec output matched to the variable that
// implements it, its inputs matched to the program's, and the two functions compared on every
// input combination. Gaps and conflicts are judged at the safe value, as the spec's functions
// take them (`gapsFree` leaves gaps unjudged); don't-cares are reported beside, never differences.
import {
  checkImplementation,
  count,
  cubeContains,
  has,
  inputBit,
  intersect,
  LISTED,
  members,
  minus,
  sideSentence,
  signalIndex,
  SYMBOLIC_FROM_INPUTS,
  union,
  variable,
  wideContains,
  type BoolFunction,
  type Combination,
  type CounterexampleKind,
  type Expr,
  type Monomial,
  type SideSentence,
  type Signal,
  type WideCombination,
} from '../logic/index.js';
import { compareSymbolically, symbolicSpec, type SymbolicSpec } from './verify-wide.js';
import { mapVars, nodeCount, varsOf } from './expr-dag.js';
import { qualifiedAddress, type SpecTable } from '../table/index.js';
import type { NameMapping, NamePair } from './mapping.js';
import { LineError } from './line-error.js';
import { isPath, parsePath, pathKey, resolvePath } from './paths.js';
import type { CannotJudge, ImplOutput, ImplPou, ImplProgram, ImplVariable } from './types.js';

export type VerifyStatus = 'equal' | 'differs' | 'unchecked' | 'not-found';

/** A count: a number up to 24 inputs, BigInt over (a table of 64 inputs has 2^64 combinations). */
export type Count = number | bigint;

export interface CounterexampleRow {
  /** A number up to 24 inputs, BigInt over. */
  readonly combination: Combination | WideCombination;
  /** Spec input values, leftmost input first. */
  readonly inputs: readonly (0 | 1)[];
  readonly expected: 0 | 1;
  readonly actual: 0 | 1;
  /** Unsafe: the spec requires the safe value and the program gives the other; spurious trip: the other way. */
  readonly kind: CounterexampleKind;
  /** Where `expected` comes from: a spec row, or the safe value of a gap or a conflict. */
  readonly source: 'row' | 'gap' | 'conflict';
  /** The spec row that asks for `expected` here: its cells, and its cell for this output. */
  readonly specRow?: { readonly cells: string; readonly outputCell: string };
}

/** Combinations the spec leaves open, and what the implementation does with them. */
export interface OpenCombinations {
  readonly count: Count;
  /** Of them, how many the implementation turns ON. */
  readonly implementationOn: Count;
}

export interface OutputVerdict {
  /** "Sheet!A3:H13". */
  readonly table: string;
  readonly output: Signal;
  /** Header cell of the output, sheet-qualified. */
  readonly cell: string;
  readonly status: VerifyStatus;
  /** The implementing variable, "Pou.Variable", and the line of its last assignment. */
  readonly variable?: string;
  readonly line?: number;
  readonly combinations: Count;
  readonly mismatchCount: Count;
  /** Of the disagreements, over every combination judged: unsafe ones and spurious trips (they add up to `mismatchCount`). */
  readonly unsafeCount: Count;
  readonly spuriousTripCount: Count;
  /** The first 50 unsafe disagreements, then the first 50 spurious trips. */
  readonly counterexamples: readonly CounterexampleRow[];
  /** Each side in a sentence, from the minimal AND/OR form of its set (absent when the side is empty). */
  readonly unsafeWhen?: SideSentence;
  readonly spuriousTripWhen?: SideSentence;
  /** ANF monomials of spec XOR implementation, printed ("Jog AND Mode_setup"), first 50. */
  readonly differenceMonomials: readonly string[];
  readonly differenceMonomialCount: Count;
  readonly dontCare: OpenCombinations;
  /**
   * Gaps take the safe value in the spec; those where the implementation is not safe are
   * counted, and are differences unless `judged` is false (`gapsFree`).
   */
  readonly gaps: OpenCombinations & { readonly safe: 0 | 1; readonly unsafe: Count; readonly unsafeExamples: readonly (Combination | WideCombination)[]; readonly judged: boolean };
  /** Combinations the spec asks to be both 1 and 0. */
  readonly conflicted: Count;
  /** Why the output is unchecked or not found. */
  readonly reasons: readonly string[];
  readonly cannotJudge: readonly CannotJudge[];
  /**
   * Program values that are no input by their declaration (a member, an array element, a
   * block's output, a variable never written) taken as spec inputs because the mapping says
   * so: "tonSync.Q taken as the spec input Sync fault, by mapping (map.csv line 2)". Absent: none.
   */
  readonly byMapping?: readonly string[];
}

/** A mapping pair that cannot be used as written; the outputs it touches are unchecked. */
export interface MappingProblem {
  readonly code: 'mapping-unknown-signal' | 'mapping-unknown-variable' | 'mapping-shared-variable' | 'mapping-not-bool' | 'mapping-not-input';
  /** The mapping's cell or line: "map.csv line 3", "Map!B3". */
  readonly where: string;
  readonly message: string;
  /** Spec signals it concerns: every output of their tables is unchecked. */
  readonly signals: readonly string[];
  /** The program variable of a pair whose spec signal is unknown: outputs of POUs that read or write it are unchecked. */
  readonly program?: string;
}

export interface VerifyReport {
  readonly file: string;
  readonly mapping?: string;
  readonly outputs: readonly OutputVerdict[];
  /** Input headers per table ("Sheet!range" -> headers), for printing counterexamples. */
  readonly inputs: Readonly<Record<string, readonly Signal[]>>;
  /** Spec signals that no program variable implements or feeds. */
  readonly unmatchedSpec: readonly string[];
  /** Program inputs and outputs that match no spec signal. */
  readonly unmatchedProgram: readonly string[];
  /** The mapping's problems as text ("map.csv line 2: ..."), one per problem of `mappingProblems`. */
  readonly unusedMapping: readonly string[];
  readonly mappingProblems: readonly MappingProblem[];
  /** Everything in the program that a truth table cannot judge. */
  readonly cannotJudge: readonly CannotJudge[];
  readonly notes: readonly string[];
}

export interface VerifyOptions {
  /** Gaps are not judged (they are reported, never differences). Default: judged at the safe value. */
  readonly gapsFree?: boolean;
}

/**
 * Evaluating an output costs (distinct expression nodes) x (2^n / 32) words; beyond this it
 * is unchecked rather than run for minutes.
 */
const MAX_EVALUATION_WORDS = 2 ** 31;

/** The difference fields of an output that was not compared. */
export const NO_DIFFERENCE = { mismatchCount: 0, unsafeCount: 0, spuriousTripCount: 0, counterexamples: [], differenceMonomials: [], differenceMonomialCount: 0 } as const;

const same = (a: string, b: string): boolean => a.toLowerCase() === b.toLowerCase();

/** A mapping pair with its program side split into a POU (when it starts with a POU's name) and a name or path. */
interface Mapped {
  readonly pair: NamePair;
  readonly pou?: string;
  readonly name: string;
}

/** The mapping's pairs, each program side read against the program's POU names. */
function mappedPairs(mapping: NameMapping | undefined, impl: ImplProgram): readonly Mapped[] {
  return (mapping?.pairs ?? []).map((pair) => {
    const name = pair.program;
    const dot = name.indexOf('.');
    const head = dot < 0 ? '' : name.slice(0, dot);
    const pou = !name.startsWith('%') && !head.includes('[') && impl.pous.some((p) => same(p.name, head)) ? head : undefined;
    return pou === undefined ? { pair, name } : { pair, pou, name: name.slice(dot + 1) };
  });
}

/** Names and paths compared as ST does: case-insensitive, indices as integers. */
const samePath = (a: string, b: string): boolean => pathKey(a) === pathKey(b);

const names = (m: Mapped, pou: ImplPou, name: string): boolean => samePath(m.name, name) && (m.pou === undefined || same(m.pou, pou.name));

function pairFor(pairs: readonly Mapped[], signal: Signal): Mapped | undefined {
  return pairs.find((m) => signalIndex([signal], m.pair.spec) === 0);
}

/** Does program name `name` (in `pou`) stand for `signal`, by the mapping or by its name? */
function stands(pairs: readonly Mapped[], signal: Signal, pou: ImplPou, name: string): boolean {
  const m = pairFor(pairs, signal);
  if (m) return names(m, pou, name);
  return signalIndex([signal], name) === 0;
}

export function verifyImplementation(tables: readonly SpecTable[], impl: ImplProgram, mapping?: NameMapping, options: VerifyOptions = {}): VerifyReport {
  const pairs = mappedPairs(mapping, impl);
  const problems = mappingProblems(tables, impl, pairs);
  const outputs: OutputVerdict[] = [];
  const inputs: Record<string, readonly Signal[]> = {};
  const usedProgram = new Set<string>();
  const unmatchedSpec: string[] = [];
  for (const table of tables) {
    const where = qualifiedAddress(table.sheet, table.range);
    inputs[where] = table.inputs;
    const symbolic = table.wide ? symbolicSpec(table) : undefined;
    specOutputs(table).forEach((spec, o) => {
      const verdict = withMappingProblems(verifyOutput(table, o, impl, pairs, options, symbolic), table, impl, problems);
      outputs.push(verdict);
      if (verdict.variable) usedProgram.add(verdict.variable.toLowerCase());
      if (verdict.status === 'not-found') unmatchedSpec.push(`${where}: output ${spec.signal.header}`);
    });
    table.inputs.forEach((signal) => {
      const feeds = impl.pous.flatMap((p) => p.inputs.filter((n) => stands(pairs, signal, p, n)).map((n) => `${p.name}.${n}`));
      feeds.forEach((f) => usedProgram.add(f.toLowerCase()));
      if (feeds.length === 0) unmatchedSpec.push(`${where}: input ${signal.header}`);
    });
  }
  const unmatchedProgram: string[] = [];
  for (const pou of impl.pous) {
    for (const n of pou.inputs) if (!usedProgram.has(`${pou.name}.${n}`.toLowerCase())) unmatchedProgram.push(`${pou.name}.${n} (input)`);
    for (const out of pou.outputs) {
      if (out.section === 'local' || out.section === 'temp') continue;
      if (!usedProgram.has(`${pou.name}.${out.name}`.toLowerCase())) unmatchedProgram.push(`${pou.name}.${out.name} (output, line ${out.line})`);
    }
  }
  return {
    file: impl.file,
    ...(mapping ? { mapping: mapping.source } : {}),
    outputs,
    inputs,
    unmatchedSpec,
    unmatchedProgram,
    unusedMapping: problems.map((p) => `${p.where}: ${p.message}`),
    mappingProblems: problems,
    cannotJudge: impl.pous.flatMap((p) => p.cannotJudge),
    notes: [...impl.pous.flatMap((p) => p.notes.map((n) => `${p.name}: ${n}`)), ...outputs.flatMap((o) => (o.byMapping ?? []).map((b) => `${o.output.header}: ${b}`))],
  };
}

/** The declaration of a name or path in a POU: as the body read it, else resolved against the project's types. */
function declarationIn(impl: ImplProgram, pou: ImplPou, name: string): ImplVariable | undefined {
  if (!isPath(name)) return pou.variables.find((v) => same(v.name, name));
  const read = pou.paths.find((v) => samePath(v.name, name));
  const parsed = parsePath(name);
  const base = parsed && pou.variables.find((v) => same(v.name, parsed.base));
  if (read || !impl.types || !base) return read;
  try {
    const r = resolvePath(base, parsed, impl.types, base.line);
    return r.ok ? r.variable : undefined;
  } catch (e) {
    // An index outside the bounds names nothing.
    if (e instanceof LineError) return undefined;
    throw e;
  }
}

function knownIn(impl: ImplProgram, pou: ImplPou, name: string): boolean {
  return pou.inputs.some((n) => samePath(n, name)) || pou.outputs.some((o) => samePath(o.name, name)) || declarationIn(impl, pou, name) !== undefined;
}

/**
 * What in the mapping cannot be used as written: a spec signal no table has, a program
 * variable no POU has (or, for a path, reads or writes), one variable for two spec signals,
 * a variable that is not a BOOL. One problem each, at the mapping's cell or line.
 */
function mappingProblems(tables: readonly SpecTable[], impl: ImplProgram, pairs: readonly Mapped[]): MappingProblem[] {
  const inputSignals = tables.flatMap((t) => t.inputs);
  const signals = [...inputSignals, ...tables.flatMap((t) => specOutputs(t).map((o) => o.signal))];
  const out: MappingProblem[] = [];
  pairs.forEach((m, i) => {
    const { pair } = m;
    if (signalIndex(signals, pair.spec) < 0) {
      out.push({ code: 'mapping-unknown-signal', where: pair.where, message: `no spec table has a signal '${pair.spec}'`, signals: [], program: pair.program });
    }
    const pous = impl.pous.filter((p) => m.pou === undefined || same(m.pou, p.name));
    if (!pous.some((p) => knownIn(impl, p, m.name))) {
      const message = isPath(m.name) ? `the program has no variable, member or element '${pair.program}'` : `the program has no variable '${pair.program}'`;
      out.push({ code: 'mapping-unknown-variable', where: pair.programWhere, message, signals: [pair.spec] });
      return;
    }
    for (const p of pous) {
      const d = declarationIn(impl, p, m.name);
      if (d && d.type !== '' && d.type.trim().toUpperCase() !== 'BOOL') {
        out.push({ code: 'mapping-not-bool', where: pair.programWhere, message: `'${pair.program}' is ${d.type.trim()} in ${p.name} (line ${d.line}), not BOOL`, signals: [pair.spec] });
        return;
      }
    }
    const notInput = signalIndex(inputSignals, pair.spec) >= 0 && !pous.some((p) => p.inputs.some((n) => samePath(n, m.name))) ? notAnInput(pous, m.name) : undefined;
    if (notInput) {
      out.push({ code: 'mapping-not-input', where: pair.programWhere, message: `'${pair.program}' cannot stand for the spec input '${pair.spec}': ${notInput}`, signals: [pair.spec] });
      return;
    }
    const earlier = pairs.slice(0, i).find((e) => samePath(e.name, m.name) && (e.pou === undefined || m.pou === undefined || same(e.pou, m.pou)));
    if (earlier) {
      out.push({
        code: 'mapping-shared-variable',
        where: pair.programWhere,
        message: `spec signals '${earlier.pair.spec}' (${earlier.pair.where}) and '${pair.spec}' (${pair.where}) are both mapped to ${pair.program}`,
        signals: [earlier.pair.spec, pair.spec],
      });
    }
  });
  return out;
}

/** The outputs with their safe values, whichever engine takes the table. */
function specOutputs(table: SpecTable): readonly { readonly signal: Signal; readonly safe: 0 | 1 }[] {
  return table.wide?.outputs ?? table.outputs;
}

/**
 * Why a program name that is no input of any POU cannot be one: the program assigns it, or
 * reads it only where it is not followed (a block's member in an LD or FBD body). Undefined for a
 * variable the program declares and does not read (a spec input the program ignores).
 */
function notAnInput(pous: readonly ImplPou[], name: string): string | undefined {
  for (const p of pous) {
    const out = p.outputs.find((o) => samePath(o.name, name));
    if (out) return `${p.name} assigns it (line ${out.line}), so it is no input; map what it is assigned from`;
    if (p.paths.some((v) => samePath(v.name, name))) return `${p.name} reads it only where it does not follow it (a block's member in an ${p.language} body is opaque)`;
  }
  return undefined;
}

/** An output its mapping's problems touch is unchecked, the problems its reasons. */
function withMappingProblems(v: OutputVerdict, table: SpecTable, impl: ImplProgram, problems: readonly MappingProblem[]): OutputVerdict {
  const signals = [...table.inputs, ...specOutputs(table).map((o) => o.signal)];
  const pou = v.variable === undefined ? undefined : impl.pous.find((p) => same(`${p.name}.`, v.variable!.slice(0, p.name.length + 1)));
  const touching = problems.filter(
    (p) => p.signals.some((s) => signalIndex(signals, s) >= 0) || (p.program !== undefined && pou !== undefined && knownIn(impl, pou, p.program)),
  );
  if (touching.length === 0) return v;
  return {
    ...v,
    status: 'unchecked',
    ...NO_DIFFERENCE,
    reasons: [...touching.map((p) => `the mapping cannot be used as written: ${p.where}: ${p.message}`), ...v.reasons],
  };
}

/** An output's verdict before anything is compared: nothing found different, nothing counted. */
function blankVerdict(table: SpecTable, o: number, options: VerifyOptions) {
  const spec = specOutputs(table)[o]!;
  const n = table.inputs.length;
  return {
    table: qualifiedAddress(table.sheet, table.range),
    output: spec.signal,
    cell: qualifiedAddress(table.sheet, table.headerCells[n + o] ?? ''),
    combinations: table.wide ? 1n << BigInt(n) : 2 ** n,
    ...NO_DIFFERENCE,
    dontCare: { count: 0, implementationOn: 0 },
    gaps: { count: 0, implementationOn: 0, safe: spec.safe, unsafe: 0, unsafeExamples: [], judged: !options.gapsFree },
    conflicted: 0,
    cannotJudge: [],
  };
}

/** What comparing an expression with an output's spec finds (the rest of a verdict names the program). */
export type Judged = Pick<
  OutputVerdict,
  'status' | 'mismatchCount' | 'unsafeCount' | 'spuriousTripCount' | 'counterexamples' | 'unsafeWhen' | 'spuriousTripWhen' | 'differenceMonomials' | 'differenceMonomialCount' | 'dontCare' | 'gaps' | 'conflicted' | 'reasons'
>;

/**
 * An expression over the spec's inputs against output `o`, on every combination: symbolically
 * (BDDs) for a table of more than 24 inputs, on truth tables below; or why it is too large to.
 */
function judgeExpression(expr: Expr, table: SpecTable, o: number, options: VerifyOptions, symbolic: SymbolicSpec | undefined): Judged | { tooLarge: string } {
  if (symbolic) return compareSymbolically(expr, table, o, options, symbolic);
  const n = table.inputs.length;
  const work = nodeCount(expr) * Math.ceil(2 ** n / 32);
  if (work > MAX_EVALUATION_WORDS) return { tooLarge: `too large to evaluate over ${n} inputs (${nodeCount(expr)} distinct operations)` };
  return compare(expr, table, o, options);
}

/**
 * A typed or pasted expression (over the spec's inputs) checked against output `o` of a table,
 * exactly as a program's output is: the same verdict, counts, sides and counterexamples.
 */
export function verifyExpression(table: SpecTable, o: number, expr: Expr, options: VerifyOptions = {}): OutputVerdict {
  const base = blankVerdict(table, o, options);
  const judged = judgeExpression(expr, table, o, options, table.wide ? symbolicSpec(table) : undefined);
  return 'tooLarge' in judged ? { ...base, status: 'unchecked', reasons: [`the check is ${judged.tooLarge}`] } : { ...base, ...judged };
}

function verifyOutput(
  table: SpecTable,
  o: number,
  impl: ImplProgram,
  pairs: readonly Mapped[],
  options: VerifyOptions,
  symbolic: SymbolicSpec | undefined,
): OutputVerdict {
  const spec = specOutputs(table)[o]!;
  const base = blankVerdict(table, o, options);
  const candidates = impl.pous.flatMap((pou) => pou.outputs.filter((out) => stands(pairs, spec.signal, pou, out.name)).map((out) => ({ pou, out })));
  const pair = pairFor(pairs, spec.signal)?.pair;
  if (candidates.length === 0) {
    const reason = pair
      ? `the mapping (${pair.where}) names ${pair.program}, which no POU assigns`
      : `no POU assigns a variable named ${spec.signal.identifier} or "${spec.signal.header}"; map it in a mapping table`;
    return { ...base, status: 'not-found', reasons: [reason] };
  }
  if (candidates.length > 1) {
    const names = candidates.map((c) => `${c.pou.name}.${c.out.name} (line ${c.out.line})`).join(', ');
    return { ...base, status: 'unchecked', reasons: [`assigned in more than one place: ${names}; name one as Pou.Variable in a mapping table`] };
  }
  const { pou, out } = candidates[0]!;
  const found = { ...base, variable: `${pou.name}.${out.name}`, line: out.line };
  if (!out.expr) {
    return { ...found, status: 'unchecked', cannotJudge: out.cannotJudge, reasons: out.cannotJudge.map((c) => `${c.what} (${c.pou}, line ${c.line})`) };
  }
  const remapped = toSpecInputs(out, pou, table, pairs);
  if (!remapped.ok) return { ...found, status: 'unchecked', reasons: remapped.reasons, cannotJudge: remapped.cannotJudge };
  const judged = judgeExpression(remapped.expr, table, o, options, symbolic);
  return 'tooLarge' in judged ? { ...found, status: 'unchecked', reasons: [`${out.name} (line ${out.line}): ${judged.tooLarge}`] } : { ...found, byMapping: remapped.byMapping, ...judged };
}

/**
 * The output's expression over the spec's inputs, or why its inputs do not all match. A read
 * the POU does not declare as an input (`undriven`) counts only when a mapping names it.
 */
function toSpecInputs(
  out: ImplOutput,
  pou: ImplPou,
  table: SpecTable,
  pairs: readonly Mapped[],
): { ok: true; expr: Expr; byMapping: string[] } | { ok: false; reasons: string[]; cannotJudge: CannotJudge[] } {
  const index: number[] = [];
  const reasons: string[] = [];
  const cannotJudge: CannotJudge[] = [];
  const undriven = new Map(pou.undriven.map((u) => [pathKey(u.name), u.item]));
  const mapped = (name: string): boolean => pairs.some((m) => names(m, pou, name));
  pou.inputs.forEach((name, j) => {
    const matches = table.inputs.map((s, i) => (stands(pairs, s, pou, name) ? i : -1)).filter((i) => i >= 0);
    if (matches.length > 1) reasons.push(`${name} stands for more than one spec input (${matches.map((i) => table.inputs[i]!.header).join(', ')})`);
    index[j] = matches.length === 1 ? matches[0]! : -1;
  });
  const used = varsOf(out.expr!);
  const byMapping = new Set<string>();
  for (const j of used) {
    const name = pou.inputs[j]!;
    const item = undriven.get(pathKey(name));
    if (item && !mapped(name)) {
      reasons.push(`${item.what} (${item.pou}, line ${item.line})`);
      cannotJudge.push(item);
    } else if (index[j] === -1 && !reasons.some((r) => r.startsWith(`${name} `))) {
      reasons.push(`${out.name} uses ${name}, which matches no input of the spec table (map it in a mapping table)`);
    } else if (used.some((k) => k < j && samePath(pou.inputs[k]!, name))) {
      reasons.push(
        `${out.name} reads ${name} before and after its block is called (two values in one scan): one spec input cannot stand for both`,
      );
    } else if (index[j] !== -1 && (item || isPath(name)) && mapped(name)) {
      const signal = table.inputs[index[j]!]!;
      byMapping.add(`${name} taken as the spec input ${signal.header}, by mapping (${pairFor(pairs, signal)!.pair.where})`);
    }
  }
  if (reasons.length > 0) return { ok: false, reasons, cannotJudge };
  return { ok: true, expr: mapVars(out.expr!, (v) => variable(index[v.input]!, table.inputs[index[v.input]!]!.identifier)), byMapping: [...byMapping] };
}

function compare(expr: Expr, table: SpecTable, o: number, options: VerifyOptions): Judged {
  const spec = table.outputs[o]!;
  const { fn, gaps, conflicted } = spec.built;
  const n = fn.n;
  // The spec's function already gives gaps and conflicts the safe value; --gaps-free frees gaps.
  const judged: BoolFunction = options.gapsFree ? { n, on: minus(fn.on, gaps), dc: union(fn.dc, gaps) } : fn;
  const check = checkImplementation(expr, judged, { safe: spec.safe, symbolicFrom: SYMBOLIC_FROM_INPUTS });
  const values = check.values;
  const dc = minus(fn.dc, union(gaps, conflicted));
  const unsafeGaps = spec.safe === 1 ? minus(gaps, values) : intersect(gaps, values);
  const counterexamples = check.counterexamples.map((c) => {
    const source = has(gaps, c.combination) ? 'gap' : has(conflicted, c.combination) ? 'conflict' : 'row';
    const specRow = source === 'row' ? specRowOf(table, o, c.combination, c.expected) : undefined;
    return { combination: c.combination, inputs: c.inputs, expected: c.expected, actual: c.actual, kind: c.kind, source, ...(specRow ? { specRow } : {}) } as const;
  });
  const unsafeWhen = sideSentence('unsafe', n, check.unsafeWhen, table.inputs);
  const spuriousTripWhen = sideSentence('spurious-trip', n, check.spuriousTripWhen, table.inputs);
  return {
    status: check.equal ? 'equal' : 'differs',
    mismatchCount: check.mismatchCount,
    unsafeCount: check.unsafeCount,
    spuriousTripCount: check.spuriousTripCount,
    counterexamples,
    ...(unsafeWhen ? { unsafeWhen } : {}),
    ...(spuriousTripWhen ? { spuriousTripWhen } : {}),
    differenceMonomials: check.differenceMonomials.map((m) => printMonomial(m, table.inputs)),
    differenceMonomialCount: check.differenceMonomialCount,
    dontCare: { count: count(dc), implementationOn: count(intersect(dc, values)) },
    gaps: {
      count: count(gaps),
      implementationOn: count(intersect(gaps, values)),
      safe: spec.safe,
      unsafe: count(unsafeGaps),
      unsafeExamples: members(unsafeGaps, LISTED),
      judged: !options.gapsFree,
    },
    conflicted: count(conflicted),
    reasons: [],
  };
}

/** The first spec row that asks output `o` for `expected` on combination `k`: its cells and its output cell. */
export function specRowOf(table: SpecTable, o: number, k: Combination | WideCombination, expected: 0 | 1): CounterexampleRow['specRow'] {
  const cubes = table.wide?.cubes;
  const covers = (r: SpecTable['rows'][number], i: number): boolean => (cubes ? wideContains(cubes[i]!, BigInt(k)) : cubeContains(r.cube, Number(k)));
  const row = table.rows.find((r, i) => covers(r, i) && r.values[o] === expected);
  return row ? { cells: qualifiedAddress(table.sheet, row.cells), outputCell: qualifiedAddress(table.sheet, row.outputCells[o] ?? '') } : undefined;
}

/** A monomial (a number up to 24 inputs, BigInt over) as an AND of identifiers (TRUE for the constant monomial). */
export function printMonomial(m: Monomial | bigint, inputs: readonly Signal[]): string {
  const n = inputs.length;
  const mask = BigInt(m);
  const names = inputs.filter((_, i) => mask & inputBit(n, i)).map((s) => s.identifier);
  return names.length === 0 ? 'TRUE' : names.join(' AND ');
}

/** 0 when every output is equal to its spec; 1 when any differs, is unchecked or is not found. */
export function verifyExitCode(report: VerifyReport): 0 | 1 {
  return report.outputs.length > 0 && report.outputs.every((o) => o.status === 'equal') ? 0 : 1;
}
