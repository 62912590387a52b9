// The sheets a run writes, the same set in every host: per table its results sheet (a
// not-analysed sheet for a table with errors), and the commissioning test record of each
// cleared table (a table of more than 24 inputs too: its sheets have no live check).
import type { WorkbookHost, WriteReport } from '../hosts/index.js';
import { notAnalysedSheet, resultsSheet, testRecordSheet, type SheetBlock } from '../report/index.js';
import { type TableResult, type Workbook } from './examine.js';
import { cleared, verdictWords } from './verdict.js';

function tableSheets(t: TableResult, source: string): SheetBlock[] {
  if (!t.analysis) return [notAnalysedSheet(t.table, verdictWords(t.verdict), { source })];
  const results = resultsSheet(t.analysis, { source });
  return cleared(t.verdict) ? [results, testRecordSheet(t.analysis, { source })] : [results];
}

export function sheetsToWrite(wb: Workbook): SheetBlock[] {
  return wb.resultsWrite.allowed ? wb.tables.flatMap((t) => tableSheets(t, wb.source)) : [];
}

/** Each block to a new sheet of the host, in order; what was written where. */
export async function writeSheets(host: Pick<WorkbookHost, 'writeSheet'>, blocks: readonly SheetBlock[]): Promise<WriteReport[]> {
  const reports: WriteReport[] = [];
  for (const block of blocks) reports.push(await host.writeSheet(block));
  return reports;
}
