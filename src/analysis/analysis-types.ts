// The result of analysing one spec table: what the CLI prints, the pane shows and the
// report writes. Built by analyse.ts; plain data, so that it crosses a worker boundary.
import type { BoolFunction, Combination, Cube, Expr, FormBound, Monomial, Signal, TestStep } from '../logic/index.js';
import type { DontCarePolicy, Problem, SpecTable } from '../table/index.js';
import type { WideTableAnalysis } from './wide-types.js';

/** A form checked on every combination against the output's resolved function. */
export interface FormProof {
  readonly combinations: number;
  readonly mismatchCount: number;
  /** The first 50 mismatches (see LISTED in proof.ts); the count is complete. */
  readonly mismatches: readonly Combination[];
}

export interface AndOrForm {
  readonly cubes: readonly Cube[];
  readonly expr: Expr;
  /** Structured Text. */
  readonly text: string;
  readonly proven: boolean;
  readonly terms: number;
  readonly literals: number;
  /** Proven: no form has fewer terms, none with the fewest terms fewer literals (= cost when proven). */
  readonly lowerBound: FormBound;
  readonly proof: FormProof;
  /** Don't-care combinations this form turns ON: the first 50 of them. */
  readonly permitsAlso: readonly Combination[];
  readonly permitsAlsoCount: number;
}

export interface XorForm {
  readonly monomials: readonly Monomial[];
  /** Bit set in Combination positions: that input appears complemented. 0 for the plain ANF. */
  readonly polarity: number;
  readonly expr: Expr;
  readonly text: string;
  readonly terms: number;
  /** Best-polarity search covered all 2^n polarities. */
  readonly exhaustive: boolean;
  readonly proof: FormProof;
  readonly permitsAlso: readonly Combination[];
  readonly permitsAlsoCount: number;
}

export interface ConflictReport {
  readonly rowCellsA: string;
  readonly rowCellsB: string;
  /** The rows' annotation text (notes columns), when they have any. */
  readonly notes?: readonly [string | undefined, string | undefined];
  readonly example: Combination;
  readonly combinations: number;
}

export interface OutputAnalysis {
  readonly signal: Signal;
  readonly safe: 0 | 1;
  /** How the don't-cares were resolved into `resolved`. */
  readonly dontCares: DontCarePolicy;
  /**
   * The one function of this output: the spec with every don't-care resolved by the policy
   * (no don't-cares left). Every form is proven equal to it, the test steps expect it, and
   * every hand-over file is of it.
   */
  readonly resolved: BoolFunction;
  /** Don't-care combinations the resolved function turns ON (first 50; count complete), as disjoint cubes too. */
  readonly permitsAlso: readonly Combination[];
  readonly permitsAlsoCount: number;
  readonly permitsAlsoCubes: readonly Cube[];
  readonly andOr: AndOrForm;
  readonly xor: XorForm;
  readonly bestXor: XorForm;
  readonly degree: number;
  /** Inputs that appear in no ANF monomial (do not matter), by index. */
  readonly unusedInputs: readonly number[];
  /** Combinations no row covers, as cubes (they take the safe value). */
  readonly gaps: readonly Cube[];
  readonly gapCount: number;
  readonly conflicts: readonly ConflictReport[];
  readonly dontCareCount: number;
  readonly steps: readonly TestStep[];
}

export interface TableAnalysis {
  readonly table: SpecTable;
  readonly inputs: readonly Signal[];
  /** Empty for a table of more than 24 inputs: its outputs are in `wide`. */
  readonly outputs: readonly OutputAnalysis[];
  readonly problems: readonly Problem[];
  /** Only for a table of more than 24 inputs: the symbolic engine's results. */
  readonly wide?: WideTableAnalysis;
}
