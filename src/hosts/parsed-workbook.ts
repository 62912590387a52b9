// What the two file hosts share: a workbook or CSV file read once into plain grids, with result
// sheets queued for a copy of it. Neutral about where it runs (no node: imports): the command
// line (file-host.ts) and the standalone page (browser-file-host.ts) each bring the file's bytes
// and their own way of running parse-worker.mjs, the only place SheetJS parses a user's file.
import { fail, ok, type Result } from '../logic/result.js';
import type { SheetBlock } from '../report/sheet-block.js';
import { parseCsv } from '../spec/csv.js';
import { cellAddress, parseRange, restrictGrid } from '../spec/grid.js';
import type { CellValue, Grid } from '../spec/types.js';
import type { WorkbookHost, WriteReport } from './workbook-host.js';
import { addSheets, newWorkbook, type InflateRaw, type NamedBlock } from './xlsx-package.js';
import { ERROR_CODES, freeSheetName } from './xlsx-write.js';

export type FileKind = 'workbook' | 'csv';

/** What a file name's extension says it holds; undefined for anything else. */
export function fileKind(fileName: string): FileKind | undefined {
  const ext = /\.[^./\\]*$/.exec(fileName)?.[0].toLowerCase();
  if (ext === '.xlsx' || ext === '.xlsm') return 'workbook';
  if (ext === '.csv' || ext === '.txt') return 'csv';
  return undefined;
}

export interface SheetData {
  readonly name: string;
  /** Used range, as a grid; undefined when the sheet is too large to read whole. */
  readonly grid?: Grid;
  readonly tooLarge?: { readonly range: string; readonly cells: number };
}

/**
 * Runs one job of parse-worker.mjs on `bytes` (which it may transfer) and gives back the
 * worker's message as it came, or a failure naming the file (time limit, crash).
 */
export type RunParseJob = (job: Record<string, unknown>, bytes: Uint8Array) => Promise<Result<unknown>>;

const ERROR_NAMES: Record<number, string> = Object.fromEntries(Object.entries(ERROR_CODES).map(([name, code]) => [code, name]));

/** The worker's message: `{ ok: true, ... }` or `{ ok: false, message }`; anything else is refused. */
function workerAnswer(raw: unknown, what: string, failed: (message: string) => string): Result<Record<string, unknown>> {
  if (typeof raw === 'object' && raw !== null) {
    const answer = raw as Record<string, unknown>;
    if (answer.ok === true) return ok(answer);
    if (answer.ok === false && typeof answer.message === 'string') return fail({ message: failed(answer.message) });
  }
  return fail({ message: `${what}: the reader answered with something other than a result` });
}

/** Only plain values cross from the worker: anything else is refused, objects are rebuilt. */
function plainCell(v: unknown): CellValue | undefined {
  if (v === null || typeof v === 'boolean' || typeof v === 'string') return v;
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  if (typeof v === 'object' && Object.getPrototypeOf(v) === Object.prototype) {
    const keys = Object.keys(v);
    const o = v as Record<string, unknown>;
    if (keys.length === 1 && keys[0] === 'error' && typeof o.error === 'string') return { error: o.error };
    if (keys.length === 1 && keys[0] === 'date' && typeof o.date === 'number') return { date: o.date };
  }
  return undefined;
}

/** The worker's sheets, every cell checked and copied; anything not sheets of plain cells is refused. */
export function checkSheets(raw: unknown, what: string): Result<SheetData[]> {
  const bad = fail({ message: `${what}: the reader returned something other than sheets of cells` });
  if (!Array.isArray(raw)) return bad;
  const out: SheetData[] = [];
  for (const s of raw as unknown[]) {
    if (typeof s !== 'object' || s === null) return bad;
    const { name, origin, cells, tooLarge } = s as Record<string, unknown>;
    if (typeof name !== 'string' || typeof origin !== 'string') return bad;
    if (typeof tooLarge === 'number') {
      out.push({ name, tooLarge: { range: origin, cells: tooLarge } });
      continue;
    }
    if (!Array.isArray(cells)) return bad;
    const rows: CellValue[][] = [];
    for (const row of cells as unknown[]) {
      if (!Array.isArray(row)) return bad;
      const clean: CellValue[] = new Array(row.length);
      for (let c = 0; c < row.length; c++) {
        const v = plainCell(row[c]);
        if (v === undefined) return bad;
        clean[c] = v;
      }
      rows.push(clean);
    }
    out.push({ name, grid: { sheet: name, origin, cells: rows } });
  }
  return ok(out);
}

/**
 * The sheets of a file's bytes: CSV through our own reader (one sheet, named after the file as
 * Excel does), a workbook through `run` in the isolated worker. Errors name the file (`what`).
 */
export async function readSheets(
  what: string,
  fileName: string,
  kind: FileKind,
  bytes: Uint8Array,
  maxCells: number,
  run: RunParseJob,
): Promise<Result<SheetData[]>> {
  if (kind === 'csv') {
    let text: string;
    try {
      text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    } catch {
      return fail({ message: `${what}: not UTF-8 text (save the CSV as "CSV UTF-8")` });
    }
    const rows = parseCsv(text);
    if (!rows.ok) return fail({ message: `${what}: ${rows.error.message}` });
    const name = fileName.replace(/\.[^.]*$/, '').slice(0, 31) || 'Sheet1';
    return ok([{ name, grid: { sheet: name, origin: 'A1', cells: rows.value } }]);
  }
  // An .xlsx file is a zip; anything else would be sniffed by SheetJS as some other format.
  const zip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 3 && bytes[3] === 4;
  if (!zip) return fail({ message: `${what}: not an .xlsx workbook (the file is not a zip package)` });
  const raw = await run({ mode: 'grids', maxCells, errorNames: ERROR_NAMES }, bytes);
  if (!raw.ok) return raw;
  const answer = workerAnswer(raw.value, what, (m) => `${what}: not a workbook SheetJS can read (${m})`);
  return answer.ok ? checkSheets(answer.value.sheets, what) : answer;
}

/** A file read into plain grids, with result sheets queued for a copy of it. */
export class ParsedWorkbook implements WorkbookHost {
  private readonly queued: NamedBlock[] = [];

  constructor(
    /** The file as errors name it: a path on the command line, a file name in the page. */
    private readonly what: string,
    readonly kind: FileKind,
    private readonly sheets: readonly SheetData[],
  ) {}

  async listSheets(): Promise<string[]> {
    return this.sheets.map((s) => s.name);
  }

  /** Why a sheet cannot be read whole, or undefined when it can. */
  sheetProblem(sheet: string): string | undefined {
    const s = this.sheets.find((x) => x.name === sheet);
    if (!s) return `no sheet named "${sheet}"`;
    if (s.tooLarge) return `sheet "${sheet}" uses ${s.tooLarge.range} (${s.tooLarge.cells} cells), more than can be read at once`;
    return undefined;
  }

  /** The sheet's grid; throws (with `sheetProblem`'s words) for a sheet that cannot be read. */
  async readGrid(sheet: string, range?: string): Promise<Grid> {
    const problem = this.sheetProblem(sheet);
    if (problem) throw new Error(`${this.what}: ${problem}`);
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
    this.queued.push({ name, block });
    const width = Math.max(1, ...block.rows.map((r) => r.length));
    const cells = block.rows.reduce((n, r) => n + r.filter((c) => c !== null && (c.value !== null || c.formula !== undefined)).length, 0);
    return { sheet: name, range: `A1:${cellAddress(Math.max(0, block.rows.length - 1), width - 1)}`, cells };
  }

  /** Sheets queued so far, by name. */
  queuedSheets(): string[] {
    return this.queued.map((q) => q.name);
  }

  /**
   * The file's sheets followed by the queued ones, as .xlsx bytes: our sheets are added to a
   * copy of the workbook's package, every part of it kept as it was (xlsx-package.ts); a CSV
   * source becomes the first sheet of a new workbook. `source` gives the workbook's bytes.
   */
  protected async resultsBytes(source: () => Promise<Result<Uint8Array>>, inflate: InflateRaw): Promise<Result<Uint8Array>> {
    const added = this.kind === 'csv'
      ? await newWorkbook(this.sheets.map((s) => ({ name: s.name, origin: s.grid!.origin, cells: s.grid!.cells })), this.queued)
      : await source().then((bytes) => (bytes.ok ? addSheets(bytes.value, this.queued, inflate) : bytes));
    return added.ok ? added : fail({ message: `${this.what}: ${added.error.message}` });
  }
}
