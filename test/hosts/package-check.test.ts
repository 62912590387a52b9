// Workbook packages are checked before SheetJS sees them, and nothing it skips is lost
// silently: every case is a small workbook made here, then damaged or crafted by hand.
import XLSX from 'xlsx';
import { describe, expect, it } from 'vitest';
import { openFile, type FileHostOptions } from '../../src/hosts/file-host.js';
import { checkZip, crc32, storedEntry, writeZip } from '../../src/hosts/zip-package.mjs';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { Problem } from '../../src/table/types.js';
import { AND_TABLE, deflatedEntry, pack, partsOf, patch, put, saved, workbook } from './packages.js';

const SHEET1 = 'xl/worksheets/sheet1.xml';

async function opened(bytes: Uint8Array, options: FileHostOptions = {}) {
  const host = await openFile(saved('book.xlsx', bytes), options);
  if (!host.ok) throw new Error(host.error.message);
  return host.value;
}

async function refusal(bytes: Uint8Array, options: FileHostOptions = {}): Promise<string> {
  const host = await openFile(saved('book.xlsx', bytes), options);
  if (host.ok) throw new Error('the file was read');
  return host.error.message;
}

const brief = (p: Problem) => ({ severity: p.severity, code: p.code, cell: p.cell });

describe('the zip reader', () => {
  it('computes the CRC-32 of the check value "123456789" (APPNOTE 4.4.7, CRC-32/ISO-HDLC check 0xCBF43926)', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });

  it('reads back what it packed, stored or deflated', async () => {
    const data = new TextEncoder().encode('<a>'.repeat(1000));
    const zip = await checkZip(writeZip([storedEntry('s.xml', data), deflatedEntry('d.xml', data)]), { maxEntryBytes: 1e6, maxTotalBytes: 1e6, maxRatio: 1000 });
    expect(zip.ok && zip.value.map((e) => [e.name, e.data?.length])).toEqual([['s.xml', 3000], ['d.xml', 3000]]);
  });
});

describe('a damaged or unsafe package is refused with its reason', () => {
  it('a sheet part whose CRC-32 does not match its bytes is an error at that sheet, naming the part', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const good = parts.get(SHEET1)!;
    const flipped = patch(parts, SHEET1, (x) => x.replace('<c r="C6"><v>1</v></c>', '<c r="C6"><v>0</v></c>'));
    // The bytes of the flipped cell under the CRC-32 of the original: a damaged file.
    const bytes = pack(flipped, { [SHEET1]: good });
    const host = await opened(bytes);
    expect(host.sheetProblem('Purge')).toMatch(/part xl\/worksheets\/sheet1\.xml is damaged: its CRC-32 does not match its bytes/);
    expect(host.fileProblems().map((p) => ({ ...brief(p), sheet: p.sheet }))).toEqual([{ severity: 'error', code: 'damaged-part', cell: 'A1', sheet: 'Purge' }]);
  });

  it('a part that unpacks to more than its header records is damaged', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const sheet = parts.get(SHEET1)!;
    const bytes = pack(parts, { [SHEET1]: sheet.subarray(0, 100) });
    expect((await opened(bytes)).sheetProblem('Purge')).toMatch(/does not unpack to the 100 bytes its header records/);
  });

  it('a damaged workbook part makes the whole file unreadable', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const bytes = pack(parts, { 'xl/workbook.xml': parts.get('xl/workbook.xml')!.map((b) => b ^ 1) });
    expect(await refusal(bytes)).toMatch(/book\.xlsx: part xl\/workbook\.xml is damaged: its CRC-32 does not match/);
  });

  it('a part that would unpack more than 200 times its size is taken for a zip bomb', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const bomb = put(parts, 'xl/media/padding.xml', ' '.repeat(8 * 1024 * 1024));
    expect(await refusal(pack(bomb))).toMatch(/part xl\/media\/padding\.xml would unpack \d+ times its packed size \(the limit is 200\)/);
  });

  it('unpacking stops at the budget per part and in all', async () => {
    const bytes = workbook({ Purge: AND_TABLE });
    expect(await refusal(bytes, { budget: { maxEntryBytes: 2000, maxTotalBytes: 1e6, maxRatio: 200 } })).toMatch(/part xl\/theme\/theme1\.xml unpacks to 7,646 bytes, more than the limit of 2,000 bytes per part/);
    expect(await refusal(bytes, { budget: { maxEntryBytes: 1e6, maxTotalBytes: 10_000, maxRatio: 200 } })).toMatch(/the package unpacks to more than the limit of/);
  });

  it('a directory entry that points at another entry\'s bytes is refused (how the densest zip bombs are built)', async () => {
    const bytes = workbook({ Purge: AND_TABLE });
    const view = new DataView(bytes.buffer);
    // Point the second central directory entry at the first entry's local header.
    const end = bytes.length - 22;
    let at = view.getUint32(end + 16, true);
    const firstLocal = view.getUint32(at + 42, true);
    at += 46 + view.getUint16(at + 28, true) + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
    view.setUint32(at + 42, firstLocal, true);
    expect(await refusal(bytes)).toMatch(/: its local header names "[^"]+" \(damaged file\)/);
  });

  it('an encrypted entry, a truncated file, a zip that is no workbook, a binary workbook and a password-protected one', async () => {
    const bytes = workbook({ Purge: AND_TABLE });
    const encrypted = bytes.slice();
    const view = new DataView(encrypted.buffer);
    const cd = view.getUint32(encrypted.length - 22 + 16, true);
    view.setUint16(cd + 8, view.getUint16(cd + 8, true) | 1, true);
    expect(await refusal(encrypted)).toMatch(/the workbook is encrypted \(part .*\); save it without a password/);
    expect(await refusal(bytes.subarray(0, bytes.length - 100))).toMatch(/truncated or damaged/);
    const notes = writeZip([storedEntry('notes.txt', new TextEncoder().encode('hello'))]);
    expect(await refusal(notes)).toMatch(/holds no workbook part/);
    const parts = await partsOf(bytes);
    const binary = patch(put(parts, 'xl/workbook.bin', 'binary'), '_rels/.rels', (x) => x.replace('Target="xl/workbook.xml"', 'Target="xl/workbook.bin"'));
    expect(await refusal(pack(binary))).toMatch(/the workbook is in the binary format \(part xl\/workbook\.bin\)/);
    const ole = new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0]);
    expect(await refusal(ole)).toMatch(/encrypted \(password-protected\) or an old \.xls file/);
  });
});

describe('nothing SheetJS skips is lost silently', () => {
  it('a shared-string index out of range is an error at its cell, and the cells SheetJS dropped with it are errors too', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const crafted = patch(parts, SHEET1, (x) => x.replace('<c r="C6"><v>1</v></c>', '<c r="C6" t="s"><v>999</v></c>'));
    const grid = await (await opened(pack(crafted))).readGrid('Purge');
    const problems = grid.readProblems ?? [];
    expect(problems.filter((p) => p.code === 'shared-string-out-of-range').map(brief)).toEqual([{ severity: 'error', code: 'shared-string-out-of-range', cell: 'C6' }]);
    // SheetJS (0.18.5) gives up on the whole sheet: every other cell with a value is named, none is lost.
    expect(grid.cells).toEqual([]);
    const unreadable = problems.filter((p) => p.code === 'unreadable-cell');
    expect(unreadable.map(brief)).toEqual(['A1:A6', 'B1:B6', 'C1:C5'].map((cell) => ({ severity: 'error', code: 'unreadable-cell', cell })));
    expect(readSpecTables(grid).problems.filter((p) => p.severity === 'error')).toHaveLength(4);
  });

  it('hidden rows, hidden columns and hidden sheets are warnings at their place', async () => {
    const bytes = workbook({ Purge: AND_TABLE, Notes: [['spare']] }, (book) => {
      book.Sheets.Purge!['!rows'] = [undefined!, undefined!, undefined!, { hidden: true }, { hidden: true }];
      book.Sheets.Purge!['!cols'] = [undefined!, { hidden: true, wch: 8 }];
      book.Workbook = { Sheets: [{ Hidden: 0 }, { Hidden: 1 }] };
    });
    const host = await opened(bytes);
    const grid = await host.readGrid('Purge');
    expect(grid.readProblems!.map(brief)).toEqual([
      { severity: 'warning', code: 'hidden-rows', cell: 'A4:XFD5' },
      { severity: 'warning', code: 'hidden-columns', cell: 'B1:B1048576' },
    ]);
    expect(grid.readProblems![0]!.message).toBe('rows 4 to 5 are hidden in Excel; read like any other row');
    expect(host.fileProblems().map((p) => ({ ...brief(p), sheet: p.sheet }))).toEqual([{ severity: 'warning', code: 'hidden-sheet', cell: 'A1', sheet: 'Notes' }]);
    // Handed to the table that holds them: warnings, so its claims stand.
    const table = readSpecTables(grid).tables[0]!;
    expect(table.problems.map((p) => p.code)).toEqual(expect.arrayContaining(['hidden-rows', 'hidden-columns']));
  });

  it('a formula cell is a warning saying which computed value was used, even a wrong one', async () => {
    const bytes = workbook({ Purge: AND_TABLE }, (book) => {
      book.Sheets.Purge!.C6 = { t: 'n', v: 0, f: 'A6*B6+1' }; // the stored value disagrees with the formula
      book.Sheets.Purge!.C3 = { t: 'n', v: 0, f: 'A3*B3' };
      book.Sheets.Purge!.C4 = { t: 'n', v: 0, f: 'A4*B4' };
    });
    const grid = await (await opened(bytes)).readGrid('Purge');
    expect(grid.readProblems!.map(brief)).toEqual([
      { severity: 'warning', code: 'formula-cell', cell: 'C3:C4' },
      { severity: 'warning', code: 'formula-cell', cell: 'C6' },
    ]);
    expect(grid.readProblems![1]!.message).toBe('formula cell: its last computed value 0 was used (formulas are not recalculated here)');
    expect(grid.cells[5]![2]).toBe(0);
  });

  it('merged areas come with the grid, and a range read keeps those it touches', async () => {
    const host = await opened(workbook({ Purge: AND_TABLE }, (book) => void (book.Sheets.Purge!['!merges'] = [XLSX.utils.decode_range('A1:B1')])));
    expect((await host.readGrid('Purge')).merges).toEqual(['A1:B1']);
    expect((await host.readGrid('Purge', 'A1:C3')).merges).toEqual(['A1:B1']);
    expect((await host.readGrid('Purge', 'A2:C6')).merges).toEqual([]);
  });

  it('cells past Excel\'s last column are an error, not dropped', async () => {
    const parts = await partsOf(workbook({ Purge: AND_TABLE }));
    const crafted = patch(parts, SHEET1, (x) => x.replace('</row></sheetData>', '<c r="XFE6"><v>1</v></c></row></sheetData>'));
    const grid = await (await opened(pack(crafted))).readGrid('Purge');
    expect(grid.readProblems!.filter((p) => p.code === 'cut-by-limit').map((p) => p.message)).toEqual([
      "1 cell past Excel's last row or column (the first at XFE6) could not be read",
    ]);
  });
});

describe('Excel tables by name', () => {
  const withTable = async () => {
    const parts = await partsOf(workbook({ Notes: [['see Purge']], Purge: [['title'], [], ...AND_TABLE] }));
    let crafted = put(parts, 'xl/tables/table1.xml', '<?xml version="1.0"?><table xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" id="1" name="Table1" displayName="tblPurge" ref="A3:C8"/>');
    crafted = put(crafted, 'xl/worksheets/_rels/sheet2.xml.rels', '<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/table" Target="../tables/table1.xml"/></Relationships>');
    return opened(pack(crafted));
  };

  it('lists the tables with their sheet and range, and resolves a name to them (any case)', async () => {
    const host = await withTable();
    expect(host.tables()).toEqual([{ name: 'tblPurge', sheet: 'Purge', range: 'A3:C8' }]);
    expect(host.resolveRange('TBLPURGE')).toEqual({ ok: true, value: { sheet: 'Purge', range: 'A3:C8' } });
    expect(host.resolveRange('B2:C3', 'Notes')).toEqual({ ok: true, value: { sheet: 'Notes', range: 'B2:C3' } });
  });

  it('an unknown name is one error listing the tables there are', async () => {
    const r = (await withTable()).resolveRange('tblPurg');
    expect(!r.ok && r.error).toMatch(/"tblPurg" is neither an A1 range such as A1:H20 nor a table of .*book\.xlsx \(tables: tblPurge\)/);
  });
});
