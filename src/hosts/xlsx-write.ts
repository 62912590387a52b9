// Cells and sheet blocks -> SheetJS sheets, for the file host and the sample generator.
// Runs in the main thread: it only builds objects from our own data, it never parses a file.
import XLSX from 'xlsx';
import type { BlockCell, SheetBlock } from '../report/sheet-block.js';
import type { CellValue } from '../spec/types.js';

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
export function cellObject(value: CellValue): XLSX.CellObject | undefined {
  if (value === null) return undefined;
  if (typeof value === 'number') return { t: 'n', v: value };
  if (typeof value === 'boolean') return { t: 'b', v: value };
  if (typeof value === 'string') return { t: 's', v: value };
  if ('error' in value) return { t: 'e', v: ERROR_CODES[value.error] ?? ERROR_CODES['#N/A']!, w: value.error };
  return { t: 'n', v: value.date, z: 'yyyy-mm-dd' };
}

/** A sheet holding the rows of cells with their top-left cell at `origin`. */
export function sheetFromCells(rows: readonly (readonly CellValue[])[], origin = 'A1'): XLSX.WorkSheet {
  const start = XLSX.utils.decode_cell(origin);
  const sheet: XLSX.WorkSheet = {};
  let lastRow = start.r;
  let lastCol = start.c;
  rows.forEach((row, r) =>
    row.forEach((value, c) => {
      const cell = cellObject(value);
      if (!cell) return;
      sheet[XLSX.utils.encode_cell({ r: start.r + r, c: start.c + c })] = cell;
      lastRow = Math.max(lastRow, start.r + r);
      lastCol = Math.max(lastCol, start.c + c);
    }),
  );
  sheet['!ref'] = XLSX.utils.encode_range(start, { r: lastRow, c: lastCol });
  return sheet;
}

/**
 * Excel's functions added after the 2007 file format must carry the `_xlfn.` prefix inside a
 * file, or Excel shows #NAME? (DESIGN.md section 3). Of those, our formulas use XOR.
 */
export function fileFormula(typed: string): string {
  return typed.replace(/(?<![A-Za-z0-9_.])XOR\(/gi, '_xlfn.XOR(');
}

function blockCellObject(cell: BlockCell): XLSX.CellObject | undefined {
  const plain = cellObject(cell.value);
  if (cell.formula === undefined) return plain;
  // A formula cell keeps its expected value as the cached value, shown until Excel recalculates.
  return { ...(plain ?? { t: 's', v: '' }), f: fileFormula(cell.formula) };
}

/** The sheet for a block, rows from A1, with its column widths. */
export function sheetFromBlock(block: SheetBlock): XLSX.WorkSheet {
  const sheet: XLSX.WorkSheet = {};
  let width = 1;
  block.rows.forEach((row, r) => {
    width = Math.max(width, row.length);
    row.forEach((cell, c) => {
      const object = cell ? blockCellObject(cell) : undefined;
      if (object) sheet[XLSX.utils.encode_cell({ r, c })] = object;
    });
  });
  sheet['!ref'] = XLSX.utils.encode_range({ r: 0, c: 0 }, { r: Math.max(0, block.rows.length - 1), c: width - 1 });
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
