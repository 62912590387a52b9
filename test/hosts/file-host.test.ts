// The file host: workbook and CSV files read as grids, parsing isolated in a worker with
// limits, results written to a new file beside the untouched input.
import { linkSync, mkdtempSync, readFileSync, readdirSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { beforeAll, describe, expect, it } from 'vitest';
import { openFile, sameFile, writeResults, type FileHost } from '../../src/hosts/file-host.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';

const SAMPLES = join(import.meta.dirname, '..', '..', 'sample-workbooks');
const CAPPER = join(SAMPLES, 'capper-cell.xlsx');
const BROKEN = join(SAMPLES, 'capper-cell-broken.xlsx');
const CSV = join(SAMPLES, 'spindle-permit.csv');

async function open(path: string): Promise<FileHost> {
  const host = await openFile(path);
  if (!host.ok) throw new Error(host.error.message);
  return host.value;
}

function scratch(): string {
  return mkdtempSync(join(tmpdir(), 'file-host-'));
}

describe('reading a workbook file', () => {
  let capper: FileHost;
  beforeAll(async () => {
    capper = await open(CAPPER);
  });

  it('lists the sheets in workbook order', async () => {
    expect(await capper.listSheets()).toEqual(['Spindle', 'Chuck and feeder', 'Channels']);
  });

  it('reads the used range of a sheet with its top-left address', async () => {
    const grid = await capper.readGrid('Chuck and feeder');
    expect(grid.origin).toBe('B2');
    expect(grid.cells[0]!.slice(0, 6)).toEqual(['Cap in chuck', 'Bottle in position', 'Head down', 'Torque reached', 'Air pressure OK', null]);
    expect(grid.cells[0]![6]).toBe('Chuck air release');
    expect(grid.cells.length).toBe(33);
  });

  it('keeps numbers, Excel booleans and text as they are', async () => {
    const grid = await capper.readGrid('Spindle');
    expect(grid.origin).toBe('A1');
    expect(grid.cells[2]![0]).toBe('input'); // role row of the spindle table, row 3
    expect(grid.cells[4]!.slice(0, 8)).toEqual(['-', '-', '-', 0, '-', '-', '-', 0]); // row 5
    expect(grid.cells[17]!.slice(0, 4)).toEqual([false, false, false, false]); // row 18: air vote
  });

  it('reads a given range only, with that range as its origin', async () => {
    const grid = await capper.readGrid('Spindle', 'A16:D25');
    expect(grid.origin).toBe('A16');
    expect(grid.cells.length).toBe(10);
    expect(grid.cells[1]).toEqual(['Pressure switch 1', 'Pressure switch 2', 'Pressure switch 3', 'Air supply OK']);
  });

  it('reads error cells as their error text, and blanks as null', async () => {
    const broken = await open(BROKEN);
    const grid = await broken.readGrid('Air supply vote');
    expect(grid.cells[3]![1]).toBeNull(); // the blank input (data row 1, B4)
    expect(grid.cells[5]![0]).toBe(2);
    expect(grid.cells[7]![3]).toEqual({ error: '#N/A' });
    expect(grid.cells[8]![2]).toBe('X');
  });

  it('refuses a file that is not a workbook, naming it', async () => {
    const dir = scratch();
    const fake = join(dir, 'notes.xlsx');
    writeFileSync(fake, 'input,input\n1,0\n');
    const r = await openFile(fake);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toContain('notes.xlsx');
  });

  it('refuses a missing file and an unknown file type', async () => {
    const missing = await openFile(join(scratch(), 'nothing.xlsx'));
    expect(!missing.ok && missing.error.message).toMatch(/no such file/);
    const pdf = await openFile(join(SAMPLES, 'capper-cell.pdf'));
    expect(!pdf.ok && pdf.error.message).toMatch(/expected \.xlsx, \.xlsm or \.csv/);
  });
});

describe('the parsing worker is isolated and limited', () => {
  it('a prototype polluted while parsing does not reach this realm', async () => {
    const r = await openFile(CAPPER, { testHook: 'pollute-prototype' });
    expect(r.ok).toBe(true);
    expect((Object.prototype as Record<string, unknown>).polluted).toBeUndefined();
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    if (r.ok) expect(Object.getPrototypeOf((await r.value.readGrid('Spindle')).cells)).toBe(Array.prototype);
  });

  it('a parse that runs past its time limit is stopped with a clear error', async () => {
    const r = await openFile(CAPPER, { testHook: 'never-finish', timeLimitMs: 300 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/capper-cell\.xlsx: reading took longer than the limit of 0\.3 s/);
  });

  it('a parse that runs out of its heap is stopped with a clear error, and this process goes on', async () => {
    // A growing Map: out of memory there ends a whole process when the parser is a worker thread.
    const r = await openFile(CAPPER, { testHook: 'exhaust-heap', heapMb: 16 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/memory limit of 16 MB/);
  });

  it('a parser that crashes is a failed read naming the file', async () => {
    const r = await openFile(CAPPER, { testHook: 'crash' });
    expect(!r.ok && r.error.message).toMatch(/capper-cell\.xlsx: the reader stopped unexpectedly \(SIGABRT\)/);
  });

  it('a file larger than the size limit is not read at all', async () => {
    const r = await openFile(CAPPER, { maxBytes: 1000 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/bytes is more than the limit of 1000 bytes/);
  });

  it('a sheet whose used range is too large is named instead of read', async () => {
    const host = await openFile(CAPPER, { maxCells: 100 });
    expect(host.ok).toBe(true);
    if (host.ok) expect(host.value.sheetProblem('Chuck and feeder')).toMatch(/B2:J34 \(297 cells\)/);
  });
});

describe('reading a CSV file', () => {
  it('reads the semicolon sample (with its byte-order mark) as the same cells as the workbook table', async () => {
    const csv = await open(CSV);
    expect(await csv.listSheets()).toEqual(['spindle-permit']);
    const fromCsv = await csv.readGrid('spindle-permit');
    const fromBook = await (await open(CAPPER)).readGrid('Spindle', 'A3:H13');
    expect(fromCsv.cells).toEqual(fromBook.cells);
  });

  it('reads a comma-separated file without a byte-order mark', async () => {
    const path = join(scratch(), 'table.csv');
    writeFileSync(path, 'input,output\nA,Y\n1,0\n');
    const grid = await (await open(path)).readGrid('table');
    expect(grid.cells).toEqual([['input', 'output'], ['A', 'Y'], [1, 0]]);
  });

  it('refuses a CSV file that is not UTF-8', async () => {
    const path = join(scratch(), 'latin.csv');
    writeFileSync(path, Buffer.from([0x41, 0x3b, 0xe9, 0x0a]));
    const r = await openFile(path);
    expect(!r.ok && r.error.message).toMatch(/not UTF-8/);
  });
});

const block: SheetBlock = {
  name: 'Spindle', // taken: the host must choose another name
  rows: [
    [{ value: 'Check', style: 'heading' }, null, { value: 'Status' }],
    [{ value: true, formula: 'XOR(A5=1,B5=1)' }, { value: 1 }, { value: 'OK', formula: 'IF(AND(A2,NOT(XOR(A2,TRUE))),"OK","DIFFERS")' }],
  ],
  columnWidths: [12, 8, 30],
};

describe('writing results', () => {
  it('adds the results sheet after the source sheets, which keep every cell', async () => {
    const dir = scratch();
    const out = join(dir, 'results.xlsx');
    const r = await writeResults(CAPPER, [block], out);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.sheets[0]!.sheet).toBe('Spindle (2)');
    const source = XLSX.read(readFileSync(CAPPER));
    const written = XLSX.read(readFileSync(out), { cellFormula: true, xlfn: true, cellStyles: true });
    expect(written.SheetNames).toEqual([...source.SheetNames, 'Spindle (2)']);
    for (const name of source.SheetNames) {
      const values = (s: XLSX.WorkSheet): unknown[][] => XLSX.utils.sheet_to_json(s, { header: 1, raw: true });
      expect(values(written.Sheets[name]!), name).toEqual(values(source.Sheets[name]!));
    }
    const results = written.Sheets['Spindle (2)']!;
    expect(results.A2!.f).toBe('_xlfn.XOR(A5=1,B5=1)');
    expect(results.A2!.v).toBe(true);
    expect(results.C2!.f).toBe('IF(AND(A2,NOT(_xlfn.XOR(A2,TRUE))),"OK","DIFFERS")');
    expect(results['!cols']!.map((c) => Math.round(c.wch ?? 0))).toEqual([12, 8, 30]);
    expect(readdirSync(dir)).toEqual(['results.xlsx']); // no temp file left behind
  });

  it('stores the XOR function with its _xlfn prefix in the sheet XML', async () => {
    const out = join(scratch(), 'results.xlsx');
    await writeResults(CAPPER, [block], out);
    const zip = XLSX.CFB.read(readFileSync(out), { type: 'buffer' });
    const sheet4 = XLSX.CFB.find(zip, '/xl/worksheets/sheet4.xml');
    expect(Buffer.from(sheet4!.content as Uint8Array).toString('utf8')).toContain('<f>_xlfn.XOR(A5=1,B5=1)</f>');
  });

  it('writes a CSV source as the first sheet of the results workbook', async () => {
    const out = join(scratch(), 'from-csv.xlsx');
    const r = await writeResults(CSV, [block], out);
    expect(r.ok).toBe(true);
    const written = XLSX.read(readFileSync(out));
    expect(written.SheetNames).toEqual(['spindle-permit', 'Spindle']);
    expect(written.Sheets['spindle-permit']!.A2!.v).toBe('Guard door A closed');
  });

  it('refuses to write over its input, by any name, and leaves the input as it was', async () => {
    const dir = scratch();
    const input = join(dir, 'Cell.xlsx');
    writeFileSync(input, readFileSync(CAPPER));
    symlinkSync(input, join(dir, 'link.xlsx'));
    linkSync(input, join(dir, 'hard.xlsx'));
    const before = readFileSync(input);
    for (const out of [input, join(dir, '.', 'Cell.xlsx'), join(dir, 'cell.XLSX'), join(dir, 'link.xlsx'), join(dir, 'hard.xlsx')]) {
      const r = await writeResults(input, [block], out);
      expect(r.ok, out).toBe(false);
      if (!r.ok) expect(r.error.message).toMatch(/is the input file/);
    }
    expect(readFileSync(input).equals(before)).toBe(true);
  });

  it('tells paths of different files apart', () => {
    expect(sameFile(CAPPER, BROKEN)).toBe(false);
    expect(sameFile(CAPPER, join(SAMPLES, 'source', '..', 'capper-cell.xlsx'))).toBe(true);
  });

  it('refuses a results name that is not .xlsx, or in a folder that does not exist', async () => {
    const csvOut = await writeResults(CAPPER, [block], join(scratch(), 'out.csv'));
    expect(!csvOut.ok && csvOut.error.message).toMatch(/ending in \.xlsx/);
    const nowhere = await writeResults(CAPPER, [block], join(scratch(), 'no', 'out.xlsx'));
    expect(!nowhere.ok && nowhere.error.message).toMatch(/does not exist/);
  });
});
