// One output's forms as the sheets and hand-over files print them, from either engine: the
// bit-set engine's OutputAnalysis (up to 24 inputs) and the symbolic engine's (up to 64), in
// one shape. Counts are BigInt (a table of 64 inputs has 2^64 combinations); combinations and
// cubes are patterns over the inputs, leftmost first, as the sheets write them.
import {
  combinationPattern,
  type CountBounds,
  cubeToPattern,
  toWide,
  widePattern,
  type Expr,
  type FormBound,
  type Signal,
  type WideCube,
} from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';

export interface FormView {
  /** Structured Text; for an XOR form too long to print, what it is instead (`expr` null). */
  readonly text: string;
  readonly expr: Expr | null;
  readonly terms: bigint;
  readonly combinations: bigint;
  readonly mismatchCount: bigint;
  /** Don't-care combinations the form turns ON: the first few as patterns, the count complete. */
  readonly permitsAlso: readonly string[];
  readonly permitsAlsoCount: bigint;
}

export interface AndOrView extends FormView {
  readonly expr: Expr;
  readonly cubes: readonly WideCube[];
  readonly literals: number;
  readonly proven: boolean;
  readonly lowerBound: FormBound;
}

export interface XorView extends FormView {
  /** Bit set = that input complemented (Combination positions). */
  readonly polarity: bigint;
  readonly exhaustive: boolean;
}

export interface OutputView {
  readonly signal: Signal;
  readonly safe: 0 | 1;
  readonly andOr: AndOrView;
  /** Null where the table was analysed on its rows' cubes (no decision diagram: no XOR form). */
  readonly xor: XorView | null;
  readonly bestXor: XorView | null;
  readonly unusedInputs: readonly number[];
  /** Gap cubes as patterns (the first of them). */
  readonly gaps: readonly string[];
  /** Exact (atLeast = atMost) unless counting on the rows' cubes ran out of time. */
  readonly gapCount: CountBounds;
  readonly conflicts: readonly { readonly rowCellsA: string; readonly rowCellsB: string; readonly combinations: bigint; readonly example: string }[];
  readonly dontCareCount: bigint;
  /** Of the XOR form (algebraic normal form); null with it. */
  readonly degree: number | null;
  /** The unique-cause test steps of the AND/OR form, combinations as patterns. */
  readonly steps: readonly StepView[];
}

export interface StepView {
  readonly pattern: string;
  /** What the resolved function gives there: what the step expects. */
  readonly expected: 0 | 1;
}

/** The outputs of a table, whichever engine analysed it. */
export function outputViews(analysis: TableAnalysis): OutputView[] {
  const n = analysis.inputs.length;
  const pattern = (k: number | bigint): string => combinationPattern(n, BigInt(k));
  const conflicts = (cs: readonly { rowCellsA: string; rowCellsB: string; combinations: number | bigint; example: number | bigint }[]): OutputView['conflicts'] =>
    cs.map((c) => ({ rowCellsA: c.rowCellsA, rowCellsB: c.rowCellsB, combinations: BigInt(c.combinations), example: pattern(c.example) }));
  if (analysis.wide) {
    const gaps = analysis.wide.gaps.map((c) => widePattern(n, c));
    return analysis.wide.outputs.map((o) => {
      const form = (f: { text: string; proof: { combinations: bigint; mismatchCount: bigint; permitsAlso: readonly bigint[]; permitsAlsoCount: bigint } }) => ({
        text: f.text,
        combinations: f.proof.combinations,
        mismatchCount: f.proof.mismatchCount,
        permitsAlso: f.proof.permitsAlso.map(pattern),
        permitsAlsoCount: f.proof.permitsAlsoCount,
      });
      const xor = (f: typeof o.xor): XorView | null => f && { ...form(f), expr: f.expr, terms: f.terms, polarity: f.polarity, exhaustive: f.exhaustive };
      return {
        signal: o.signal,
        safe: o.safe,
        andOr: { ...form(o.andOr), expr: o.andOr.expr, terms: BigInt(o.andOr.terms), cubes: o.andOr.cubes, literals: o.andOr.literals, proven: o.andOr.proven, lowerBound: o.andOr.lowerBound },
        xor: xor(o.xor),
        bestXor: xor(o.bestXor),
        unusedInputs: o.unusedInputs,
        gaps,
        gapCount: analysis.wide!.gapCount,
        conflicts: conflicts(o.conflicts),
        dontCareCount: o.dontCareCount,
        degree: o.degree,
        steps: o.steps.map((t) => ({ pattern: pattern(t.combination), expected: t.expected })),
      };
    });
  }
  return analysis.outputs.map((o) => {
    const form = (f: (typeof o)['xor'] | (typeof o)['andOr']) => ({
      text: f.text,
      expr: f.expr,
      terms: BigInt(f.terms),
      combinations: BigInt(f.proof.combinations),
      mismatchCount: BigInt(f.proof.mismatchCount),
      permitsAlso: f.permitsAlso.map(pattern),
      permitsAlsoCount: BigInt(f.permitsAlsoCount),
    });
    const xor = (f: typeof o.xor): XorView => ({ ...form(f), polarity: BigInt(f.polarity), exhaustive: f.exhaustive });
    return {
      signal: o.signal,
      safe: o.safe,
      andOr: { ...form(o.andOr), expr: o.andOr.expr, cubes: o.andOr.cubes.map(toWide), literals: o.andOr.literals, proven: o.andOr.proven, lowerBound: o.andOr.lowerBound },
      xor: xor(o.xor),
      bestXor: xor(o.bestXor),
      unusedInputs: o.unusedInputs,
      gaps: o.gaps.map((c) => cubeToPattern(n, c)),
      gapCount: { atLeast: BigInt(o.gapCount), atMost: BigInt(o.gapCount) },
      conflicts: conflicts(o.conflicts),
      dontCareCount: BigInt(o.dontCareCount),
      degree: o.degree,
      steps: o.steps.map((t) => ({ pattern: pattern(t.combination), expected: t.expected })),
    };
  });
}

/** The output signals of an analysis, whichever engine took it. */
export function outputSignalsOf(analysis: TableAnalysis): Signal[] {
  return analysis.wide ? analysis.wide.outputs.map((o) => o.signal) : analysis.outputs.map((o) => o.signal);
}

