// When a search must stop: a time on a clock. The clock can be replaced (tests make one that
// moves a step per reading, so a deadline falls at the same point of the work on any machine).

/** Milliseconds, increasing. */
export type Clock = () => number;

/** The clock every budget of the engine is read from by default (milliseconds). */
export const now: Clock = () => globalThis.performance.now();

export interface Deadline {
  /** The clock has passed the deadline (reads the clock). */
  passed(): boolean;
  /** The same clock with a deadline of its own. */
  at(time: number): Deadline;
  /** The clock's reading. */
  readonly clock: Clock;
}

export function deadlineAt(time: number, clock: Clock = now): Deadline {
  return { passed: () => clock() > time, at: (t) => deadlineAt(t, clock), clock };
}

/** A deadline that never passes: run to the end. */
export const NEVER: Deadline = deadlineAt(Infinity);
