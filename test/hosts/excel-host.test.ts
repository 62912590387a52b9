// The Excel host against the strict Office.js double: what it reads, what it writes and where,
// in requests that fit Excel on the web's 5 MB limit.
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { areaAddresses, createExcelHost, ExcelHostError } from '../../src/hosts/excel-host.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { cellFromExcel, isDateFormat, rowBlocks } from '../../src/hosts/excel-cells.js';
import type { BlockCell, SheetBlock } from '../../src/report/sheet-block.js';
import { column, DoubleError, ExcelDouble, LIMIT, type SeedCell } from './excel-double.js';

function setup(sheets: Record<string, { rows: SeedCell[][]; origin?: string }> = {}) {
  const double = new ExcelDouble();
  for (const [name, { rows, origin }] of Object.entries(sheets)) double.addSheet(name, rows, origin);
  return { double, host: createExcelHost(double.run, double.supports) };
}

const cell = (value: BlockCell['value'], extra: Partial<BlockCell> = {}): BlockCell => ({ value, ...extra });

describe('the double is as strict as Office.js', () => {
  test('reading a property before load and sync throws PropertyNotLoaded', async () => {
    const { double } = setup({ S: { rows: [[1]] } });
    await double.run(async (context) => {
      const range = context.workbook.worksheets.getItem('S').getRange('A1');
      expect(() => range.values).toThrow(expect.objectContaining({ code: 'PropertyNotLoaded' }));
      range.load('values');
      expect(() => range.values).toThrow(expect.objectContaining({ code: 'PropertyNotLoaded' }));
      await context.sync();
      expect(range.values).toEqual([[1]]);
    });
  });

  test('page layout and frozen panes throw ApiNotFound in an Excel below their requirement set', async () => {
    const { double } = setup({ S: { rows: [] } });
    double.excelApi = '1.6';
    await double.run(async (context) => {
      const sheet = context.workbook.worksheets.getItem('S');
      expect(() => sheet.pageLayout).toThrow(expect.objectContaining({ code: 'ApiNotFound' }));
      expect(() => sheet.freezePanes).toThrow(expect.objectContaining({ code: 'ApiNotFound' }));
    });
  });

  test('print title rows must be whole rows, and a page layout property reads only after load', async () => {
    const { double } = setup({ S: { rows: [] } });
    await double.run(async (context) => {
      const page = context.workbook.worksheets.getItem('S').pageLayout;
      expect(() => page.orientation).toThrow(expect.objectContaining({ code: 'PropertyNotLoaded' }));
      page.setPrintTitleRows('A1:C1');
      await expect(context.sync()).rejects.toMatchObject({ code: 'InvalidArgument' });
    });
  });

  test('values of the wrong shape fail the sync with InvalidArgument', async () => {
    const { double } = setup({ S: { rows: [] } });
    await double.run(async (context) => {
      context.workbook.worksheets.getItem('S').getRange('A1:B2').values = [[1, 2]];
      await expect(context.sync()).rejects.toMatchObject({ code: 'InvalidArgument' });
    });
  });

  test('a request over 5 MB fails the sync', async () => {
    const { double } = setup({ S: { rows: [] } });
    const big = Array.from({ length: 60_000 }, () => ['x'.repeat(100)]);
    await double.run(async (context) => {
      context.workbook.worksheets.getItem('S').getRange('A1:A60000').values = big;
      await expect(context.sync()).rejects.toBeInstanceOf(DoubleError);
    });
    expect(double.syncs.at(-1)!.failed).toBe('RequestPayloadSizeLimitExceeded');
    expect(double.read('S', 'A1')).toEqual([['']]);
  });

  test('a sheet that does not exist fails the sync with ItemNotFound', async () => {
    const { double } = setup();
    await double.run(async (context) => {
      context.workbook.worksheets.getItem('Nowhere').getRange('A1').load('values');
      await expect(context.sync()).rejects.toMatchObject({ code: 'ItemNotFound' });
    });
  });
});

describe('reading', () => {
  test('lists the sheets in workbook order', async () => {
    const { host } = setup({ Capper: { rows: [[1]] }, Notes: { rows: [] } });
    expect(await host.listSheets()).toEqual(['Capper', 'Notes']);
  });

  test('reads the used range with its top-left address', async () => {
    const { host } = setup({ Capper: { rows: [['Guard', 'Run'], [1, 0]], origin: 'B3' } });
    expect(await host.readGrid('Capper')).toEqual({ sheet: 'Capper', origin: 'B3', cells: [['Guard', 'Run'], [1, 0]], merges: [] });
  });

  test('keeps the kind of each cell: empty, text, number, boolean, error, date', async () => {
    const { host } = setup({ S: { rows: [['a', null, 2, true, { error: '#N/A' }, { date: 45000 }]] } });
    const grid = await host.readGrid('S');
    expect(grid.cells).toEqual([['a', null, 2, true, { error: '#N/A' }, { date: 45000 }]]);
  });

  test('reads only the A1 range asked for', async () => {
    const { host } = setup({ S: { rows: [[1, 2, 3], [4, 5, 6], [7, 8, 9]] } });
    expect(await host.readGrid('S', 'B2:C3')).toEqual({ sheet: 'S', origin: 'B2', cells: [[5, 6], [8, 9]], merges: [] });
  });

  test('an empty sheet reads as an empty grid', async () => {
    const { host } = setup({ Empty: { rows: [] } });
    expect(await host.readGrid('Empty')).toEqual({ sheet: 'Empty', origin: 'A1', cells: [] });
  });

  test('a missing sheet rejects with a message naming it', async () => {
    const { host } = setup({ S: { rows: [] } });
    await expect(host.readGrid('Capper')).rejects.toThrow(/sheet Capper/);
  });

  test('a big range is read in several requests, each under 5 MB', async () => {
    const rows = Array.from({ length: 16_000 }, (_, r) => [`row ${r}`, r % 2, r % 3 === 0, 'long text '.repeat(40)]);
    const { double, host } = setup({ Big: { rows } });
    const grid = await host.readGrid('Big');
    expect(grid.cells.length).toBe(16_000);
    expect(grid.cells[15_999]).toEqual(rows[15_999]);
    const ok = double.syncs.filter((s) => !s.failed);
    expect(ok.length).toBeGreaterThan(2);
    expect(Math.max(...ok.map((s) => s.responseBytes))).toBeLessThanOrEqual(LIMIT);
  });

  test('a block Excel finds too large is read again in halves', async () => {
    const wide = 'w'.repeat(2000);
    const rows = Array.from({ length: 6000 }, () => [wide, wide]);
    const { double, host } = setup({ Wide: { rows } });
    const grid = await host.readGrid('Wide');
    expect(grid.cells.length).toBe(6000);
    expect(double.syncs.some((s) => s.failed === 'ResponsePayloadSizeLimitExceeded')).toBe(true);
  });

  test('the selection comes back as sheet and A1 range', async () => {
    const { double, host } = setup({ 'Capper cell': { rows: [[1]] } });
    double.selection = { sheet: 'Capper cell', range: 'B2:D9' };
    expect(await host.selection()).toEqual({ sheet: 'Capper cell', range: 'B2:D9', cells: 24 });
  });

  test('lists Excel tables with their sheet and range', async () => {
    const { double, host } = setup({ Capper: { rows: [[1]] } });
    double.tables.push({ name: 'CapperSpec', sheet: 'Capper', range: 'A1:F12' });
    expect(await host.listTables()).toEqual([{ name: 'CapperSpec', sheet: 'Capper', range: 'A1:F12' }]);
  });

  test('selecting a problem cell activates its sheet and selects the cell', async () => {
    const { double, host } = setup({ A: { rows: [] }, Capper: { rows: [] } });
    await host.selectCell('Capper', 'D7');
    expect(double.activeSheet).toBe('Capper');
    expect(double.selection).toEqual({ sheet: 'Capper', range: 'D7' });
  });
});

describe('writing', () => {
  const block: SheetBlock = {
    name: 'Results',
    rows: [
      [cell('Results', { style: 'title' })],
      [cell('Input', { style: 'heading' }), cell('Form', { style: 'heading' }), cell('Status', { style: 'heading' })],
      [cell(1), cell(true, { formula: 'AND(A3=1,NOT(B3))' }), cell('OK', { formula: 'IF(B3,"OK","DIFFERS")', style: 'status' })],
      [cell('1'), null, cell('=not a formula')],
    ],
    columnWidths: [12, 30],
    statusRanges: ['C3:C3'],
  };

  test('adds a new sheet with values and live formulas, and says where', async () => {
    const { double, host } = setup({ Capper: { rows: [[1]] } });
    const report = await host.writeSheet(block);
    expect(report).toEqual({ sheet: 'Results', range: 'A1:C4', cells: 9 });
    expect(double.read('Results', 'A3:C3')).toEqual([[1, '=AND(A3=1,NOT(B3))', '=IF(B3,"OK","DIFFERS")']]);
    expect(double.activeSheet).toBe('Results');
  });

  const laidOut: SheetBlock = { ...block, freezeRows: 2, print: { landscape: true, fitToWidth: true, titleRows: { first: 1, last: 2 }, footer: 'Results of Purge!A2:C5 & more' } };

  test('where Excel has ExcelApi 1.9, the sheet prints as the block says and its heading rows are frozen', async () => {
    const { double, host } = setup();
    const report = await host.writeSheet(laidOut);
    expect(report.notApplied).toBeUndefined();
    const sheet = double.sheet('Results')!;
    expect(sheet.frozenRows).toBe(2);
    expect(sheet.print).toEqual({
      orientation: 'Landscape',
      zoom: { horizontalFitToPages: 1, verticalFitToPages: 0 },
      titleRows: '$1:$2',
      leftFooter: 'Results of Purge!A2:C5 && more',
      rightFooter: 'Page &P of &N',
    });
  });

  test('where Excel has only ExcelApi 1.6, the sheet is written without print setup and frozen rows, and the report says so', async () => {
    const { double, host } = setup();
    double.excelApi = '1.6';
    const report = await host.writeSheet(laidOut);
    expect(report.notApplied).toEqual([
      'the top 2 rows are not frozen (this Excel lacks ExcelApi 1.7)',
      'the print setup (landscape, one page wide, title rows, footer) is not applied (this Excel lacks ExcelApi 1.9)',
    ]);
    expect(double.sheet('Results')).toMatchObject({ frozenRows: 0, print: {} });
    expect(double.read('Results', 'A3:C3')).toEqual([[1, '=AND(A3=1,NOT(B3))', '=IF(B3,"OK","DIFFERS")']]);
  });

  test('with ExcelApi 1.7 the heading rows are frozen and only the print setup is left out', async () => {
    const { double, host } = setup();
    double.excelApi = '1.7';
    const report = await host.writeSheet(laidOut);
    expect(report.notApplied).toEqual(['the print setup (landscape, one page wide, title rows, footer) is not applied (this Excel lacks ExcelApi 1.9)']);
    expect(double.sheet('Results')).toMatchObject({ frozenRows: 2, print: {} });
  });

  test('text that Excel would take for a number or a formula stays text', async () => {
    const { double, host } = setup();
    await host.writeSheet(block);
    expect(double.read('Results', 'A4:C4')).toEqual([['1', '', '=not a formula']]);
    expect(await host.readGrid('Results', 'A4:C4')).toMatchObject({ cells: [['1', null, '=not a formula']] });
  });

  test('a taken sheet name gets a suffix and the user sheet is left as it was', async () => {
    const { double, host } = setup({ results: { rows: [['mine']] } });
    const report = await host.writeSheet(block);
    expect(report.sheet).toBe('Results (2)');
    expect(double.read('results', 'A1:C4')).toEqual([['mine', '', ''], ['', '', ''], ['', '', ''], ['', '', '']]);
  });

  test('values and formulas are all written before any format', async () => {
    const { double, host } = setup();
    await host.writeSheet(block);
    const lastValue = double.log.map((l) => l.startsWith('formulas') || l.startsWith('values')).lastIndexOf(true);
    const firstFormat = double.log.findIndex((l) => l.startsWith('format') || l.startsWith('conditionalFormat'));
    expect(lastValue).toBeGreaterThanOrEqual(0);
    expect(firstFormat).toBeGreaterThan(lastValue);
  });

  test('styles become formats: title large, headings bold on a fill', async () => {
    const { double, host } = setup();
    await host.writeSheet(block);
    expect(double.cellFormat('Results', 'A1')).toMatchObject({ 'font.bold': true, 'font.size': 14 });
    expect(double.cellFormat('Results', 'B2')).toMatchObject({ 'font.bold': true, 'fill.color': '#DCE6F0' });
  });

  test('column widths follow the block', async () => {
    const { double, host } = setup();
    await host.writeSheet(block);
    const sheet = double.sheet('Results')!;
    expect(sheet.columnWidths.get(column('A'))).toBeGreaterThan(0);
    expect(sheet.columnWidths.get(column('B'))!).toBeGreaterThan(sheet.columnWidths.get(column('A'))!);
  });

  test('status cells get a conditional format: DIFFERS red, OK green', async () => {
    const { double, host } = setup();
    await host.writeSheet(block);
    const rules = double.sheet('Results')!.conditionalFormats;
    expect(rules).toEqual([
      { range: 'C3', text: 'DIFFERS', fill: '#F4C7C3', font: '#8B0000' },
      { range: 'C3', text: 'OK', fill: '#CDE8C5', font: '#1E5B1E' },
    ]);
  });

  test('a big block is written in several requests, each under 5 MB', async () => {
    const rows = Array.from({ length: 40_000 }, (_, r) => [cell(r), cell(`step ${r} text `.repeat(4)), cell(r % 2 === 0, { formula: `ISEVEN(A${r + 1})` })]);
    const { double, host } = setup();
    const report = await host.writeSheet({ name: 'Steps', rows });
    expect(report.range).toBe('A1:C40000');
    expect(double.read('Steps', 'A40000:B40000')).toEqual([[39_999, rows[39_999]![1]!.value]]);
    const writes = double.syncs.filter((s) => s.commands.some((c) => c.startsWith('formulas')));
    expect(writes.length).toBeGreaterThan(1);
    expect(double.syncs.every((s) => !s.failed && s.requestBytes <= LIMIT)).toBe(true);
  });

  test('an unusable sheet name is cleaned rather than refused', async () => {
    const { host } = setup();
    const report = await host.writeSheet({ name: 'Results: capper/cell [draft] for the night shift', rows: [[cell(1)]] });
    expect(report.sheet.length).toBeLessThanOrEqual(31);
    expect(report.sheet).not.toMatch(/[\\/?*[\]:]/);
  });

  test('writing then reading gives the same values back (any text, number or boolean)', async () => {
    const value = fc.oneof(
      fc.integer({ min: -1e6, max: 1e6 }),
      fc.boolean(),
      fc.string({ minLength: 1, maxLength: 8 }).filter((s) => s.trim() !== ''),
      fc.constantFrom('1', 'TRUE', '=A1', "'x", '+1', '-', '2024-01-02', '12:30'),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(fc.array(value, { minLength: 1, maxLength: 4 }), { minLength: 1, maxLength: 5 }), async (rows) => {
        const { host } = setup();
        const width = Math.max(...rows.map((r) => r.length));
        await host.writeSheet({ name: 'R', rows: rows.map((r) => r.map((v) => cell(v))) });
        const grid = await host.readGrid('R', `A1:${String.fromCharCode(64 + width)}${rows.length}`);
        expect(grid.cells).toEqual(rows.map((r) => Array.from({ length: width }, (_, c) => (c < r.length ? r[c] : null))));
      }),
      { numRuns: 60 },
    );
  });
});

describe('cells and blocks', () => {
  test('date formats are told from number formats', () => {
    expect(['yyyy-mm-dd', 'd/m/yy', 'h:mm', '[$-409]mmm d', 'dd"."mm'].map(isDateFormat)).toEqual([true, true, true, true, true]);
    expect(['General', '0.00', '#,##0', '"days"0', '@'].map(isDateFormat)).toEqual([false, false, false, false, false]);
  });

  test('an Office.js error value keeps its text', () => {
    expect(cellFromExcel('#DIV/0!', 'Error', 'General')).toEqual({ error: '#DIV/0!' });
  });

  test('row blocks stay within the budget and cover every row once, in order', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 500 }), { maxLength: 200 }), fc.integer({ min: 500, max: 3000 }), (bytes, budget) => {
        const blocks = rowBlocks(bytes, budget);
        expect(blocks.flatMap((b) => Array.from({ length: b.count }, (_, i) => b.start + i))).toEqual(bytes.map((_, i) => i));
        for (const b of blocks) expect(bytes.slice(b.start, b.start + b.count).reduce((x, y) => x + y, 0)).toBeLessThanOrEqual(budget);
      }),
    );
  });

  test('a host error is an ExcelHostError carrying the Office.js code', async () => {
    const { host } = setup();
    const failure = await host.readGrid('Missing', 'A1').catch((e: unknown) => e);
    expect(failure).toBeInstanceOf(ExcelHostError);
    expect(failure).toMatchObject({ code: 'ItemNotFound' });
  });
});

describe('merged cells', () => {
  /** A role row whose 'input' is merged over A1:B1; C1 is blank and not merged. Invented data. */
  const PRESS: SeedCell[][] = [
    ['input', null, null, 'output'],
    ['Guard closed', 'Two-hand OK', 'Lamp test', 'Stroke permit'],
    [1, 1, 0, 1],
    [0, '-', 0, 0],
    [1, 0, 0, 0],
  ];
  const pressed = (excelApi: string) => {
    const { double, host } = setup({ Press: { rows: PRESS } });
    double.sheet('Press')!.merges.push('A1:B1');
    double.excelApi = excelApi;
    return { double, host };
  };

  test('with ExcelApi 1.13 the merged areas of the range read are in the grid, and the reader takes them', async () => {
    const grid = await pressed('1.13').host.readGrid('Press');
    expect(grid.merges).toEqual(['A1:B1']);
    expect(grid.readProblems).toBeUndefined();
    const read = readSpecTables(grid, { xReading: 'none' });
    // The merged 'input' covers A and B only: column C, blank in the role row, is no input, and says so.
    expect(read.tables[0]!.inputs.map((s) => s.header)).toEqual(['Guard closed', 'Two-hand OK']);
    expect(read.tables[0]!.problems.map((p) => [p.code, p.cell])).toEqual([['no-role', 'C2']]);
  });

  test('without ExcelApi 1.13 the grid has no merges and says once, as info at the range, what was not read', async () => {
    const { host } = pressed('1.9');
    const grid = await host.readGrid('Press');
    expect(grid.merges).toBeUndefined();
    expect(grid.readProblems).toEqual([
      {
        severity: 'info',
        code: 'merges-not-read',
        sheet: 'Press',
        cell: 'A1',
        message: 'merged cells of sheet Press not read (this Excel lacks ExcelApi 1.13): a role word over merged cells is read as covering the blank cells on its right',
      },
    ]);
    // As without merges: the blank C1 takes the role on its left.
    const read = readSpecTables(grid, { xReading: 'none' });
    expect(read.tables[0]!.inputs.map((s) => s.header)).toEqual(['Guard closed', 'Two-hand OK', 'Lamp test']);
    expect(read.tables[0]!.problems.filter((p) => p.code === 'merges-not-read')).toHaveLength(1);
  });

  test('the double has no getMergedAreasOrNullObject below ExcelApi 1.13, as Office.js', async () => {
    const { double } = pressed('1.12');
    await double.run(async (context) => {
      expect(() => context.workbook.worksheets.getItem('Press').getRange('A1:D5').getMergedAreasOrNullObject()).toThrow(expect.objectContaining({ code: 'ApiNotFound' }));
    });
  });

  test('a range read keeps the merged areas whose top-left cell is in it; none is an empty list', async () => {
    const { host, double } = pressed('1.13');
    double.sheet('Press')!.merges.push('C2:D2');
    expect((await host.readGrid('Press', 'B1:D5')).merges).toEqual(['C2:D2']);
    expect((await host.readGrid('Press', 'A3:D5')).merges).toEqual([]);
  });

  test('more merged areas than Excel returns (512) is an info problem with Excel\'s reason; the cells are still read', async () => {
    const { host, double } = pressed('1.13');
    const merges = double.sheet('Press')!.merges;
    for (let r = 10; r < 10 + 513; r++) merges.push(`A${r}:B${r}`);
    double.sheet('Press')!.cells.set(`${9 + 513},0`, { value: 'x', numberFormat: 'General', format: {} });
    const grid = await host.readGrid('Press');
    expect(grid.cells[0]).toEqual(['input', null, null, 'output']);
    expect(grid.readProblems?.map((p) => [p.code, p.severity])).toEqual([['merges-not-read', 'info']]);
    expect(grid.readProblems?.[0]!.message).toContain('more than 512 merged areas');
  });

  test('merged areas are split at commas outside quoted sheet names', () => {
    expect(areaAddresses('Press!A1:B1,Press!D1:E1')).toEqual(['A1:B1', 'D1:E1']);
    expect(areaAddresses("'It''s, here'!$A$1:$B$1, 'It''s, here'!D1:E1")).toEqual(['A1:B1', 'D1:E1']);
  });
});
