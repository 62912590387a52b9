// Questions about a union of cubes over up to 64 inputs answered on the cubes themselves, for
// tables whose union has no decision diagram of reasonable size (a few hundred rows of random
// inputs: every variable order needs millions of nodes). Finding a combination inside a cube
// and outside a union is satisfiability of a clause set (each cube of the union is a clause
// "some literal of mine is false"), solved by a small Davis-Putnam-Logemann-Loveland search:
// unit cubes force their input, pure inputs are set against their cubes, and the search
// branches on a short cube. Every answer is exact or says that the clock ran out.
//
// Inside, a cube is four 32-bit words (mask high, mask low, bits high, bits low) in one
// Int32Array per list: every BigInt operation allocates, and a search does millions of them.
import type { Deadline } from './deadline.js';
import type { WideCombination, WideCube } from './wide-cube.js';

/** The clock ran out before the answer was known. */
export const UNKNOWN = 'unknown';
export type Unknown = typeof UNKNOWN;

/** Fixed patterns of inputs (all 0, all 1, alternating, and two mixed ones), high and low words, guessed first. */
const GUESSES: readonly (readonly [number, number])[] = [
  [0, 0],
  [-1, -1],
  [0x55555555, 0x55555555],
  [0xaaaaaaaa | 0, 0xaaaaaaaa | 0],
  [0x3c96e1d2, 0xa5f0875b | 0],
  [0xc3691e2d | 0, 0x5a0f78a4],
];

/** A search reads the clock at its first step and then once in this many. */
const CLOCK_EVERY = 64;

/** Cubes looked at for the branching input. */
const SCANNED = 24;

const LOW = 0xffffffffn;

/** A list of cubes as words: cube i at 4i (mask high, mask low, bits high, bits low). */
function toWords(cubes: readonly WideCube[]): Int32Array {
  const w = new Int32Array(cubes.length * 4);
  cubes.forEach((c, i) => {
    w[4 * i] = Number(c.mask >> 32n) | 0;
    w[4 * i + 1] = Number(c.mask & LOW) | 0;
    w[4 * i + 2] = Number(c.bits >> 32n) | 0;
    w[4 * i + 3] = Number(c.bits & LOW) | 0;
  });
  return w;
}

function toBig(hi: number, lo: number): bigint {
  return (BigInt(hi >>> 0) << 32n) | BigInt(lo >>> 0);
}

function bitCount(x: number): number {
  x -= (x >>> 1) & 0x55555555;
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24) as number;
}

function isOneBit(x: number): boolean {
  return x !== 0 && (x & (x - 1)) === 0;
}

/** Cubes restricted to a cube, with what a search needs to know of them (one pass). */
interface Restricted {
  readonly w: Int32Array;
  readonly count: number;
  /** One-literal cubes: the inputs they fix, the values a point outside them must take. */
  readonly unit: readonly [number, number, number, number];
  /** Two one-literal cubes on one input with both values: nothing lies outside both. */
  readonly clash: boolean;
  /** Inputs some cube asks to be 1 (high, low), and to be 0. */
  readonly positive: readonly [number, number];
  readonly negative: readonly [number, number];
}

/** Cubes (their literals outside the fixed mask) restricted to a cube; null when one holds it whole. */
function restrict(w: Int32Array, count: number, fmh: number, fml: number, fbh: number, fbl: number): Restricted | null {
  const out = new Int32Array(count * 4);
  let k = 0;
  let umh = 0;
  let uml = 0;
  let ubh = 0;
  let ubl = 0;
  let clash = false;
  let ph = 0;
  let pl = 0;
  let nh = 0;
  let nl = 0;
  for (let j = 0; j < count * 4; j += 4) {
    const mh = w[j]!;
    const ml = w[j + 1]!;
    const bh = w[j + 2]!;
    const bl = w[j + 3]!;
    if ((((bh ^ fbh) & mh & fmh) | ((bl ^ fbl) & ml & fml)) !== 0) continue;
    const rmh = mh & ~fmh;
    const rml = ml & ~fml;
    if ((rmh | rml) === 0) return null;
    const rbh = bh & rmh;
    const rbl = bl & rml;
    out[k] = rmh;
    out[k + 1] = rml;
    out[k + 2] = rbh;
    out[k + 3] = rbl;
    k += 4;
    ph |= rbh;
    pl |= rbl;
    nh |= rmh ^ rbh;
    nl |= rml ^ rbl;
    if ((rmh === 0 && isOneBit(rml)) || (rml === 0 && isOneBit(rmh))) {
      // A one-literal cube: a point outside it takes the input's other value.
      const wantH = rbh === 0 ? rmh : 0;
      const wantL = rbl === 0 ? rml : 0;
      if ((umh & rmh) | (uml & rml)) clash ||= (ubh & rmh) !== wantH || (ubl & rml) !== wantL;
      else {
        umh |= rmh;
        uml |= rml;
        ubh |= wantH;
        ubl |= wantL;
      }
    }
  }
  return { w: out, count: k / 4, unit: [umh, uml, ubh, ubl], clash, positive: [ph, pl], negative: [nh, nl] };
}

/** The index of a short cube among the first few (counting every cube's literals would cost more than it saves). */
function shortest(r: Restricted): number {
  let best = 0;
  let fewest = bitCount(r.w[0]!) + bitCount(r.w[1]!);
  const end = Math.min(r.count, SCANNED);
  for (let i = 1; i < end && fewest > 2; i++) {
    const k = bitCount(r.w[4 * i]!) + bitCount(r.w[4 * i + 1]!);
    if (k < fewest) [best, fewest] = [i, k];
  }
  return best;
}

/** One input of cube i, as (high, low) words with one bit set, and the value its literal asks for. */
function branchInput(r: Restricted, i: number): { h: number; l: number; wantH: number; wantL: number } {
  const ml = r.w[4 * i + 1]!;
  if (ml !== 0) {
    const l = ml & -ml;
    return { h: 0, l, wantH: 0, wantL: r.w[4 * i + 3]! & l };
  }
  const mh = r.w[4 * i]!;
  const h = mh & -mh;
  return { h, l: 0, wantH: r.w[4 * i + 2]! & h, wantL: 0 };
}

class Search {
  private steps = 0;
  timedOut = false;
  constructor(private readonly deadline: Deadline) {}

  tick(): boolean {
    if (this.steps++ % CLOCK_EVERY === 0 && this.deadline.passed()) this.timedOut = true;
    return this.timedOut;
  }

  /** A point outside every cube of `r`, agreeing with (bh, bl) on the inputs of (mh, ml); null: none. */
  point(r: Restricted, mh: number, ml: number, bh: number, bl: number): WideCombination | null {
    if (this.tick()) return null;
    for (;;) {
      if (r.count === 0) return toBig(bh, bl);
      if (r.clash) return null;
      // Units first, else the inputs every cube asks the same of, set against it: no cube gains by them.
      let [fmh, fml, fbh, fbl] = r.unit;
      if ((fmh | fml) === 0) {
        fmh = r.positive[0] ^ r.negative[0];
        fml = r.positive[1] ^ r.negative[1];
        fbh = r.negative[0] & ~r.positive[0];
        fbl = r.negative[1] & ~r.positive[1];
      }
      if ((fmh | fml) === 0) break;
      mh |= fmh;
      ml |= fml;
      bh |= fbh;
      bl |= fbl;
      const rest = restrict(r.w, r.count, fmh, fml, fbh, fbl);
      if (rest === null) return null;
      r = rest;
    }
    const { h, l, wantH, wantL } = branchInput(r, shortest(r));
    // First the value that makes the short cube false.
    for (const [vh, vl] of [
      [wantH ^ h, wantL ^ l],
      [wantH, wantL],
    ] as const) {
      const rest = restrict(r.w, r.count, h, l, vh, vl);
      if (rest === null) continue;
      const found = this.point(rest, mh | h, ml | l, bh | vh, bl | vl);
      if (found !== null || this.timedOut) return found;
    }
    return null;
  }
}

/** The words of the first n inputs: high, low. */
function inputWords(n: number): [number, number] {
  return [n <= 32 ? 0 : n >= 64 ? -1 : (2 ** (n - 32) - 1) | 0, n >= 32 ? -1 : (2 ** n - 1) | 0];
}

/**
 * A combination over n inputs inside `within` that no cube of `cubes` holds, null when the
 * cubes cover `within`, UNKNOWN when the deadline passed first.
 */
export function pointOutside(n: number, within: WideCube, cubes: readonly WideCube[], deadline: Deadline): WideCombination | null | Unknown {
  const w = toWords(cubes);
  const fixed = toWords([within]);
  const [mh, ml, bh, bl] = [fixed[0]!, fixed[1]!, fixed[2]!, fixed[3]!];
  const [allH, allL] = inputWords(n);
  // Most questions have many answers: a few fixed guesses first, each one pass over the cubes.
  for (const [gh, gl] of GUESSES) {
    const kh = bh | (gh & ~mh & allH);
    const kl = bl | (gl & ~ml & allL);
    let inside = false;
    for (let j = 0; j < w.length && !inside; j += 4) inside = (((kh ^ w[j + 2]!) & w[j]!) | ((kl ^ w[j + 3]!) & w[j + 1]!)) === 0;
    if (!inside) return toBig(kh, kl);
  }
  const r = restrict(w, cubes.length, mh, ml, bh, bl);
  if (r === null) return null;
  const search = new Search(deadline);
  const found = search.point(r, mh, ml, bh, bl);
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
  type Part = { readonly r: Restricted; readonly mh: number; readonly ml: number; readonly bh: number; readonly bl: number; readonly free: number };
  const start = restrict(toWords(cubes), cubes.length, 0, 0, 0, 0);
  const parts: Part[] = start === null ? [] : [{ r: start, mh: 0, ml: 0, bh: 0, bl: 0, free: n }];
  let head = 0;
  let broad = true;
  while (head < parts.length && !search.tick()) {
    broad &&= !halfway.passed();
    const { r, mh, ml, bh, bl, free } = broad ? parts[head++]! : parts.pop()!;
    if (r.count === 0) {
      atLeast += 1n << BigInt(free);
      if (found.length < listed) found.push({ mask: toBig(mh, ml), bits: toBig(bh, bl) });
      continue;
    }
    // A one-literal cube covers its half at once: only the other half is left.
    if (r.clash) continue;
    const [umh, uml, ubh, ubl] = r.unit;
    if ((umh | uml) !== 0) {
      const rest = restrict(r.w, r.count, umh, uml, ubh, ubl);
      if (rest !== null) parts.push({ r: rest, mh: mh | umh, ml: ml | uml, bh: bh | ubh, bl: bl | ubl, free: free - bitCount(umh) - bitCount(uml) });
      continue;
    }
    const { h, l } = branchInput(r, shortest(r));
    for (const [vh, vl] of [
      [h, l],
      [0, 0],
    ] as const) {
      const rest = restrict(r.w, r.count, h, l, vh, vl);
      if (rest !== null) parts.push({ r: rest, mh: mh | h, ml: ml | l, bh: bh | vh, bl: bl | vl, free: free - 1 });
    }
  }
  let unsettled = 0n;
  for (let k = head; k < parts.length; k++) unsettled += 1n << BigInt(parts[k]!.free);
  return { atLeast, atMost: atLeast + unsettled, cubes: found };
}
