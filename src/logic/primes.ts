// Prime implicants of a function with don't-cares, and the cube/bit-set relations they need.
import { flipBit, popcount, union, wordCount, type BitSet } from './bits.js';
import { cube, type Cube } from './cube.js';
import type { BoolFunction } from './boolfn.js';
import { NEVER, type Deadline } from './deadline.js';

/** Up to this many inputs the primes come from the bit-set lattice; above, from cubes. */
export const LATTICE_MAX_INPUTS = 14;

/**
 * Every prime implicant of on ∪ dc that contains at least one on-set combination (primes made
 * of don't-cares only never help a cover), in printed order (see `comparePrinted`).
 */
export function primeImplicants(fn: BoolFunction): Cube[] {
  return primesWithin(fn, NEVER)!;
}

/** As `primeImplicants`, or null when `deadline` passes first. */
export function primesWithin(fn: BoolFunction, deadline: Deadline): Cube[] | null {
  const found =
    fn.n <= LATTICE_MAX_INPUTS ? latticePrimes(fn.n, union(fn.on, fn.dc), deadline) : cubePrimes(fn, deadline);
  if (found === null) return null;
  const touching: Cube[] = [];
  for (let i = 0; i < found.length; i++) {
    if ((i & 255) === 255 && deadline.passed()) return null;
    if (cubeMeetsSet(fn.n, found[i]!, fn.on)) touching.push(found[i]!);
  }
  return touching.sort(comparePrinted(fn.n));
}

/**
 * Printed order: input by input from the leftmost, a cube with the plain literal first, then
 * the negated one, then the cube without that input. AB + AC' + B'C reads in this order.
 */
export function comparePrinted(n: number): (a: Cube, b: Cube) => number {
  const rank = (c: Cube, bit: number): number => (c.mask & bit ? (c.bits & bit ? 0 : 1) : 2);
  return (a, b) => {
    for (let i = n - 1; i >= 0; i--) {
      const d = rank(a, 1 << i) - rank(b, 1 << i);
      if (d !== 0) return d;
    }
    return 0;
  };
}

// ---- cubes against bit sets, a word at a time ------------------------------------------------

/** Visit each word of a bit set that a cube touches, with the cube's bits inside that word. */
function forEachCubeWord(n: number, c: Cube, visit: (word: number, bits: number) => boolean): void {
  const positions = n >= 5 ? 32 : 1 << n;
  const lowMask = c.mask & 31;
  const lowBits = c.bits & 31;
  let inWord = 0;
  for (let p = 0; p < positions; p++) if ((p & lowMask) === lowBits) inWord |= 1 << p;
  inWord >>>= 0;
  if (n <= 5) {
    visit(0, inWord);
    return;
  }
  const freeHigh = ((1 << (n - 5)) - 1) & ~(c.mask >>> 5);
  const base = c.bits >>> 5;
  let sub = 0;
  do {
    if (!visit(base | sub, inWord)) return;
    sub = (sub - freeHigh) & freeHigh;
  } while (sub !== 0);
}

/** Every combination of the cube is in the set. */
export function cubeInsideSet(n: number, c: Cube, set: BitSet): boolean {
  let inside = true;
  forEachCubeWord(n, c, (w, bits) => (inside = ((set[w]! & bits) >>> 0) === bits));
  return inside;
}

/** Some combination of the cube is in the set. */
export function cubeMeetsSet(n: number, c: Cube, set: BitSet): boolean {
  let meets = false;
  forEachCubeWord(n, c, (w, bits) => !(meets = (set[w]! & bits) !== 0));
  return meets;
}

/** a ⊆ b as sets of combinations. */
export function cubeWithin(a: Cube, b: Cube): boolean {
  return (b.mask & ~a.mask) === 0 && ((a.bits ^ b.bits) & b.mask) === 0;
}

export function cubesDisjoint(a: Cube, b: Cube): boolean {
  return ((a.bits ^ b.bits) & a.mask & b.mask) !== 0;
}

// ---- the bit-set lattice (small n) -------------------------------------------------------------

/**
 * For each set D of free inputs, I_D = the x whose cube (D free, the rest as in x) lies in F:
 * I_{D+v} = I_D AND flip_v(I_D). A cube is prime when no I_{D+v} holds it. Layers by |D| keep
 * two layers in memory; a D whose I_D is empty has no implicant above it, so it is not kept.
 */
function latticePrimes(n: number, f: BitSet, deadline: Deadline): Cube[] | null {
  const full = (1 << n) - 1;
  const out: Cube[] = [];
  let layer = new Map<number, BitSet>([[0, f]]);
  while (layer.size > 0) {
    const next = new Map<number, BitSet>();
    for (const [d, set] of layer) {
      if (deadline.passed()) return null;
      for (let v = 32 - Math.clz32(d); v < n; v++) {
        const grown = flipBit(set, v);
        let any = 0;
        for (let i = 0; i < grown.length; i++) any |= grown[i]! &= set[i]!;
        if (any !== 0) next.set(d | (1 << v), grown);
      }
    }
    for (const [d, set] of layer) {
      const prime = set.slice();
      for (let v = 0; v < n; v++) {
        const above = d & (1 << v) ? undefined : next.get(d | (1 << v));
        if (above) for (let i = 0; i < prime.length; i++) prime[i]! &= ~above[i]!;
      }
      collectAnchors(n, d, prime, (x) => out.push(cube(full & ~d, x)));
    }
    layer = next;
  }
  return out;
}

/** Members x of the set with no bit of d (one anchor per cube with free inputs d). */
function collectAnchors(n: number, d: number, set: BitSet, found: (x: number) => void): void {
  let lowFree = 0;
  const positions = n >= 5 ? 32 : 1 << n;
  for (let p = 0; p < positions; p++) if ((p & d & 31) === 0) lowFree |= 1 << p;
  const highD = d >>> 5;
  for (let w = 0; w < wordCount(n); w++) {
    if ((w & highD) !== 0) continue;
    let word = set[w]! & lowFree;
    while (word !== 0) {
      const low = word & -word;
      found((w << 5) | (31 - Math.clz32(low)));
      word ^= low;
    }
  }
}

// ---- cubes (large n) ------------------------------------------------------------------------

/**
 * A cover of the set by disjoint cubes: split on the leftmost input still free, but leave an
 * input free where both halves agree, so that a row "any, any, ..., 1" stays one cube.
 */
export function setToCubes(n: number, set: BitSet): Cube[] {
  const out: Cube[] = [];
  // words: the function of the low k inputs; mask/bits: the inputs above k fixed so far.
  const walkWords = (words: BitSet, k: number, mask: number, bits: number): void => {
    if (k <= 5) {
      walkBits(words[0]!, k, mask, bits);
      return;
    }
    let all = 0xffffffff;
    let any = 0;
    for (let i = 0; i < words.length; i++) {
      all &= words[i]!;
      any |= words[i]!;
    }
    if (any === 0) return;
    if (all >>> 0 === 0xffffffff) {
      out.push(cube(mask, bits));
      return;
    }
    const half = words.length >> 1;
    const lo = words.subarray(0, half);
    const hi = words.subarray(half);
    const bit = 1 << (k - 1);
    let same = true;
    for (let i = 0; i < half && same; i++) same = lo[i] === hi[i];
    if (same) walkWords(lo, k - 1, mask, bits);
    else {
      walkWords(lo, k - 1, mask | bit, bits);
      walkWords(hi, k - 1, mask | bit, bits | bit);
    }
  };
  const walkBits = (word: number, k: number, mask: number, bits: number): void => {
    const width = 1 << k;
    const ones = width === 32 ? 0xffffffff : (1 << width) - 1;
    const w = (word & ones) >>> 0;
    if (w === 0) return;
    if (w === ones >>> 0) {
      out.push(cube(mask, bits));
      return;
    }
    const h = width >> 1;
    const lo = w & ((1 << h) - 1);
    const hi = w >>> h;
    const bit = 1 << (k - 1);
    if (lo === hi) walkBits(lo, k - 1, mask, bits);
    else {
      walkBits(lo, k - 1, mask | bit, bits);
      walkBits(hi, k - 1, mask | bit, bits | bit);
    }
  };
  walkWords(set, n, 0, 0);
  return out;
}

function cubePrimes(fn: BoolFunction, deadline: Deadline): Cube[] | null {
  return completeSum(setToCubes(fn.n, union(fn.on, fn.dc)), deadline);
}

/**
 * All primes of the union of the cubes (its complete sum), recursively: with P0, P1 the complete
 * sums of the two halves on input x, CS = absorb(x'P0 + xP1 + P0·P1) (Blake; Brown, "Boolean
 * Reasoning", the product of complete sums multiplied out and absorbed is a complete sum).
 */
export function completeSum(cubes: readonly Cube[], deadline: Deadline): Cube[] | null {
  if (cubes.length === 0) return [];
  if (deadline.passed()) return null;
  if (cubes.some((c) => c.mask === 0)) return [cube(0, 0)];
  if (cubes.length === 1) return [cubes[0]!];
  // Split on the input that the most cubes name.
  const uses = new Map<number, number>();
  for (const c of cubes) for (let m = c.mask; m !== 0; m &= m - 1) uses.set(m & -m, (uses.get(m & -m) ?? 0) + 1);
  let x = 0;
  let most = -1;
  for (const [bit, k] of uses) if (k > most || (k === most && bit > x)) [x, most] = [bit, k];
  const half = (value: number): Cube[] =>
    cubes.filter((c) => !(c.mask & x) || (c.bits & x) === value).map((c) => cube(c.mask & ~x, c.bits & ~x));
  const p0 = completeSum(half(0), deadline);
  const p1 = p0 && completeSum(half(x), deadline);
  if (!p0 || !p1) return null;
  const all: Cube[] = [];
  for (const c of p0) all.push(cube(c.mask | x, c.bits));
  for (const c of p1) all.push(cube(c.mask | x, c.bits | x));
  for (const a of p0) {
    if (deadline.passed()) return null;
    for (const b of p1) if (!cubesDisjoint(a, b)) all.push(cube(a.mask | b.mask, a.bits | b.bits));
  }
  return absorb(all, deadline);
}

/** Drop every cube contained in another (and duplicates); null when past the deadline. */
function absorb(cubes: Cube[], deadline: Deadline): Cube[] | null {
  const byLiterals = cubes.map((c) => ({ c, k: popcount(c.mask) })).sort((a, b) => a.k - b.k);
  const kept: Cube[] = [];
  const trie = new CubeTrie(cubes.reduce((m, c) => m | c.mask, 0));
  for (let i = 0; i < byLiterals.length; i++) {
    if ((i & 63) === 63 && deadline.passed()) return null;
    const c = byLiterals[i]!.c;
    if (trie.holds(c)) continue;
    trie.add(c);
    kept.push(c);
  }
  return kept;
}

/**
 * Cubes by their value on each input (0, 1, absent), input by input from the highest bit used:
 * whether some cube added contains a given one is then a walk that branches only where the
 * given cube has a literal (the container may have that literal or none).
 */
class CubeTrie {
  /** Per node, three children (0, 1, absent); 0 = none (node 0 is the root, never a child). */
  private next = new Int32Array(3 * 64);
  private size = 1;
  private readonly bits: number[] = [];

  constructor(used: number) {
    for (let b = 31 - Math.clz32(used); b >= 0; b--) if (used & (1 << b)) this.bits.push(1 << b);
  }

  add(c: Cube): void {
    let node = 0;
    for (const bit of this.bits) {
      const slot = 3 * node + (c.mask & bit ? (c.bits & bit ? 1 : 0) : 2);
      if (this.next[slot] === 0) {
        if (3 * (this.size + 1) > this.next.length) {
          const grown = new Int32Array(this.next.length * 2);
          grown.set(this.next);
          this.next = grown;
        }
        this.next[slot] = this.size++;
      }
      node = this.next[slot]!;
    }
  }

  /** Some cube added contains c (or equals it). */
  holds(c: Cube, node = 0, depth = 0): boolean {
    if (depth === this.bits.length) return true;
    const bit = this.bits[depth]!;
    const absent = this.next[3 * node + 2]!;
    if (absent !== 0 && this.holds(c, absent, depth + 1)) return true;
    if (!(c.mask & bit)) return false;
    const same = this.next[3 * node + (c.bits & bit ? 1 : 0)]!;
    return same !== 0 && this.holds(c, same, depth + 1);
  }
}
