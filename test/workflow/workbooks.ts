// The workbooks the workflow's tests and the hosts' tests share, built here from rows: a good
// one, one with an error cell, one with words in an output column (every row an error), and
// one with a Notes column beside the outputs (an annotation). Invented data (demo), with a WorkbookHost over plain rows and an .xlsx writer.
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import XLSX from 'xlsx';
import type { WorkbookHost, WriteReport } from '../../src/hosts/workbook-host.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';
import { cellAddress, parseRange, restrictGrid } from '../../src/table/grid.js';
import type { CellValue, Grid } from '../../src/table/types.js';
import { runCli, scratch } from '../cli/run-cli.js';

export type Rows = readonly (readonly (string | number | null)[])[];

export interface TestWorkbook {
  readonly name: string;
  /** File name as a host names its source. */
  readonly file: string;
  readonly sheets: Readonly<Record<string, Rows>>;
}

const ROLES = ['input', 'input', 'input', 'output'];
const HEADERS = ['Guard closed', 'E-stop healthy', 'Jog', 'Motor permit'];

/** Motor permit = guard closed AND e-stop healthy; every combination covered once. */
export const GOOD: TestWorkbook = {
  name: 'good',
  file: 'good.xlsx',
  sheets: {
    Cell: [ROLES, HEADERS, [1, 1, '-', 1], [0, '-', '-', 0], [1, 0, '-', 0]],
    Vote: [
      ['input', 'input', 'input', 'output'],
      ['Pressure 1', 'Pressure 2', 'Pressure 3', 'Air OK'],
      [1, 1, '-', 1],
      [1, 0, 1, 1],
      [0, 1, 1, 1],
      [1, 0, 0, 0],
      [0, 1, 0, 0],
      [0, 0, '-', 0],
    ],
  },
};

/** The good workbook with a 2 typed into Cell!B4. */
export const ERROR_CELL: TestWorkbook = {
  name: 'error cell',
  file: 'error-cell.xlsx',
  sheets: { ...GOOD.sheets, Cell: [ROLES, HEADERS, [1, 1, '-', 1], [0, 2, '-', 0], [1, 0, '-', 0]] },
};

/** A second output whose cells are words, not truth values: every row has an error there. */
export const WORDS_OUTPUT: TestWorkbook = {
  name: 'words in an output column',
  file: 'words.xlsx',
  sheets: {
    Cell: [
      [...ROLES, 'output'],
      [...HEADERS, 'Lamp'],
      [1, 1, '-', 1, 'lit'],
      [0, '-', '-', 0, 'dark'],
      [1, 0, '-', 0, 'dark'],
    ],
  },
};

/** A Notes column beside the outputs, outside the role cells: an annotation, not an output. */
export const NOTES: TestWorkbook = {
  name: 'notes column',
  file: 'notes.xlsx',
  sheets: {
    Cell: [
      [...ROLES, null],
      [...HEADERS, 'Notes'],
      [1, 1, '-', 1, 'normal run'],
      [0, '-', '-', 0, 'guard open'],
      [1, 0, '-', 0, 'e-stop pressed'],
    ],
  },
};

export const WORKBOOKS = [GOOD, ERROR_CELL, WORDS_OUTPUT, NOTES] as const;

/** The inputs of the wide trip: Cause 1 ... Cause 40. */
export const CAUSES = Array.from({ length: 40 }, (_, i) => `Cause ${i + 1}`);

/** An OR trip of 40 causes (the symbolic engine's): each cause alone trips, all healthy runs; `extra` rows after those. */
export function tripRows(extra: Rows = []): Rows {
  return [
    [...CAUSES.map(() => 'input'), 'output'],
    [...CAUSES, 'Trip'],
    ...CAUSES.map((_, i) => [...CAUSES.map((_, j) => (j === i ? 1 : '-')), 1]),
    [...CAUSES.map(() => 0), 0],
    ...extra,
  ];
}

export const TRIP_40: TestWorkbook = { name: 'forty-cause trip', file: 'trip40.xlsx', sheets: { Trip: tripRows() } };

export function gridOf(sheet: string, rows: Rows): Grid {
  return { sheet, origin: 'A1', cells: rows.map((r) => r.map((v): CellValue => (v === '' ? null : v))) };
}

/** A WorkbookHost over plain rows that keeps the blocks written, as a host would add sheets. */
export class RowsHost implements WorkbookHost {
  readonly written: SheetBlock[] = [];
  constructor(private readonly book: TestWorkbook) {}
  async listSheets(): Promise<string[]> {
    return Object.keys(this.book.sheets);
  }
  async readGrid(sheet: string, range?: string): Promise<Grid> {
    const rows = this.book.sheets[sheet];
    if (!rows) throw new Error(`no sheet named "${sheet}"`);
    const grid = gridOf(sheet, rows);
    const rect = range === undefined ? undefined : parseRange(range);
    if (!rect) return grid;
    return restrictGrid(grid, rect) ?? { sheet, origin: cellAddress(rect.top, rect.left), cells: [] };
  }
  async writeSheet(block: SheetBlock): Promise<WriteReport> {
    this.written.push(block);
    return { sheet: block.name, range: 'A1', cells: 0 };
  }
}

/** The workbook as .xlsx bytes, for the file hosts. */
export function xlsxBytes(book: TestWorkbook): Uint8Array {
  const wb = XLSX.utils.book_new();
  for (const [name, rows] of Object.entries(book.sheets)) XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(rows.map((r) => [...r])), name);
  return new Uint8Array(XLSX.write(wb, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer);
}

/** A written sheet as text rows, the same whichever host wrote it: formulas as "=..." without _xlfn. */
export type SheetText = { readonly name: string; readonly rows: string[][] };

export function blockText(block: SheetBlock): SheetText {
  return {
    name: block.name,
    rows: trim(block.rows.map((r) => r.map((c) => (c === null ? '' : c.formula !== undefined ? `=${c.formula}` : c.value === null ? '' : String(c.value))))),
  };
}

/** Empty trailing cells and rows cut, so hosts that store an empty cell differently compare equal. */
export function trim(rows: string[][]): string[][] {
  const out = rows.map((r) => {
    const row = [...r];
    while (row.length > 0 && row[row.length - 1] === '') row.pop();
    return row;
  });
  while (out.length > 0 && out[out.length - 1]!.length === 0) out.pop();
  return out;
}

/** The sheets of an .xlsx file after the first `skip`, as text rows. */
export function xlsxSheets(bytes: Uint8Array, skip: number): SheetText[] {
  const book = XLSX.read(bytes, { type: 'array', cellFormula: true });
  return book.SheetNames.slice(skip).map((name) => {
    const sheet = book.Sheets[name]!;
    const ref = sheet['!ref'];
    if (!ref) return { name, rows: [] };
    const range = XLSX.utils.decode_range(ref);
    const rows: string[][] = [];
    for (let r = 0; r <= range.e.r; r++) {
      const row: string[] = [];
      for (let c = 0; c <= range.e.c; c++) {
        const cell = sheet[XLSX.utils.encode_cell({ r, c })] as XLSX.CellObject | undefined;
        row.push(cell === undefined ? '' : cell.f !== undefined ? `=${cell.f.replace(/_xlfn\./g, '')}` : cell.v === undefined ? '' : String(cell.v));
      }
      rows.push(row);
    }
    return { name, rows: trim(rows) };
  });
}

/** What a host shows and does with one sheet of a workbook. */
export interface Outcome {
  /** Per table: its verdict words, then each output's. */
  readonly verdicts: string[][];
  /** The sheets it writes (the results workbook's sheets after the user's). */
  readonly sheets: SheetText[];
  readonly handedOver: boolean;
}

interface JsonDoc {
  tables: { verdict: { text: string }; outputs: { verdict: { text: string } }[] }[];
}

/** The command line in-process: `analyze --json -o` for verdicts and sheets, `export --st` for the hand-over. */
export async function cliOutcome(book: TestWorkbook, sheet: string): Promise<Outcome> {
  const dir = scratch();
  const file = join(dir, book.file);
  writeFileSync(file, xlsxBytes(book));
  const out = join(dir, 'results.xlsx');
  const analyzed = await runCli('analyze', file, '--sheet', sheet, '--json', '-o', out);
  const doc = JSON.parse(analyzed.out) as JsonDoc;
  const st = join(dir, 'out.st');
  const exported = await runCli('export', file, '--sheet', sheet, '--st', st);
  if ((exported.code === 0) !== existsSync(st)) throw new Error(`export said ${exported.code} but the file ${existsSync(st) ? 'is' : 'is not'} there`);
  return {
    verdicts: doc.tables.map((t) => [t.verdict.text, ...t.outputs.map((o) => o.verdict.text)]),
    sheets: xlsxSheets(new Uint8Array(readFileSync(out)), Object.keys(book.sheets).length),
    handedOver: exported.code === 0,
  };
}
