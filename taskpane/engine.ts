// The pane's handle on the engine worker: one request at a time, progress reports, and a
// cancel that terminates the worker (the only way to stop a long computation) and starts anew.
import type { Analysed, EngineMessage, EngineRequest } from './engine-protocol.js';
import type { Result } from '../src/logic/result.js';
import type { ImplCheck } from '../src/logic/implcheck.js';
import type { VerifyReport } from '../src/impl/verify.js';

export type Progress = (done: number, total: number, what: string) => void;

export class Cancelled extends Error {
  constructor() {
    super('stopped by the user');
  }
}

export class Engine {
  private worker: Worker;
  private nextId = 1;
  private pending: { id: number; resolve: (v: unknown) => void; reject: (e: Error) => void; progress?: Progress } | undefined;

  constructor(private readonly start: () => Worker) {
    this.worker = this.spawn();
  }

  private spawn(): Worker {
    const worker = this.start();
    worker.onmessage = (e: MessageEvent<EngineMessage>) => {
      const p = this.pending;
      if (!p || e.data.id !== p.id) return;
      if (e.data.kind === 'progress') p.progress?.(e.data.done, e.data.total, e.data.what);
      else {
        this.pending = undefined;
        if (e.data.kind === 'answer') p.resolve(e.data.answer);
        else p.reject(new Error(e.data.message));
      }
    };
    worker.onerror = (e: ErrorEvent) => {
      const p = this.pending;
      this.pending = undefined;
      p?.reject(new Error(`the engine stopped: ${e.message}`));
    };
    return worker;
  }

  private request<T>(request: EngineRequest, progress?: Progress): Promise<T> {
    if (this.pending) this.cancel();
    const id = this.nextId++;
    return new Promise<T>((resolve, reject) => {
      this.pending = { id, resolve: resolve as (v: unknown) => void, reject, ...(progress ? { progress } : {}) };
      this.worker.postMessage({ id, request });
    });
  }

  analyse(request: Extract<EngineRequest, { kind: 'analyse' }>, progress?: Progress): Promise<Analysed> {
    return this.request(request, progress);
  }

  check(request: Extract<EngineRequest, { kind: 'check' }>): Promise<Result<ImplCheck>> {
    return this.request(request);
  }

  verify(request: Extract<EngineRequest, { kind: 'verify' }>): Promise<Result<VerifyReport>> {
    return this.request(request);
  }

  get busy(): boolean {
    return this.pending !== undefined;
  }

  /** Stop whatever runs: the worker is terminated and a fresh one started. */
  cancel(): void {
    this.worker.terminate();
    const p = this.pending;
    this.pending = undefined;
    this.worker = this.spawn();
    p?.reject(new Cancelled());
  }
}
