// Questions about a union of cubes over up to 64 inputs answered on the cubes themselves, for
// tables whose union has no decision diagram of reasonable size (a few hundred rows of random
// inputs: every variable order needs millions of nodes). Finding a combination inside a cube
// and outside a union is satisfiability of a clause set (each cube of the union is a clause
// "some literal of mine is false"), solved by a small Davis-Putnam-Logemann-Loveland search:
// unit cubes force their input, pure inputs are set against their cubes, and the search
// branches on a short cube. Every answer is exact or says that the clock ran out.
import type { Deadline } from './deadline.js';
import type { WideCombination, WideCube } from './wide-cube.js';

/** The clock ran out before the answer was known. */
export const UNKNOWN = 'unknown';
export type Unknown = typeof UNKNOWN;

/** Fixed patterns of inputs (all 0, all 1, alternating, and two mixed ones) guessed first. */
const GUESSES = [0n, 0xffffffffffffffffn, 0x5555555555555555n, 0xaaaaaaaaaaaaaaaan, 0x3c96e1d2a5f0875bn, 0xc3691e2d5a0f78a4n];

/** A search reads the clock at its first step and then once in this many. */
const CLOCK_EVERY = 64;

/** Cubes looked at for the branching input. */
const SCANNED = 24;

/** Cubes restricted to a cube, with what a search needs to know of them (one pass). */
interface Restricted {
  readonly list: readonly WideCube[];
  /** One-literal cubes: the inputs they fix, the values a point outside them must take. */
  readonly unitMask: bigint;
  readonly unitBits: bigint;
  /** Two one-literal cubes on one input with both values: nothing lies outside both. */
  readonly clash: boolean;
  /** Inputs some cube asks to be 1, and to be 0. */
  readonly positive: bigint;
  readonly negative: bigint;
}

/** Cubes (their literals outside `fixedMask`) restricted to a cube; null when one holds it whole. */
function restrict(cubes: readonly WideCube[], fixedMask: bigint, fixedBits: bigint): Restricted | null {
  const list: WideCube[] = [];
  let unitMask = 0n;
  let unitBits = 0n;
  let clash = false;
  let positive = 0n;
  let negative = 0n;
  for (const c of cubes) {
    if (((c.bits ^ fixedBits) & c.mask & fixedMask) !== 0n) continue;
    const mask = c.mask & ~fixedMask;
    if (mask === 0n) return null;
    const bits = c.bits & mask;
    list.push(mask === c.mask ? c : { mask, bits });
    positive |= bits;
    negative |= mask ^ bits;
    if ((mask & (mask - 1n)) === 0n) {
      // A one-literal cube: a point outside it takes the input's other value.
      const want = bits === 0n ? mask : 0n;
      if (unitMask & mask) clash ||= (unitBits & mask) !== want;
      else {
        unitMask |= mask;
        unitBits |= want;
      }
    }
  }
  return { list, unitMask, unitBits, clash, positive, negative };
}

function lowestBit(m: bigint): bigint {
  return m & -m;
}

function literalCount(m: bigint): number {
  let k = 0;
  for (; m !== 0n; m &= m - 1n) k++;
  return k;
}

/** A short cube among the first few (counting every cube's literals would cost more than it saves). */
function shortest(cubes: readonly WideCube[]): WideCube {
  let best = cubes[0]!;
  let fewest = literalCount(best.mask);
  const end = Math.min(cubes.length, SCANNED);
  for (let i = 1; i < end && fewest > 2; i++) {
    const k = literalCount(cubes[i]!.mask);
    if (k < fewest) [best, fewest] = [cubes[i]!, k];
  }
  return best;
}

class Search {
  private steps = 0;
  timedOut = false;
  constructor(private readonly deadline: Deadline) {}

  tick(): boolean {
    if (this.steps++ % CLOCK_EVERY === 0 && this.deadline.passed()) this.timedOut = true;
    return this.timedOut;
  }

  /** A point outside every cube of `r`, agreeing with `bits` on the inputs of `mask`; null: none. */
  point(r: Restricted, mask: bigint, bits: bigint): WideCombination | null {
    if (this.tick()) return null;
    for (;;) {
      if (r.list.length === 0) return bits;
      if (r.clash) return null;
      // Units first, else the inputs every cube asks the same of, set against it: no cube gains by them.
      let fixMask = r.unitMask;
      let fixBits = r.unitBits;
      if (fixMask === 0n) {
        fixMask = r.positive ^ r.negative;
        fixBits = r.negative & ~r.positive;
      }
      if (fixMask === 0n) break;
      mask |= fixMask;
      bits |= fixBits;
      const rest = restrict(r.list, fixMask, fixBits);
      if (rest === null) return null;
      r = rest;
    }
    const branch = shortest(r.list);
    const bit = lowestBit(branch.mask);
    const literal = branch.bits & bit;
    // First the value that makes the short cube false.
    for (const value of [literal ^ bit, literal]) {
      const rest = restrict(r.list, bit, value);
      if (rest === null) continue;
      const found = this.point(rest, mask | bit, bits | value);
      if (found !== null || this.timedOut) return found;
    }
    return null;
  }
}

/**
 * A combination over n inputs inside `within` that no cube of `cubes` holds, null when the
 * cubes cover `within`, UNKNOWN when the deadline passed first.
 */
export function pointOutside(n: number, within: WideCube, cubes: readonly WideCube[], deadline: Deadline): WideCombination | null | Unknown {
  // Most questions have many answers: a few fixed guesses first, each one pass over the cubes.
  const free = ~within.mask & ((1n << BigInt(n)) - 1n);
  for (const guess of GUESSES) {
    const k = within.bits | (guess & free);
    if (!cubes.some((c) => ((k ^ c.bits) & c.mask) === 0n)) return k;
  }
  const list = restrict(cubes, within.mask, within.bits);
  if (list === null) return null;
  const search = new Search(deadline);
  const found = search.point(list, within.mask, within.bits);
  return search.timedOut ? UNKNOWN : found;
}

/** `within` lies inside the union of `cubes`: true, false, or UNKNOWN past the deadline. */
export function coveredBy(n: number, within: WideCube, cubes: readonly WideCube[], deadline: Deadline): boolean | Unknown {
  const found = pointOutside(n, within, cubes, deadline);
  return found === UNKNOWN ? UNKNOWN : found === null;
}

/** How many combinations a union leaves out: exact when `atLeast` = `atMost`. */
export interface CountBounds {
  readonly atLeast: bigint;
  readonly atMost: bigint;
}

/** "5 combinations", or "at least 5 combinations (at most 9: ...)" where the count was cut short. */
export function boundsWords(b: CountBounds, word: string): string {
  const words = (k: bigint): string => `${k} ${word}${k === 1n ? '' : 's'}`;
  if (b.atLeast === b.atMost) return words(b.atLeast);
  return `at least ${words(b.atLeast)} (at most ${b.atMost}: the count on the rows' cubes stopped at its time limit)`;
}

/** The combinations left out: counted, and the disjoint cubes of those found (the first of them). */
export interface LeftOut extends CountBounds {
  readonly cubes: readonly WideCube[];
}

/**
 * The combinations over n inputs that no cube holds: counted by splitting on an input of a
 * short cube (a one-literal cube covers its half at once). Breadth first until `halfway`, so
 * that the largest parts are settled first (a close upper bound), then depth first, so that
 * gaps are found (a lower bound that is not 0). Where the deadline stops the count, each part
 * not yet settled adds 0 to `atLeast` and its size to `atMost`. The disjoint cubes of what was
 * found left out come with it (at most `listed`).
 */
export function countOutside(n: number, cubes: readonly WideCube[], deadline: Deadline, listed: number, halfway: Deadline = deadline): LeftOut {
  const search = new Search(deadline);
  const found: WideCube[] = [];
  let atLeast = 0n;
  type Part = { readonly r: Restricted; readonly mask: bigint; readonly bits: bigint; readonly free: number };
  const start = restrict(cubes, 0n, 0n);
  const parts: Part[] = start === null ? [] : [{ r: start, mask: 0n, bits: 0n, free: n }];
  let head = 0;
  let broad = true;
  while (head < parts.length && !search.tick()) {
    broad &&= !halfway.passed();
    const { r, mask, bits, free } = broad ? parts[head++]! : parts.pop()!;
    if (r.list.length === 0) {
      atLeast += 1n << BigInt(free);
      if (found.length < listed) found.push({ mask, bits });
      continue;
    }
    // A one-literal cube covers its half at once: only the other half is left.
    if (r.clash) continue;
    if (r.unitMask !== 0n) {
      const rest = restrict(r.list, r.unitMask, r.unitBits);
      if (rest !== null) parts.push({ r: rest, mask: mask | r.unitMask, bits: bits | r.unitBits, free: free - literalCount(r.unitMask) });
      continue;
    }
    const bit = lowestBit(shortest(r.list).mask);
    for (const value of [bit, 0n]) {
      const rest = restrict(r.list, bit, value);
      if (rest !== null) parts.push({ r: rest, mask: mask | bit, bits: bits | value, free: free - 1 });
    }
  }
  let unsettled = 0n;
  for (let k = head; k < parts.length; k++) unsettled += 1n << BigInt(parts[k]!.free);
  return { atLeast, atMost: atLeast + unsettled, cubes: found };
}
