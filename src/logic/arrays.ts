// Array helpers for input-sized lists. `list.push(...items)` and `Math.max(...values)` pass
// every element as a call argument, and a call takes only so many (about 100,000 in V8)
// before it overflows the stack: a sheet with 150,000 bad cells has that many problems.

/** Append every item to `target`, one at a time. */
export function appendAll<T>(target: T[], items: Iterable<T>): T[] {
  for (const item of items) target.push(item);
  return target;
}

/** The largest of the values, or `floor` when there are none (or all are below it). */
export function maxOf(values: Iterable<number>, floor = -Infinity): number {
  let max = floor;
  for (const v of values) if (v > max) max = v;
  return max;
}

/** The smallest of the values, or `ceiling` when there are none (or all are above it). */
export function minOf(values: Iterable<number>, ceiling = Infinity): number {
  let min = ceiling;
  for (const v of values) if (v < min) min = v;
  return min;
}
