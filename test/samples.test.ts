// The committed sample files are what the readable source says (cell values, not bytes:
// a zip written twice differs in its timestamps).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { describe, expect, it } from 'vitest';
import { LAYOUT_WORKBOOKS, SAMPLE_DIR, SAMPLE_WORKBOOKS, layoutWorkbook, sampleCsv, sampleWorkbook } from '../scripts/make-samples.js';
import { spindleCsv } from '../sample-workbooks/source/capper-cell.js';

/** Every non-empty cell of a sheet as "address -> type:value". */
function cellMap(sheet: XLSX.WorkSheet): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [address, cell] of Object.entries(sheet)) {
    if (address.startsWith('!')) continue;
    const c = cell as XLSX.CellObject;
    out[address] = `${c.t}:${String(c.v)}`;
  }
  return out;
}

describe('sample workbooks', () => {
  for (const sample of SAMPLE_WORKBOOKS) {
    it(`${sample.file} holds the cells its source describes`, () => {
      const committed = XLSX.read(readFileSync(join(SAMPLE_DIR, sample.file)));
      const fresh = sampleWorkbook(sample);
      expect(committed.SheetNames).toEqual(fresh.SheetNames);
      for (const name of fresh.SheetNames) {
        expect(cellMap(committed.Sheets[name]!), name).toEqual(cellMap(fresh.Sheets[name]!));
      }
    });
  }

  for (const sample of LAYOUT_WORKBOOKS) {
    it(`${sample.file} holds the cells and merged areas its source describes`, () => {
      const committed = XLSX.read(readFileSync(join(SAMPLE_DIR, sample.file)));
      const fresh = layoutWorkbook(sample);
      expect(committed.SheetNames).toEqual(fresh.SheetNames);
      for (const name of fresh.SheetNames) {
        expect(cellMap(committed.Sheets[name]!), name).toEqual(cellMap(fresh.Sheets[name]!));
        const merges = (ws: XLSX.WorkSheet): string[] => (ws['!merges'] ?? []).map((m) => XLSX.utils.encode_range(m)).sort();
        expect(merges(committed.Sheets[name]!), name).toEqual(merges(fresh.Sheets[name]!));
      }
    });
  }

  it('the CSV sample is the spindle table, semicolon-separated, as its source says', () => {
    const committed = readFileSync(join(SAMPLE_DIR, spindleCsv.file), 'utf8');
    expect(committed).toBe(sampleCsv());
    expect(committed.startsWith('\uFEFFinput;')).toBe(true);
  });

  it('the broken workbook holds each kind of bad cell', () => {
    const sheet = sampleWorkbook(SAMPLE_WORKBOOKS[1]!).Sheets['Air supply vote']!;
    const values = Object.values(cellMap(sheet));
    expect(values).toContain('n:2');
    expect(values).toContain('s:X');
    expect(values).toContain(`e:${0x2a}`);
  });
});
