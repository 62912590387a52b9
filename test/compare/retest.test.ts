// The retest on the sample workbook, read through the file host: one row of the chuck and
// feeder table changed; the steps to repeat are exactly those whose expectation or term changed.
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import XLSX from 'xlsx';
import { readFileSync, writeFileSync } from 'node:fs';
import { compareAnalyses, oldStepsOf, retestRecordSheet, selectRetest, type TableComparison } from '../../src/compare/index.js';
import { readTestRecord } from '../../src/report/record-read.js';
import { openFile, type FileHost } from '../../src/hosts/file-host.js';
import { has } from '../../src/logic/bits.js';
import { stepTable } from '../../src/report/test-steps.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { CAPPER, runCli, scratch } from '../cli/run-cli.js';
import { CHUCK, writeRevision } from './sample-revision.js';

async function chuckTable(path: string) {
  const host = (await openFile(path)) as { ok: true; value: FileHost };
  expect(host.ok).toBe(true);
  return readSpecTables(await host.value.readGrid('Chuck and feeder')).tables[0]!;
}

describe('retest after one row of the sample workbook changed', () => {
  const dir = scratch();
  // Row 24 is "1 0 1 1 1 | 1 0 0"; the head may now lower there too.
  const revised = join(dir, 'capper-revised.xlsx');
  let c: TableComparison;
  beforeAll(async () => {
    writeRevision(revised, CHUCK, 23, '1 0 1 1 1 | 1 0 1');
    c = compareAnalyses(analyseTable(await chuckTable(CAPPER)), analyseTable(await chuckTable(revised)));
  });

  it('only the head lower permit changed, at the one combination of the row', () => {
    expect(c.outputs.map((o) => [o.name, o.changed])).toEqual([
      ['Chuck air release', false],
      ['Cap feeder enable', false],
      ['Head lower permit', true],
    ]);
    expect(c.outputs[2]!.change!.nowPermits.count).toBe(1);
  });

  it('the steps repeated are exactly those whose expected value or tested term changed', () => {
    const retest = selectRetest(c, oldStepsOf(c), 'old table');
    const newTable = c.new.table;
    const expectationChanged = stepTable(c.old).rows.filter((r) =>
      newTable.outputs.some((o, j) => (has(o.built.fn.dc, r.combination) ? '-' : has(o.built.fn.on, r.combination) ? 1 : 0) !== r.expected[j]),
    );
    // Every old term is still in the new forms here, so no step repeats for its term.
    c.outputs.forEach((o) => expect(o.before!.terms.every((t) => o.after!.terms.some((u) => u.mask === t.mask && u.bits === t.bits))).toBe(true));
    expect(retest.repeat.map((e) => e.testId)).toEqual(expectationChanged.map((r) => r.testId));
    expect(retest.repeat.map((e) => e.testId)).toEqual(['T-10111']);
    expect(retest.stillValid.length + retest.repeat.length).toBe(stepTable(c.old).rows.length);
  });

  it('the new record marks its steps as repeats, new steps, or still valid', () => {
    const retest = selectRetest(c, oldStepsOf(c), 'old table');
    const sheet = retestRecordSheet(c, retest, { date: '2026-12-02' });
    const head = sheet.rows.findIndex((r) => r[0]?.value === 'Step');
    expect(sheet.rows[head]!.at(-1)).toEqual({ value: 'Retest', style: 'heading' });
    const marks = new Map(sheet.rows.slice(head + 1).map((r) => [String(r[1]?.value), String(r.at(-1)?.value)]));
    for (const s of retest.newRecord) expect(marks.get(s.testId)).toMatch(s.status === 'new' ? /^new step$/ : s.status === 'repeat' ? /^repeat/ : /^still valid/);
    expect(retest.newRecord.some((s) => s.status === 'new')).toBe(true);
  });

  describe('from a filled-in record', () => {
    const results = join(dir, 'results.xlsx');
    const filled = join(dir, 'filled.xlsx');
    beforeAll(async () => {
      expect((await runCli('analyze', CAPPER, '-o', results)).code).toBe(0);
      // The commissioning engineer fills in Pass for every step but one, which failed.
      const book = XLSX.read(readFileSync(results));
      const name = book.SheetNames.find((s) => s.startsWith('Chuck and feeder') && s.endsWith('record'))!;
      const ws = book.Sheets[name]!;
      const rows = XLSX.utils.sheet_to_json<unknown[]>(ws, { header: 1, defval: null });
      const head = rows.findIndex((r) => r[0] === 'Step');
      const col = (rows[head] as string[]).indexOf('Pass/Fail');
      for (let r = head + 1; r < rows.length && rows[r]![1]; r++)
        ws[XLSX.utils.encode_cell({ r, c: col })] = { t: 's', v: rows[r]![1] === 'T-11000' ? 'Fail' : 'Pass' };
      writeFileSync(filled, XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }) as Buffer);
    });

    it('the record read back is of the old table: same revision stamp, same steps', async () => {
      const host = (await openFile(filled)) as { ok: true; value: FileHost };
      const sheets = await host.value.listSheets();
      const record = readTestRecord(await host.value.readGrid(sheets.find((s) => s.startsWith('Chuck and feeder') && s.endsWith('record'))!));
      expect(record!.table).toEqual({ sheet: 'Chuck and feeder', range: 'B2:J34' });
      expect(record!.stamp).toBe(c.oldStamp);
      expect(record!.steps.map((s) => s.testId)).toEqual(stepTable(c.old).rows.map((r) => r.testId));
    });

    it('compare --old-record repeats the changed step and the step that failed, the rest still valid', async () => {
      const run = await runCli('compare', CAPPER, revised, '--old-record', filled, '--json');
      expect(run.code).toBe(1);
      const doc = JSON.parse(run.out);
      const chuck = doc.tables.find((t: { old: { sheet: string } }) => t.old.sheet === 'Chuck and feeder');
      expect(chuck.retest.source).toBe('record');
      expect(chuck.retest.repeat.map((e: { testId: string }) => e.testId).sort()).toEqual(['T-10111', 'T-11000']);
      expect(chuck.retest.repeat.find((e: { testId: string }) => e.testId === 'T-11000').reasons).toEqual(['the old record shows it failed']);
      expect(chuck.outputs[2].retest.repeat).toEqual(['T-10111']);
    });
  });
});
