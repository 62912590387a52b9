// Helpers of the package tests: small workbooks made here with SheetJS, taken apart into their
// parts, changed as a crafted or damaged file would be, and packed again (zip-package.mjs).
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { writeZip } from '../../src/hosts/zip-package.mjs';
import type { CellValue } from '../../src/table/types.js';
import { scratch } from '../cli/run-cli.js';
import { deflatedEntry } from './workbook-parts.js';

export { deflatedEntry, partsOf } from './workbook-parts.js';

export type Parts = Map<string, Uint8Array>;

/** A two-input table with a role row: Y = A AND B. */
export const AND_TABLE: CellValue[][] = [
  ['input', 'input', 'output'],
  ['A', 'B', 'Y'],
  [0, 0, 0],
  [0, 1, 0],
  [1, 0, 0],
  [1, 1, 1],
];

/** .xlsx bytes of a workbook SheetJS writes (shared strings on), after `shape` had its say. */
export function workbook(sheets: Record<string, CellValue[][]>, shape: (book: XLSX.WorkBook) => void = () => undefined): Uint8Array {
  const book = XLSX.utils.book_new();
  for (const [name, rows] of Object.entries(sheets)) XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(rows), name);
  shape(book);
  return new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx', bookSST: true, compression: true }) as ArrayBuffer);
}

/** The part's text changed by `edit` (which must change it: a patch that misses is a broken test). */
export function patch(parts: Parts, name: string, edit: (xml: string) => string): Parts {
  const before = new TextDecoder().decode(parts.get(name));
  const after = edit(before);
  if (after === before) throw new Error(`the patch of ${name} changed nothing`);
  return new Map(parts).set(name, new TextEncoder().encode(after));
}

export function put(parts: Parts, name: string, xml: string): Parts {
  return new Map(parts).set(name, new TextEncoder().encode(xml));
}

/** The parts packed again, deflated as Excel does; `recorded` may give an entry headers that lie about its bytes. */
export function pack(parts: Parts, recorded: Readonly<Record<string, Uint8Array>> = {}): Uint8Array {
  return writeZip([...parts].map(([name, data]) => deflatedEntry(name, data, recorded[name])));
}

/** Bytes written to a new file in a scratch folder; its path. */
export function saved(name: string, bytes: Uint8Array | string): string {
  const path = join(scratch(), name);
  writeFileSync(path, bytes);
  return path;
}
