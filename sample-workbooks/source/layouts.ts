// Spec tables typed the way controls engineers type them: merged role cells, a remarks
// column, titles over tables side by side, I/Q role rows, a tag row, group titles over the
// signal names, ON/OFF and Y/N cells, X for "any", a blank row inside the table. Three
// invented machines: a press, a conveyor and a burner's purge permits. All data here is
// invented for the demo and describes no real machine. `npm run samples` writes the
// workbooks from this file; test/samples.test.ts checks the committed files still match it.
//
// A sheet is written row by row, cells separated by '|' and trimmed; an empty cell is
// nothing between two bars; a cell reading exactly 1 or 0 is written as a number, every
// other cell as text. `merges` are the merged areas of the sheet (A1 ranges).

export interface LayoutSheet {
  readonly name: string;
  readonly rows: readonly string[];
  readonly merges: readonly string[];
  /** The range a user gives to read the table, when the layout needs one (see `what`). */
  readonly range?: string;
  /** What the sheet shows, for DEVELOPERS.md and the tests. */
  readonly what: string;
}

export interface LayoutWorkbook {
  readonly file: string;
  readonly sheets: readonly LayoutSheet[];
}

// Press P-1: the role cells are merged over exactly their columns, and a remarks column
// right of the outputs is outside both: it is read as notes beside the rows. ON/OFF cells.
// "Light curtain muting active" is too long for an identifier; cut at a word break it would
// be the identifier of "Light curtain muting", so a word is left out instead.
const press: LayoutSheet = {
  name: 'Press P-1',
  what: 'merged role cells, a remarks column outside them, ON/OFF cells, a long header',
  merges: ['A1:H1', 'A3:E3', 'F3:G3'],
  rows: [
    'Press P-1 stroke permit (invented demo data)',
    '',
    'INPUTS | | | | | OUTPUTS | |',
    'Two-hand control OK | Guard door closed | Light curtain clear | Light curtain muting | Light curtain muting active | Stroke permit | Ready lamp | Remarks for the fitter',
    '-   | OFF | -   | -   | -   | OFF | OFF | guard door open: nothing moves',
    'OFF | ON  | ON  | -   | -   | OFF | ON  | ready, waiting for both hands',
    'ON  | ON  | ON  | -   | -   | ON  | ON  | normal stroke',
    '-   | ON  | OFF | OFF | -   | OFF | OFF | light curtain broken, no muting',
    '-   | ON  | OFF | ON  | OFF | OFF | OFF | muting asked but not confirmed',
    'OFF | ON  | OFF | ON  | ON  | OFF | ON  | muted, waiting for both hands',
    'ON  | ON  | OFF | ON  | ON  | ON  | ON  | muted stroke below the curtain',
  ],
};

// Conveyor CV-3: two tables side by side one empty column apart, each with its own title;
// I/Q role rows (each column its own word); Y/N cells; a tag row under the headers gives each
// signal's program name (the word Tag in the label column left of the signals), so the
// identifiers are the tags and a program using them is verified without a mapping file.
const conveyor: LayoutSheet = {
  name: 'Conveyor CV-3',
  what: 'two titled tables side by side, I/Q role rows, Y/N cells, tag rows',
  merges: [],
  rows: [
    'Belt drive permit | | | | | | Diverter gate | | | |',
    '| I | I | I | Q | | | I | I | I | Q',
    '| E-stop healthy | Pull-cord OK | Downstream ready | Belt run | | | Gate home | Parcel at diverter | Reject requested | Divert solenoid',
    'Tag | ES_101 | PC_102 | RD_103 | M_BELT | | Tag | GS_301 | PE_302 | RQ_303 | Y_DIV',
    '| N | - | - | N | | | N | - | - | N',
    '| Y | N | - | N | | | Y | N | - | N',
    '| Y | Y | N | N | | | Y | Y | N | N',
    '| Y | Y | Y | Y | | | Y | Y | Y | Y',
  ],
};

// Burner B-1 purge: a role row and, under it, group titles merged over the signal names
// (a two-line header); X typed for "any" (read under the setting only); a blank row inside
// the table, so it is read as one table only when its range is given.
const burner: LayoutSheet = {
  name: 'Burner purge',
  what: 'group titles over the headers, X cells, a blank row inside the range given',
  merges: ['A3:E3', 'F3:G3', 'A4:C4', 'D4:E4', 'F4:G4'],
  range: 'A3:G18',
  rows: [
    'Burner B-1 purge and false-flame permits (invented demo data)',
    '',
    'INPUTS | | | | | OUTPUTS |',
    'Air | | | Fuel and flame | | Permits and alarms |',
    'Combustion fan running | Air flow proven | Damper at high fire | Fuel valves closed | Flame detected | Purge timer enable | False flame alarm',
    '0 | X | X | 1 | 1 | 0 | 1',
    '0 | X | X | 1 | 0 | 0 | 0',
    '0 | X | X | 0 | X | 0 | 0',
    '1 | 0 | X | 1 | 1 | 0 | 1',
    '1 | 0 | X | 1 | 0 | 0 | 0',
    '1 | 0 | X | 0 | X | 0 | 0',
    '1 | 1 | 0 | 1 | 1 | 0 | 1',
    '1 | 1 | 0 | 1 | 0 | 0 | 0',
    '1 | 1 | 0 | 0 | X | 0 | 0',
    '',
    '1 | 1 | 1 | 1 | 1 | 0 | 1',
    '1 | 1 | 1 | 1 | 0 | 1 | 0',
    '1 | 1 | 1 | 0 | X | 0 | 0',
  ],
};

export const pressWorkbook: LayoutWorkbook = { file: 'press-p1.xlsx', sheets: [press] };
export const conveyorWorkbook: LayoutWorkbook = { file: 'conveyor-cv3.xlsx', sheets: [conveyor] };
export const burnerWorkbook: LayoutWorkbook = { file: 'burner-purge.xlsx', sheets: [burner] };
