// A spec table -> per output its AND/OR and XOR forms, each proven against every input
// combination, with gaps, conflicts and commissioning test steps.
import {
  anfDegree,
  SYMBOLIC_FROM_INPUTS,
  anfOf,
  anfSupport,
  anfToExpr,
  appendAll,
  bestPolarity,
  count,
  emptySet,
  intersect,
  LISTED,
  members,
  minimiseSop,
  printSt,
  prove,
  sopToExpr,
  truthTable,
  union,
  uniqueCauseSteps,
  type BitSet,
  type BoolFunction,
  type Cube,
  type Monomial,
  type Signal,
} from '../logic/index.js';
import type { AndOrForm, FormProof, OutputAnalysis, TableAnalysis, XorForm } from './analysis-types.js';
import {
  describeCube,
  gapCubes,
  patternTable,
  settingName,
  type OutputSpec,
  type Problem,
  type ProblemCode,
  type SpecTable,
} from '../table/index.js';
import { analyseWide, conflictReports } from './analyse-wide.js';
import { analyseSymbolically } from './analyse-symbolic.js';

export interface AnalyseOptions {
  /** Time for each output's AND/OR form (minimisation and proof of minimality). */
  readonly budgetMs?: number;
  /** Called after each step: `what` says which ("Motor_Permit: XOR form"). */
  readonly onProgress?: (done: number, total: number, what: string) => void;
  /** Up to 24 inputs, which engine: by default the symbolic one from SYMBOLIC_FROM_INPUTS on (benches and tests compare). */
  readonly engine?: 'bit-set' | 'symbolic';
}

/** Steps per output reported to onProgress; one more for the gaps of the table. */
const STEPS_PER_OUTPUT = 4;

export function analyseTable(table: SpecTable, options: AnalyseOptions = {}): TableAnalysis {
  if (table.wide) return analyseWide(table, table.wide, options);
  const engine = options.engine ?? (table.inputs.length >= SYMBOLIC_FROM_INPUTS ? 'symbolic' : 'bit-set');
  const symbolic = engine === 'symbolic' ? analyseSymbolically(table, options) : null;
  if (symbolic) return symbolic;
  const n = table.inputs.length;
  const total = table.outputs.length * STEPS_PER_OUTPUT + 1;
  let done = 0;
  const progress = (what: string): void => options.onProgress?.(++done, total, what);
  const sopOptions = options.budgetMs === undefined ? {} : { budgetMs: options.budgetMs };

  // Every output has the same gaps: a row read covers its combinations for all outputs.
  const gapSet = table.outputs[0]?.built.gaps ?? emptySet(n);
  const gaps = gapCubes(n, gapSet).cubes;
  progress('gaps');

  const problems: Problem[] = [...table.problems];
  const outputs = table.outputs.map((output, j) => {
    const analysed = analyseOutput(table, output, gaps, count(gapSet), sopOptions, (stage) =>
      progress(`${output.signal.header}: ${stage}`),
    );
    appendAll(problems, outputProblems(table, analysed, table.headerCells[n + j]!));
    return analysed;
  });
  return { table, inputs: table.inputs, outputs, problems };
}

function analyseOutput(
  table: SpecTable,
  output: OutputSpec,
  gaps: readonly Cube[],
  gapCount: number,
  sopOptions: { budgetMs?: number },
  progress: (stage: string) => void,
): OutputAnalysis {
  const spec = output.built.fn;
  const n = spec.n;
  const inputs = table.inputs;
  const policy = table.dontCares ?? 'minimal';
  // The one function of this output: its don't-cares resolved once, by the policy.
  const atSafe: BoolFunction = { n, on: output.safe === 1 ? union(spec.on, spec.dc) : spec.on, dc: emptySet(n) };
  const sop = minimiseSop(policy === 'minimal' ? spec : atSafe, sopOptions);
  const andOrExpr = sopToExpr(sop.cubes, inputs);
  const andOrValues = truthTable(andOrExpr, n);
  const resolved: BoolFunction =
    policy === 'minimal' ? { n, on: union(spec.on, intersect(andOrValues, spec.dc)), dc: emptySet(n) } : atSafe;
  const andOr: AndOrForm = {
    cubes: sop.cubes,
    expr: andOrExpr,
    text: printSt(andOrExpr),
    proven: sop.proven,
    terms: sop.terms,
    literals: sop.literals,
    lowerBound: sop.lowerBound,
    ...checked(spec, resolved, andOrValues),
  };
  progress('AND/OR form');

  const monomials = anfOf(resolved.on, n);
  const xor = xorForm(spec, resolved, inputs, monomials, 0, true);
  progress('XOR form');
  const best = bestPolarity(resolved.on, n);
  const bestXor = xorForm(spec, resolved, inputs, best.monomials, best.polarity, best.exhaustive);
  progress('best-polarity XOR form');

  const support = anfSupport(monomials, n);
  const steps = uniqueCauseSteps(sop.cubes, resolved, inputs);
  progress('test steps');
  const permits = intersect(resolved.on, spec.dc);
  return {
    signal: output.signal,
    safe: output.safe,
    dontCares: policy,
    resolved,
    permitsAlso: members(permits, LISTED),
    permitsAlsoCount: count(permits),
    permitsAlsoCubes: gapCubes(n, permits).cubes,
    andOr,
    xor,
    bestXor,
    degree: anfDegree(monomials),
    unusedInputs: support.flatMap((used, i) => (used ? [] : [i])),
    gaps,
    gapCount,
    conflicts: conflictReports(table, output.built.conflicts),
    dontCareCount: count(spec.dc),
    steps,
  };
}

function xorForm(
  spec: BoolFunction,
  resolved: BoolFunction,
  inputs: readonly Signal[],
  monomials: readonly Monomial[],
  polarity: number,
  exhaustive: boolean,
): XorForm {
  const expr = anfToExpr(monomials, inputs, polarity);
  return {
    monomials,
    polarity,
    expr,
    text: printSt(expr),
    terms: monomials.length,
    exhaustive,
    ...checked(spec, resolved, truthTable(expr, spec.n)),
  };
}

/** A form's values proven against the resolved function; the don't-cares it turns ON, from the spec. */
function checked(spec: BoolFunction, resolved: BoolFunction, values: BitSet): Pick<AndOrForm, 'proof' | 'permitsAlso' | 'permitsAlsoCount'> {
  const { permitsAlso, permitsAlsoCount } = prove(spec, values);
  return { proof: formProof(prove(resolved, values)), permitsAlso, permitsAlsoCount };
}

function formProof(p: FormProof): FormProof {
  return { combinations: p.combinations, mismatchCount: p.mismatchCount, mismatches: p.mismatches };
}

/** What the analysis adds to the table's problems for one output, pinned to its header cell. */
export function outputProblems(table: SpecTable, o: OutputAnalysis, cell: string): Problem[] {
  const at = (severity: Problem['severity'], code: ProblemCode, message: string): Problem => ({ severity, code, sheet: table.sheet, cell, message });
  const out: Problem[] = [];
  const forms: [string, { proof: FormProof }][] = [
    ['AND/OR form', o.andOr],
    ['XOR form', o.xor],
    ['best-polarity XOR form', o.bestXor],
  ];
  for (const [name, form] of forms)
    if (form.proof.mismatchCount > 0)
      out.push(at('error', 'form-differs', `the ${name} of ${o.signal.header} differs from the table at ${form.proof.mismatchCount} combinations: do not use it`));
  if (!o.andOr.proven)
    out.push(at('info', 'not-proven', `the AND/OR form of ${o.signal.header} is the best found in the time given, not proven minimal`));
  if (o.unusedInputs.length > 0) {
    const names = o.unusedInputs.map((i) => table.inputs[i]!.header).join(', ');
    const where = o.dontCareCount > 0 ? ` (don't-cares resolved ${POLICY_WORDS[o.dontCares]})` : '';
    out.push(at('info', 'unused-inputs', `${o.signal.header} does not depend on ${names}${where}`));
  }
  const permits = permitsAlsoProblem(table, o, cell);
  if (permits) out.push(permits);
  return out;
}

export const POLICY_WORDS = { minimal: 'as the minimal AND/OR form uses them', safe: 'at the safe value' } as const;

/** How many cubes of a permits-also warning its message spells out (its pattern table has up to LISTED). */
const PERMITS_SHOWN = 8;

/** The don't-cares the resolved function turned ON: a warning at the output's header cell. */
function permitsAlsoProblem(table: SpecTable, o: OutputAnalysis, cell: string): Problem | undefined {
  if (o.permitsAlsoCount === 0) return undefined;
  const cubes = o.permitsAlsoCubes;
  const shown = cubes.slice(0, PERMITS_SHOWN).map((c) => describeCube(c, table.inputs));
  const more = cubes.length > PERMITS_SHOWN ? ` or ${cubes.length - PERMITS_SHOWN} more` : '';
  const plural = o.permitsAlsoCount === 1 ? 'combination' : 'combinations';
  const message =
    `${o.signal.header} permits also ${o.permitsAlsoCount} don't-care ${plural} (resolved ${POLICY_WORDS[o.dontCares]}): ` +
    `ON with ${shown.join(' or ')}${more}. Check each is acceptable; write 0 in the table where it is not` +
    (o.dontCares === 'minimal' ? `, or resolve every don't-care at the safe value: ${settingName('dont-cares', table.wording)}` : '');
  return {
    severity: 'warning',
    code: 'permits-also',
    sheet: table.sheet,
    cell,
    message,
    patterns: patternTable(table.inputs, cubes.slice(0, LISTED)),
  };
}
