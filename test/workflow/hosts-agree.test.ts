// The same workbooks through the three hosts' paths give the same verdicts, the same written
// sheets and the same hand-over decision: the command line in-process (`main(argv, io)`), and
// the Excel pane's path over the strict Office.js double (cells read in the pane, the engine
// core answering the pane's requests as its worker does). The standalone page is driven in
// Chromium by test/browser/run.ts against the same workbooks.
import { beforeAll, describe, expect, it } from 'vitest';
import { createExcelHost } from '../../src/hosts/excel-host.js';
import { readGrids, verdictWords, writeSheets, type WorkbookView } from '../../src/workflow/index.js';
import { EngineCore } from '../../taskpane/engine-core.js';
import { ExcelDouble } from '../hosts/excel-double.js';
import { cliOutcome, trim, WORKBOOKS, type Outcome, type TestWorkbook } from './workbooks.js';

async function throughExcelPane(book: TestWorkbook, sheet: string): Promise<Outcome> {
  const double = new ExcelDouble();
  for (const [name, rows] of Object.entries(book.sheets)) double.addSheet(name, rows.map((r) => [...r]));
  const host = createExcelHost(double.run, double.supports);
  const core = new EngineCore();
  // As app.tsx: the cells are read in the pane, the request crosses to the worker as a copy.
  const choice = { sheet, xReading: 'none' as const };
  const grids = await readGrids(host, choice, book.file);
  if (!grids.ok) throw new Error(grids.error.message);
  const examined = core.answer(structuredClone({ kind: 'examine', grids: grids.value, choice, source: book.file }));
  if (examined.kind !== 'examine' || !examined.value.ok) throw new Error('examine failed');
  const view: WorkbookView = structuredClone(examined.value.value);
  const blocks = core.answer({ kind: 'sheets' });
  if (blocks.kind !== 'sheets' || !blocks.value.ok) throw new Error('no sheets');
  const reports = await writeSheets(host, structuredClone(blocks.value.value));
  const handOver = core.answer({ kind: 'handOver', files: { kinds: ['st'] } });
  if (handOver.kind !== 'handOver') throw new Error('not a hand-over answer');
  expect(handOver.value.ok).toBe(view.handOver.allowed);
  return {
    verdicts: view.tables.map((t) => [verdictWords(t.verdict), ...t.outputs.map((o) => verdictWords(o.verdict))]),
    sheets: reports.map((r) => ({ name: r.sheet, rows: trim(double.read(r.sheet, r.range).map((row) => row.map((v) => String(v)))) })),
    handedOver: view.handOver.allowed,
  };
}

const CASES = WORKBOOKS.flatMap((book) => Object.keys(book.sheets).map((sheet) => ({ book, sheet })));

describe.each(CASES)('$book.name workbook, sheet $sheet', ({ book, sheet }) => {
  let cli: Outcome;
  let excel: Outcome;
  beforeAll(async () => {
    cli = await cliOutcome(book, sheet);
    excel = await throughExcelPane(book, sheet);
  });

  it('the command line and the Excel pane give the same verdicts', () => {
    expect(excel.verdicts).toEqual(cli.verdicts);
  });

  it('they write the same sheets, cell for cell', () => {
    expect(excel.sheets.map((s) => s.name)).toEqual(cli.sheets.map((s) => s.name));
    expect(excel.sheets).toEqual(cli.sheets);
  });

  it('they make the same hand-over decision', () => {
    expect(excel.handedOver).toBe(cli.handedOver);
  });
});

describe('what the hosts agree on', () => {
  it('the error cell and the words in an output column are not analysed, and nothing of them is handed over', async () => {
    const [, broken, words] = WORKBOOKS;
    const a = await cliOutcome(broken, 'Cell');
    const b = await cliOutcome(words, 'Cell');
    expect(a.verdicts[0]![0]).toBe('not analysed: 1 error, the first at Cell!B4');
    // The three bad cells of the Lamp column are one problem over their range.
    expect(b.verdicts[0]![0]).toBe('not analysed: 1 error, the first at Cell!E3:E5');
    expect([a.handedOver, b.handedOver]).toEqual([false, false]);
    expect(b.sheets.map((s) => s.name)).toEqual(['Cell results']);
  });

  it('the good sample is proven and handed over, with a results sheet, its live check and a test record per table', async () => {
    const good = await cliOutcome(WORKBOOKS[0], 'Vote');
    expect(good.verdicts).toEqual([['proven minimum', 'proven minimum']]);
    expect(good.handedOver).toBe(true);
    // The live check is written first: the results sheet's summary names it.
    expect(good.sheets.map((s) => s.name)).toEqual(['Vote live check', 'Vote results', 'Vote record']);
    // The live check's formulas are among the cells compared.
    expect(good.sheets[0]!.rows.flat().filter((v) => v.startsWith('=IF(')).length).toBeGreaterThan(8);
    // The results sheet's summary counts the live check's DIFFERS on its sheet, by name.
    expect(good.sheets[1]!.rows.flat().some((v) => v.startsWith("=COUNTIF('Vote live check'!"))).toBe(true);
  });
});
