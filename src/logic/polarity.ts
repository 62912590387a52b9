// Best-polarity XOR form: the fixed-polarity Reed–Muller expansion with the fewest terms.
// With polarity p (bit set = that input is used complemented) the function f is written as the
// ANF of g(y) = f(y XOR p), where y_i is the literal of input i (NOT x_i when complemented).
import { popcount, type BitSet } from './bits.js';
import { monomialsOf, type Monomial } from './anf.js';
import { mobius } from './mobius.js';

/** Up to this many inputs all 2^n polarities are tried; above it, a local search. */
export const EXHAUSTIVE_POLARITY_INPUTS = 16;

export interface PolarityForm {
  /** Bit n-1-i set = input i (0 = leftmost) is used complemented, as in a Combination. */
  readonly polarity: number;
  /** The terms, in printed order; each a set of literals in the polarity above. */
  readonly monomials: Monomial[];
  /** True when every polarity was tried (n <= EXHAUSTIVE_POLARITY_INPUTS). */
  readonly exhaustive: boolean;
}

/** Masks of the low half of each pair of bit groups inside a word, per combination bit 0..4. */
const LOW_HALVES = [0x55555555, 0x33333333, 0x0f0f0f0f, 0x00ff00ff, 0x0000ffff];
/** Bits of a word whose combination index has bit j set, per j = 0..4. */
const HIGH_HALVES = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

/**
 * Rewrite the coefficients of polarity p into those of p with input `input` flipped, in place,
 * and return the new number of terms. Substituting y_i -> y_i XOR 1 turns each monomial y_i·r
 * into y_i·r XOR r, so along that dimension only: c[S] ^= c[S ∪ {i}] for every S without i.
 */
export function flipPolarity(coefficients: Uint32Array, n: number, input: number): number {
  return flipDimension(signed(coefficients), n - 1 - input);
}

/** Signed view of the same words: V8 keeps int32 in registers, uint32 above 2^31 as doubles. */
function signed(words: Uint32Array): Int32Array {
  return new Int32Array(words.buffer, words.byteOffset, words.length);
}

/** flipPolarity along combination bit `bit`, on the signed view. */
function flipDimension(c: Int32Array, bit: number): number {
  let terms = 0;
  if (bit < 5) {
    const shift = 1 << bit;
    const low = LOW_HALVES[bit]!;
    for (let t = 0; t < c.length; t++) {
      const x = c[t]!;
      const y = x ^ ((x >>> shift) & low);
      c[t] = y;
      terms += popcount(y);
    }
    return terms;
  }
  const h = 1 << (bit - 5);
  for (let base = 0; base < c.length; base += 2 * h) {
    for (let t = base; t < base + h; t++) {
      const hi = c[t + h]!;
      const lo = c[t]! ^ hi;
      c[t] = lo;
      terms += popcount(lo) + popcount(hi);
    }
  }
  return terms;
}

/** Complemented literals in all terms together: sum over monomials S of |S ∩ polarity|. */
function complementedLiterals(coefficients: Int32Array, polarity: number): number {
  let total = 0;
  for (let w = 0; w < coefficients.length; w++) {
    const x = coefficients[w]!;
    if (x === 0) continue;
    // Bits 5 and up of the monomial are the word index; bits 0..4 its place in the word.
    total += popcount(x) * popcount((w << 5) & polarity);
    for (let j = 0; j < 5; j++) if ((polarity >>> j) & 1) total += popcount(x & HIGH_HALVES[j]!);
  }
  return total;
}

interface Cost {
  terms: number;
  complemented: number;
  polarity: number;
}

/** Fewest terms, then fewest complemented literals (NOTs to print), then the lowest polarity. */
function cheaper(a: Cost, b: Cost): boolean {
  if (a.terms !== b.terms) return a.terms < b.terms;
  if (a.complemented !== b.complemented) return a.complemented < b.complemented;
  return a.polarity < b.polarity;
}

/** Cost of the current coefficients, counting literals only when the terms could compete. */
function costIfCompeting(c: Int32Array, terms: number, polarity: number, best: Cost): Cost | undefined {
  if (terms > best.terms) return undefined;
  const cost = { terms, complemented: complementedLiterals(c, polarity), polarity };
  return cheaper(cost, best) ? cost : undefined;
}

/** Move the coefficients from polarity `from` to polarity `to`, one input at a time. */
function walkTo(c: Int32Array, from: number, to: number): void {
  for (let bit = 0; bit < 26; bit++) if (((from ^ to) >>> bit) & 1) flipDimension(c, bit);
}

/**
 * The fixed-polarity Reed–Muller form of the function with fewest terms. Exhaustive for
 * n <= 16: a Gray-code walk visits every polarity, each step one in-place flip along one input.
 * Above that, a local search from polarity 0 flips single inputs while the cost falls.
 */
export function bestPolarity(values: BitSet, n: number): PolarityForm {
  const coefficients = mobius(values, n);
  const c = signed(coefficients);
  let best: Cost = { terms: 0, complemented: 0, polarity: 0 };
  for (let t = 0; t < c.length; t++) best.terms += popcount(c[t]!);
  let polarity = 0;
  const exhaustive = n <= EXHAUSTIVE_POLARITY_INPUTS;
  if (exhaustive) {
    for (let step = 1; step < 2 ** n; step++) {
      // Gray code: step k flips the input of its lowest set bit; input 0 (the highest
      // dimension, whole word blocks) is the one flipped most often.
      const bit = n - 1 - (31 - Math.clz32(step & -step));
      polarity ^= 1 << bit;
      const terms = flipDimension(c, bit);
      best = costIfCompeting(c, terms, polarity, best) ?? best;
    }
  } else {
    for (let improved = true; improved; ) {
      improved = false;
      for (let bit = n - 1; bit >= 0; bit--) {
        const flipped = polarity ^ (1 << bit);
        const better = costIfCompeting(c, flipDimension(c, bit), flipped, best);
        if (better) {
          best = better;
          polarity = flipped;
          improved = true;
        } else {
          flipDimension(c, bit);
        }
      }
    }
  }
  walkTo(c, polarity, best.polarity);
  return { polarity: best.polarity, monomials: monomialsOf(coefficients), exhaustive };
}
