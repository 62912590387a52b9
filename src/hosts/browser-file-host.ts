// WorkbookHost over a workbook or CSV file opened in the browser (the standalone page).
// SheetJS parses the file only inside a Web Worker that runs the file host's own parsing
// worker (parse-worker.mjs), one job per worker, stopped after a time limit; plain grids come
// back. CSV text goes through our own parser (csv.ts). Results are new sheets of a copy of the
// workbook, offered as a download: the user's file is never changed.
import XLSX from 'xlsx';
import { fail, ok, type Result } from '../logic/result.js';
import type { SheetBlock } from '../report/sheet-block.js';
import { cellAddress, parseRange, restrictGrid } from '../spec/grid.js';
import type { Grid } from '../spec/types.js';
import { parseCsv } from '../spec/csv.js';
import type { WorkbookHost, WriteReport } from './workbook-host.js';
import { ERROR_CODES, freeSheetName, sheetFromBlock, sheetFromCells } from './xlsx-write.js';

export interface BrowserFileOptions {
  /** Starts the worker that runs parse-worker.mjs (taskpane/xlsx-worker.ts in the page). */
  readonly startWorker: () => Worker;
  readonly timeLimitMs?: number;
  readonly maxBytes?: number;
  readonly maxCells?: number;
}

/** Browser tabs have less room than the command line: smaller limits than file-host.ts. */
export const BROWSER_DEFAULTS = { timeLimitMs: 20_000, maxBytes: 30 * 1024 * 1024, maxCells: 5_000_000 } as const;

const ERROR_NAMES: Record<number, string> = Object.fromEntries(Object.entries(ERROR_CODES).map(([name, code]) => [code, name]));

type Answer = { ok: true; sheets?: unknown; bytes?: unknown } | { ok: false; message: string };

/** One job in a fresh worker, stopped when it takes longer than the limit. */
function runJob(job: Record<string, unknown>, transfer: Transferable[], options: BrowserFileOptions, what: string): Promise<Result<Answer>> {
  const limit = options.timeLimitMs ?? BROWSER_DEFAULTS.timeLimitMs;
  return new Promise((done) => {
    const worker = options.startWorker();
    const finish = (r: Result<Answer>) => {
      clearTimeout(timer);
      worker.terminate();
      done(r);
    };
    const timer = setTimeout(() => finish(fail({ message: `${what}: reading took longer than ${limit / 1000} s and was stopped` })), limit);
    worker.onmessage = (e: MessageEvent<Answer>) => finish(ok(e.data));
    worker.onerror = (e: ErrorEvent) => finish(fail({ message: `${what}: could not be read (${e.message})` }));
    worker.postMessage(job, transfer);
  });
}

interface SheetData {
  readonly name: string;
  readonly grid?: Grid;
  readonly tooLarge?: string;
}

/** The worker's answer as sheets; anything not shaped like sheets of rows is refused. */
function sheetsFrom(raw: unknown, what: string): Result<SheetData[]> {
  const bad = fail({ message: `${what}: the reader returned something other than sheets of cells` });
  if (!Array.isArray(raw)) return bad;
  const out: SheetData[] = [];
  for (const s of raw as Record<string, unknown>[]) {
    const { name, origin, cells, tooLarge } = s ?? {};
    if (typeof name !== 'string' || typeof origin !== 'string') return bad;
    if (typeof tooLarge === 'number') out.push({ name, tooLarge: `sheet "${name}" uses ${origin} (${tooLarge} cells), more than the page reads at once` });
    else if (Array.isArray(cells) && cells.every(Array.isArray)) out.push({ name, grid: { sheet: name, origin, cells } });
    else return bad;
  }
  return ok(out);
}

export class BrowserFileHost implements WorkbookHost {
  private readonly queued: { name: string; sheet: XLSX.WorkSheet }[] = [];

  constructor(
    readonly fileName: string,
    readonly kind: 'workbook' | 'csv',
    private readonly source: Uint8Array,
    private readonly sheets: readonly SheetData[],
    private readonly options: BrowserFileOptions,
  ) {}

  async listSheets(): Promise<string[]> {
    return this.sheets.map((s) => s.name);
  }

  /** Why a sheet cannot be read, or undefined when it can. */
  sheetProblem(sheet: string): string | undefined {
    const s = this.sheets.find((x) => x.name === sheet);
    return s ? s.tooLarge : `no sheet named "${sheet}" in ${this.fileName}`;
  }

  async readGrid(sheet: string, range?: string): Promise<Grid> {
    const problem = this.sheetProblem(sheet);
    if (problem) throw new Error(problem);
    const grid = this.sheets.find((x) => x.name === sheet)!.grid!;
    if (range === undefined) return grid;
    const rect = parseRange(range);
    if (!rect) throw new Error(`"${range}" is not an A1 range such as A1:H20`);
    return restrictGrid(grid, rect) ?? { sheet, origin: cellAddress(rect.top, rect.left), cells: [] };
  }

  /** Queue a new sheet for the results workbook; the file's own sheets are never written into. */
  async writeSheet(block: SheetBlock): Promise<WriteReport> {
    const taken = [...this.sheets.map((s) => s.name), ...this.queued.map((q) => q.name)];
    const name = freeSheetName(block.name, taken);
    const sheet = sheetFromBlock(block);
    this.queued.push({ name, sheet });
    return { sheet: name, range: sheet['!ref'] ?? 'A1', cells: Object.keys(sheet).filter((k) => !k.startsWith('!')).length };
  }

  /** Sheets queued so far, by name. */
  queuedSheets(): string[] {
    return this.queued.map((q) => q.name);
  }

  /** Name offered for the download: "capper-cell-results.xlsx". */
  resultsFileName(): string {
    return `${this.fileName.replace(/\.[^.]*$/, '')}-results.xlsx`;
  }

  /** The file's sheets followed by the queued ones, as .xlsx bytes. */
  async resultsWorkbook(): Promise<Result<Uint8Array>> {
    if (this.kind === 'csv') {
      const book = XLSX.utils.book_new();
      for (const s of this.sheets) XLSX.utils.book_append_sheet(book, sheetFromCells(s.grid!.cells, s.grid!.origin), s.name);
      for (const q of this.queued) XLSX.utils.book_append_sheet(book, q.sheet, q.name);
      return ok(new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx', compression: true }) as ArrayBuffer));
    }
    const bytes = this.source.slice();
    const answer = await runJob({ mode: 'append', bytes, sheets: this.queued }, [bytes.buffer], this.options, this.fileName);
    if (!answer.ok) return answer;
    if (!answer.value.ok) return fail({ message: `${this.fileName}: could not be copied (${answer.value.message})` });
    const out = answer.value.bytes;
    return out instanceof Uint8Array ? ok(out) : fail({ message: `${this.fileName}: the writer returned no file` });
  }
}

/** Open a workbook (.xlsx, .xlsm) or CSV file the user picked. Errors name the file. */
export async function openBrowserFile(fileName: string, bytes: Uint8Array, options: BrowserFileOptions): Promise<Result<BrowserFileHost>> {
  const maxBytes = options.maxBytes ?? BROWSER_DEFAULTS.maxBytes;
  if (bytes.length > maxBytes) return fail({ message: `${fileName}: ${bytes.length} bytes is more than the page's limit of ${maxBytes} bytes` });
  const ext = fileName.toLowerCase().replace(/^.*(\.[^.]*)$/, '$1');
  if (ext === '.csv' || ext === '.txt') {
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      return fail({ message: `${fileName}: not UTF-8 text (save the CSV as "CSV UTF-8")` });
    }
    const rows = parseCsv(text);
    if (!rows.ok) return fail({ message: `${fileName}: ${rows.error.message}` });
    const name = fileName.replace(/\.[^.]*$/, '').slice(0, 31) || 'Sheet1';
    return ok(new BrowserFileHost(fileName, 'csv', bytes, [{ name, grid: { sheet: name, origin: 'A1', cells: rows.value } }], options));
  }
  if (ext !== '.xlsx' && ext !== '.xlsm') return fail({ message: `${fileName}: not a workbook or CSV file (expected .xlsx, .xlsm or .csv)` });
  const zip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 3 && bytes[3] === 4;
  if (!zip) return fail({ message: `${fileName}: not an .xlsx workbook (the file is not a zip package)` });
  const copy = bytes.slice();
  const job = { mode: 'grids', bytes: copy, maxCells: options.maxCells ?? BROWSER_DEFAULTS.maxCells, errorNames: ERROR_NAMES };
  const answer = await runJob(job, [copy.buffer], options, fileName);
  if (!answer.ok) return answer;
  if (!answer.value.ok) return fail({ message: `${fileName}: not a workbook SheetJS can read (${answer.value.message})` });
  const sheets = sheetsFrom(answer.value.sheets, fileName);
  if (!sheets.ok) return sheets;
  return ok(new BrowserFileHost(fileName, 'workbook', bytes, sheets.value, options));
}
