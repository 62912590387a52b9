// Web Worker of the standalone page: SheetJS parses the workbook here, never in the page.
// One job per worker (as on the command line): the page posts the job, this realm answers
// with plain grids (or the appended workbook's bytes) and is then thrown away.
// A CSV job is answered by our own reader here, so that the page's main thread never parses.
import { csvAnswer } from '../src/hosts/index.js';
import { setWorkerData } from './worker-threads-shim.js';

self.onmessage = async (event: MessageEvent) => {
  const job = event.data as { mode?: string; fileName?: string; bytes?: Uint8Array; maxCells?: number };
  if (job.mode === 'csv') {
    self.postMessage(csvAnswer(job.fileName ?? 'Sheet1', job.bytes ?? new Uint8Array(), job.maxCells ?? 0));
    return;
  }
  setWorkerData(event.data);
  try {
    // @ts-expect-error plain JavaScript without types; only running it is wanted.
    await import(/* webpackMode: "eager" */ '../src/hosts/parse-worker.mjs');
  } catch (e) {
    self.postMessage({ ok: false, message: e instanceof Error ? e.message : String(e) });
  }
};
