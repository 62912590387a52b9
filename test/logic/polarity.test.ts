import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  add,
  emptySet,
  fullSet,
  has,
  inputSet,
  intersect,
  members,
  popcount,
  wordCount,
  type BitSet,
} from '../../src/logic/bits.js';
import { anfValues } from '../../src/logic/anf.js';
import { mobius } from '../../src/logic/mobius.js';
import { bestPolarity, flipPolarity } from '../../src/logic/polarity.js';

/** Random functions of 1..maxN inputs, bits beyond 2^n cleared. */
const functionArb = (maxN: number): fc.Arbitrary<{ n: number; values: BitSet }> =>
  fc.integer({ min: 1, max: maxN }).chain((n) =>
    fc
      .uint32Array({ minLength: wordCount(n), maxLength: wordCount(n) })
      .map((words) => ({ n, values: intersect(words, fullSet(n)) })),
  );

/** From scratch: with polarity p the terms are the ANF of g(y) = f(y XOR p). */
function coefficientsAt(values: BitSet, n: number, polarity: number): BitSet {
  const g = emptySet(n);
  for (let y = 0; y < 1 << n; y++) if (has(values, y ^ polarity)) add(g, y);
  return mobius(g, n);
}

/** Brute force over all polarities: fewest terms, then complemented literals, then lowest p. */
function bruteForce(values: BitSet, n: number): { polarity: number; terms: number[] } {
  let best = { polarity: 0, terms: [] as number[], cost: [Infinity, 0] };
  for (let p = 0; p < 1 << n; p++) {
    const terms = members(coefficientsAt(values, n, p));
    const cost = [terms.length, terms.reduce((sum, m) => sum + popcount(m & p), 0)];
    if (cost[0]! < best.cost[0]! || (cost[0] === best.cost[0] && cost[1]! < best.cost[1]!)) {
      best = { polarity: p, terms, cost };
    }
  }
  return best;
}

/** XOR of inputs 0..n-1. */
function parity(n: number): BitSet {
  const f = emptySet(n);
  for (let k = 0; k < 1 << n; k++) if (popcount(k) & 1) add(f, k);
  return f;
}

describe('best-polarity XOR form', () => {
  it('flipping one input updates the terms along that input only: c[S] ^= c[S with i], as from scratch', () => {
    fc.assert(
      fc.property(functionArb(8), fc.nat(), fc.nat(), ({ n, values }, pRaw, iRaw) => {
        const polarity = pRaw % (1 << n);
        const input = iRaw % n;
        const c = coefficientsAt(values, n, polarity);
        const terms = flipPolarity(c, n, input);
        const flipped = coefficientsAt(values, n, polarity ^ (1 << (n - 1 - input)));
        expect(c).toEqual(flipped);
        expect(terms).toBe(members(flipped).length);
      }),
      { numRuns: 200 },
    );
  });

  it('finds the same polarity and terms as brute force over every polarity, up to 8 inputs', () => {
    fc.assert(
      fc.property(functionArb(8), ({ n, values }) => {
        const best = bestPolarity(values, n);
        const brute = bruteForce(values, n);
        expect(best.polarity).toBe(brute.polarity);
        expect([...best.monomials].sort((a, b) => a - b)).toEqual(brute.terms);
        expect(best.exhaustive).toBe(true);
      }),
    );
  });

  it('writes its terms so that they give back the function: f(x) = XOR of terms in y = x XOR polarity', () => {
    fc.assert(
      fc.property(functionArb(10), ({ n, values }) => {
        const { polarity, monomials } = bestPolarity(values, n);
        const g = anfValues(monomials, n);
        for (let x = 0; x < 1 << n; x++) expect(has(g, x ^ polarity)).toBe(has(values, x));
      }),
    );
  });

  it('writes NOT a AND NOT b as one term at polarity 11 (both complemented)', () => {
    const f = emptySet(2);
    add(f, 0);
    expect(bestPolarity(f, 2)).toEqual({ polarity: 0b11, monomials: [0b11], exhaustive: true });
  });

  it('keeps XOR of n inputs at n terms with an even number complemented, n + 1 with an odd number', () => {
    for (let n = 1; n <= 6; n++) {
      for (let p = 0; p < 1 << n; p++) {
        expect(members(coefficientsAt(parity(n), n, p)).length).toBe(n + (popcount(p) & 1));
      }
      const best = bestPolarity(parity(n), n);
      expect(best.polarity).toBe(0);
      expect(best.monomials.length).toBe(n);
    }
  });

  it('prefers fewer complemented literals between equal term counts: a XOR b stays uncomplemented', () => {
    const f = parity(2);
    expect(bestPolarity(f, 2).polarity).toBe(0);
  });

  it('takes the lowest polarity between equal forms: NOT (a XOR b) as a XOR NOT b', () => {
    const f = emptySet(2);
    add(f, 0b00);
    add(f, 0b11);
    expect(bestPolarity(f, 2)).toEqual({ polarity: 0b01, monomials: [0b10, 0b01], exhaustive: true });
  });

  it('tries every polarity up to 16 inputs: NOR of 16 inputs is one term with all complemented', () => {
    const n = 16;
    const f = emptySet(n);
    add(f, 0);
    expect(bestPolarity(f, n)).toEqual({ polarity: 0xffff, monomials: [0xffff], exhaustive: true });
  });

  it('searches locally above 16 inputs and says so: NOR of 17 inputs still reaches one term', () => {
    const n = 17;
    const f = emptySet(n);
    add(f, 0);
    expect(bestPolarity(f, n)).toEqual({ polarity: 0x1ffff, monomials: [0x1ffff], exhaustive: false });
  });

  it('never does worse than the plain ANF above 16 inputs', () => {
    const n = 18;
    const f = intersect(inputSet(n, 0), inputSet(n, 17));
    for (let i = 1; i < 17; i += 3) add(f, (1 << i) | 1);
    const best = bestPolarity(f, n);
    expect(best.monomials.length).toBeLessThanOrEqual(members(mobius(f, n)).length);
    expect(best.exhaustive).toBe(false);
  });
});
