// Revisions of the sample capper-cell workbook with the rows of one table replaced, written
// as an .xlsx file the way the sample generator writes the original.
import { writeFileSync } from 'node:fs';
import XLSX from 'xlsx';
import { capperCell, type SampleTable } from '../../sample-workbooks/source/capper-cell.js';
import { sampleWorkbook } from '../../scripts/make-samples.js';

/** Where a table sits in the sample: sheet index, table index. */
export const SPINDLE = [0, 0] as const;
export const CHUCK = [1, 0] as const;

export function sampleTable([sheet, table]: readonly [number, number]): SampleTable {
  return capperCell.sheets[sheet]!.tables[table]!;
}

/** Write the sample workbook with one table's rows edited, to `path`. */
export function writeRows(path: string, at: readonly [number, number], edit: (rows: readonly string[]) => readonly string[]): string {
  const [sheetAt, tableAt] = at;
  const sheets = capperCell.sheets.map((s, i) =>
    i !== sheetAt ? s : { ...s, tables: s.tables.map((t, j) => (j !== tableAt ? t : { ...t, rows: edit(t.rows) })) },
  );
  writeFileSync(path, XLSX.write(sampleWorkbook({ ...capperCell, sheets }), { type: 'buffer', bookType: 'xlsx' }) as Buffer);
  return path;
}

/** Write the sample workbook with one table's row `index` replaced, to `path`. */
export function writeRevision(path: string, at: readonly [number, number], index: number, row: string): string {
  return writeRows(path, at, (rows) => rows.map((r, k) => (k === index ? row : r)));
}
