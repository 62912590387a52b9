import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  complement,
  emptySet,
  equals,
  fullSet,
  has,
  inputSet,
  intersect,
  popcount,
  union,
  wordCount,
  type BitSet,
} from '../../src/logic/bits.js';
import { anfDegree, anfDifference, anfOf, anfSupport, anfValues } from '../../src/logic/anf.js';

/** Random truth values of n inputs, bits beyond 2^n cleared. */
const valuesArb = (n: number): fc.Arbitrary<BitSet> =>
  fc.uint32Array({ minLength: wordCount(n), maxLength: wordCount(n) }).map((w) => intersect(w, fullSet(n)));

const nArb = fc.integer({ min: 1, max: 9 });

describe('algebraic normal form', () => {
  it('lists monomials by degree, then by the printed order of inputs, leftmost first', () => {
    // Every monomial of a, b, c (a = bit 2): 1, a, b, c, ab, ac, bc, abc.
    const all = [0, 1, 2, 3, 4, 5, 6, 7];
    expect(anfOf(anfValues(all, 3), 3)).toEqual([0, 0b100, 0b010, 0b001, 0b110, 0b101, 0b011, 0b111]);
  });

  it('keeps that order for any function: degree ascending, then the larger mask (leftmost input) first', () => {
    fc.assert(
      fc.property(nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n))), ([n, values]) => {
        const monos = anfOf(values, n);
        const sorted = [...monos].sort((x, y) => popcount(x) - popcount(y) || y - x);
        expect(monos).toEqual(sorted);
      }),
    );
  });

  it('gives back the truth values from its monomials', () => {
    fc.assert(
      fc.property(nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n))), ([n, values]) => {
        expect(anfValues(anfOf(values, n), n)).toEqual(values);
      }),
    );
  });

  it('is the empty XOR for FALSE and the single monomial 0 for TRUE', () => {
    expect(anfOf(emptySet(4), 4)).toEqual([]);
    expect(anfOf(fullSet(4), 4)).toEqual([0]);
  });

  it('cancels a monomial listed twice when turned back into values', () => {
    expect(anfValues([0b01, 0b10, 0b01], 2)).toEqual(anfValues([0b10], 2));
  });

  it('has as degree the most inputs in one monomial: 0 for constants, k for an AND of k inputs', () => {
    expect(anfDegree([])).toBe(0);
    expect(anfDegree([0])).toBe(0);
    let and = fullSet(6);
    for (let k = 1; k <= 6; k++) {
      and = intersect(and, inputSet(6, k - 1));
      expect(anfDegree(anfOf(and, 6))).toBe(k);
    }
  });

  it('finds the inputs that do not matter: a OR c of a, b, c, d depends on a and c only', () => {
    const f = union(inputSet(4, 0), inputSet(4, 2));
    expect(anfSupport(anfOf(f, 4), 4)).toEqual([true, false, true, false]);
  });

  it('says an input matters exactly when flipping it changes the value somewhere', () => {
    fc.assert(
      fc.property(nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n))), ([n, values]) => {
        const support = anfSupport(anfOf(values, n), n);
        for (let i = 0; i < n; i++) {
          const bit = 1 << (n - 1 - i);
          let matters = false;
          for (let k = 0; k < 1 << n && !matters; k++) matters = has(values, k) !== has(values, k ^ bit);
          expect(support[i]).toBe(matters);
        }
      }),
    );
  });

  it('gives a AND b and a OR b the difference a XOR b', () => {
    const a = inputSet(2, 0);
    const b = inputSet(2, 1);
    expect(anfDifference(intersect(a, b), union(a, b), 2)).toEqual([0b10, 0b01]);
  });

  it('gives as difference the monomials in exactly one of the two ANFs, empty when equal', () => {
    fc.assert(
      fc.property(
        nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n), valuesArb(n))),
        ([n, a, b]) => {
          const inA = new Set(anfOf(a, n));
          const oneSide = anfOf(b, n).filter((m) => !inA.delete(m)).concat([...inA]);
          const difference = anfDifference(a, b, n);
          expect(new Set(difference)).toEqual(new Set(oneSide));
          expect(difference.length === 0).toBe(equals(a, b));
        },
      ),
    );
  });

  it('complements a function by toggling the monomial 0 only', () => {
    fc.assert(
      fc.property(nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n))), ([n, values]) => {
        expect(anfDifference(values, complement(values, n), n)).toEqual([0]);
      }),
    );
  });

  it('keeps every monomial within the n inputs', () => {
    fc.assert(
      fc.property(nArb.chain((n) => fc.tuple(fc.constant(n), valuesArb(n))), ([n, values]) => {
        for (const m of anfOf(values, n)) expect(m).toBeLessThan(1 << n);
      }),
    );
  });
});
