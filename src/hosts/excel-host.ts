// WorkbookHost over Office.js: the live workbook in Excel. Big ranges go in blocks of rows that
// keep each request under Excel on the web's 5 MB limit; values and formulas are written
// before any format; results always go to a new sheet, checked empty before writing.
import {
  footerText,
  LOOKS,
  PAGE_FOOTER,
  STATUS_LOOKS,
  type BlockCell,
  type CellStyle,
  type Look,
  type SheetBlock,
} from '../report/index.js';
import { cellAddress, columnLetters, type CellValue, type Grid } from '../table/index.js';
import type { WorkbookHost, WriteReport } from './workbook-host.js';
import { XL_ERROR, xlErrorCode, type XlContext, type XlRange, type XlRun, type XlSupports, type XlWorksheet } from './excel-api.js';
import {
  PAYLOAD_BUDGET,
  cellFromExcel,
  formulaInput,
  localAddress,
  readBlockRows,
  rowBlocks,
  rowWriteBytes,
  topLeftOf,
} from './excel-cells.js';
import { freeSheetName } from './xlsx-write.js';
import { appendAll, maxOf } from '../logic/index.js';

/** An Excel table (ListObject) the user may pick instead of a selection. */
export interface NamedTable {
  readonly name: string;
  readonly sheet: string;
  /** A1 range without the sheet name, header row included. */
  readonly range: string;
}

export interface ExcelHost extends WorkbookHost {
  /** The sheet and A1 range of the current selection. */
  selection(): Promise<{ sheet: string; range: string; cells: number }>;
  listTables(): Promise<NamedTable[]>;
  /** Show a cell or range to the user: activate its sheet and select it. */
  selectCell(sheet: string, cell: string): Promise<void>;
}

/** Something in the workbook stopped the host; the message names the sheet and range. */
export class ExcelHostError extends Error {
  constructor(
    message: string,
    readonly code?: string,
  ) {
    super(message);
    this.name = 'ExcelHostError';
  }
}

/** Points per character of column width (Calibri 11: 8.43 characters = 48 pt), from memory. */
const POINTS_PER_CHAR = 5.7;
/** Estimated request bytes of one format command. */
const FORMAT_COMMAND_BYTES = 400;

async function syncOrExplain(context: XlContext, what: string): Promise<void> {
  try {
    await context.sync();
  } catch (error) {
    const code = xlErrorCode(error);
    const detail = error instanceof Error ? error.message : String(error);
    throw new ExcelHostError(`${what}: ${detail}`, code);
  }
}

function isTooLarge(error: unknown): boolean {
  const code = error instanceof ExcelHostError ? error.code : xlErrorCode(error);
  return code === XL_ERROR.requestTooLarge || code === XL_ERROR.responseTooLarge;
}

/** Read `rows` x `columns` cells of `range` from row `start`, halving the block when Excel finds it too large. */
async function readRows(context: XlContext, range: XlRange, start: number, rows: number, columns: number, where: string): Promise<CellValue[][]> {
  const part = range.getCell(start, 0).getResizedRange(rows - 1, columns - 1);
  part.load('values,valueTypes,numberFormat');
  try {
    await syncOrExplain(context, `reading ${where}`);
  } catch (error) {
    if (!isTooLarge(error) || rows === 1) throw error;
    const half = Math.ceil(rows / 2);
    const first = await readRows(context, range, start, half, columns, where);
    return first.concat(await readRows(context, range, start + half, rows - half, columns, where));
  }
  return part.values.map((row, r) => row.map((v, c) => cellFromExcel(v, part.valueTypes[r]![c]!, part.numberFormat[r]![c]!)));
}

async function readRange(context: XlContext, sheet: string, range: XlRange, where: string, supports: XlSupports): Promise<Grid> {
  range.load('address,rowCount,columnCount,isNullObject');
  await syncOrExplain(context, `reading ${where}`);
  if (range.isNullObject) return { sheet, origin: 'A1', cells: [] };
  const origin = topLeftOf(range.address);
  const rows = range.rowCount;
  const columns = range.columnCount;
  const per = readBlockRows(columns);
  const cells: CellValue[][] = [];
  for (let start = 0; start < rows; start += per) {
    appendAll(cells, await readRows(context, range, start, Math.min(per, rows - start), columns, where));
  }
  return { sheet, origin, cells, ...(await readMerges(context, sheet, range, origin, where, supports)) };
}

/**
 * The merged areas of a range read (ExcelApi 1.13: those whose top-left cell is in it). Where
 * this Excel lacks 1.13, or Excel refuses (over 512 areas), one info problem at the range's
 * top-left cell says what was not read; role cells are then read as without merges.
 */
async function readMerges(context: XlContext, sheet: string, range: XlRange, origin: string, where: string, supports: XlSupports): Promise<Pick<Grid, 'merges' | 'readProblems'>> {
  const notRead = (why: string): Pick<Grid, 'readProblems'> => ({
    readProblems: [
      {
        severity: 'info',
        code: 'merges-not-read',
        sheet,
        cell: origin,
        message: `merged cells of ${where} not read (${why}): a role word over merged cells is read as covering the blank cells on its right`,
      },
    ],
  });
  if (!supports('1.13')) return notRead('this Excel lacks ExcelApi 1.13');
  const areas = range.getMergedAreasOrNullObject();
  areas.load('isNullObject,address');
  try {
    await syncOrExplain(context, `reading the merged cells of ${where}`);
  } catch (error) {
    return notRead(error instanceof Error ? error.message : String(error));
  }
  return { merges: areas.isNullObject ? [] : areaAddresses(areas.address) };
}

/** "B2:D2" and "F2:G2" from "'It''s, here'!B2:D2,'It''s, here'!F2:G2": split at commas outside quotes. */
export function areaAddresses(address: string): string[] {
  const parts: string[] = [];
  let quoted = false;
  let start = 0;
  for (let i = 0; i <= address.length; i++) {
    const c = address[i];
    if (c === "'") quoted = !quoted;
    else if ((c === ',' && !quoted) || i === address.length) {
      const part = address.slice(start, i).trim();
      if (part !== '') parts.push(localAddress(part));
      start = i + 1;
    }
  }
  return parts;
}

const OFFICE_ALIGN = { left: 'Left', center: 'Center', right: 'Right' } as const;

function look(range: XlRange, l: Look): void {
  if (l.bold) range.format.font.bold = true;
  if (l.italic) range.format.font.italic = true;
  if (l.color) range.format.font.color = l.color;
  if (l.fontName) range.format.font.name = l.fontName;
  if (l.size) range.format.font.size = l.size;
  if (l.fill) range.format.fill.color = l.fill;
  if (l.wrap) range.format.wrapText = true;
  if (l.align) range.format.horizontalAlignment = OFFICE_ALIGN[l.align];
}

/** Runs of equal style along each row: one format command per run instead of per cell. */
function styleRuns(rows: SheetBlock['rows']): { row: number; from: number; to: number; style: CellStyle }[] {
  const runs: { row: number; from: number; to: number; style: CellStyle }[] = [];
  rows.forEach((cells, r) => {
    let c = 0;
    while (c < cells.length) {
      const style = cells[c]?.style;
      if (!style) {
        c++;
        continue;
      }
      let end = c;
      while (end + 1 < cells.length && cells[end + 1]?.style === style) end++;
      runs.push({ row: r, from: c, to: end, style });
      c = end + 1;
    }
  });
  return runs;
}

/**
 * Frozen rows (ExcelApi 1.7) and print setup (ExcelApi 1.9), where this Excel has them; the
 * manifest asks for 1.6 only, so an older Excel gets the sheet without them and is told so.
 */
function layout(sheet: XlWorksheet, block: SheetBlock, supports: XlSupports): string[] {
  const notApplied: string[] = [];
  if (block.freezeRows) {
    if (supports('1.7')) sheet.freezePanes.freezeRows(block.freezeRows);
    else notApplied.push(`the top ${block.freezeRows} rows are not frozen (this Excel lacks ExcelApi 1.7)`);
  }
  const print = block.print;
  if (print) {
    if (supports('1.9')) {
      const page = sheet.pageLayout;
      page.orientation = print.landscape ? 'Landscape' : 'Portrait';
      // Zero pages tall: as many pages down as needed, as fitToHeight="0" in the file (from memory).
      if (print.fitToWidth) page.zoom = { horizontalFitToPages: 1, verticalFitToPages: 0 };
      page.setPrintTitleRows(`$${print.titleRows.first}:$${print.titleRows.last}`);
      page.headersFooters.defaultForAllPages.leftFooter = footerText(print.footer);
      page.headersFooters.defaultForAllPages.rightFooter = PAGE_FOOTER;
    } else notApplied.push('the print setup (landscape, one page wide, title rows, footer) is not applied (this Excel lacks ExcelApi 1.9)');
  }
  return notApplied;
}

async function writeBlock(context: XlContext, sheet: XlWorksheet, block: SheetBlock, name: string, supports: XlSupports): Promise<string[]> {
  const width = maxOf(block.rows.map((r) => r.length), 1);
  const inputs = block.rows.map((row) => Array.from({ length: width }, (_, c) => formulaInput((row[c] ?? null) as BlockCell | null)));
  // 1. Values and formulas, in blocks of rows that fit a request.
  for (const { start, count } of rowBlocks(inputs.map(rowWriteBytes))) {
    const target = sheet.getRange(`A${start + 1}`).getResizedRange(count - 1, width - 1);
    target.formulas = inputs.slice(start, start + count);
    await syncOrExplain(context, `writing rows ${start + 1}-${start + count} of sheet ${name}`);
  }
  // 2. Formats, once the values are in, batched under the same budget.
  let pending = 0;
  const flush = async (force: boolean) => {
    if (pending > 0 && (force || pending + FORMAT_COMMAND_BYTES > PAYLOAD_BUDGET)) {
      await syncOrExplain(context, `formatting sheet ${name}`);
      pending = 0;
    }
  };
  for (const run of styleRuns(block.rows)) {
    await flush(false);
    look(sheet.getRange(`${cellAddress(run.row, run.from)}:${cellAddress(run.row, run.to)}`), LOOKS[run.style]);
    pending += FORMAT_COMMAND_BYTES;
  }
  for (const [c, chars] of (block.columnWidths ?? []).entries()) {
    await flush(false);
    sheet.getRange(`${columnLetters(c)}1`).format.columnWidth = Math.round(chars * POINTS_PER_CHAR);
    pending += FORMAT_COMMAND_BYTES;
  }
  for (const address of block.statusRanges ?? []) {
    for (const s of STATUS_LOOKS) {
      await flush(false);
      const cf = sheet.getRange(address).conditionalFormats.add('ContainsText');
      cf.textComparison.format.fill.color = s.fill;
      cf.textComparison.format.font.color = s.font;
      cf.textComparison.rule = { operator: 'Contains', text: s.text };
      pending += FORMAT_COMMAND_BYTES;
    }
  }
  const notApplied = layout(sheet, block, supports);
  sheet.activate();
  pending += FORMAT_COMMAND_BYTES;
  await flush(true);
  return notApplied;
}

/**
 * The Excel host over a batch runner and the requirement sets this Excel has: `Excel.run` and
 * `Office.context.requirements` in the pane, the test double in tests.
 */
export function createExcelHost(run: XlRun, supports: XlSupports): ExcelHost {
  return {
    listSheets: () =>
      run(async (context) => {
        const sheets = context.workbook.worksheets;
        sheets.load('items/name');
        await syncOrExplain(context, 'listing sheets');
        return sheets.items.map((s) => s.name);
      }),

    readGrid: (sheet, range) =>
      run(async (context) => {
        const ws = context.workbook.worksheets.getItem(sheet);
        const target = range ? ws.getRange(range) : ws.getUsedRangeOrNullObject(true);
        return readRange(context, sheet, target, range ? `${sheet}!${range}` : `sheet ${sheet}`, supports);
      }),

    writeSheet: (block) =>
      run(async (context): Promise<WriteReport> => {
        const sheets = context.workbook.worksheets;
        sheets.load('items/name');
        await syncOrExplain(context, 'listing sheets');
        const name = freeSheetName(block.name, sheets.items.map((s) => s.name));
        const sheet = sheets.add(name);
        const rows = Math.max(1, block.rows.length);
        const width = maxOf(block.rows.map((r) => r.length), 1);
        // Never write over a user's cell: the target must read empty before anything is written.
        const used = sheet.getRange('A1').getResizedRange(rows - 1, width - 1).getUsedRangeOrNullObject(true);
        used.load('isNullObject,address');
        await syncOrExplain(context, `adding sheet ${name}`);
        if (!used.isNullObject) throw new ExcelHostError(`sheet ${name} already has values in ${localAddress(used.address)}; nothing was written`);
        const notApplied = await writeBlock(context, sheet, block, name, supports);
        const cells = block.rows.reduce((n, row) => n + row.filter((c) => c !== null && (c.value !== null || c.formula !== undefined)).length, 0);
        return { sheet: name, range: `A1:${cellAddress(rows - 1, width - 1)}`, cells, ...(notApplied.length > 0 ? { notApplied } : {}) };
      }),

    selection: () =>
      run(async (context) => {
        const range = context.workbook.getSelectedRange();
        range.load('address,rowCount,columnCount');
        range.worksheet.load('name');
        await syncOrExplain(context, 'reading the selection');
        return { sheet: range.worksheet.name, range: localAddress(range.address), cells: range.rowCount * range.columnCount };
      }),

    listTables: () =>
      run(async (context) => {
        const tables = context.workbook.tables;
        tables.load('items/name');
        await syncOrExplain(context, 'listing tables');
        const found = tables.items.map((t) => {
          const range = t.getRange();
          range.load('address');
          t.worksheet.load('name');
          return { table: t, range };
        });
        await syncOrExplain(context, 'listing tables');
        return found.map(({ table, range }) => ({ name: table.name, sheet: table.worksheet.name, range: localAddress(range.address) }));
      }),

    selectCell: (sheet, cell) =>
      run(async (context) => {
        const ws = context.workbook.worksheets.getItem(sheet);
        ws.activate();
        ws.getRange(cell).select();
        await syncOrExplain(context, `selecting ${sheet}!${cell}`);
      }),
  };
}

/** The host over the real Office.js `Excel.run`, for the task pane inside Excel. */
export function officeExcelHost(): ExcelHost {
  return createExcelHost(
    (batch) => Excel.run((context) => batch(context)),
    (version) => Office.context.requirements.isSetSupported('ExcelApi', version),
  );
}
