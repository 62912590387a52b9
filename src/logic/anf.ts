// Algebraic normal form: a function as the XOR of AND-monomials, read off the Möbius transform.
import { members, popcount, symmetricDifference, wordCount, type BitSet } from './bits.js';
import { mobius, mobiusInPlace } from './mobius.js';

/**
 * A set of inputs, ANDed: input i (0 = leftmost) of n is bit n-1-i, as in a Combination.
 * Monomial 0 is the constant TRUE.
 */
export type Monomial = number;

/**
 * The monomials of a coefficient set (bit S set = monomial S present), in printed order: degree
 * first; within a degree by the printed order of inputs, leftmost first (ab, ac, bc), which with
 * the leftmost input in the highest bit is the larger mask first. A counting sort by degree, no
 * comparisons: ANFs of many inputs have millions of terms.
 */
export function monomialsOf(coefficients: BitSet): Monomial[] {
  const ascending = members(coefficients);
  const next = new Array<number>(34).fill(0);
  for (const m of ascending) next[popcount(m) + 1]!++;
  for (let d = 1; d < next.length; d++) next[d]! += next[d - 1]!;
  const out = new Array<Monomial>(ascending.length);
  for (let i = ascending.length - 1; i >= 0; i--) out[next[popcount(ascending[i]!)]!++] = ascending[i]!;
  return out;
}

/** The monomials whose XOR is the function with the given truth values (n inputs). */
export function anfOf(values: BitSet, n: number): Monomial[] {
  return monomialsOf(mobius(values, n));
}

/** Largest number of inputs in one monomial; constants (TRUE or FALSE) have degree 0. */
export function anfDegree(monos: readonly Monomial[]): number {
  let degree = 0;
  for (const m of monos) degree = Math.max(degree, popcount(m));
  return degree;
}

/**
 * Per input (0 = leftmost): whether the function depends on it. An input that appears in no
 * monomial of the ANF cannot change the value; one that appears in any does.
 */
export function anfSupport(monos: readonly Monomial[], n: number): boolean[] {
  let used = 0;
  for (const m of monos) used |= m;
  return Array.from({ length: n }, (_, i) => ((used >>> (n - 1 - i)) & 1) === 1);
}

/** The monomials by which two functions differ: the ANF of a XOR b (the transform is linear). */
export function anfDifference(a: BitSet, b: BitSet, n: number): Monomial[] {
  return anfOf(symmetricDifference(a, b), n);
}

/** Truth values of the XOR of the monomials (a monomial listed twice cancels). */
export function anfValues(monos: readonly Monomial[], n: number): BitSet {
  const set = new Uint32Array(wordCount(n));
  for (const m of monos) {
    if (!Number.isInteger(m) || m < 0 || m >= 2 ** n) throw new RangeError(`monomial ${m} of ${n} inputs`);
    set[m >>> 5]! ^= 1 << (m & 31);
  }
  mobiusInPlace(set, n);
  return set;
}
