// A table of SYMBOLIC_FROM_INPUTS to 24 inputs analysed by the symbolic engine, its results
// given in the bit-set engine's types (cubes, combinations and monomials fit in numbers there),
// so that every host reads them as it reads analyse.ts's. Chosen by `npm run bench -- wide`:
// on sparse tables the truth-table proofs of the bit-set path cost seconds at 20 inputs and
// minutes at 24, the BDDs a fraction of a second.
import {
  analyseWideOutput,
  anfToExpr,
  count,
  cubeToSet,
  DdTooLarge,
  emptySet,
  exprToBdd,
  popcount,
  printSt,
  proveWide,
  toNarrow,
  union,
  wideResolved,
  wideUniqueCauseSteps,
  type BitSet,
  type BoolFunction,
  type Node,
  type Signal,
  type WideFunction,
  type WideProof,
  type WideXor,
} from '../logic/index.js';
import { outputProblems, type AnalyseOptions } from './analyse.js';
import { conflictReports, wideOptions, wideSpecOf } from './analyse-wide.js';
import type { FormProof, OutputAnalysis, TableAnalysis, XorForm } from './analysis-types.js';
import { gapCubes, wideBuilt, type Problem, type SpecTable } from '../table/index.js';


/** Null when the diagrams grow too large (the bit-set path then takes the table). */
export function analyseSymbolically(table: SpecTable, options: AnalyseOptions = {}): TableAnalysis | null {
  try {
    return symbolically(table, options);
  } catch (e) {
    if (e instanceof DdTooLarge) return null;
    throw e;
  }
}

function symbolically(table: SpecTable, options: AnalyseOptions): TableAnalysis {
  const n = table.inputs.length;
  const total = table.outputs.length + 1;
  let done = 0;
  const progress = (what: string): void => options.onProgress?.(++done, total, what);
  const gapSet = table.outputs[0]!.built.gaps;
  const gaps = gapCubes(n, gapSet).cubes;
  progress('gaps');
  const { built } = wideBuilt(n, wideSpecOf(table), table.rows);
  const problems: Problem[] = [...table.problems];
  const outputs = table.outputs.map((output, j): OutputAnalysis => {
    const wide = built[j]!.fn;
    const spec = output.built.fn;
    const forms = analyseWideOutput(wide, output.safe, table.inputs, wideOptions(table, options));
    const cubes = forms.andOr.cubes.map(toNarrow);
    // The one function of this output, as a bit set: the spec's ON set and the don't-cares the policy turned ON.
    const on = wideResolved(wide, output.safe, forms.dontCares, exprToBdd(wide.dd, forms.andOr.expr));
    const permits = setOf(wide, wide.dd.and(on, wide.dc));
    const resolved: BoolFunction = { n, on: union(spec.on, permits), dc: emptySet(n) };
    const analysed: OutputAnalysis = {
      signal: output.signal,
      safe: output.safe,
      dontCares: forms.dontCares,
      resolved,
      permitsAlso: forms.permitsAlso.map(Number),
      permitsAlsoCount: Number(forms.permitsAlsoCount),
      permitsAlsoCubes: gapCubes(n, permits).cubes,
      andOr: {
        cubes,
        expr: forms.andOr.expr,
        text: forms.andOr.text,
        proven: forms.andOr.proven,
        lowerBound: forms.andOr.lowerBound,
        terms: forms.andOr.terms,
        literals: forms.andOr.literals,
        ...proofFields(forms.andOr.proof),
      },
      xor: xorForm(wide, on, forms.xor, table.inputs),
      bestXor: xorForm(wide, on, forms.bestXor, table.inputs),
      degree: forms.degree,
      unusedInputs: forms.unusedInputs,
      gaps,
      gapCount: count(gapSet),
      conflicts: conflictReports(table, output.built.conflicts),
      dontCareCount: count(spec.dc),
      // The one plan of steps.ts (causeSteps) on the BDDs: the same steps, without the truth tables.
      steps: wideUniqueCauseSteps(wide.dd, forms.andOr.cubes, on, table.inputs).map((s) => ({ ...s, combination: Number(s.combination) })),
    };
    problems.push(...outputProblems(table, analysed, table.headerCells[n + j]!));
    progress(`${output.signal.header}: forms`);
    return analysed;
  });
  return { table, inputs: table.inputs, outputs, problems };
}

/** A function of at most 24 inputs as a bit set, painted from its BDD's disjoint path cubes. */
function setOf(fn: WideFunction, f: Node): BitSet {
  const into = emptySet(fn.dd.n);
  for (const c of fn.dd.pathCubes(f).cubes) cubeToSet(fn.dd.n, toNarrow(c), into);
  return into;
}

/** Every term listed and printed, as the bit-set path does, and the printed expression proven against `resolved`. */
function xorForm(fn: WideFunction, resolved: Node, form: WideXor, inputs: readonly Signal[]): XorForm {
  const { dd } = fn;
  const polarity = Number(form.polarity);
  const monomials = form.monomials ? form.monomials.map(Number) : allMonomials(fn, resolved, form.polarity);
  const expr = form.expr ?? anfToExpr(monomials, inputs, polarity);
  const proof = form.expr ? form.proof : proveWide(fn, exprToBdd(dd, expr), resolved);
  return { monomials, polarity, expr, text: printSt(expr), terms: monomials.length, exhaustive: form.exhaustive, ...proofFields(proof) };
}

/** Every monomial of an XOR form of the resolved function (its polarity applied), in printed order. */
function allMonomials(fn: WideFunction, resolved: Node, polarity: bigint): number[] {
  const { dd } = fn;
  const ms = dd.zMembers(dd.anf(dd.flip(resolved, polarity)), Infinity).map(Number);
  const degree = (m: number): number => popcount(m);
  return ms.sort((a, b) => degree(a) - degree(b) || b - a);
}

function proofFields(p: WideProof): { proof: FormProof; permitsAlso: number[]; permitsAlsoCount: number } {
  return {
    proof: { combinations: Number(p.combinations), mismatchCount: Number(p.mismatchCount), mismatches: p.mismatches.map(Number) },
    permitsAlso: p.permitsAlso.map(Number),
    permitsAlsoCount: Number(p.permitsAlsoCount),
  };
}
