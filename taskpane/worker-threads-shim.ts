// Stands in for node:worker_threads inside a Web Worker (wired by webpack.config.ts), so that
// the file host's SheetJS worker (src/hosts/parse-worker.mjs) runs in the browser unchanged.
// `workerData` is filled from the first message before that module is evaluated.

/** The job the page posted; set by xlsx-worker.ts before it imports parse-worker.mjs. */
export let workerData: unknown;

export function setWorkerData(data: unknown): void {
  workerData = data;
}

export const parentPort = {
  postMessage(message: unknown, transfer: Transferable[] = []): void {
    (self as unknown as Worker).postMessage(message, transfer);
  },
};
