// Progress on stderr, only once the work has taken more than a moment: a quick run prints
// nothing there, a long one says what it is doing about twice a second.
import type { CliIo } from './io.js';

const QUIET_MS = 1000;
const EVERY_MS = 500;

export class Progress {
  private readonly start: number;
  private last = -Infinity;

  constructor(
    private readonly io: CliIo,
    private readonly now: () => number = () => performance.now(),
  ) {
    this.start = now();
  }

  /** Say what is being done, when the run has already taken a while. */
  note(text: string): void {
    const t = this.now();
    if (t - this.start < QUIET_MS) return;
    this.last = t;
    this.io.err(`${text}\n`);
  }

  /** A step of a long piece of work: printed at most twice a second, after the first second. */
  tick(label: string, done: number, total: number): void {
    const t = this.now();
    if (t - this.start < QUIET_MS || t - this.last < EVERY_MS) return;
    this.last = t;
    this.io.err(`${label}: ${done} of ${total}\n`);
  }

  /** Await work that runs elsewhere (a worker); say so if it takes more than a moment. */
  async during<T>(label: string, work: Promise<T>): Promise<T> {
    const timer = setTimeout(() => this.io.err(`${label} ...\n`), QUIET_MS);
    try {
      return await work;
    } finally {
      clearTimeout(timer);
    }
  }
}
