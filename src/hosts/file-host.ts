// WorkbookHost over a workbook file (.xlsx/.xlsm) or a CSV file, for the command line.
// Workbook files are parsed by SheetJS only inside parse-worker.mjs, in a worker thread with
// a time limit, a heap limit and a file-size limit; plain grids come back and are checked
// again here. Results are written to a new file: never the input, via a temp file + rename.
import { randomBytes } from 'node:crypto';
import { existsSync, realpathSync, statSync } from 'node:fs';
import { readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import XLSX from 'xlsx';
import { fail, ok, type Result } from '../logic/result.js';
import type { SheetBlock } from '../report/sheet-block.js';
import { cellAddress, parseRange, restrictGrid } from '../spec/grid.js';
import type { CellValue, Grid } from '../spec/types.js';
import { parseCsv } from '../spec/csv.js';
import type { WorkbookHost, WriteReport } from './workbook-host.js';
import { ERROR_CODES, freeSheetName, sheetFromBlock, sheetFromCells } from './xlsx-write.js';

export interface FileHostOptions {
  /** Longest a workbook parse may take (default 60 s). */
  readonly timeLimitMs?: number;
  /** Largest file accepted (default 50 MB). */
  readonly maxBytes?: number;
  /** Heap of the parsing worker (default 1024 MB). */
  readonly heapMb?: number;
  /** Largest used range of one sheet, in cells (default 20 million). */
  readonly maxCells?: number;
  /** Tests of the isolation only: make the parsing worker misbehave on purpose. */
  readonly testHook?: 'pollute-prototype' | 'never-finish' | 'exhaust-heap';
}

export const FILE_DEFAULTS = { timeLimitMs: 60_000, maxBytes: 50 * 1024 * 1024, heapMb: 1024, maxCells: 20_000_000 } as const;

type FileKind = 'workbook' | 'csv';

function fileKind(path: string): FileKind | undefined {
  const ext = extname(path).toLowerCase();
  if (ext === '.xlsx' || ext === '.xlsm') return 'workbook';
  if (ext === '.csv' || ext === '.txt') return 'csv';
  return undefined;
}

const ERROR_NAMES: Record<number, string> = Object.fromEntries(Object.entries(ERROR_CODES).map(([name, code]) => [code, name]));

type WorkerAnswer =
  | { ok: true; sheets?: unknown; bytes?: unknown }
  | { ok: false; message: string };

/** Run the parsing worker on one job, within the time limit and the heap limit. */
function runWorker(job: Record<string, unknown>, bytes: Uint8Array, options: FileHostOptions, what: string): Promise<Result<WorkerAnswer>> {
  const timeLimitMs = options.timeLimitMs ?? FILE_DEFAULTS.timeLimitMs;
  return new Promise((done) => {
    const worker = new Worker(new URL('./parse-worker.mjs', import.meta.url), {
      workerData: { ...job, bytes, testHook: options.testHook },
      transferList: [bytes.buffer as ArrayBuffer],
      resourceLimits: { maxOldGenerationSizeMb: options.heapMb ?? FILE_DEFAULTS.heapMb },
      // Whatever the parser prints stays out of our stdout (which may carry the --json document).
      stdout: true,
      stderr: true,
    });
    let settled = false;
    const finish = (answer: Result<WorkerAnswer>): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate();
      done(answer);
    };
    const timer = setTimeout(
      () => finish(fail({ message: `${what}: reading took longer than the limit of ${timeLimitMs / 1000} s and was stopped` })),
      timeLimitMs,
    );
    worker.on('message', (answer: WorkerAnswer) => finish(ok(answer)));
    worker.on('error', (e: Error & { code?: string }) =>
      finish(
        fail({
          message:
            e.code === 'ERR_WORKER_OUT_OF_MEMORY'
              ? `${what}: reading needed more than the memory limit of ${options.heapMb ?? FILE_DEFAULTS.heapMb} MB and was stopped`
              : `${what}: could not be read (${e.message})`,
        }),
      ),
    );
    worker.on('exit', (code) => finish(fail({ message: `${what}: the reader stopped unexpectedly (exit ${code})` })));
  });
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

interface SheetData {
  readonly name: string;
  /** Used range, as a grid; undefined when the sheet is too large to read whole. */
  readonly grid?: Grid;
  readonly tooLarge?: { readonly range: string; readonly cells: number };
}

function checkSheets(raw: unknown, what: string): Result<SheetData[]> {
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

async function readLimited(path: string, options: FileHostOptions): Promise<Result<Uint8Array>> {
  const maxBytes = options.maxBytes ?? FILE_DEFAULTS.maxBytes;
  let size: number;
  try {
    const info = await stat(path);
    if (!info.isFile()) return fail({ message: `${path}: not a file` });
    size = info.size;
  } catch {
    return fail({ message: `${path}: no such file` });
  }
  if (size > maxBytes)
    return fail({ message: `${path}: ${size} bytes is more than the limit of ${maxBytes} bytes` });
  return ok(new Uint8Array(await readFile(path)));
}

/** The grids of a workbook file's sheets, parsed in the isolated worker. */
async function readWorkbookSheets(path: string, options: FileHostOptions): Promise<Result<SheetData[]>> {
  const bytes = await readLimited(path, options);
  if (!bytes.ok) return bytes;
  // An .xlsx file is a zip; anything else would be sniffed by SheetJS as some other format.
  const zip = bytes.value.length >= 4 && bytes.value[0] === 0x50 && bytes.value[1] === 0x4b && bytes.value[2] === 3 && bytes.value[3] === 4;
  if (!zip) return fail({ message: `${path}: not an .xlsx workbook (the file is not a zip package)` });
  const job = { mode: 'grids', maxCells: options.maxCells ?? FILE_DEFAULTS.maxCells, errorNames: ERROR_NAMES };
  const answer = await runWorker(job, bytes.value, options, path);
  if (!answer.ok) return answer;
  if (!answer.value.ok) return fail({ message: `${path}: not a workbook SheetJS can read (${answer.value.message})` });
  return checkSheets(answer.value.sheets, path);
}

async function readCsvSheet(path: string, options: FileHostOptions): Promise<Result<SheetData[]>> {
  const bytes = await readLimited(path, options);
  if (!bytes.ok) return bytes;
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes.value);
  } catch {
    return fail({ message: `${path}: not UTF-8 text (save the CSV as "CSV UTF-8")` });
  }
  const rows = parseCsv(text);
  if (!rows.ok) return fail({ message: `${path}: ${rows.error.message}` });
  // Excel names the one sheet of a CSV file after the file.
  const name = basename(path, extname(path)).slice(0, 31) || 'Sheet1';
  return ok([{ name, grid: { sheet: name, origin: 'A1', cells: rows.value } }]);
}

/** A workbook or CSV file opened for reading, with result sheets queued for `save`. */
export class FileHost implements WorkbookHost {
  private readonly queued: { name: string; sheet: XLSX.WorkSheet }[] = [];

  constructor(
    readonly path: string,
    readonly kind: FileKind,
    private readonly sheets: readonly SheetData[],
    private readonly options: FileHostOptions,
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

  async readGrid(sheet: string, range?: string): Promise<Grid> {
    const problem = this.sheetProblem(sheet);
    if (problem) throw new Error(`bug: readGrid called for a sheet that cannot be read: ${problem}`);
    const grid = this.sheets.find((x) => x.name === sheet)!.grid!;
    if (range === undefined) return grid;
    const rect = parseRange(range);
    if (!rect) throw new Error(`bug: readGrid called with range "${range}"`);
    return restrictGrid(grid, rect) ?? { sheet, origin: cellAddress(rect.top, rect.left), cells: [] };
  }

  /** Queue a new sheet for `save`; existing sheets are never written into. */
  async writeSheet(block: SheetBlock): Promise<WriteReport> {
    const taken = [...this.sheets.map((s) => s.name), ...this.queued.map((q) => q.name)];
    const name = freeSheetName(block.name, taken);
    const sheet = sheetFromBlock(block);
    this.queued.push({ name, sheet });
    const cells = Object.keys(sheet).filter((k) => !k.startsWith('!')).length;
    return { sheet: name, range: sheet['!ref'] ?? 'A1', cells };
  }

  /**
   * Write the source sheets and the queued sheets to `outPath` (.xlsx). Refuses the input file
   * itself; writes a temp file in the same folder, then renames it into place.
   */
  async save(outPath: string): Promise<Result<string>> {
    if (sameFile(this.path, outPath)) return fail({ message: `${outPath}: is the input file; choose another name for the results` });
    if (extname(outPath).toLowerCase() !== '.xlsx') return fail({ message: `${outPath}: results are written as .xlsx; give a name ending in .xlsx` });
    const bytes = this.kind === 'workbook' ? await this.appendInWorker() : ok(this.csvWorkbook());
    if (!bytes.ok) return bytes;
    return writeOutputFile(this.path, outPath, bytes.value);
  }

  /** Source parsed again in the worker (never in this realm), our sheets appended there. */
  private async appendInWorker(): Promise<Result<Uint8Array>> {
    const source = await readLimited(this.path, this.options);
    if (!source.ok) return source;
    const answer = await runWorker({ mode: 'append', sheets: this.queued }, source.value, this.options, this.path);
    if (!answer.ok) return answer;
    if (!answer.value.ok) return fail({ message: `${this.path}: could not be copied (${answer.value.message})` });
    const out = answer.value.bytes;
    return out instanceof Uint8Array ? ok(out) : fail({ message: `${this.path}: the writer returned no file` });
  }

  /** A CSV source becomes the first sheet of the results workbook. */
  private csvWorkbook(): Uint8Array {
    const book = XLSX.utils.book_new();
    for (const s of this.sheets) XLSX.utils.book_append_sheet(book, sheetFromCells(s.grid!.cells, s.grid!.origin), s.name);
    for (const q of this.queued) XLSX.utils.book_append_sheet(book, q.sheet, q.name);
    return new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx', compression: true }) as ArrayBuffer);
  }
}

/**
 * Write a file the program produced: never over `input` (by any name), into an existing
 * folder, through a temp file in that folder renamed into place (no half-written file).
 */
export async function writeOutputFile(input: string, outPath: string, data: Uint8Array | string): Promise<Result<string>> {
  const target = resolve(outPath);
  if (sameFile(input, target)) return fail({ message: `${outPath}: is the input file; choose another name` });
  if (!existsSync(dirname(target))) return fail({ message: `${outPath}: the folder ${dirname(target)} does not exist` });
  const temp = join(dirname(target), `.${basename(target)}.${randomBytes(6).toString('hex')}.tmp`);
  try {
    await writeFile(temp, data, { flag: 'wx' });
    await rename(temp, target);
  } catch (e) {
    await unlink(temp).catch(() => undefined);
    return fail({ message: `${outPath}: could not be written (${(e as Error).message})` });
  }
  return ok(target);
}

/**
 * Whether two paths name the same file: same real path, the same ignoring case (a
 * case-insensitive file system would make them one file), or the same inode (a hard link).
 */
export function sameFile(a: string, b: string): boolean {
  const real = (p: string): string => {
    const full = resolve(p);
    try {
      return realpathSync(full);
    } catch {
      // Not there yet: resolve its folder, keep its name.
      try {
        return join(realpathSync(dirname(full)), basename(full));
      } catch {
        return full;
      }
    }
  };
  const ra = real(a);
  const rb = real(b);
  if (ra === rb || ra.toLowerCase() === rb.toLowerCase()) return true;
  const sa = statSyncSafe(ra);
  const sb = statSyncSafe(rb);
  return sa !== undefined && sb !== undefined && sa.dev === sb.dev && sa.ino === sb.ino;
}

function statSyncSafe(p: string): { dev: number; ino: number } | undefined {
  try {
    return statSync(p);
  } catch {
    return undefined;
  }
}

/** Open a workbook (.xlsx, .xlsm) or CSV file. Errors name the file. */
export async function openFile(path: string, options: FileHostOptions = {}): Promise<Result<FileHost>> {
  const kind = fileKind(path);
  if (!kind) return fail({ message: `${path}: not a workbook or CSV file (expected .xlsx, .xlsm or .csv)` });
  const sheets = kind === 'workbook' ? await readWorkbookSheets(path, options) : await readCsvSheet(path, options);
  if (!sheets.ok) return sheets;
  return ok(new FileHost(path, kind, sheets.value, options));
}

/**
 * Write `blocks` as new sheets after the source's own sheets into `outPath`. The source file
 * is only read; `outPath` must not be the source.
 */
export async function writeResults(
  source: string,
  blocks: readonly SheetBlock[],
  outPath: string,
  options: FileHostOptions = {},
): Promise<Result<{ path: string; sheets: WriteReport[] }>> {
  if (sameFile(source, outPath)) return fail({ message: `${outPath}: is the input file; choose another name for the results` });
  const host = await openFile(source, options);
  if (!host.ok) return host;
  const sheets: WriteReport[] = [];
  for (const block of blocks) sheets.push(await host.value.writeSheet(block));
  const saved = await host.value.save(outPath);
  return saved.ok ? ok({ path: saved.value, sheets }) : saved;
}
