// What a spec table is once read from a grid of cells, and what went wrong reading it.
import type { BuiltFunction, Cube, LeftOut, OutputValue, SafeValue, Signal, WideCube } from '../logic/index.js';

/** One cell as a host reads it. Dates keep their serial number; errors keep their text (#N/A). */
export type CellValue = null | number | boolean | string | { readonly error: string } | { readonly date: number };

/** A rectangle of cells read from a sheet, with the address of its top-left cell ("B3"). */
export interface Grid {
  readonly sheet: string;
  readonly origin: string;
  readonly cells: readonly (readonly CellValue[])[];
  /** Merged areas (A1 ranges) that overlap the grid, as the host found them. */
  readonly merges?: readonly string[];
  /**
   * What the host found while reading these cells (hidden rows, formula cells, parts it could
   * not read), at their addresses: `readSpecTables` hands each to the table whose range holds
   * it, so that an error there stops that table's claims.
   */
  readonly readProblems?: readonly Problem[];
}

export type Severity = 'error' | 'warning' | 'info';

/** Something the user should know about their sheet, pinned to a cell ("Sheet1!C7" is sheet + cell). */
/**
 * What kind of problem it is, stable across wording changes: tests, the pane and the JSON match
 * codes, not messages. Kebab-case; add a code when a new kind of problem is reported.
 */
export type ProblemCode = string;

export interface Problem {
  readonly severity: Severity;
  readonly code: ProblemCode;
  readonly sheet: string;
  /** A1 address of the cell (or range) concerned, without the sheet name. */
  readonly cell: string;
  readonly message: string;
  /** Every cell concerned, when one problem stands for several cells of one kind. */
  readonly cells?: readonly string[];
  /** The reading setting that would change this problem; the message names it as the host calls it. */
  readonly setting?: Setting;
  /** Combinations or cubes the problem is about: one column per signal. */
  readonly patterns?: PatternTable;
}

/** Input combinations or cubes as a small table: a column per signal, cells '1', '0' or '-' (any). */
export interface PatternTable {
  readonly headers: readonly string[];
  readonly rows: readonly (readonly string[])[];
}

/** Reading settings a problem can point to (see settings.ts for how each host names them). */
export type Setting = 'x-means-dont-care' | 'inputs' | 'range' | 'dont-cares';

/** Which host words the messages: each names its settings its own way (settings.ts); 'pane' = the Excel pane, 'page' = the standalone page. */
export type HostKind = 'cli' | 'pane' | 'page' | 'any';

/**
 * How an output's don't-cares are resolved, once, into the one function every form, proof, test
 * step and hand-over file is of: `minimal` as the minimal AND/OR form uses them, `safe` all at
 * the output's safe value.
 */
export type DontCarePolicy = 'minimal' | 'safe';

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
  /** How don't-cares are resolved in the analysis; default 'minimal'. */
  readonly dontCares?: DontCarePolicy;
  /** Who shows the messages, so that they name settings as that host does; default: all hosts' names. */
  readonly host?: HostKind;
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
  /** The row's annotation cells (notes, comments), joined with "; ": shown beside the row in messages. */
  readonly note?: string;
}

/** Why a column was taken as an annotation (never a signal). */
export type AnnotationReason = 'outside-roles' | 'note-header' | 'free-text';

/** A column read as notes beside the rows, not as a signal. */
export interface AnnotationColumn {
  /** The header text ('' when the header cell is empty). */
  readonly header: string;
  /** A1 address of its header cell. */
  readonly cell: string;
  readonly reason: AnnotationReason;
}

/** A way of writing truth values that occurred in a table's data cells. */
export type ValueReading = '1/0' | 'TRUE/FALSE' | 'ON/OFF' | 'Y/N' | 'YES/NO' | '-' | 'X';

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
  // The fields below are always set by readSpecTables; optional for tables built by hand.
  /** How the analysis resolves don't-cares (from SpecOptions.dontCares); absent = 'minimal'. */
  readonly dontCares?: DontCarePolicy;
  /** The spellings of truth values found in the data cells, in a fixed order. */
  readonly readings?: readonly ValueReading[];
  /** Columns taken as notes beside the rows, left to right. */
  readonly annotations?: readonly AnnotationColumn[];
  /** The host the messages are worded for (SpecOptions.host); absent = 'any'. */
  readonly wording?: HostKind;
  /** A1 range of the tag row (program names of the signals) when the table has one. */
  readonly tagRow?: string;
  /** A1 address of each header cell: inputs first, then outputs. */
  readonly headerCells: readonly string[];
  /** Problems of this table (those of the whole grid are returned beside the tables). */
  readonly problems: readonly Problem[];
  /** Only in a table of more than 24 inputs: its rows' cubes and outputs, for the symbolic engine (`outputs` is empty). */
  readonly wide?: WideSpec;
}

/** What a spec table of more than 24 inputs carries for the symbolic engine. Plain data (BigInt included). */
export interface WideSpec {
  /** Each data row's input cube (same order as `SpecTable.rows`). */
  readonly cubes: readonly WideCube[];
  /** The outputs with their safe values (`SpecTable.outputs` is empty for such a table). */
  readonly outputs: readonly { readonly signal: Signal; readonly safe: SafeValue }[];
  /**
   * Set when the rows' union has no decision diagram within the budget (why, in words): the
   * table is then analysed on its rows' cubes (an info problem at the table says so).
   */
  readonly noDiagram?: { readonly why: string; readonly gaps: LeftOut };
}
