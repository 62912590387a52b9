import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fullSet, has, intersect, members, wordCount, type BitSet } from '../../src/logic/bits.js';
import { mobius, mobiusInPlace, mobiusInPlaceJs } from '../../src/logic/mobius.js';
import { naiveMobius } from '../../bench/transform.bench.js';

/** Random truth values of n inputs, bits beyond 2^n cleared. */
const functionArb = (minN: number, maxN: number): fc.Arbitrary<{ n: number; values: BitSet }> =>
  fc.integer({ min: minN, max: maxN }).chain((n) =>
    fc
      .uint32Array({ minLength: wordCount(n), maxLength: wordCount(n) })
      .map((words) => ({ n, values: intersect(words, fullSet(n)) })),
  );

/** The JS path alone (the public functions take the kernel from 10 inputs on). */
function mobiusJs(values: BitSet, n: number): BitSet {
  const copy = values.slice(0, wordCount(n));
  mobiusInPlaceJs(copy, n);
  return copy;
}

/** Index of the first word in which two sets differ, -1 when equal (cheap for large sets). */
function firstDifference(a: BitSet, b: BitSet): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return i;
  return a.length === b.length ? -1 : a.length;
}

/** A deterministic spread of words for sizes too large for many fast-check runs. */
function scrambled(n: number): BitSet {
  const words = new Uint32Array(wordCount(n));
  for (let i = 0; i < words.length; i++) words[i] = Math.imul(i + 1, 0x9e3779b1) ^ (i >>> 3);
  return words;
}

describe('Möbius transform on packed words', () => {
  it('agrees with a naive one-value-per-byte butterfly for random functions of 1 to 14 inputs, on both paths', () => {
    fc.assert(
      fc.property(functionArb(1, 14), ({ n, values }) => {
        const expected = naiveMobius(values, n);
        expect(mobius(values, n)).toEqual(expected);
        expect(mobiusJs(values, n)).toEqual(expected);
      }),
      { numRuns: 150 },
    );
  });

  it('agrees with the naive butterfly past one cache block, where levels sweep the whole array (21 to 23 inputs), on both paths', () => {
    for (const n of [21, 22, 23]) {
      const values = scrambled(n);
      const expected = naiveMobius(values, n);
      expect(firstDifference(mobius(values, n), expected)).toBe(-1);
      expect(firstDifference(mobiusJs(values, n), expected)).toBe(-1);
    }
  });

  it('gives the coefficient of S as the XOR of f over all subsets of S (the subset rule)', () => {
    fc.assert(
      fc.property(functionArb(1, 7), ({ n, values }) => {
        const coefficients = mobius(values, n);
        for (let s = 0; s < 1 << n; s++) {
          let xor = 0;
          for (let x = 0; x < 1 << n; x++) if ((x & s) === x && has(values, x)) xor ^= 1;
          expect(has(coefficients, s) ? 1 : 0).toBe(xor);
        }
      }),
    );
  });

  it('turns the constant TRUE into the single empty monomial, and back', () => {
    for (let n = 1; n <= 12; n++) {
      expect(members(mobius(fullSet(n), n))).toEqual([0]);
      const one = new Uint32Array(wordCount(n));
      one[0] = 1;
      expect(mobius(one, n)).toEqual(fullSet(n));
    }
  });

  it('keeps the bits beyond 2^n of word 0 zero below 5 inputs', () => {
    for (let n = 1; n <= 4; n++) {
      const words = fullSet(n);
      mobiusInPlace(words, n);
      expect(words[0]! >>> (1 << n)).toBe(0);
    }
  });

  it('returns a copy and leaves its argument alone', () => {
    const values = scrambled(9);
    const before = values.slice();
    const result = mobius(values, 9);
    expect(values).toEqual(before);
    expect(result).not.toBe(values);
  });

  it('treats a number of inputs outside 1..26, or too few words, as a bug, on both paths', () => {
    for (const transform of [mobiusInPlace, mobiusInPlaceJs]) {
      expect(() => transform(new Uint32Array(1), 0)).toThrow(RangeError);
      expect(() => transform(new Uint32Array(1 << 22), 27)).toThrow(RangeError);
      expect(() => transform(new Uint32Array(2), 7)).toThrow(RangeError);
      expect(() => transform(new Uint32Array(16), 12)).toThrow(RangeError);
    }
  });
});
