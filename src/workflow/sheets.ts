// The sheets a run writes, the same set in every host: per table its results sheet (a
// not-analysed sheet for a table with errors) and its live check (up to 12 inputs), and the
// commissioning test record of each cleared table; none for a table of more than 24 inputs.
import type { WorkbookHost, WriteReport } from '../hosts/workbook-host.js';
import { notAnalysedSheet } from '../report/not-analysed-sheet.js';
import { resultsSheets } from '../report/results-sheet.js';
import { renameSheetRefs, type SheetBlock } from '../report/sheet-block.js';
import { freeSheetName } from '../hosts/xlsx-write.js';
import { testRecordSheet } from '../report/test-steps.js';
import { wideLimit, type TableResult, type Workbook } from './examine.js';
import { cleared, verdictWords } from './verdict.js';

function tableSheets(t: TableResult, source: string): SheetBlock[] {
  if (!t.analysis) return [notAnalysedSheet(t.table, verdictWords(t.verdict), { source })];
  // Over 24 inputs no sheet takes the forms: the table's problems and `wideLimit` say so.
  if (wideLimit(t.table)) return [];
  const results = resultsSheets(t.analysis, { source });
  return cleared(t.verdict) ? [...results, testRecordSheet(t.analysis, { source })] : results;
}

export function sheetsToWrite(wb: Workbook): SheetBlock[] {
  return wb.resultsWrite.allowed ? wb.tables.flatMap((t) => tableSheets(t, wb.source)) : [];
}

/**
 * Each block to a new sheet of the host, in order; what was written where. The names are
 * chosen first, free in the workbook and among the blocks, so that a formula naming another
 * block's sheet (`SheetBlock.refersTo`) names the sheet that block gets.
 */
export async function writeSheets(host: Pick<WorkbookHost, 'writeSheet' | 'listSheets' | 'queuedSheets'>, blocks: readonly SheetBlock[]): Promise<WriteReport[]> {
  const taken = [...(await host.listSheets()), ...(host.queuedSheets?.() ?? [])];
  const names = blocks.map((b) => {
    const name = freeSheetName(b.name, taken);
    taken.push(name);
    return name;
  });
  const reports: WriteReport[] = [];
  for (const [i, block] of blocks.entries()) {
    let named: SheetBlock = { ...block, name: names[i]! };
    for (const d of block.refersTo ?? []) named = renameSheetRefs(named, blocks[i + d]!.name, names[i + d]!);
    reports.push(await host.writeSheet(named));
  }
  // A sheet added by someone else meanwhile may have taken a chosen name: say which formulas now miss.
  return reports.map((r, i) => {
    const missed = (blocks[i]!.refersTo ?? []).filter((d) => reports[i + d]!.sheet !== names[i + d]);
    if (missed.length === 0) return r;
    const notes = missed.map((d) => `the formulas naming sheet ${names[i + d]} miss it: it was written as ${reports[i + d]!.sheet}`);
    return { ...r, notApplied: [...(r.notApplied ?? []), ...notes] };
  });
}
