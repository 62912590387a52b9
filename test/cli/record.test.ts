// The commissioning test record's round trip: made by `analyze -o`, filled in as an engineer
// would in a spreadsheet, and read back by `record`.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { beforeAll, describe, expect, it } from 'vitest';
import { CSV, runCli, scratch } from './run-cli.js';

interface RecordDoc {
  records: { sheet: string; current: boolean; stale?: string; passed: number; failed: number; notRun: number; ok: boolean; problems: { code: string; cell: string; message: string }[]; steps: { step: number; result: string; cell: string }[] }[];
}

let results = '';
const RECORD = 'spindle-permit record';

beforeAll(async () => {
  results = join(scratch(), 'results.xlsx');
  expect((await runCli('analyze', CSV, '-o', results)).code).toBe(0);
});

/** A copy of the results workbook with `edit` applied to its sheets, as saved by a spreadsheet. */
function filled(edit: (book: XLSX.WorkBook) => void): string {
  const book = XLSX.read(readFileSync(results), { type: 'buffer' });
  edit(book);
  const path = join(scratch(), 'filled.xlsx');
  XLSX.writeFile(book, path);
  return path;
}

/** Rows of the record sheet below its Step / Test ID heading, with their 0-based sheet rows. */
function stepRows(book: XLSX.WorkBook): { row: number; resultCol: number }[] {
  const ws = book.Sheets[RECORD]!;
  const rows = XLSX.utils.sheet_to_json<unknown[]>(ws, { header: 1, defval: '', blankrows: true });
  const header = rows.findIndex((r) => r[0] === 'Step' && r[1] === 'Test ID');
  const resultCol = rows[header]!.indexOf('Pass/Fail');
  return rows.slice(header + 1).flatMap((r, i) => (typeof r[0] === 'number' ? [{ row: header + 1 + i, resultCol }] : []));
}

function setResult(book: XLSX.WorkBook, row: number, col: number, value: string): void {
  book.Sheets[RECORD]![XLSX.utils.encode_cell({ r: row, c: col })] = { t: 's', v: value };
}

const passAll = (word: (i: number) => string) => (book: XLSX.WorkBook) => stepRows(book).forEach((s, i) => setResult(book, s.row, s.resultCol, word(i)));

async function record(path: string): Promise<{ code: number; doc: RecordDoc }> {
  const run = await runCli('record', path, '--json');
  return { code: run.code, doc: JSON.parse(run.out) as RecordDoc };
}

describe('reading a filled-in test record back', () => {
  it('every step passed on the current revision: exit 0', async () => {
    const { code, doc } = await record(filled(passAll(() => 'Pass')));
    expect(doc.records).toHaveLength(1);
    expect(doc.records[0]).toMatchObject({ sheet: RECORD, current: true, failed: 0, notRun: 0, ok: true });
    expect(doc.records[0]!.passed).toBeGreaterThan(3);
    expect(code).toBe(0);
  });

  it('reads P/F, OK/NOK in any case as pass and fail', async () => {
    const words = ['p', 'OK', 'PASS', 'ok'];
    const { code, doc } = await record(filled(passAll((i) => words[i % words.length]!)));
    expect(doc.records[0]!.failed).toBe(0);
    expect(code).toBe(0);
  });

  it('one failed step: exit 1, naming the step and its cell', async () => {
    const path = filled((book) => {
      passAll(() => 'Pass')(book);
      const second = stepRows(book)[1]!;
      setResult(book, second.row, second.resultCol, 'nok');
    });
    const { code, doc } = await record(path);
    expect(code).toBe(1);
    expect(doc.records[0]!.failed).toBe(1);
    expect(doc.records[0]!.steps.find((s) => s.result === 'failed')).toMatchObject({ step: 2 });
    const text = (await runCli('record', path)).out;
    expect(text).toMatch(/step 2 \(T-[01]+\) FAILED at 'spindle-permit record'!/);
  });

  it('a step left empty is not run: exit 1', async () => {
    const { code, doc } = await record(filled((book) => stepRows(book).slice(1).forEach((s) => setResult(book, s.row, s.resultCol, 'Pass'))));
    expect(code).toBe(1);
    expect(doc.records[0]!.notRun).toBe(1);
  });

  it('a spec cell changed after the record was made: the record is stale, exit 1', async () => {
    const path = filled((book) => {
      passAll(() => 'Pass')(book);
      const spec = book.Sheets['spindle-permit']!;
      const cell = spec['A3'] as XLSX.CellObject;
      spec['A3'] = { t: 'n', v: cell.v === 1 ? 0 : 1 };
    });
    const { code, doc } = await record(path);
    expect(code).toBe(1);
    expect(doc.records[0]!.current).toBe(false);
    expect(doc.records[0]!.stale).toMatch(/has changed since the record was made/);
    expect((await runCli('record', path)).out).toContain('STALE');
  });

  it('unknown Pass/Fail text is a problem at its cell; nothing is written', async () => {
    const path = filled((book) => {
      passAll(() => 'Pass')(book);
      const first = stepRows(book)[0]!;
      setResult(book, first.row, first.resultCol, 'looked fine');
    });
    const before = readFileSync(path);
    const { code, doc } = await record(path);
    expect(code).toBe(1);
    expect(doc.records[0]!.problems).toContainEqual(expect.objectContaining({ code: 'record-bad-result', message: expect.stringContaining('"looked fine" is not a result') }));
    expect(readFileSync(path).equals(before)).toBe(true);
  });

  it('a step added by hand and a step deleted are problems', async () => {
    const path = filled((book) => {
      passAll(() => 'Pass')(book);
      const ws = book.Sheets[RECORD]!;
      const rows = stepRows(book);
      const last = rows[rows.length - 1]!;
      ws[XLSX.utils.encode_cell({ r: last.row + 1, c: 0 })] = { t: 'n', v: 99 };
      ws[XLSX.utils.encode_cell({ r: last.row + 1, c: 1 })] = { t: 's', v: 'extra check of the lamp' };
      ws['!ref'] = XLSX.utils.encode_range({ s: { r: 0, c: 0 }, e: { r: last.row + 1, c: 30 } });
      for (let c = 0; c < 30; c++) delete ws[XLSX.utils.encode_cell({ r: rows[0]!.row, c })];
    });
    const { code, doc } = await record(path);
    expect(code).toBe(1);
    const codes = doc.records[0]!.problems.map((p) => p.code);
    expect(codes).toContain('record-added-step');
    expect(codes).toContain('record-missing-step');
  });

  it('a workbook without a record: exit 1 and says so', async () => {
    const run = await runCli('record', CSV.replace('.csv', '.csv'));
    expect(run.code).toBe(1);
    expect(run.out).toContain('no commissioning test record found');
  });
});
