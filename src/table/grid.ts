// A1 addresses and rectangles of cells: what every Problem and table range is written in.
import type { CellValue, Grid } from './types.js';

/** Excel's sheet size: columns A..XFD, rows 1..1,048,576. */
export const MAX_COLUMNS = 16384;
export const MAX_ROWS = 1048576;

/** A cell position on a sheet, both 0-based (A1 is row 0, column 0). */
export interface CellRef {
  readonly row: number;
  readonly col: number;
}

/** A rectangle of cells on a sheet, 0-based and inclusive on all sides. */
export interface RangeRef {
  readonly top: number;
  readonly left: number;
  readonly bottom: number;
  readonly right: number;
}

/** "A" for 0, "Z" for 25, "AA" for 26 ... "XFD" for 16383. */
export function columnLetters(col: number): string {
  if (!Number.isInteger(col) || col < 0 || col >= MAX_COLUMNS) throw new Error(`bug: column index ${col}`);
  let s = '';
  for (let c = col + 1; c > 0; c = Math.floor((c - 1) / 26)) s = String.fromCharCode(65 + ((c - 1) % 26)) + s;
  return s;
}

/** 0-based index of column letters (any case), or undefined when they are not a column of a sheet. */
export function columnIndex(letters: string): number | undefined {
  if (!/^[A-Za-z]{1,3}$/.test(letters)) return undefined;
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n <= MAX_COLUMNS ? n - 1 : undefined;
}

/** "B3" for row 2, column 1 (both 0-based). */
export function cellAddress(row: number, col: number): string {
  if (!Number.isInteger(row) || row < 0 || row >= MAX_ROWS) throw new Error(`bug: row index ${row}`);
  return `${columnLetters(col)}${row + 1}`;
}

/** The position of an A1 address such as "B3" or "$B$3"; undefined when it is not one. */
export function parseA1(text: string): CellRef | undefined {
  const m = /^\$?([A-Za-z]{1,3})\$?([0-9]{1,7})$/.exec(text.trim());
  if (!m) return undefined;
  const col = columnIndex(m[1]!);
  const row = Number(m[2]) - 1;
  if (col === undefined || row < 0 || row >= MAX_ROWS) return undefined;
  return { row, col };
}

/** The rectangle of "A1:H20" (corners in any order) or of a single cell "B3"; undefined when neither. */
export function parseRange(text: string): RangeRef | undefined {
  const parts = text.split(':');
  if (parts.length > 2) return undefined;
  const a = parseA1(parts[0]!);
  const b = parts.length === 2 ? parseA1(parts[1]!) : a;
  if (!a || !b) return undefined;
  return {
    top: Math.min(a.row, b.row),
    left: Math.min(a.col, b.col),
    bottom: Math.max(a.row, b.row),
    right: Math.max(a.col, b.col),
  };
}

/** "B3:H20", or "B3" for a single cell. */
export function rangeAddress(r: RangeRef): string {
  const a = cellAddress(r.top, r.left);
  return r.top === r.bottom && r.left === r.right ? a : `${a}:${cellAddress(r.bottom, r.right)}`;
}

/** The overlap of two rectangles, or undefined when they do not meet. */
export function intersectRanges(a: RangeRef, b: RangeRef): RangeRef | undefined {
  const r = {
    top: Math.max(a.top, b.top),
    left: Math.max(a.left, b.left),
    bottom: Math.min(a.bottom, b.bottom),
    right: Math.min(a.right, b.right),
  };
  return r.top <= r.bottom && r.left <= r.right ? r : undefined;
}

/** A sheet name as it appears before '!' in a reference: quoted when it is not a plain word. */
export function sheetPrefix(sheet: string): string {
  return /^[A-Za-z_][A-Za-z0-9_.]*$/.test(sheet) ? sheet : `'${sheet.replace(/'/g, "''")}'`;
}

/** "Capper!D7", or "'Capper cell'!D7" when the sheet name needs quotes. */
export function qualifiedAddress(sheet: string, cell: string): string {
  return `${sheetPrefix(sheet)}!${cell}`;
}

/** Number of columns of the grid: its longest row (rows may be ragged). */
export function gridWidth(grid: Grid): number {
  let w = 0;
  for (const row of grid.cells) w = Math.max(w, row.length);
  return w;
}

/** A cell of the grid by its position inside the grid (0-based); null outside the rows given. */
export function gridCell(grid: Grid, row: number, col: number): CellValue {
  return grid.cells[row]?.[col] ?? null;
}

/**
 * Where the grid lies on its sheet. The origin is the host's business; an unreadable one
 * is reported by `gridExtent` rather than guessed.
 */
export function gridOrigin(grid: Grid): CellRef | undefined {
  return parseA1(grid.origin);
}

/** The sheet rectangle the grid covers; undefined when it has no cells or its origin is unreadable. */
export function gridExtent(grid: Grid): RangeRef | undefined {
  const origin = gridOrigin(grid);
  const width = gridWidth(grid);
  if (!origin || grid.cells.length === 0 || width === 0) return undefined;
  return {
    top: origin.row,
    left: origin.col,
    bottom: Math.min(MAX_ROWS - 1, origin.row + grid.cells.length - 1),
    right: Math.min(MAX_COLUMNS - 1, origin.col + width - 1),
  };
}

/** The part of the grid inside `range` (sheet addresses), with its own origin; undefined when they do not meet. */
export function restrictGrid(grid: Grid, range: RangeRef): Grid | undefined {
  const extent = gridExtent(grid);
  const inside = extent && intersectRanges(extent, range);
  if (!extent || !inside) return undefined;
  const cells: CellValue[][] = [];
  for (let r = inside.top; r <= inside.bottom; r++) {
    const row: CellValue[] = [];
    for (let c = inside.left; c <= inside.right; c++) row.push(gridCell(grid, r - extent.top, c - extent.left));
    cells.push(row);
  }
  return { sheet: grid.sheet, origin: cellAddress(inside.top, inside.left), cells };
}
