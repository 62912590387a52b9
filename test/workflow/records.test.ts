// Filled-in test records judged by the workflow: the command line (`record`) and the pane's
// path (cells read in the pane over the strict Excel double, judged by the engine core as its
// worker does) call the same function and agree; a changed table makes the record stale.
import { describe, expect, it } from 'vitest';
import { createExcelHost } from '../../src/hosts/excel-host.js';
import { checkRecords, examine, readGrids, readRecordGrids, readTables, recordsCleared, sheetsToWrite, writeSheets, type RecordVerdict } from '../../src/workflow/index.js';
import { EngineCore } from '../../taskpane/engine-core.js';
import { ExcelDouble } from '../hosts/excel-double.js';
import { GOOD } from './workbooks.js';

/** The good workbook in the double with its test records written, as the pane writes them. */
async function withRecords(): Promise<{ double: ExcelDouble; records: string[] }> {
  const double = new ExcelDouble();
  for (const [name, rows] of Object.entries(GOOD.sheets)) double.addSheet(name, rows.map((r) => [...r]));
  const host = createExcelHost(double.run, double.supports);
  const grids = await readGrids(host, {}, GOOD.file);
  if (!grids.ok) throw new Error(grids.error.message);
  const tables = readTables(grids.value, {});
  if (!tables.ok) throw new Error(tables.error.message);
  const written = await writeSheets(host, sheetsToWrite(examine(tables.value, { source: GOOD.file })));
  return { double, records: written.map((w) => w.sheet).filter((s) => s.endsWith('record')) };
}

/** Writes `word(i)` into the Pass/Fail cell of every step i of the record sheet. */
function fill(double: ExcelDouble, sheet: string, word: (i: number) => string): void {
  const model = double.sheet(sheet)!;
  const cellAt = (r: number, c: number) => model.cells.get(`${r},${c}`)?.value;
  let header = 0;
  while (!(cellAt(header, 0) === 'Step' && cellAt(header, 1) === 'Test ID')) header++;
  let col = 0;
  while (cellAt(header, col) !== 'Pass/Fail') col++;
  for (let r = header + 1, i = 0; typeof cellAt(r, 0) === 'number'; r++, i++) model.cells.set(`${r},${col}`, { value: word(i), numberFormat: 'General', format: {} });
}

async function bothWays(double: ExcelDouble): Promise<{ cli: RecordVerdict[]; pane: RecordVerdict[] }> {
  const host = createExcelHost(double.run, double.supports);
  const cli = await checkRecords(host);
  const answer = new EngineCore().answer(structuredClone({ kind: 'records', grids: await readRecordGrids(host) }));
  if (answer.kind !== 'records') throw new Error(`a ${answer.kind} answer`);
  return { cli, pane: structuredClone(answer.value) };
}

describe('checking filled-in test records through the workflow', () => {
  it('every step passed on the current revision: both paths say so, and the records are cleared', async () => {
    const { double, records } = await withRecords();
    expect(records).toHaveLength(2);
    for (const r of records) fill(double, r, () => 'Pass');
    const { cli, pane } = await bothWays(double);
    expect(pane).toEqual(cli);
    expect(cli.map((v) => ({ current: v.current, failed: v.failed, notRun: v.notRun, ok: v.ok }))).toEqual(records.map(() => ({ current: true, failed: 0, notRun: 0, ok: true })));
    expect(recordsCleared(cli)).toBe(true);
  });

  it('a failed step and a step not run are counted, and the records are not cleared', async () => {
    const { double, records } = await withRecords();
    fill(double, records[0]!, (i) => (i === 0 ? 'Fail' : i === 1 ? '' : 'Pass'));
    const { cli, pane } = await bothWays(double);
    expect(pane).toEqual(cli);
    const first = cli.find((v) => v.record.sheet === records[0])!;
    expect({ failed: first.failed, notRun: first.notRun, ok: first.ok }).toEqual({ failed: 1, notRun: 1, ok: false });
    expect(recordsCleared(cli)).toBe(false);
  });

  it('a record whose table changed since is stale, and says so', async () => {
    const { double, records } = await withRecords();
    for (const r of records) fill(double, r, () => 'Pass');
    // Cell!D3: the first row's output 1 -> 0 (the table now means something else).
    double.sheet('Cell')!.cells.set('2,3', { value: 0, numberFormat: 'General', format: {} });
    const { cli, pane } = await bothWays(double);
    expect(pane).toEqual(cli);
    const stale = cli.filter((v) => !v.current);
    expect(stale.map((v) => v.record.table.sheet)).toEqual(['Cell']);
    expect(stale[0]!.stale).toMatch(/has changed since the record was made/);
    expect(stale[0]!.ok).toBe(false);
  });

  it('a workbook without a record gives no verdict, and is not cleared', async () => {
    const double = new ExcelDouble();
    for (const [name, rows] of Object.entries(GOOD.sheets)) double.addSheet(name, rows.map((r) => [...r]));
    const verdicts = await checkRecords(createExcelHost(double.run, double.supports));
    expect(verdicts).toEqual([]);
    expect(recordsCleared(verdicts)).toBe(false);
  });
});
