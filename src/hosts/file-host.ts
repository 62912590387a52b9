// WorkbookHost over a workbook file (.xlsx/.xlsm) or a CSV file, for the command line.
// Workbook files are checked (zip-package.mjs) and parsed by SheetJS only inside
// parse-worker.mjs, in a child process with a time limit, a heap limit, an unpacking budget
// and a file-size limit; plain grids come back and are checked again cell by cell
// (parsed-workbook.ts, shared with the standalone page). Results are written to a new file: never the input, via a temp file + rename.
import { fork } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, realpathSync, statSync } from 'node:fs';
import { readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { inflateRawSync } from 'node:zlib';
import { fail, ok, type Result } from '../logic/index.js';
import type { SheetBlock } from '../report/index.js';
import { fileKind, ParsedWorkbook, readSheets, type FileKind, type FileRead, type RunParseJob, type UnpackBudget } from './parsed-workbook.js';
import type { WriteReport } from './workbook-host.js';
import { fileSystemReason } from './fs-errors.js';

export interface FileHostOptions {
  /** Longest a workbook parse may take (default 60 s). */
  readonly timeLimitMs?: number;
  /** Largest file accepted (default 50 MB). */
  readonly maxBytes?: number;
  /** Heap of the parsing worker (default 1024 MB). */
  readonly heapMb?: number;
  /** Largest used range of one sheet, in cells (default 20 million). */
  readonly maxCells?: number;
  /** How far a workbook package may unpack (default 128 MB per part, 256 MB in all, ratio 200). */
  readonly budget?: UnpackBudget;
  /** Tests of the isolation only: make the parsing worker misbehave on purpose. */
  readonly testHook?: 'pollute-prototype' | 'never-finish' | 'exhaust-heap' | 'crash';
}

const MB = 1024 * 1024;

/**
 * The unpacked package must fit the worker's 1024 MB heap (SheetJS holds each part as text and
 * more); a real sheet's XML packs 10-20 times (a 200,000-row sheet of 0/1 cells: 11.5), so a
 * ratio over 200 in a part of more than 1 MB is taken for a zip bomb.
 */
export const FILE_DEFAULTS = {
  timeLimitMs: 60_000,
  maxBytes: 50 * MB,
  heapMb: 1024,
  maxCells: 20_000_000,
  budget: { maxEntryBytes: 128 * MB, maxTotalBytes: 256 * MB, maxRatio: 200 },
} as const;

/**
 * Each job in a fresh child process running parse-worker.mjs, within the time limit and the
 * heap limit. A process, not a worker thread: some out-of-memory failures of a worker thread
 * (a growing Map, for one) end the whole process; a child's end is only a failed read here.
 */
const workerRunner = (options: FileHostOptions, what: string): RunParseJob => (job, bytes) => {
  const timeLimitMs = options.timeLimitMs ?? FILE_DEFAULTS.timeLimitMs;
  const heapMb = options.heapMb ?? FILE_DEFAULTS.heapMb;
  return new Promise((done) => {
    const child = fork(fileURLToPath(new URL('./parse-worker.mjs', import.meta.url)), [], {
      // No loaders of ours (tsx, vitest): the worker is plain JavaScript.
      execArgv: [`--max-old-space-size=${heapMb}`],
      serialization: 'advanced',
      // Whatever the parser or V8 prints stays out of our stdout (which may carry the --json document).
      stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
    });
    let stderr = '';
    child.stderr?.on('data', (d: Buffer) => void (stderr = (stderr + d.toString()).slice(-4096)));
    child.stdout?.resume();
    let settled = false;
    const finish = (answer: Result<unknown>): void => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      child.kill('SIGKILL');
      done(answer);
    };
    const timer = setTimeout(
      () => finish(fail({ message: `${what}: reading took longer than the limit of ${timeLimitMs / 1000} s and was stopped` })),
      timeLimitMs,
    );
    child.on('message', (answer: unknown) => finish(ok(answer)));
    child.on('error', (e: Error) => finish(fail({ message: `${what}: the reader could not be started (${e.message})` })));
    child.on('exit', (code, signal) =>
      finish(
        fail({
          message: /heap limit|out of memory/i.test(stderr)
            ? `${what}: reading needed more than the memory limit of ${heapMb} MB and was stopped`
            : `${what}: the reader stopped unexpectedly (${signal ?? `exit ${code}`})`,
        }),
      ),
    );
    child.send({ ...job, bytes, testHook: options.testHook });
  });
};

async function readLimited(path: string, options: FileHostOptions): Promise<Result<Uint8Array>> {
  const maxBytes = options.maxBytes ?? FILE_DEFAULTS.maxBytes;
  try {
    const info = await stat(path);
    if (info.isDirectory()) return fail({ message: `${path}: ${fileSystemReason({ code: 'EISDIR' })}` });
    if (!info.isFile()) return fail({ message: `${path}: not a regular file` });
    if (info.size > maxBytes) return fail({ message: `${path}: ${info.size} bytes is more than the limit of ${maxBytes} bytes` });
    return ok(new Uint8Array(await readFile(path)));
  } catch (e) {
    return fail({ message: `${path}: ${fileSystemReason(e)}` });
  }
}

/** Raw inflate with an output limit (zlib stops at it), for the parts of a package we add to. */
async function inflateRawNode(data: Uint8Array, maxBytes: number): Promise<Uint8Array> {
  return new Uint8Array(inflateRawSync(data, { maxOutputLength: maxBytes }));
}

/** A workbook or CSV file opened for reading, with result sheets queued for `save`. */
export class FileHost extends ParsedWorkbook {
  constructor(
    readonly path: string,
    kind: FileKind,
    read: FileRead,
    private readonly options: FileHostOptions,
  ) {
    super(path, kind, read);
  }

  /**
   * Write the source sheets and the queued sheets to `outPath` (.xlsx). Refuses the input file
   * itself; writes a temp file in the same folder, then renames it into place.
   */
  async save(outPath: string): Promise<Result<string>> {
    if (sameFile(this.path, outPath)) return fail({ message: `${outPath}: is the input file; choose another name for the results` });
    if (extname(outPath).toLowerCase() !== '.xlsx') return fail({ message: `${outPath}: results are written as .xlsx; give a name ending in .xlsx` });
    const bytes = await this.resultsBytes(() => readLimited(this.path, this.options), inflateRawNode);
    if (!bytes.ok) return bytes;
    return writeOutputFile(this.path, outPath, bytes.value);
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
    return fail({ message: `${outPath}: could not be written: ${fileSystemReason(e)}` });
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
  const bytes = await readLimited(path, options);
  if (!bytes.ok) return bytes;
  const limits = { maxCells: options.maxCells ?? FILE_DEFAULTS.maxCells, budget: options.budget ?? FILE_DEFAULTS.budget };
  const read = await readSheets(path, basename(path), kind, bytes.value, limits, workerRunner(options, path));
  if (!read.ok) return read;
  return ok(new FileHost(path, kind, read.value, options));
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
