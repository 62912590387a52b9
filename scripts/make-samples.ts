// `npm run samples`: writes the demo workbooks and the CSV of sample-workbooks/ from the
// readable source in sample-workbooks/source/. test/samples.test.ts checks the committed
// files against the same source, cell by cell.
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import XLSX from 'xlsx';
import { sheetFromCells } from '../src/hosts/xlsx-write.js';
import type { CellValue, Grid } from '../src/table/types.js';
import { burnerWorkbook, conveyorWorkbook, pressWorkbook, type LayoutSheet, type LayoutWorkbook } from '../sample-workbooks/source/layouts.js';
import {
  capperCell,
  capperCellBroken,
  spindleCsv,
  type BadCell,
  type SampleSheet,
  type SampleTable,
  type SampleWorkbook,
} from '../sample-workbooks/source/capper-cell.js';

export const SAMPLE_DIR = join(dirname(fileURLToPath(import.meta.url)), '..', 'sample-workbooks');
export const SAMPLE_WORKBOOKS: readonly SampleWorkbook[] = [capperCell, capperCellBroken];
export const LAYOUT_WORKBOOKS: readonly LayoutWorkbook[] = [pressWorkbook, conveyorWorkbook, burnerWorkbook];

/** A sheet of the layout samples as rows of cells: '|' separates cells, 1 and 0 are numbers, the rest text. */
export function layoutCells(sheet: LayoutSheet): CellValue[][] {
  const rows = sheet.rows.map((line) =>
    line === '' ? [] : line.split('|').map((t): CellValue => {
      const text = t.trim();
      return text === '' ? null : text === '1' || text === '0' ? Number(text) : text;
    }),
  );
  const width = Math.max(...rows.map((r) => r.length));
  return rows.map((r) => [...r, ...Array.from({ length: width - r.length }, () => null)]);
}

/** The sheet as the reader gets it from a host: cells from A1 and the merged areas. */
export function layoutGrid(sheet: LayoutSheet): Grid {
  return { sheet: sheet.name, origin: 'A1', cells: layoutCells(sheet), merges: sheet.merges };
}

export function layoutWorkbook(sample: LayoutWorkbook): XLSX.WorkBook {
  return workbookOf(sample.sheets.map((sheet) => ({ name: sheet.name, cells: layoutCells(sheet), merges: sheet.merges })));
}

/** A workbook of sheets given as cells from A1 (and merged areas), columns 20 characters wide. */
function workbookOf(sheets: readonly { name: string; cells: CellValue[][]; merges?: readonly string[] }[]): XLSX.WorkBook {
  const book = XLSX.utils.book_new();
  for (const sheet of sheets) {
    const ws = sheetFromCells(sheet.cells);
    ws['!cols'] = sheet.cells[0]!.map(() => ({ wch: 20 }));
    if (sheet.merges) ws['!merges'] = sheet.merges.map((m) => XLSX.utils.decode_range(m));
    XLSX.utils.book_append_sheet(book, ws, sheet.name);
  }
  return book;
}

/** One row's values: inputs then outputs, as the characters written in the source. */
function splitRow(row: string, table: SampleTable): { inputs: string[]; outputs: string[] } {
  const [left, right] = row.split('|');
  const inputs = (left ?? '').trim().split(/\s+/);
  const outputs = (right ?? '').trim().split(/\s+/);
  if (inputs.length !== table.inputs.length || outputs.length !== table.outputs.length)
    throw new Error(`bug in the sample source: row "${row}" does not fit its headers`);
  return { inputs, outputs };
}

function valueOf(ch: string, table: SampleTable): CellValue {
  if (ch === '-') return '-';
  if (ch !== '1' && ch !== '0') throw new Error(`bug in the sample source: cell "${ch}"`);
  return table.ones === 'booleans' ? ch === '1' : Number(ch);
}

function badValue(bad: BadCell): CellValue {
  if ('blank' in bad) return null;
  if ('number' in bad) return bad.number;
  if ('error' in bad) return { error: bad.error };
  return bad.text;
}

/** The table as rows of cells, its role row (if any) first. */
export function tableCells(table: SampleTable): CellValue[][] {
  const lay = (inputs: CellValue[], outputs: CellValue[]): CellValue[] =>
    table.separatorColumn ? [...inputs, null, ...outputs] : [...inputs, ...outputs];
  const out: CellValue[][] = [];
  if (table.roleRow) out.push(lay(table.inputs.map(() => 'input'), table.outputs.map(() => 'output')));
  out.push(lay([...table.inputs], [...table.outputs]));
  table.rows.forEach((row, r) => {
    const { inputs, outputs } = splitRow(row, table);
    const values = [...inputs, ...outputs].map((ch) => valueOf(ch, table));
    for (const bad of table.bad ?? []) if (bad.row === r) values[bad.column] = badValue(bad.cell);
    out.push(lay(values.slice(0, table.inputs.length), values.slice(table.inputs.length)));
  });
  return out;
}

/** The whole sheet as one grid from A1 (title and tables in place). */
export function sheetCells(sheet: SampleSheet): CellValue[][] {
  const grid: CellValue[][] = [];
  const put = (r: number, c: number, value: CellValue): void => {
    while (grid.length <= r) grid.push([]);
    const row = grid[r]!;
    while (row.length <= c) row.push(null);
    row[c] = value;
  };
  if (sheet.title) put(0, 0, sheet.title);
  for (const table of sheet.tables) {
    const at = XLSX.utils.decode_cell(table.at);
    tableCells(table).forEach((row, r) => row.forEach((value, c) => put(at.r + r, at.c + c, value)));
  }
  const width = Math.max(...grid.map((row) => row.length));
  for (const row of grid) while (row.length < width) row.push(null);
  return grid;
}

export function sampleWorkbook(sample: SampleWorkbook): XLSX.WorkBook {
  return workbookOf(sample.sheets.map((sheet) => ({ name: sheet.name, cells: sheetCells(sheet) })));
}

/** The CSV sample: semicolons, CRLF line ends, UTF-8 with a byte-order mark (as Excel saves it). */
export function sampleCsv(): string {
  const text = (value: CellValue): string => (value === null ? '' : String(value));
  const lines = tableCells(spindleCsv.table).map((row) => row.map(text).join(';'));
  return '\uFEFF' + lines.join('\r\n') + '\r\n';
}

function main(): void {
  for (const sample of SAMPLE_WORKBOOKS) {
    const data = XLSX.write(sampleWorkbook(sample), { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
    writeFileSync(join(SAMPLE_DIR, sample.file), data);
    console.log(`wrote sample-workbooks/${sample.file}`);
  }
  for (const sample of LAYOUT_WORKBOOKS) {
    const data = XLSX.write(layoutWorkbook(sample), { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
    writeFileSync(join(SAMPLE_DIR, sample.file), data);
    console.log(`wrote sample-workbooks/${sample.file}`);
  }
  writeFileSync(join(SAMPLE_DIR, spindleCsv.file), sampleCsv(), 'utf8');
  console.log(`wrote sample-workbooks/${spindleCsv.file}`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) main();
