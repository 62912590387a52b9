// Messages between the pane and its engine worker. Everything is plain data (structured clone).
import type { Result } from '../src/logic/result.js';
import type { ImplCheck } from '../src/logic/implcheck.js';
import type { VerifyReport } from '../src/impl/verify.js';
import type { TableAnalysis } from '../src/spec/analysis-types.js';
import type { Grid, Problem, SpecOptions, SpecTable } from '../src/spec/types.js';

export type EngineRequest =
  | { readonly kind: 'analyse'; readonly grid: Grid; readonly options: SpecOptions }
  | { readonly kind: 'check'; readonly table: SpecTable; readonly output: number; readonly text: string }
  | { readonly kind: 'verify'; readonly tables: readonly SpecTable[]; readonly fileName: string; readonly text: string };

export interface Analysed {
  readonly analyses: TableAnalysis[];
  /** Problems that belong to no table (each table's own are in its analysis). */
  readonly problems: Problem[];
}

export type EngineAnswer = Analysed | Result<ImplCheck> | Result<VerifyReport>;

export type EngineMessage =
  | { readonly id: number; readonly kind: 'progress'; readonly done: number; readonly total: number; readonly what: string }
  | { readonly id: number; readonly kind: 'answer'; readonly answer: EngineAnswer }
  | { readonly id: number; readonly kind: 'failed'; readonly message: string };
