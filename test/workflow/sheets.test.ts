// The sheets a run writes keep their column titles in view and their cross-sheet formulas
// right, in every host: the summary on a results sheet names the live check sheet its table
// got, even when the name it asked for is taken; the record and the live check are frozen at
// their column-title rows in the file host (<pane>) and in Excel (freezePanes, ExcelApi 1.7).
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createExcelHost } from '../../src/hosts/excel-host.js';
import { examine, readGrids, readTables, sheetsToWrite, writeSheets } from '../../src/workflow/index.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';
import { ExcelDouble } from '../hosts/excel-double.js';
import { partsOf } from '../hosts/workbook-parts.js';
import { runCli, scratch } from '../cli/run-cli.js';
import { GOOD, RowsHost, xlsxBytes } from './workbooks.js';

async function blocksOf(host: RowsHost, sheet = 'Vote'): Promise<SheetBlock[]> {
  const grids = await readGrids(host, { sheet, xReading: 'none' }, GOOD.file);
  if (!grids.ok) throw new Error(grids.error.message);
  const tables = readTables(grids.value, { sheet, xReading: 'none' });
  if (!tables.ok) throw new Error(tables.error.message);
  return sheetsToWrite(examine(tables.value, { source: GOOD.file }));
}

/** The summary cell of the results sheet among the blocks a host was given. */
const summaryOf = (written: readonly SheetBlock[]) => written.find((b) => b.name.endsWith(' results'))!.rows.find((r) => r[0]?.value === 'Combinations that differ (live check)')![1]!;

describe('writing the sheets of a run', () => {
  it('names the sheets as asked when the names are free, and the summary names the live check sheet', async () => {
    const host = new RowsHost(GOOD);
    const reports = await writeSheets(host, await blocksOf(host));
    expect(reports.map((r) => r.sheet)).toEqual(['Vote live check', 'Vote results', 'Vote record']);
    expect(summaryOf(host.written).formula).toMatch(/^COUNTIF\('Vote live check'!I7:I14,"DIFFERS"\)$/);
  });

  it('writes the live check before the results sheet that names it, so Excel finds the sheet when it takes the formula', async () => {
    const host = new RowsHost(GOOD);
    await writeSheets(host, await blocksOf(host));
    expect(host.written.map((b) => b.name)).toEqual(['Vote live check', 'Vote results', 'Vote record']);
  });

  it("never takes a user's sheet name: a taken live check name gets a suffix, and the summary follows it", async () => {
    const book = { ...GOOD, sheets: { ...GOOD.sheets, 'vote LIVE check': [['mine']] } };
    const host = new RowsHost(book);
    const reports = await writeSheets(host, await blocksOf(host));
    expect(reports.map((r) => r.sheet)).toEqual(['Vote live check (2)', 'Vote results', 'Vote record']);
    expect(summaryOf(host.written).formula).toMatch(/^COUNTIF\('Vote live check \(2\)'!I7:I14,"DIFFERS"\)$/);
  });

  it('a sheet name with a quote is quoted with the quote doubled in the summary', async () => {
    const book = { ...GOOD, sheets: { "Op's vote": GOOD.sheets.Vote! } };
    const host = new RowsHost(book);
    await writeSheets(host, await blocksOf(host, "Op's vote"));
    expect(summaryOf(host.written).formula).toMatch(/^COUNTIF\('Op''s vote live check'!I7:I14,"DIFFERS"\)$/);
  });

  it('in Excel (ExcelApi 1.7 and later) the record and the live check are frozen at their column titles; the results sheet is not', async () => {
    const double = new ExcelDouble();
    double.addSheet('Vote', GOOD.sheets.Vote!.map((r) => [...r]));
    const host = createExcelHost(double.run, double.supports);
    const blocks = await blocksOf(new RowsHost(GOOD));
    const reports = await writeSheets(host, blocks);
    expect(reports.map((r) => r.sheet).sort()).toEqual(blocks.map((b) => b.name).sort());
    const frozen = blocks.map((b) => double.sheet(b.name)!.frozenRows);
    const titleRows = blocks.map((b) => b.rows.findIndex((r) => r[0]?.value === '#' || r[0]?.value === 'Step') + 1);
    expect(frozen).toEqual([0, titleRows[1], titleRows[2]]);
    expect(titleRows[1]).toBeGreaterThan(0);
    expect(titleRows[2]).toBeLessThanOrEqual(12);
    expect(double.read('Vote live check', `A${titleRows[1]}:A${titleRows[1]}`)).toEqual([['#']]);
    expect(double.read('Vote record', `A${titleRows[2]}:B${titleRows[2]}`)).toEqual([['Step', 'Test ID']]);
  });

  it('in Excel (ExcelApi 1.9 and later) the record and the live check print their column titles on every page', async () => {
    const double = new ExcelDouble();
    double.addSheet('Vote', GOOD.sheets.Vote!.map((r) => [...r]));
    const blocks = await blocksOf(new RowsHost(GOOD));
    await writeSheets(createExcelHost(double.run, double.supports), blocks);
    const heading = (b: (typeof blocks)[number]) => b.rows.findIndex((r) => r[0]?.value === '#' || r[0]?.value === 'Step') + 1;
    expect(blocks.map((b) => double.sheet(b.name)!.print.titleRows)).toEqual(['$1:$1', `$${heading(blocks[1]!)}:$${heading(blocks[1]!)}`, `$${heading(blocks[2]!)}:$${heading(blocks[2]!)}`]);
  });

  it('in a results workbook the record and live check sheets hold a frozen pane just below their column titles', async () => {
    const text = await resultsWorkbookParts();
    const workbook = text('xl/workbook.xml');
    const rels = text('xl/_rels/workbook.xml.rels');
    const partOf = (sheet: string) => {
      const id = new RegExp(`<sheet [^>]*name="${sheet}"[^>]*r:id="([^"]+)"`).exec(workbook)![1]!;
      return `xl/${new RegExp(`Id="${id}"[^>]*Target="([^"]+)"`).exec(rels)![1]!}`;
    };
    const blocks = await blocksOf(new RowsHost(GOOD));
    for (const [sheet, title] of [['Vote live check', '#'], ['Vote record', 'Step']] as const) {
      const block = blocks.find((b) => b.name === sheet)!;
      const row = block.rows.findIndex((r) => r[0]?.value === title) + 1;
      expect(text(partOf(sheet))).toContain(`<pane ySplit="${row}" topLeftCell="A${row + 1}" activePane="bottomLeft" state="frozen"/>`);
    }
    expect(text(partOf('Vote results'))).not.toContain('<pane');
  });

  it('in a results workbook the record and live check print their column titles on every page, the results sheet its title row', async () => {
    const workbook = (await resultsWorkbookParts())('xl/workbook.xml');
    const blocks = await blocksOf(new RowsHost(GOOD));
    const sheetIds = [...workbook.matchAll(/<sheet [^>]*name="([^"]+)"/g)].map((m) => m[1]!);
    const titlesOf = (sheet: string) => new RegExp(`name="_xlnm.Print_Titles" localSheetId="${sheetIds.indexOf(sheet)}">'${sheet}'!\\$(\\d+):\\$(\\d+)<`).exec(workbook)?.slice(1);
    for (const [sheet, title] of [['Vote live check', '#'], ['Vote record', 'Step']] as const) {
      const row = String(blocks.find((b) => b.name === sheet)!.rows.findIndex((r) => r[0]?.value === title) + 1);
      expect(titlesOf(sheet)).toEqual([row, row]);
    }
    expect(titlesOf('Vote results')).toEqual(['1', '1']);
  });
});

/** `analyze -o` on the good workbook: each part of the results workbook as text. */
async function resultsWorkbookParts(): Promise<(part: string) => string> {
  const dir = scratch();
  const input = join(dir, 'good.xlsx');
  writeFileSync(input, xlsxBytes({ ...GOOD, sheets: { Vote: GOOD.sheets.Vote! } }));
  const out = join(dir, 'results.xlsx');
  expect((await runCli('analyze', input, '-o', out)).code).toBe(0);
  const parts = partsOf(new Uint8Array(readFileSync(out)));
  return (part) => new TextDecoder().decode(parts.get(part)!);
}
