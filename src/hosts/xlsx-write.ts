// Cells -> SheetJS sheets, for the sample generator and benches; sheet names for every host.
// Runs in the main thread: it only builds objects from our own data, it never parses a file.
// Types only from SheetJS (addresses are ours): loading the library costs about a second, so
// the command line never loads it in its main thread (the parse worker does).
import { cellAddress, parseA1, rangeAddress, type CellValue } from '../table/index.js';
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
