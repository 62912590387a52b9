// The CSV reader behind the file host: delimiter detection, quoting (RFC 4180), values.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readSheets } from '../../src/hosts/parsed-workbook.js';
import { csvValue, detectDelimiter, parseCsv, type Delimiter } from '../../src/table/csv.js';

function rows(text: string): unknown {
  const r = parseCsv(text);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('CSV reading', () => {
  it('detects semicolons, commas and tabs from the first line', () => {
    expect(detectDelimiter('input;input;output\r\n1;0;1')).toBe(';');
    expect(detectDelimiter('input,input,output\n1,0,1')).toBe(',');
    expect(detectDelimiter('A\tB\n1\t0')).toBe('\t');
    expect(detectDelimiter('"a;b;c",d\n')).toBe(',');
  });

  it('drops a byte-order mark and accepts CRLF, LF and a missing last line end', () => {
    expect(rows('\uFEFFA;B\r\n1;0\r\n')).toEqual([['A', 'B'], [1, 0]]);
    expect(rows('A;B\n1;0')).toEqual([['A', 'B'], [1, 0]]);
  });

  it('reads quoted fields holding delimiters, line breaks and doubled quotes', () => {
    expect(rows('"Door ""A"", closed";"line\nbreak"\n1;0\n')).toEqual([['Door "A", closed', 'line\nbreak'], [1, 0]]);
  });

  it('turns numbers into numbers, TRUE/FALSE into booleans and empty fields into blanks', () => {
    expect(rows('1;0;TRUE;false;-;;2.5;X\n')).toEqual([[1, 0, true, false, '-', null, 2.5, 'X']]);
  });

  it('pads short rows to the widest row', () => {
    expect(rows('A;B;C\n1\n')).toEqual([['A', 'B', 'C'], [1, null, null]]);
  });

  it('reports an unclosed quote with the line it opened on', () => {
    const r = parseCsv('A;B\n1;"open\n0;1\n');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toBe('line 2: a quoted field is not closed');
  });

  it('refuses a row wider than Excel\'s 16,384 columns with its count, without building it', () => {
    const r = parseCsv(`A;B\n${';'.repeat(20_000)}\n`);
    expect(!r.ok && r.error.message).toBe('row 2 (line 2) has 20,001 columns; at most 16,384');
    expect(parseCsv(`${';'.repeat(16_383)}\n`).ok).toBe(true);
  });

  it('refuses rows past Excel\'s 1,048,576, naming the first one', () => {
    const full = '0\n'.repeat(1_048_576);
    expect(parseCsv(full).ok).toBe(true);
    const r = parseCsv(`${full}1\n`);
    expect(!r.ok && r.error.message).toBe("row 1,048,577 (line 1048577) is past Excel's last row: at most 1,048,576 rows");
  });

  it('refuses a table whose padded rows would pass the cell limit, before padding', () => {
    const r = parseCsv(`${'a;'.repeat(99)}a\n1\n1\n`, ';', 250);
    expect(!r.ok && r.error.message).toBe('3 rows of 100 columns are 300 cells, more than the limit of 250');
  });

  it('the page hands CSV bytes to its worker instead of parsing them itself', async () => {
    const jobs: Record<string, unknown>[] = [];
    const budget = { maxEntryBytes: 1, maxTotalBytes: 1, maxRatio: 1 };
    const read = await readSheets('t.csv', 't.csv', 'csv', new TextEncoder().encode('A;B\n1;0\n'), { maxCells: 100, budget, csvInWorker: true }, async (job) => {
      jobs.push(job);
      return { ok: true, value: { ok: true, sheets: [{ name: 't', origin: 'A1', cells: [['from the worker']] }] } };
    });
    expect(jobs).toEqual([{ mode: 'csv', fileName: 't.csv', maxCells: 100 }]);
    expect(read.ok && read.value.sheets[0]!.grid!.cells).toEqual([['from the worker']]);
  });

  it('reads back any table written with quoting (property)', () => {
    const delimiter = fc.constantFrom<Delimiter>(',', ';', '\t');
    const field = fc.string({ unit: fc.constantFrom('a', 'B', '1', '0', ' ', ',', ';', '\t', '"', '\n', '\r', '-', 'é') });
    const table = fc.integer({ min: 1, max: 5 }).chain((w) => fc.array(fc.array(field, { minLength: w, maxLength: w }), { minLength: 1, maxLength: 6 }));
    fc.assert(
      fc.property(delimiter, table, fc.boolean(), (d, t, bom) => {
        const quote = (f: string): string => `"${f.replace(/"/g, '""')}"`;
        const text = (bom ? '\uFEFF' : '') + t.map((r) => r.map(quote).join(d)).join('\r\n') + '\r\n';
        const r = parseCsv(text, d);
        expect(r.ok && r.value).toEqual(t.map((row) => row.map(csvValue)));
      }),
    );
  });
});
