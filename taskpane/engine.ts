// The pane's handle on the engine worker: one request at a time, each method typed by its
// request kind, progress reports, and a cancel that terminates the worker (the only way to
// stop a long computation) and starts anew. The new worker is given the last workbook examined
// again, so table ids the pane holds keep their meaning.
import type { Answers, EngineAnswer, EngineMessage, EngineRequest, Requests } from './engine-protocol.js';

export type Progress = (done: number, total: number, what: string) => void;

export class Cancelled extends Error {
  constructor() {
    super('stopped by the user');
  }
}

interface Pending {
  readonly id: number;
  readonly accept: (answer: EngineAnswer) => void;
  readonly reject: (e: Error) => void;
  readonly progress?: Progress;
}

export class Engine {
  private worker: Worker;
  private nextId = 1;
  private pending: Pending | undefined;
  /** The last examine that was answered: replayed into a new worker after a cancel. */
  private examined: EngineRequest | undefined;

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
        if (e.data.kind === 'answer') p.accept(e.data.answer);
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

  /** Send a request; `pick` takes the answer of the same kind (any other is a bug, reported). */
  private send<T>(request: EngineRequest, pick: (a: EngineAnswer) => T | undefined, progress?: Progress): Promise<T> {
    if (this.pending) this.cancel();
    const id = this.nextId++;
    return new Promise<T>((resolve, reject) => {
      const accept = (a: EngineAnswer) => {
        const value = pick(a);
        if (value === undefined) reject(new Error(`bug in the engine: a ${a.kind} answer to a ${request.kind} request`));
        else resolve(value);
      };
      this.pending = { id, accept, reject, ...(progress ? { progress } : {}) };
      this.worker.postMessage({ id, request });
    });
  }

  async examine(body: Requests['examine'], progress?: Progress): Promise<Answers['examine']> {
    const request: EngineRequest = { kind: 'examine', ...body };
    const answer = await this.send(request, (a) => (a.kind === 'examine' ? a.value : undefined), progress);
    this.examined = request;
    return answer;
  }

  check(body: Requests['check']): Promise<Answers['check']> {
    return this.send({ kind: 'check', ...body }, (a) => (a.kind === 'check' ? a.value : undefined));
  }

  verify(body: Requests['verify']): Promise<Answers['verify']> {
    return this.send({ kind: 'verify', ...body }, (a) => (a.kind === 'verify' ? a.value : undefined));
  }

  sheets(): Promise<Answers['sheets']> {
    return this.send({ kind: 'sheets' }, (a) => (a.kind === 'sheets' ? a.value : undefined));
  }

  handOver(body: Requests['handOver']): Promise<Answers['handOver']> {
    return this.send({ kind: 'handOver', ...body }, (a) => (a.kind === 'handOver' ? a.value : undefined));
  }

  records(body: Requests['records']): Promise<Answers['records']> {
    return this.send({ kind: 'records', ...body }, (a) => (a.kind === 'records' ? a.value : undefined));
  }

  compare(body: Requests['compare'], progress?: Progress): Promise<Answers['compare']> {
    return this.send({ kind: 'compare', ...body }, (a) => (a.kind === 'compare' ? a.value : undefined), progress);
  }

  get busy(): boolean {
    return this.pending !== undefined;
  }

  /** Stop whatever runs: the worker is terminated and a fresh one started with the last workbook examined. */
  cancel(): void {
    this.worker.terminate();
    const p = this.pending;
    this.pending = undefined;
    this.worker = this.spawn();
    // Messages are handled in order: anything sent next finds the workbook examined again.
    if (this.examined) this.worker.postMessage({ id: this.nextId++, request: this.examined });
    p?.reject(new Cancelled());
  }
}
