// WorkbookHost over a workbook or CSV file opened in the browser (the standalone page).
// SheetJS parses the file only inside a Web Worker that runs the file host's own parsing
// worker (parse-worker.mjs), one job per worker, stopped after a time limit; plain grids come
// back and are checked cell by cell (parsed-workbook.ts, shared with the command line). CSV
// text goes through our own parser (csv.ts). Results are new sheets added to a copy of the
// workbook's package (xlsx-package.ts), offered as a download: the user's file is never changed.
import { fail, ok, type Result } from '../logic/result.js';
import { inflateRawWeb } from './inflate-web.js';
import { fileKind, ParsedWorkbook, readSheets, type FileKind, type RunParseJob, type SheetData } from './parsed-workbook.js';

export interface BrowserFileOptions {
  /** Starts the worker that runs parse-worker.mjs (taskpane/xlsx-worker.ts in the page). */
  readonly startWorker: () => Worker;
  readonly timeLimitMs?: number;
  readonly maxBytes?: number;
  readonly maxCells?: number;
}

/** Browser tabs have less room than the command line: smaller limits than file-host.ts. */
export const BROWSER_DEFAULTS = { timeLimitMs: 20_000, maxBytes: 30 * 1024 * 1024, maxCells: 5_000_000 } as const;

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
      worker.onerror = (e: ErrorEvent) => finish(fail({ message: `${what}: could not be read (${e.message})` }));
      worker.postMessage({ ...job, bytes: copy }, [copy.buffer]);
    });
}

export class BrowserFileHost extends ParsedWorkbook {
  constructor(
    readonly fileName: string,
    kind: FileKind,
    private readonly source: Uint8Array,
    sheets: readonly SheetData[],
  ) {
    super(fileName, kind, sheets);
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
  const sheets = await readSheets(fileName, fileName, kind, bytes, options.maxCells ?? BROWSER_DEFAULTS.maxCells, jobRunner(options, fileName));
  return sheets.ok ? ok(new BrowserFileHost(fileName, kind, bytes, sheets.value)) : sheets;
}
