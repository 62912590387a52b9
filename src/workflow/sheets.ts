// The sheets a run writes, the same set in every host: per table its results sheet (a
// not-analysed sheet for a table with errors) and its live check (up to 12 inputs), and the
// commissioning test record of each cleared table (a table of more than 24 inputs too: it has
// no live check).
import { freeSheetName, type WorkbookHost, type WriteReport } from '../hosts/index.js';
import { notAnalysedSheet, renameSheetRefs, resultsSheets, testRecordSheet, type SheetBlock } from '../report/index.js';
import { type TableResult, type Workbook } from './examine.js';
import { cleared, verdictWords } from './verdict.js';

function tableSheets(t: TableResult, source: string): SheetBlock[] {
  if (!t.analysis) return [notAnalysedSheet(t.table, verdictWords(t.verdict), { source })];
  const results = resultsSheets(t.analysis, { source });
  return cleared(t.verdict) ? [...results, testRecordSheet(t.analysis, { source })] : results;
}

export function sheetsToWrite(wb: Workbook): SheetBlock[] {
  return wb.resultsWrite.allowed ? wb.tables.flatMap((t) => tableSheets(t, wb.source)) : [];
}

/**
 * Each block to a new sheet of the host; what was written where, in the order written. The
 * names are chosen first, free in the workbook and among the blocks, so that a formula naming
 * another block's sheet (`SheetBlock.refersTo`) names the sheet that block gets; and a block
 * named is written before the block naming it, as Excel binds a reference to a sheet only when
 * that sheet exists (one to a missing sheet would stay a link to a file of that name).
 */
export async function writeSheets(host: Pick<WorkbookHost, 'writeSheet' | 'listSheets' | 'queuedSheets'>, blocks: readonly SheetBlock[]): Promise<WriteReport[]> {
  const taken = [...(await host.listSheets()), ...(host.queuedSheets?.() ?? [])];
  const names = blocks.map((b) => {
    const name = freeSheetName(b.name, taken);
    taken.push(name);
    return name;
  });
  const written: WriteReport[] = [];
  const byBlock = new Map<number, WriteReport>();
  const write = async (i: number): Promise<WriteReport> => {
    const done = byBlock.get(i);
    if (done) return done;
    const block = blocks[i]!;
    let named: SheetBlock = { ...block, name: names[i]! };
    for (const d of block.refersTo ?? []) named = renameSheetRefs(named, blocks[i + d]!.name, (await write(i + d)).sheet);
    const report = await host.writeSheet(named);
    byBlock.set(i, report);
    written.push(report);
    return report;
  };
  for (const i of blocks.keys()) await write(i);
  return written;
}
