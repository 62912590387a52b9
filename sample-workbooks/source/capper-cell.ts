// The demo machine: the capper cell (station C-2) of an invented bottling line. All data
// here is invented for the demo and describes no real machine. `npm run samples` writes the
// workbooks and the CSV from this file; test/samples.test.ts checks the committed files
// still match it.
//
// A table is written as its headers and its rows; each row is the input values, a bar, then
// the output values: '1', '0' or '-' (any / don't-care). A few cells of the broken workbook
// hold the bad values a user might type (see `BadCell`).

/** What a cell of the broken workbook holds instead of a clean 1/0/-. */
export type BadCell = { readonly blank: true } | { readonly number: number } | { readonly error: string } | { readonly text: string };

export interface SampleTable {
  /** A1 address of the table's top-left cell (the role row when there is one). */
  readonly at: string;
  /** Write a role row (input/output) above the headers. */
  readonly roleRow: boolean;
  /** Leave an empty column between the inputs and the outputs. */
  readonly separatorColumn: boolean;
  /** How 1 and 0 are written: as numbers or as Excel booleans TRUE/FALSE. */
  readonly ones: 'numbers' | 'booleans';
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** "1 0 - | 1": inputs, a bar, outputs. */
  readonly rows: readonly string[];
  /** Cells to spoil, by data row (0 = first row) and column (0 = first input). */
  readonly bad?: readonly { readonly row: number; readonly column: number; readonly cell: BadCell }[];
}

export interface SampleSheet {
  readonly name: string;
  /** A line of text in A1 (tables start lower down). */
  readonly title?: string;
  readonly tables: readonly SampleTable[];
}

export interface SampleWorkbook {
  /** File name inside sample-workbooks/. */
  readonly file: string;
  readonly sheets: readonly SampleSheet[];
}

// Spindle motor run permit. Written the way engineers write such tables: '-' rows for
// "any", and one don't-care output: the mode selector's wiring stops the jog button from
// acting in automatic mode, so that row is marked '-' (the analysis lists what a form makes
// of it).
const spindle: SampleTable = {
  at: 'A3',
  roleRow: true,
  separatorColumn: false,
  ones: 'numbers',
  inputs: [
    'Guard door A closed',
    'Guard door B closed',
    'Light curtain clear',
    'E-stop healthy',
    'Air pressure OK',
    'Mode setup',
    'Jog pressed',
  ],
  outputs: ['Spindle run permit'],
  rows: [
    '- - - 0 - - - | 0', // e-stop pressed
    '- - - 1 0 - - | 0', // no air
    '1 1 1 1 1 0 0 | 1', // automatic, all guards closed
    '0 - - 1 1 0 0 | 0', // guard door A open
    '- 0 - 1 1 0 0 | 0', // guard door B open
    '- - 0 1 1 0 0 | 0', // light curtain broken
    '- - - 1 1 0 1 | -', // jog in automatic: cannot happen
    '- - - 1 1 1 1 | 1', // setup: jog turns the spindle slowly
    '- - - 1 1 1 0 | 0', // setup, jog released
  ],
};

// Air supply vote: three pressure switches, two out of three must be made. Written with
// Excel booleans and every combination listed.
const airVote: SampleTable = {
  at: 'A16',
  roleRow: true,
  separatorColumn: false,
  ones: 'booleans',
  inputs: ['Pressure switch 1', 'Pressure switch 2', 'Pressure switch 3'],
  outputs: ['Air supply OK'],
  rows: [
    '0 0 0 | 0',
    '0 0 1 | 0',
    '0 1 0 | 0',
    '0 1 1 | 1',
    '1 0 0 | 0',
    '1 0 1 | 1',
    '1 1 0 | 1',
    '1 1 1 | 1',
  ],
};

// Chuck and cap feeder: three outputs from the same five inputs, every combination listed,
// inputs and outputs told apart by an empty column (no role row).
//   Chuck air release: torqued down, or head up with the chuck empty (ready for a cap).
//   Cap feeder enable: head up and chuck empty.
//   Head lower permit: cap held, bottle in place, torque not yet reached.
// All three need air.
const chuck: SampleTable = {
  at: 'B2',
  roleRow: false,
  separatorColumn: true,
  ones: 'numbers',
  inputs: ['Cap in chuck', 'Bottle in position', 'Head down', 'Torque reached', 'Air pressure OK'],
  outputs: ['Chuck air release', 'Cap feeder enable', 'Head lower permit'],
  rows: [
    '0 0 0 0 0 | 0 0 0',
    '0 0 0 0 1 | 1 1 0',
    '0 0 0 1 0 | 0 0 0',
    '0 0 0 1 1 | 1 1 0',
    '0 0 1 0 0 | 0 0 0',
    '0 0 1 0 1 | 0 0 0',
    '0 0 1 1 0 | 0 0 0',
    '0 0 1 1 1 | 1 0 0',
    '0 1 0 0 0 | 0 0 0',
    '0 1 0 0 1 | 1 1 0',
    '0 1 0 1 0 | 0 0 0',
    '0 1 0 1 1 | 1 1 0',
    '0 1 1 0 0 | 0 0 0',
    '0 1 1 0 1 | 0 0 0',
    '0 1 1 1 0 | 0 0 0',
    '0 1 1 1 1 | 1 0 0',
    '1 0 0 0 0 | 0 0 0',
    '1 0 0 0 1 | 0 0 0',
    '1 0 0 1 0 | 0 0 0',
    '1 0 0 1 1 | 0 0 0',
    '1 0 1 0 0 | 0 0 0',
    '1 0 1 0 1 | 0 0 0',
    '1 0 1 1 0 | 0 0 0',
    '1 0 1 1 1 | 1 0 0',
    '1 1 0 0 0 | 0 0 0',
    '1 1 0 0 1 | 0 0 1',
    '1 1 0 1 0 | 0 0 0',
    '1 1 0 1 1 | 0 0 0',
    '1 1 1 0 0 | 0 0 0',
    '1 1 1 0 1 | 0 0 1',
    '1 1 1 1 0 | 0 0 0',
    '1 1 1 1 1 | 1 0 0',
  ],
};

// Dual-channel discrepancy alarm: each guard and the light curtain report on two channels
// that should agree; any pair that disagrees raises the alarm. The alarm is an OR of XORs.
// The discrepancy time (how long a pair may disagree) is timing, outside any truth table.
const discrepancy: SampleTable = {
  at: 'A1',
  roleRow: true,
  separatorColumn: false,
  ones: 'numbers',
  inputs: [
    'Guard A channel 1',
    'Guard A channel 2',
    'Guard B channel 1',
    'Guard B channel 2',
    'Light curtain OSSD 1',
    'Light curtain OSSD 2',
  ],
  outputs: ['Channel discrepancy alarm'],
  rows: [
    '1 0 - - - - | 1',
    '0 1 - - - - | 1',
    '- - 1 0 - - | 1',
    '- - 0 1 - - | 1',
    '- - - - 1 0 | 1',
    '- - - - 0 1 | 1',
    '0 0 0 0 0 0 | 0',
    '0 0 0 0 1 1 | 0',
    '0 0 1 1 0 0 | 0',
    '0 0 1 1 1 1 | 0',
    '1 1 0 0 0 0 | 0',
    '1 1 0 0 1 1 | 0',
    '1 1 1 1 0 0 | 0',
    '1 1 1 1 1 1 | 0',
  ],
};

export const capperCell: SampleWorkbook = {
  file: 'capper-cell.xlsx',
  sheets: [
    { name: 'Spindle', title: 'Capper cell C-2: spindle and air supply (invented demo data)', tables: [spindle, airVote] },
    { name: 'Chuck and feeder', tables: [chuck] },
    { name: 'Channels', tables: [discrepancy] },
  ],
};

// The broken workbook: the same tables with mistakes put in on purpose, for the error demo.
//   Spindle: the light-curtain row is missing (a gap: guards A and B closed, curtain broken,
//   automatic, no jog) and a setup row contradicts "setup, jog released" (a conflict).
//   Air supply vote: a blank input, a 2, an #N/A output and an 'X'.
const spindleBroken: SampleTable = {
  ...spindle,
  rows: [
    ...spindle.rows.slice(0, 5),
    ...spindle.rows.slice(6),
    '1 1 1 1 1 1 - | 1', // setup with all guards closed: contradicts the row above
  ],
};

const airVoteBroken: SampleTable = {
  ...airVote,
  at: 'A1',
  bad: [
    { row: 1, column: 1, cell: { blank: true } },
    { row: 3, column: 0, cell: { number: 2 } },
    { row: 5, column: 3, cell: { error: '#N/A' } },
    { row: 6, column: 2, cell: { text: 'X' } },
  ],
};

export const capperCellBroken: SampleWorkbook = {
  file: 'capper-cell-broken.xlsx',
  sheets: [
    { name: 'Spindle', tables: [spindleBroken] },
    { name: 'Air supply vote', tables: [airVoteBroken] },
  ],
};

/** The spindle table again as a semicolon-separated CSV file (UTF-8 with a byte-order mark). */
export const spindleCsv = { file: 'spindle-permit.csv', table: { ...spindle, at: 'A1' } } as const;
