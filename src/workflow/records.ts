// Filled-in commissioning test records checked against the tables now in the workbook: each
// record names its table and the settings it was read with; the table is read again the same
// way and analysed, and the record is current only while its revision stamp still matches.
// Split like reading and examining: the cells are read where the workbook lives, the judgement
// (which analyses) runs wherever the host runs its engine. Nothing here writes.
import type { WorkbookHost } from '../hosts/index.js';
import { judgeRecord, readTestRecord, type RecordVerdict } from '../report/index.js';
import { analyseTable } from '../analysis/index.js';
import { readSpecTables, type Grid } from '../table/index.js';

export type { RecordVerdict } from '../report/index.js';

/** The record sheets of a workbook, and the sheets their tables are on. */
export interface RecordGrids {
  readonly records: readonly Grid[];
  readonly tables: readonly Grid[];
}

/** Every sheet that holds a record of ours, and the sheets they name. A sheet the host cannot read counts as absent. */
export async function readRecordGrids(host: WorkbookHost): Promise<RecordGrids> {
  const read = new Map<string, Grid>();
  for (const sheet of await host.listSheets()) {
    try {
      read.set(sheet, await host.readGrid(sheet));
    } catch {
      // A host says a sheet cannot be read by throwing; its table is then "no longer in the workbook".
    }
  }
  const records = [...read.values()].filter((g) => readTestRecord(g) !== undefined);
  const named = new Set(records.map((g) => readTestRecord(g)!.table.sheet));
  return { records, tables: [...read.values()].filter((g) => named.has(g.sheet)) };
}

/** Each record judged against its table as the workbook has it now. */
export function judgeRecords(read: RecordGrids): RecordVerdict[] {
  return read.records.flatMap((grid) => {
    const record = readTestRecord(grid);
    if (!record) return [];
    const sheet = read.tables.find((g) => g.sheet === record.table.sheet);
    const table = sheet && readSpecTables(sheet, record.settings).tables.find((t) => t.range === record.table.range);
    return [judgeRecord(record, table && { table, analysis: analyseTable(table) })];
  });
}

/** Both halves in one process (the command line). */
export async function checkRecords(host: WorkbookHost): Promise<RecordVerdict[]> {
  return judgeRecords(await readRecordGrids(host));
}

/** Every record checked passed on the current revision (exit 0 of `record`). */
export function recordsCleared(verdicts: readonly RecordVerdict[]): boolean {
  return verdicts.length > 0 && verdicts.every((v) => v.ok);
}
