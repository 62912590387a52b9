// One interface over the workbook, whether it is the live sheet in Excel or an .xlsx file.
import type { SheetBlock } from '../report/index.js';
import type { Grid, Problem } from '../table/index.js';

export interface WriteReport {
  /** The sheet actually written (a suffix is added when the wanted name is taken). */
  readonly sheet: string;
  /** A1 range written. */
  readonly range: string;
  readonly cells: number;
  /** What of the block's layout the host could not apply (print setup, frozen rows), in words. */
  readonly notApplied?: readonly string[];
}

export interface WorkbookHost {
  listSheets(): Promise<string[]>;
  /** The used range of a sheet, or the given A1 range of it. */
  readGrid(sheet: string, range?: string): Promise<Grid>;
  /**
   * Problems of the file and of whole sheets, each at its sheet (a file host: hidden sheets,
   * damaged parts, sheets not read and why, as errors where something is lost).
   */
  fileProblems?(): Problem[];
  /** Add a new sheet with the block; never writes into a non-empty cell of an existing sheet. */
  writeSheet(block: SheetBlock): Promise<WriteReport>;
}
