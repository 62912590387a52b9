// What the analysis of a spec table of more than 24 inputs gives (what such a table carries is
// `WideSpec` in types.ts). Plain data (BigInt included), so that it crosses a worker boundary.
import type { CountBounds, SafeValue, Signal, WideCombination, WideCube, WideOutputForms, WideTestStep, WideXor } from '../logic/index.js';

export interface WideConflictReport {
  readonly rowCellsA: string;
  readonly rowCellsB: string;
  readonly notes?: readonly [string | undefined, string | undefined];
  readonly example: WideCombination;
  readonly combinations: bigint;
}

/**
 * Which engine analysed the table: `diagrams` (BDDs: every form and count exact) or `rows`
 * (the rows' union has no decision diagram within the budget: the AND/OR form and its proof
 * on the rows' cubes, no XOR forms, the gap count possibly bounded).
 */
export type WideEngine = 'diagrams' | 'rows';

export interface WideOutputAnalysis extends Omit<WideOutputForms, 'xor' | 'bestXor' | 'degree'> {
  /** Null where the engine is `rows`: an XOR form needs the function's decision diagram. */
  readonly xor: WideXor | null;
  readonly bestXor: WideXor | null;
  readonly degree: number | null;
  readonly signal: Signal;
  readonly safe: SafeValue;
  readonly conflicts: readonly WideConflictReport[];
  /** The unique-cause test steps of its AND/OR form, expecting the resolved function. */
  readonly steps: readonly WideTestStep[];
}

/** A test step's combination as the table has it, for every output analysed (the record's expected values and notes). */
export interface WideStepFacts {
  readonly combination: WideCombination;
  /** Per output of `WideTableAnalysis.outputs`: the resolved function's value. */
  readonly expected: readonly (0 | 1)[];
  /** No row covers it. */
  readonly gap: boolean;
  readonly conflicted: readonly boolean[];
  readonly dontCare: readonly boolean[];
}

export interface WideTableAnalysis {
  readonly n: number;
  readonly engine: WideEngine;
  readonly outputs: readonly WideOutputAnalysis[];
  /** Combinations no row covers, as disjoint cubes (the first GAP_CUBES_LISTED). */
  readonly gaps: readonly WideCube[];
  /** Exact (atLeast = atMost) unless the count on the rows' cubes ran out of time. */
  readonly gapCount: CountBounds;
  /** Every combination some output's steps use, in the order first used. */
  readonly stepFacts: readonly WideStepFacts[];
}
