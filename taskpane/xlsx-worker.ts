// Web Worker of the standalone page: SheetJS parses the workbook here, never in the page.
// One job per worker (as on the command line): the page posts the job, this realm answers
// with plain grids (or the appended workbook's bytes) and is then thrown away.
import { setWorkerData } from './worker-threads-shim.js';

self.onmessage = async (event: MessageEvent) => {
  setWorkerData(event.data);
  try {
    // @ts-expect-error plain JavaScript without types; only running it is wanted.
    await import(/* webpackMode: "eager" */ '../src/hosts/parse-worker.mjs');
  } catch (e) {
    self.postMessage({ ok: false, message: e instanceof Error ? e.message : String(e) });
  }
};
