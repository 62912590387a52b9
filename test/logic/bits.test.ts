import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  add,
  complement,
  count,
  emptySet,
  flipBit,
  fullSet,
  has,
  inputSet,
  inputValue,
  members,
  wordCount,
} from '../../src/logic/bits.js';

describe('combination sets', () => {
  it('number the leftmost input as the most significant bit: with A, B, C, combination 6 is A=1, B=1, C=0', () => {
    expect([0, 1, 2].map((i) => inputValue(3, 6, i))).toEqual([1, 1, 0]);
  });

  it('hold one bit per combination, 32 to a word', () => {
    expect(wordCount(3)).toBe(1);
    expect(wordCount(5)).toBe(1);
    expect(wordCount(6)).toBe(2);
    expect(wordCount(24)).toBe(1 << 19);
  });

  it('full set of n inputs has exactly 2^n members, also below one word', () => {
    for (let n = 1; n <= 10; n++) expect(count(fullSet(n))).toBe(1 << n);
  });

  it('the set of an input holds exactly the combinations where that input is 1', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 10 }), fc.nat(), (n, r) => {
        const i = r % n;
        const s = inputSet(n, i);
        for (let k = 0; k < 1 << n; k++) expect(has(s, k)).toBe(inputValue(n, k, i) === 1);
      }),
    );
  });

  it('lists members in increasing order and complements within 2^n', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.array(fc.nat()), (n, ks) => {
        const s = emptySet(n);
        const want = [...new Set(ks.map((k) => k % (1 << n)))].sort((a, b) => a - b);
        for (const k of want) add(s, k);
        expect(members(s)).toEqual(want);
        expect(count(complement(s, n))).toBe((1 << n) - want.length);
      }),
    );
  });
});

describe('flipping one input of every member', () => {
  it('maps each combination k to k with that bit flipped, within a word and across words', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.array(fc.nat()), fc.nat(), (n, ks, r) => {
        const bit = r % n;
        const s = emptySet(n);
        for (const k of ks) add(s, k % (1 << n));
        const flipped = flipBit(s, bit);
        expect(members(flipped)).toEqual(members(s).map((k) => k ^ (1 << bit)).sort((a, b) => a - b));
      }),
    );
  });
});
