// The sample machine's spec tables, read from the sample workbook source the way a sheet is
// read, and the hand-built implementations in fixtures/.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { capperCell } from '../../sample-workbooks/source/capper-cell.js';
import { sheetCells } from '../../scripts/make-samples.js';
import { readImplementation } from '../../src/impl/read.js';
import type { ImplProgram } from '../../src/impl/types.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { SpecTable } from '../../src/table/types.js';

export function capperTables(): SpecTable[] {
  return capperCell.sheets.flatMap((sheet) => readSpecTables({ sheet: sheet.name, origin: 'A1', cells: sheetCells(sheet) }).tables);
}

export function fixtureText(name: string): string {
  return readFileSync(join(import.meta.dirname, 'fixtures', name), 'utf8');
}

export function implementation(name: string): ImplProgram {
  const r = readImplementation(name, fixtureText(name));
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}
