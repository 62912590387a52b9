// What the analysis of a spec table of more than 24 inputs gives (what such a table carries is
// `WideSpec` in types.ts). Plain data (BigInt included), so that it crosses a worker boundary.
import type { SafeValue, Signal, WideCombination, WideCube, WideOutputForms } from '../logic/index.js';

export interface WideConflictReport {
  readonly rowCellsA: string;
  readonly rowCellsB: string;
  readonly notes?: readonly [string | undefined, string | undefined];
  readonly example: WideCombination;
  readonly combinations: bigint;
}

export interface WideOutputAnalysis extends WideOutputForms {
  readonly signal: Signal;
  readonly safe: SafeValue;
  readonly conflicts: readonly WideConflictReport[];
}

export interface WideTableAnalysis {
  readonly n: number;
  readonly outputs: readonly WideOutputAnalysis[];
  /** Combinations no row covers, as disjoint cubes (the first GAP_CUBES_LISTED). */
  readonly gaps: readonly WideCube[];
  readonly gapCount: bigint;
}
