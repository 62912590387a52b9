// WorkbookHost over a workbook or CSV file opened in the browser (the standalone page).
// SheetJS parses the file only inside a Web Worker that runs the file host's own parsing
// worker (parse-worker.mjs), one job per worker, stopped after a time limit; plain grids come
// back and are checked cell by cell (parsed-workbook.ts, shared with the command line). CSV
// text goes through our own parser (csv.ts), in that worker too (the page stays responsive).
// Results are new sheets added to a copy of the workbook's package (xlsx-package.ts), offered
// as a download: the user's file is never changed.
import { fail, ok, type Result } from '../logic/index.js';
import { inflateRawWeb } from './zip-package.mjs';
import { fileKind, ParsedWorkbook, readSheets, type FileKind, type FileRead, type RunParseJob, type UnpackBudget } from './parsed-workbook.js';

export interface BrowserFileOptions {
  /** Starts the worker that runs parse-worker.mjs (taskpane/xlsx-worker.ts in the page). */
  readonly startWorker: () => Worker;
  readonly timeLimitMs?: number;
  readonly maxBytes?: number;
  readonly maxCells?: number;
  readonly budget?: UnpackBudget;
}

const MB = 1024 * 1024;

/** Browser tabs have less room than the command line: smaller limits than file-host.ts. */
export const BROWSER_DEFAULTS = {
  timeLimitMs: 20_000,
  maxBytes: 30 * MB,
  maxCells: 5_000_000,
  budget: { maxEntryBytes: 64 * MB, maxTotalBytes: 128 * MB, maxRatio: 200 },
} as const;

/** One job in a fresh worker, on a copy of the bytes (the page keeps its own), stopped after the time limit. */
function jobRunner(options: BrowserFileOptions, what: string): RunParseJob {
  const limit = options.timeLimitMs ?? BROWSER_DEFAULTS.timeLimitMs;
  return (job, bytes) =>
    new Promise((done) => {
      const copy = bytes.slice();
      const worker = options.startWorker();
      const finish = (r: Result<unknown>) => {
        clearTimeout(timer);
        worker.terminate();
        done(r);
      };
      const timer = setTimeout(() => finish(fail({ message: `${what}: reading took longer than the limit of ${limit / 1000} s and was stopped` })), limit);
      worker.onmessage = (e: MessageEvent<unknown>) => finish(ok(e.data));
      // A worker that runs out of memory or crashes ends here, as a failed read.
      worker.onerror = (e: ErrorEvent) => finish(fail({ message: `${what}: could not be read (${e.message || 'the reader stopped'})` }));
      worker.postMessage({ ...job, bytes: copy }, [copy.buffer]);
    });
}

export class BrowserFileHost extends ParsedWorkbook {
  constructor(
    readonly fileName: string,
    kind: FileKind,
    private readonly source: Uint8Array,
    read: FileRead,
  ) {
    super(fileName, kind, read);
  }

  /** Name offered for the download: "capper-cell-results.xlsx". */
  resultsFileName(): string {
    return `${this.fileName.replace(/\.[^.]*$/, '')}-results.xlsx`;
  }

  /** The file's sheets followed by the queued ones, as .xlsx bytes. */
  resultsWorkbook(): Promise<Result<Uint8Array>> {
    return this.resultsBytes(async () => ok(this.source), inflateRawWeb);
  }
}

/** Open a workbook (.xlsx, .xlsm) or CSV file the user picked. Errors name the file. */
export async function openBrowserFile(fileName: string, bytes: Uint8Array, options: BrowserFileOptions): Promise<Result<BrowserFileHost>> {
  const maxBytes = options.maxBytes ?? BROWSER_DEFAULTS.maxBytes;
  if (bytes.length > maxBytes) return fail({ message: `${fileName}: ${bytes.length} bytes is more than the page's limit of ${maxBytes} bytes` });
  const kind = fileKind(fileName);
  if (!kind) return fail({ message: `${fileName}: not a workbook or CSV file (expected .xlsx, .xlsm or .csv)` });
  // CSV is parsed in the worker too: a large file must not freeze the page.
  const limits = { maxCells: options.maxCells ?? BROWSER_DEFAULTS.maxCells, budget: options.budget ?? BROWSER_DEFAULTS.budget, csvInWorker: true };
  const read = await readSheets(fileName, fileName, kind, bytes, limits, jobRunner(options, fileName));
  return read.ok ? ok(new BrowserFileHost(fileName, kind, bytes, read.value)) : read;
}
