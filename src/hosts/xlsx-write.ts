// Cells and sheet blocks -> SheetJS sheets, for the file host and the sample generator.
// Runs in the main thread: it only builds objects from our own data, it never parses a file.
// Types only from SheetJS (addresses are ours): loading the library costs about a second, so
// it is imported only where a workbook is written (parsed-workbook.ts) or parsed (the worker).
import type { BlockCell, SheetBlock } from '../report/sheet-block.js';
import { cellAddress, parseA1, rangeAddress } from '../spec/grid.js';
import type { CellValue } from '../spec/types.js';
import type { CellObject, WorkSheet } from 'xlsx';

/** Excel's error codes as stored in a file (SheetJS writes `{ t: 'e', v: code }`). */
export const ERROR_CODES: Readonly<Record<string, number>> = {
  '#NULL!': 0x00,
  '#DIV/0!': 0x07,
  '#VALUE!': 0x0f,
  '#REF!': 0x17,
  '#NAME?': 0x1d,
  '#NUM!': 0x24,
  '#N/A': 0x2a,
};

/** The SheetJS cell for one value; undefined for an empty cell. */
export function cellObject(value: CellValue): CellObject | undefined {
  if (value === null) return undefined;
  if (typeof value === 'number') return { t: 'n', v: value };
  if (typeof value === 'boolean') return { t: 'b', v: value };
  if (typeof value === 'string') return { t: 's', v: value };
  if ('error' in value) return { t: 'e', v: ERROR_CODES[value.error] ?? ERROR_CODES['#N/A']!, w: value.error };
  return { t: 'n', v: value.date, z: 'yyyy-mm-dd' };
}

/** A sheet holding the rows of cells with their top-left cell at `origin`. */
export function sheetFromCells(rows: readonly (readonly CellValue[])[], origin = 'A1'): WorkSheet {
  const at = parseA1(origin);
  if (!at) throw new Error(`bug: origin ${origin} is not an A1 address`);
  const start = { r: at.row, c: at.col };
  const sheet: WorkSheet = {};
  let lastRow = start.r;
  let lastCol = start.c;
  rows.forEach((row, r) =>
    row.forEach((value, c) => {
      const cell = cellObject(value);
      if (!cell) return;
      sheet[cellAddress(start.r + r, start.c + c)] = cell;
      lastRow = Math.max(lastRow, start.r + r);
      lastCol = Math.max(lastCol, start.c + c);
    }),
  );
  sheet['!ref'] = rangeAddress({ top: start.r, left: start.c, bottom: lastRow, right: lastCol });
  return sheet;
}

/**
 * Excel's functions added after the 2007 file format must carry the `_xlfn.` prefix inside a
 * file, or Excel shows #NAME? (DESIGN.md section 3). Of those, our formulas use XOR.
 */
export function fileFormula(typed: string): string {
  return typed.replace(/(?<![A-Za-z0-9_.])XOR\(/gi, '_xlfn.XOR(');
}

function blockCellObject(cell: BlockCell): CellObject | undefined {
  const plain = cellObject(cell.value);
  if (cell.formula === undefined) return plain;
  // A formula cell keeps its expected value as the cached value, shown until Excel recalculates.
  return { ...(plain ?? { t: 's', v: '' }), f: fileFormula(cell.formula) };
}

/** The sheet for a block, rows from A1, with its column widths. */
export function sheetFromBlock(block: SheetBlock): WorkSheet {
  const sheet: WorkSheet = {};
  let width = 1;
  block.rows.forEach((row, r) => {
    width = Math.max(width, row.length);
    row.forEach((cell, c) => {
      const object = cell ? blockCellObject(cell) : undefined;
      if (object) sheet[cellAddress(r, c)] = object;
    });
  });
  sheet['!ref'] = rangeAddress({ top: 0, left: 0, bottom: Math.max(0, block.rows.length - 1), right: width - 1 });
  if (block.columnWidths) sheet['!cols'] = block.columnWidths.map((wch) => ({ wch }));
  return sheet;
}

/** A sheet name not yet in `taken`: Excel's 31-character limit, a suffix when needed. */
export function freeSheetName(wanted: string, taken: readonly string[]): string {
  const clean = wanted.replace(/[\\/?*[\]:]/g, ' ').trim().slice(0, 31) || 'Results';
  const used = new Set(taken.map((n) => n.toLowerCase()));
  if (!used.has(clean.toLowerCase())) return clean;
  for (let i = 2; ; i++) {
    const suffix = ` (${i})`;
    const name = clean.slice(0, 31 - suffix.length) + suffix;
    if (!used.has(name.toLowerCase())) return name;
  }
}
