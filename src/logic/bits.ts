// Sets of input combinations, packed 32 to a word (DESIGN.md section 2).

/**
 * Index of one input combination of n inputs. The leftmost input is the most significant
 * bit: with inputs A, B, C, combination 6 is A=1, B=1, C=0.
 */
export type Combination = number;

/** A set of combinations of n inputs: combination k is bit (k & 31) of word (k >>> 5). */
export type BitSet = Uint32Array;

export const MAX_INPUTS = 24;

/** Number of 32-bit words that hold one bit per combination of n inputs. */
export function wordCount(n: number): number {
  return n <= 5 ? 1 : 1 << (n - 5);
}

/** Mask of the valid bits of word 0 when 2^n < 32. */
function lowMask(n: number): number {
  return n >= 5 ? 0xffffffff : ((1 << (1 << n)) - 1) >>> 0;
}

export function emptySet(n: number): BitSet {
  return new Uint32Array(wordCount(n));
}

export function fullSet(n: number): BitSet {
  const s = new Uint32Array(wordCount(n)).fill(0xffffffff);
  s[0] = lowMask(n);
  return s;
}

export function has(set: BitSet, k: Combination): boolean {
  return ((set[k >>> 5]! >>> (k & 31)) & 1) === 1;
}

export function add(set: BitSet, k: Combination): void {
  set[k >>> 5]! |= 1 << (k & 31);
}

export function remove(set: BitSet, k: Combination): void {
  set[k >>> 5]! &= ~(1 << (k & 31));
}

function popcount32(x: number): number {
  x -= (x >>> 1) & 0x55555555;
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  x = (x + (x >>> 4)) & 0x0f0f0f0f;
  return Math.imul(x, 0x01010101) >>> 24;
}

export function popcount(x: number): number {
  return popcount32(x >>> 0);
}

export function count(set: BitSet): number {
  let c = 0;
  for (let i = 0; i < set.length; i++) c += popcount32(set[i]!);
  return c;
}

export function isEmpty(set: BitSet): boolean {
  for (let i = 0; i < set.length; i++) if (set[i] !== 0) return false;
  return true;
}

export function equals(a: BitSet, b: BitSet): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

export function union(a: BitSet, b: BitSet): BitSet {
  const r = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) r[i] = a[i]! | b[i]!;
  return r;
}

export function intersect(a: BitSet, b: BitSet): BitSet {
  const r = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) r[i] = a[i]! & b[i]!;
  return r;
}

/** Combinations in a but not in b. */
export function minus(a: BitSet, b: BitSet): BitSet {
  const r = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) r[i] = a[i]! & ~b[i]!;
  return r;
}

export function symmetricDifference(a: BitSet, b: BitSet): BitSet {
  const r = new Uint32Array(a.length);
  for (let i = 0; i < a.length; i++) r[i] = a[i]! ^ b[i]!;
  return r;
}

/** Complement within the 2^n combinations of n inputs. */
export function complement(set: BitSet, n: number): BitSet {
  return minus(fullSet(n), set);
}

/** Members in increasing order, at most `limit` of them. */
export function members(set: BitSet, limit = Infinity): Combination[] {
  // Pre-sized: sets of millions of members are common at 20+ inputs, and growing by push is slow.
  const out = new Array<Combination>(Math.min(count(set), limit));
  let i = 0;
  for (let w = 0; w < set.length && i < out.length; w++) {
    let word = set[w]!;
    while (word !== 0 && i < out.length) {
      const low = word & -word;
      out[i++] = (w << 5) | (31 - Math.clz32(low));
      word ^= low;
    }
  }
  return out;
}

/** The combinations in which input i (0 = leftmost, most significant) is 1. */
export function inputSet(n: number, i: number): BitSet {
  const bit = n - 1 - i;
  const s = emptySet(n);
  if (bit < 5) {
    const patterns = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];
    s.fill(patterns[bit]!);
    s[0] = s[0]! & lowMask(n);
  } else {
    const block = 1 << (bit - 5);
    for (let w = 0; w < s.length; w++) if (w & block) s[w] = 0xffffffff;
  }
  return s;
}

/** The value of input i (0 = leftmost) in combination k of n inputs. */
export function inputValue(n: number, k: Combination, i: number): 0 | 1 {
  return ((k >>> (n - 1 - i)) & 1) as 0 | 1;
}

const SWAP_MASKS = [0x55555555, 0x33333333, 0x0f0f0f0f, 0x00ff00ff, 0x0000ffff];

/**
 * The set mapped through k -> k XOR (1 << bit): every member with that combination bit flipped.
 * Inside a word, bit pairs swap by mask and shift; across words, whole words swap.
 */
export function flipBit(set: BitSet, bit: number): BitSet {
  const out = new Uint32Array(set.length);
  if (bit < 5) {
    const shift = 1 << bit;
    const m = SWAP_MASKS[bit]!;
    for (let w = 0; w < set.length; w++) {
      const x = set[w]!;
      out[w] = ((x >>> shift) & m) | ((x & m) << shift);
    }
  } else {
    const stride = 1 << (bit - 5);
    for (let w = 0; w < set.length; w++) out[w] = set[w ^ stride]!;
  }
  return out;
}
