// What a spec table is once read from a grid of cells, and what went wrong reading it.
import type { BuiltFunction, OutputValue, SafeValue } from '../logic/boolfn.js';
import type { Cube } from '../logic/cube.js';
import type { Signal } from '../logic/signals.js';
import type { WideSpec } from './wide-types.js';

/** One cell as a host reads it. Dates keep their serial number; errors keep their text (#N/A). */
export type CellValue = null | number | boolean | string | { readonly error: string } | { readonly date: number };

/** A rectangle of cells read from a sheet, with the address of its top-left cell ("B3"). */
export interface Grid {
  readonly sheet: string;
  readonly origin: string;
  readonly cells: readonly (readonly CellValue[])[];
}

export type Severity = 'error' | 'warning' | 'info';

/** Something the user should know about their sheet, pinned to a cell ("Sheet1!C7" is sheet + cell). */
export interface Problem {
  readonly severity: Severity;
  readonly sheet: string;
  /** A1 address of the cell (or range) concerned, without the sheet name. */
  readonly cell: string;
  readonly message: string;
}

/** How inputs were told apart from outputs. */
export type RoleRule = 'role-row' | 'separator-column' | 'user-choice';

/** How an 'X' cell was read: not accepted (an error), or as don't-care / any. */
export type XReading = 'none' | 'dont-care';

export interface SpecOptions {
  /** Only look inside this A1 range of the grid's sheet. */
  readonly range?: string;
  /** Accept 'X' cells, and how to read them. Default 'none': an 'X' is an error. */
  readonly xReading?: XReading;
  /** The user's choice of how many leading signal columns are inputs (the rest are outputs). */
  readonly inputCount?: number;
  /** Safe value per output, by header or identifier; default 0. */
  readonly safeValues?: Readonly<Record<string, SafeValue>>;
}

/** One data row of a spec table. */
export interface SpecRow {
  /** A1 range of the row's data cells, e.g. "B5:H5". */
  readonly cells: string;
  /** A1 address of each input cell, leftmost first, then each output cell. */
  readonly inputCells: readonly string[];
  readonly outputCells: readonly string[];
  /** The row's input cube; in a table of more than 24 inputs the cube with no literal (see `SpecTable.wide`). */
  readonly cube: Cube;
  readonly values: readonly OutputValue[];
}

export interface OutputSpec {
  readonly signal: Signal;
  readonly safe: SafeValue;
  /** The output's function; gaps and conflicts take the safe value. Conflicts name rows by index. */
  readonly built: BuiltFunction;
}

export interface SpecTable {
  readonly sheet: string;
  /** A1 range of the whole table, header row (and role row) included. */
  readonly range: string;
  readonly inputs: readonly Signal[];
  readonly outputs: readonly OutputSpec[];
  readonly rows: readonly SpecRow[];
  readonly roleRule: RoleRule;
  readonly xReading: XReading;
  /** A1 address of each header cell: inputs first, then outputs. */
  readonly headerCells: readonly string[];
  /** Problems of this table (those of the whole grid are returned beside the tables). */
  readonly problems: readonly Problem[];
  /** Only in a table of more than 24 inputs: its rows' cubes and outputs, for the symbolic engine (`outputs` is empty). */
  readonly wide?: WideSpec;
}
