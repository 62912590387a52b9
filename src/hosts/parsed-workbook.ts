// What the two file hosts share: a workbook or CSV file read once into plain grids, with result
// sheets queued for a copy of it. Neutral about where it runs (no node: imports): the command
// line (file-host.ts) and the standalone page (browser-file-host.ts) each bring the file's bytes
// and their own way of running parse-worker.mjs, the only place SheetJS parses a user's file.
import { fail, maxOf, ok, type Result } from '../logic/index.js';
import type { SheetBlock } from '../report/index.js';
import {
  cellAddress,
  intersectRanges,
  parseCsv,
  parseRange,
  restrictGrid,
  type CellValue,
  type Grid,
  type Problem,
  type Severity,
} from '../table/index.js';
import type { WorkbookHost, WriteReport } from './workbook-host.js';
import type { ZipBudget } from './zip-package.mjs';
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
  /** Used range, as a grid (with its merged areas and reading problems); undefined when not read. */
  readonly grid?: Grid;
  readonly tooLarge?: { readonly range: string; readonly cells: number };
  /** Why the sheet could not be read at all (its part is damaged or missing). */
  readonly damaged?: string;
}

/** An Excel Table object of the workbook (ListObject): its name, sheet and A1 range. */
export interface WorkbookTable {
  readonly name: string;
  readonly sheet: string;
  readonly range: string;
}

/** A file read: its sheets, its Excel tables, and problems of the file or of whole sheets. */
export interface FileRead {
  readonly sheets: readonly SheetData[];
  readonly tables: readonly WorkbookTable[];
  readonly problems: readonly Problem[];
}

/**
 * Runs one job of parse-worker.mjs on `bytes` (which it may transfer) and gives back the
 * worker's message as it came, or a failure naming the file (time limit, crash).
 */
export type RunParseJob = (job: Record<string, unknown>, bytes: Uint8Array) => Promise<Result<unknown>>;

/** How far a package may unpack (zip-package.mjs): per part, in all, and its ratio to the packed size. */
export type UnpackBudget = ZipBudget;

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

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && Object.getPrototypeOf(v) === Object.prototype;
}

/** Only plain values cross from the worker: anything else is refused, objects are rebuilt. */
function plainCell(v: unknown): CellValue | undefined {
  if (v === null || typeof v === 'boolean' || typeof v === 'string') return v;
  if (typeof v === 'number') return Number.isFinite(v) ? v : undefined;
  if (isPlainObject(v)) {
    const keys = Object.keys(v);
    if (keys.length === 1 && keys[0] === 'error' && typeof v.error === 'string') return { error: v.error };
    if (keys.length === 1 && keys[0] === 'date' && typeof v.date === 'number') return { date: v.date };
  }
  return undefined;
}

const SEVERITIES: readonly string[] = ['error', 'warning', 'info'];

/** A problem from the worker, copied field by field; undefined when it is not one. */
function plainProblem(v: unknown): Problem | undefined {
  if (!isPlainObject(v)) return undefined;
  const { severity, code, sheet, cell, message } = v;
  if (typeof severity !== 'string' || !SEVERITIES.includes(severity)) return undefined;
  if (typeof code !== 'string' || typeof sheet !== 'string' || typeof cell !== 'string' || typeof message !== 'string') return undefined;
  return { severity: severity as Severity, code, sheet, cell, message };
}

/** Every element through `each`; undefined when one is refused or `raw` is not an array. */
function allOf<T>(raw: unknown, each: (v: unknown) => T | undefined): T[] | undefined {
  if (raw === undefined) return [];
  if (!Array.isArray(raw)) return undefined;
  const out: T[] = [];
  for (const v of raw as unknown[]) {
    const t = each(v);
    if (t === undefined) return undefined;
    out.push(t);
  }
  return out;
}

const text = (v: unknown): string | undefined => (typeof v === 'string' ? v : undefined);

function plainTable(v: unknown): WorkbookTable | undefined {
  if (!isPlainObject(v) || typeof v.name !== 'string' || typeof v.sheet !== 'string' || typeof v.range !== 'string') return undefined;
  return { name: v.name, sheet: v.sheet, range: v.range };
}

function plainRow(v: unknown): CellValue[] | undefined {
  if (!Array.isArray(v)) return undefined;
  const clean: CellValue[] = new Array(v.length);
  for (let c = 0; c < v.length; c++) {
    const cell = plainCell(v[c]);
    if (cell === undefined) return undefined;
    clean[c] = cell;
  }
  return clean;
}

function plainSheet(s: unknown): SheetData | undefined {
  if (!isPlainObject(s)) return undefined;
  const { name, origin, cells, tooLarge, damaged } = s;
  if (typeof name !== 'string' || typeof origin !== 'string') return undefined;
  if (typeof tooLarge === 'number') return { name, tooLarge: { range: origin, cells: tooLarge } };
  if (typeof damaged === 'string') return { name, damaged };
  const rows = allOf(cells, plainRow);
  const merges = allOf(s.merges, text);
  const readProblems = allOf(s.problems, plainProblem);
  if (!rows || !merges || !readProblems) return undefined;
  return { name, grid: { sheet: name, origin, cells: rows, merges, readProblems } };
}

/** The worker's answer, every cell, problem and table checked and copied; anything else is refused. */
export function checkAnswer(answer: Record<string, unknown>, what: string): Result<FileRead> {
  const sheets = Array.isArray(answer.sheets) ? allOf(answer.sheets, plainSheet) : undefined;
  const tables = allOf(answer.tables, plainTable);
  const problems = allOf(answer.problems, plainProblem);
  if (!sheets || !tables || !problems) return fail({ message: `${what}: the reader returned something other than sheets of cells` });
  return ok({ sheets, tables, problems });
}

/** The sheets of a CSV file as the worker would answer them (so the page can parse CSV in its worker too). */
export function csvAnswer(fileName: string, bytes: Uint8Array, maxCells: number): Record<string, unknown> {
  let csv: string;
  try {
    csv = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    return { ok: false, message: 'not UTF-8 text (save the CSV as "CSV UTF-8")' };
  }
  const rows = parseCsv(csv, undefined, maxCells);
  if (!rows.ok) return { ok: false, message: rows.error.message };
  // Named after the file, as Excel does.
  const name = fileName.replace(/\.[^.]*$/, '').slice(0, 31) || 'Sheet1';
  return { ok: true, sheets: [{ name, origin: 'A1', cells: rows.value }] };
}

/**
 * The sheets of a file's bytes: CSV through our own reader (here, or with `csvInWorker` as a
 * job of `run`, so that a page keeps its main thread free), a workbook through `run` in the
 * isolated worker, within `budget`. Errors name the file (`what`).
 */
export async function readSheets(
  what: string,
  fileName: string,
  kind: FileKind,
  bytes: Uint8Array,
  limits: { readonly maxCells: number; readonly budget: UnpackBudget; readonly csvInWorker?: boolean },
  run: RunParseJob,
): Promise<Result<FileRead>> {
  const failed = (m: string) => `${what}: ${m}`;
  if (kind === 'csv') {
    let raw: unknown = undefined;
    if (limits.csvInWorker) {
      const r = await run({ mode: 'csv', fileName, maxCells: limits.maxCells }, bytes);
      if (!r.ok) return r;
      raw = r.value;
    } else raw = csvAnswer(fileName, bytes, limits.maxCells);
    const answer = workerAnswer(raw, what, failed);
    return answer.ok ? checkAnswer(answer.value, what) : answer;
  }
  // An .xlsx file is a zip; anything else would be sniffed by SheetJS as some other format.
  const zip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 3 && bytes[3] === 4;
  const ole = bytes.length >= 4 && bytes[0] === 0xd0 && bytes[1] === 0xcf && bytes[2] === 0x11 && bytes[3] === 0xe0;
  if (ole) return fail({ message: `${what}: the workbook is encrypted (password-protected) or an old .xls file; save it as an .xlsx workbook without a password` });
  if (!zip) return fail({ message: `${what}: not an .xlsx workbook (the file is not a zip package)` });
  const raw = await run({ mode: 'grids', maxCells: limits.maxCells, budget: limits.budget, errorNames: ERROR_NAMES }, bytes);
  if (!raw.ok) return raw;
  const answer = workerAnswer(raw.value, what, failed);
  return answer.ok ? checkAnswer(answer.value, what) : answer;
}

/** A file read into plain grids, with result sheets queued for a copy of it. */
export class ParsedWorkbook implements WorkbookHost {
  private readonly queued: NamedBlock[] = [];

  private readonly sheets: readonly SheetData[];

  constructor(
    /** The file as errors name it: a path on the command line, a file name in the page. */
    private readonly what: string,
    readonly kind: FileKind,
    private readonly read: FileRead,
  ) {
    this.sheets = read.sheets;
  }

  async listSheets(): Promise<string[]> {
    return this.sheets.map((s) => s.name);
  }

  /** Why a sheet cannot be read whole, or undefined when it can. */
  sheetProblem(sheet: string): string | undefined {
    const s = this.sheets.find((x) => x.name === sheet);
    if (!s) return `no sheet named "${sheet}"`;
    if (s.tooLarge) return `sheet "${sheet}" uses ${s.tooLarge.range} (${s.tooLarge.cells} cells), more than can be read at once`;
    if (s.damaged) return `sheet "${sheet}" could not be read: ${s.damaged}`;
    return undefined;
  }

  /**
   * Problems of the file and of whole sheets, each at its sheet: hidden sheets (warning), sheets
   * that could not be read (error: damaged, or over the cell limit), damaged parts not read.
   */
  fileProblems(): Problem[] {
    const lost = this.sheets.flatMap((s): Problem[] =>
      s.damaged
        ? [{ severity: 'error', code: 'damaged-part', sheet: s.name, cell: 'A1', message: `the sheet could not be read: ${s.damaged}` }]
        : s.tooLarge
          ? [{ severity: 'error', code: 'sheet-too-large', sheet: s.name, cell: s.tooLarge.range, message: `not read: the sheet uses ${s.tooLarge.range} (${s.tooLarge.cells} cells), more than can be read at once` }]
          : [],
    );
    return [...this.read.problems, ...lost];
  }

  /** The workbook's Excel tables (none for a CSV file). */
  tables(): readonly WorkbookTable[] {
    return this.read.tables;
  }

  /**
   * What a range the user typed means: an A1 range as it is (on `sheet`), or the name of one of
   * the workbook's Excel tables (any case), which brings its own sheet. An unknown name is one
   * error listing the tables there are.
   */
  resolveRange(range: string, sheet?: string): Result<{ sheet?: string; range: string }, string> {
    if (parseRange(range)) return ok({ ...(sheet !== undefined ? { sheet } : {}), range });
    const table = this.read.tables.find((t) => t.name.toLowerCase() === range.trim().toLowerCase());
    const names = this.read.tables.map((t) => t.name);
    if (!table)
      return fail(`"${range}" is neither an A1 range such as A1:H20 nor a table of ${this.what} (${names.length > 0 ? `tables: ${names.join(', ')}` : 'it has no tables'})`);
    if (sheet !== undefined && sheet !== table.sheet) return fail(`table ${table.name} is on sheet "${table.sheet}", not on "${sheet}"`);
    return ok({ sheet: table.sheet, range: table.range });
  }

  /**
   * The sheet's grid (cut to `range` when given, with the merged areas and reading problems
   * that touch it); throws (with `sheetProblem`'s words) for a sheet that cannot be read.
   */
  async readGrid(sheet: string, range?: string): Promise<Grid> {
    const problem = this.sheetProblem(sheet);
    if (problem) throw new Error(`${this.what}: ${problem}`);
    const grid = this.sheets.find((x) => x.name === sheet)!.grid!;
    if (range === undefined) return grid;
    const rect = parseRange(range);
    if (!rect) throw new Error(`"${range}" is not an A1 range such as A1:H20`);
    const touches = (a1: string) => {
      const at = parseRange(a1);
      return at !== undefined && intersectRanges(at, rect) !== undefined;
    };
    const cut = restrictGrid(grid, rect) ?? { sheet, origin: cellAddress(rect.top, rect.left), cells: [] };
    return { ...cut, merges: (grid.merges ?? []).filter(touches), readProblems: (grid.readProblems ?? []).filter((p) => touches(p.cell)) };
  }

  /** Queue a new sheet for the results workbook; the file's own sheets are never written into. */
  async writeSheet(block: SheetBlock): Promise<WriteReport> {
    const taken = [...this.sheets.map((s) => s.name), ...this.queued.map((q) => q.name)];
    const name = freeSheetName(block.name, taken);
    this.queued.push({ name, block });
    const width = maxOf(block.rows.map((r) => r.length), 1);
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
      ? await newWorkbook(this.sheets.map((s) => ({ name: s.name, origin: s.grid?.origin ?? 'A1', cells: s.grid?.cells ?? [] })), this.queued)
      : await source().then((bytes) => (bytes.ok ? addSheets(bytes.value, this.queued, inflate) : bytes));
    return added.ok ? added : fail({ message: `${this.what}: ${added.error.message}` });
  }
}
