// A spec table -> per output its AND/OR and XOR forms, each proven against every input
// combination, with gaps, conflicts and commissioning test steps.
import { anfDegree, anfOf, anfSupport, type Monomial } from '../logic/anf.js';
import { count, emptySet, union } from '../logic/bits.js';
import type { BoolFunction } from '../logic/boolfn.js';
import type { Cube } from '../logic/cube.js';
import { truthTable } from '../logic/expr/evaluate.js';
import { anfToExpr, sopToExpr } from '../logic/expr/forms.js';
import { printSt } from '../logic/expr/print-st.js';
import { bestPolarity } from '../logic/polarity.js';
import { prove } from '../logic/proof.js';
import type { Signal } from '../logic/signals.js';
import { minimiseSop } from '../logic/sop.js';
import { uniqueCauseSteps } from '../logic/steps.js';
import type { AndOrForm, FormProof, OutputAnalysis, TableAnalysis, XorForm } from './analysis-types.js';
import type { OutputSpec, Problem, SpecTable } from './types.js';
import { gapCubes } from './uncovered.js';
import { analyseWide, conflictReports } from './analyse-wide.js';
import { SYMBOLIC_FROM_INPUTS, analyseSymbolically } from './analyse-symbolic.js';

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
    problems.push(...outputProblems(table, analysed, table.headerCells[n + j]!));
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
  const { fn } = output.built;
  const inputs = table.inputs;
  const sop = minimiseSop(fn, sopOptions);
  const andOrExpr = sopToExpr(sop.cubes, inputs);
  const andOrProof = prove(fn, truthTable(andOrExpr, fn.n));
  const andOr: AndOrForm = {
    cubes: sop.cubes,
    expr: andOrExpr,
    text: printSt(andOrExpr),
    proven: sop.proven,
    terms: sop.terms,
    literals: sop.literals,
    proof: formProof(andOrProof),
    permitsAlso: andOrProof.permitsAlso,
    permitsAlsoCount: andOrProof.permitsAlsoCount,
  };
  progress('AND/OR form');

  // The XOR forms are of the completely specified function: don't-cares take the safe value.
  const values = output.safe === 1 ? union(fn.on, fn.dc) : fn.on;
  const monomials = anfOf(values, fn.n);
  const xor = xorForm(fn, inputs, monomials, 0, true);
  progress('XOR form');
  const best = bestPolarity(values, fn.n);
  const bestXor = xorForm(fn, inputs, best.monomials, best.polarity, best.exhaustive);
  progress('best-polarity XOR form');

  const support = anfSupport(monomials, fn.n);
  const steps = uniqueCauseSteps(sop.cubes, fn, inputs);
  progress('test steps');
  return {
    signal: output.signal,
    safe: output.safe,
    andOr,
    xor,
    bestXor,
    degree: anfDegree(monomials),
    unusedInputs: support.flatMap((used, i) => (used ? [] : [i])),
    gaps,
    gapCount,
    conflicts: conflictReports(table, output.built.conflicts),
    dontCareCount: count(fn.dc),
    steps,
  };
}

function xorForm(
  fn: BoolFunction,
  inputs: readonly Signal[],
  monomials: readonly Monomial[],
  polarity: number,
  exhaustive: boolean,
): XorForm {
  const expr = anfToExpr(monomials, inputs, polarity);
  const proof = prove(fn, truthTable(expr, fn.n));
  return {
    monomials,
    polarity,
    expr,
    text: printSt(expr),
    terms: monomials.length,
    exhaustive,
    proof: formProof(proof),
    permitsAlso: proof.permitsAlso,
    permitsAlsoCount: proof.permitsAlsoCount,
  };
}

function formProof(p: FormProof): FormProof {
  return { combinations: p.combinations, mismatchCount: p.mismatchCount, mismatches: p.mismatches };
}

/** What the analysis adds to the table's problems for one output, pinned to its header cell. */
export function outputProblems(table: SpecTable, o: OutputAnalysis, cell: string): Problem[] {
  const at = (severity: Problem['severity'], message: string): Problem => ({ severity, sheet: table.sheet, cell, message });
  const out: Problem[] = [];
  const forms: [string, { proof: FormProof }][] = [
    ['AND/OR form', o.andOr],
    ['XOR form', o.xor],
    ['best-polarity XOR form', o.bestXor],
  ];
  for (const [name, form] of forms)
    if (form.proof.mismatchCount > 0)
      out.push(at('error', `the ${name} of ${o.signal.header} differs from the table at ${form.proof.mismatchCount} combinations: do not use it`));
  if (!o.andOr.proven)
    out.push(at('info', `the AND/OR form of ${o.signal.header} is the best found in the time given, not proven minimal`));
  if (o.unusedInputs.length > 0) {
    const names = o.unusedInputs.map((i) => table.inputs[i]!.header).join(', ');
    const where = o.dontCareCount > 0 ? ` (don't-cares taken as the safe value ${o.safe})` : '';
    out.push(at('info', `${o.signal.header} does not depend on ${names}${where}`));
  }
  return out;
}
