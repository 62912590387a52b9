// Messages between the pane and its engine worker, typed per request: each request kind has
// its answer type, and every answer is tagged with the kind it answers. The worker keeps the
// workbook it examined; later requests name its tables by id instead of sending them again.
// Everything is plain data (structured clone).
import type { Result } from '../src/logic/index.js';
import type { OutputVerdict, VerifyReport } from '../src/impl/index.js';
import type { SheetBlock } from '../src/report/index.js';
import type {
  CompareView,
  GridsRead,
  HandOverFile,
  HandOverRequest,
  MappingSource,
  ReadFailure,
  RecordGrids,
  RecordVerdict,
  WorkbookChoice,
  WorkbookView,
} from '../src/workflow/index.js';

export interface Requests {
  /** Find the spec tables in the grids the host read, analyse them, keep the result. */
  readonly examine: { readonly grids: GridsRead; readonly choice: WorkbookChoice; readonly source: string };
  /** A typed expression against one output of a table examined. */
  readonly check: { readonly table: number; readonly output: number; readonly text: string };
  /** A program file against every table examined, names mapped by a mapping file and/or sheet (none: by name and tag row). */
  readonly verify: { readonly fileName: string; readonly text: string; readonly mappings?: readonly MappingSource[] };
  /** The results sheets and test records of every table examined. */
  readonly sheets: Record<never, never>;
  /** Files of the hand-over pack. */
  readonly handOver: { readonly files: HandOverRequest };
  /** Filled-in test records against their tables as the workbook has them now (independent of examine). */
  readonly records: { readonly grids: RecordGrids };
  /** Two revisions read by the host (the picked file is the old one), compared by behaviour (independent of examine). */
  readonly compare: { readonly old: GridsRead; readonly new: GridsRead; readonly choice: WorkbookChoice; readonly oldSource: string; readonly newSource: string };
}

export interface Answers {
  readonly examine: Result<WorkbookView, ReadFailure>;
  /** The check, and the sheet that writes it down. */
  readonly check: Result<{ readonly check: OutputVerdict; readonly sheet: SheetBlock }>;
  readonly verify: Result<{ readonly report: VerifyReport; readonly sheet: SheetBlock }>;
  /** Refused (with the reason) when the workflow allows no results write. */
  readonly sheets: Result<SheetBlock[], string>;
  /** Refused (with the reason) when the workflow allows no hand-over. */
  readonly handOver: Result<HandOverFile[], string>;
  readonly records: RecordVerdict[];
  readonly compare: Result<CompareView, ReadFailure>;
}

export type RequestKind = keyof Requests;

export type EngineRequest = { [K in RequestKind]: { readonly kind: K } & Requests[K] }[RequestKind];

export type EngineAnswer = { [K in RequestKind]: { readonly kind: K; readonly value: Answers[K] } }[RequestKind];

export type EngineMessage =
  | { readonly id: number; readonly kind: 'progress'; readonly done: number; readonly total: number; readonly what: string }
  | { readonly id: number; readonly kind: 'answer'; readonly answer: EngineAnswer }
  | { readonly id: number; readonly kind: 'failed'; readonly message: string };
