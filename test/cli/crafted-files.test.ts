// The command line on damaged and crafted files, in-process: the exit status and the message,
// never a stack trace, never a verdict stronger than what was read.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { AND_TABLE, pack, partsOf, patch, put, saved, workbook } from '../hosts/packages.js';
import { runCli, scratch } from './run-cli.js';

const SHEET1 = 'xl/worksheets/sheet1.xml';

/** AND_TABLE with one more row that conflicts with the last one. */
const CONFLICTING = [...AND_TABLE, [1, 1, 0]];

interface JsonDoc {
  tables: { problems: { severity: string; code: string; cell: string }[] }[];
  problems: { severity: string; code: string; sheet: string; cell: string }[];
}

function allProblems(out: string) {
  const doc = JSON.parse(out) as JsonDoc;
  return [...doc.problems, ...doc.tables.flatMap((t) => t.problems)];
}

describe('analyze on damaged and crafted workbooks', () => {
  it('a sheet with a shared-string index out of range is not "proven": exit 1, the cell named', async () => {
    const parts = await partsOf(workbook({ Purge: CONFLICTING }));
    const path = saved('purge.xlsx', pack(patch(parts, SHEET1, (x) => x.replace('<c r="C6"><v>1</v></c>', '<c r="C6" t="s"><v>999</v></c>'))));
    const run = await runCli('analyze', path);
    expect(run.code).toBe(1);
    expect(run.out).toMatch(/Purge!C6\s+the cell refers to a shared string the workbook does not have/);
    expect(run.out).not.toMatch(/Every form .* was proven/);
    const json = await runCli('analyze', path, '--json');
    expect(allProblems(json.out)).toContainEqual(expect.objectContaining({ severity: 'error', code: 'shared-string-out-of-range', cell: 'C6' }));
  });

  it('a sheet part whose CRC-32 does not match is an error naming sheet and part: exit 1, or exit 2 when that sheet is asked for', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const original = parts.get(SHEET1)!;
    const flipped = patch(parts, SHEET1, (x) => x.replace('<c r="C6"><v>1</v></c>', '<c r="C6"><v>0</v></c>'));
    const path = saved('flip.xlsx', pack(flipped, { [SHEET1]: original }));
    const all = await runCli('analyze', path, '--json');
    expect(all.code).toBe(1);
    expect(allProblems(all.out)).toEqual([expect.objectContaining({ severity: 'error', code: 'damaged-part', sheet: 'Purge' })]);
    const one = await runCli('analyze', path, '--sheet', 'Purge');
    expect(one.code).toBe(2);
    expect(one.err).toMatch(/flip\.xlsx: sheet "Purge" could not be read: part xl\/worksheets\/sheet1\.xml is damaged: its CRC-32 does not match its bytes/);
    expect(one.out).not.toMatch(/Y :=/);
  });

  it('a zip bomb, a truncated file and an encrypted one end with exit 2, the path and the reason, no stack trace', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const bomb = saved('bomb.xlsx', pack(put(parts, 'xl/media/fill.bin', '\0'.repeat(16 * 1024 * 1024))));
    const cut = workbook({ Purge: AND_TABLE });
    const truncated = saved('cut.xlsx', cut.subarray(0, cut.length - 40));
    for (const [path, reason] of [[bomb, /zip bomb/], [truncated, /truncated or damaged/]] as const) {
      const run = await runCli('analyze', path);
      expect(run.code).toBe(2);
      expect(run.err).toContain(path);
      expect(run.err).toMatch(reason);
      expect(run.err).not.toMatch(/\n\s+at /);
    }
  });

  it('hidden rows and formula cells are warnings in the report; the forms are still proven', async () => {
    const path = saved(
      'hidden.xlsx',
      workbook({ Purge: AND_TABLE }, (book) => {
        book.Sheets.Purge!['!rows'] = [undefined!, undefined!, { hidden: true }];
        book.Sheets.Purge!.C6 = { t: 'n', v: 1, f: 'A6*B6' };
      }),
    );
    const run = await runCli('analyze', path, '--json');
    expect(run.code).toBe(0);
    expect(allProblems(run.out).map((p) => [p.severity, p.code, p.cell])).toEqual([
      ['warning', 'formula-cell', 'C6'],
      ['warning', 'hidden-rows', 'A3:XFD3'],
    ]);
  });

  it('--range takes an Excel table name; an unknown one lists the tables there are', async () => {
    const parts = await partsOf(workbook({ Notes: [['see Purge']], Purge: [['title'], [], ...AND_TABLE] }));
    let crafted = put(parts, 'xl/tables/table1.xml', '<table xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" id="1" name="tblPurge" displayName="tblPurge" ref="A3:C8"/>');
    crafted = put(crafted, 'xl/worksheets/_rels/sheet2.xml.rels', '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/table" Target="../tables/table1.xml"/></Relationships>');
    const path = saved('tables.xlsx', pack(crafted));
    const run = await runCli('analyze', path, '--range', 'tblPurge', '--json');
    expect(run.code).toBe(0);
    expect((JSON.parse(run.out) as { tables: { sheet: string; range: string }[] }).tables.map((t) => [t.sheet, t.range])).toEqual([['Purge', 'A3:C8']]);
    const unknown = await runCli('analyze', path, '--range', 'tblPurg');
    expect(unknown.code).toBe(2);
    expect(unknown.err).toMatch(/--range tblPurg: "tblPurg" is neither an A1 range .* \(tables: tblPurge\)/);
  });
});

describe('analyze on damaged CSV files', () => {
  it('a first line of 2 million separators: exit 2 with the row and its column count', async () => {
    const path = saved('wide.csv', `${';'.repeat(2_000_000)}\n`);
    const run = await runCli('analyze', path);
    expect(run.code).toBe(2);
    expect(run.err).toMatch(/wide\.csv: row 1 \(line 1\) has 2,000,001 columns; at most 16,384/);
  });

  it('rows past 1,048,576: exit 2 naming the first row past the limit', async () => {
    const rows = ['input;output', 'A;Y', ...Array.from({ length: 1_048_575 }, () => '0;0')];
    const path = saved('long.csv', `${rows.join('\n')}\n1;1\n`);
    const run = await runCli('analyze', path);
    expect(run.code).toBe(2);
    expect(run.err).toMatch(/long\.csv: row 1,048,577 \(line 1048577\) is past Excel's last row: at most 1,048,576 rows/);
  });
});

describe('a crafted comment (CVE-2023-30533) cannot reach our process or our sheets', () => {
  it('-o writes results and steps sheets without any comment, and Object.prototype stays clean', async () => {
    const parts = await partsOf(
      workbook({ Purge: AND_TABLE }, (book) => {
        book.Sheets.Purge!.A1!.c = [{ a: 'someone', t: 'attacker text' }];
      }),
    );
    const comments = [...parts.keys()].find((n) => /comments\d*\.xml$/.test(n))!;
    const crafted = patch(parts, comments, (x) => x.replace('ref="A1"', 'ref="__proto__"'));
    const path = saved('comment.xlsx', pack(crafted));
    const out = join(scratch(), 'results.xlsx');
    const run = await runCli('analyze', path, '-o', out);
    expect(run.code).toBe(0);
    expect(Object.getOwnPropertyNames(Object.prototype)).not.toContain('c');
    expect(({} as Record<string, unknown>).c).toBeUndefined();
    // Read back with our own zip reader: SheetJS 0.18.5 would be polluted by the user's part again.
    const written = partsOf(new Uint8Array(readFileSync(out)));
    const ours = [...written.keys()].filter((n) => /^xl\/worksheets\/sheet\d+\.xml$/.test(n) && !parts.has(n));
    expect(ours).toHaveLength(3);
    for (const sheet of ours) {
      const rels = written.get(sheet.replace('worksheets/', 'worksheets/_rels/') + '.rels');
      expect(rels === undefined ? '' : new TextDecoder().decode(rels), sheet).not.toMatch(/comments/);
      expect(new TextDecoder().decode(written.get(sheet)), sheet).not.toMatch(/attacker text|legacyDrawing/);
    }
  });
});
