// WorkbookHost over a workbook file (.xlsx/.xlsm) or a CSV file, for the command line.
// Workbook files are parsed by SheetJS only inside parse-worker.mjs, in a worker thread with
// a time limit, a heap limit and a file-size limit; plain grids come back and are checked
// again cell by cell (parsed-workbook.ts, shared with the standalone page). Results are written to a new file: never the input, via a temp file + rename.
import { randomBytes } from 'node:crypto';
import { existsSync, realpathSync, statSync } from 'node:fs';
import { readFile, rename, stat, unlink, writeFile } from 'node:fs/promises';
import { basename, dirname, extname, join, resolve } from 'node:path';
import { Worker } from 'node:worker_threads';
import { inflateRawSync } from 'node:zlib';
import { fail, ok, type Result } from '../logic/result.js';
import type { SheetBlock } from '../report/sheet-block.js';
import { fileKind, ParsedWorkbook, readSheets, type FileKind, type RunParseJob, type SheetData } from './parsed-workbook.js';
import type { WriteReport } from './workbook-host.js';

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

/** Each job in a fresh parsing worker thread, within the time limit and the heap limit. */
const workerRunner = (options: FileHostOptions, what: string): RunParseJob => (job, bytes) => {
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
    const finish = (answer: Result<unknown>): void => {
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
    worker.on('message', (answer: unknown) => finish(ok(answer)));
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
};

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

/** Raw inflate with an output limit (zlib stops at it), for the parts of a package we add to. */
async function inflateRawNode(data: Uint8Array, maxBytes: number): Promise<Uint8Array> {
  return new Uint8Array(inflateRawSync(data, { maxOutputLength: maxBytes }));
}

/** A workbook or CSV file opened for reading, with result sheets queued for `save`. */
export class FileHost extends ParsedWorkbook {
  constructor(
    readonly path: string,
    kind: FileKind,
    sheets: readonly SheetData[],
    private readonly options: FileHostOptions,
  ) {
    super(path, kind, sheets);
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
  const bytes = await readLimited(path, options);
  if (!bytes.ok) return bytes;
  const sheets = await readSheets(path, basename(path), kind, bytes.value, options.maxCells ?? FILE_DEFAULTS.maxCells, workerRunner(options, path));
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
