import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { equals, members, symmetricDifference, type BitSet } from '../../../src/logic/bits.js';
import { cubeFromPattern, cubeToSet } from '../../../src/logic/cube.js';
import { truthTable } from '../../../src/logic/expr/evaluate.js';
import { anfToExpr, sopToExpr } from '../../../src/logic/expr/forms.js';
import { printSt } from '../../../src/logic/expr/print-st.js';
import { letterSignals } from './arbitraries.js';

const abc = letterSignals(3);

describe('AND/OR form as an expression', () => {
  it('is an OR of ANDs, literals in input order, NOT where the cube asks for 0', () => {
    expect(printSt(sopToExpr([cubeFromPattern('1-0'), cubeFromPattern('01-')], abc))).toBe('(a AND NOT c) OR (NOT a AND b)');
  });

  it('no product terms is FALSE and a term with no literals is TRUE', () => {
    expect(printSt(sopToExpr([], abc))).toBe('FALSE');
    expect(printSt(sopToExpr([cubeFromPattern('---')], abc))).toBe('TRUE');
  });

  it('is true exactly on the union of its cubes (fast-check)', () => {
    const pattern = fc.array(fc.constantFrom('0', '1', '-'), { minLength: 6, maxLength: 6 }).map((p) => p.join(''));
    fc.assert(
      fc.property(fc.array(pattern, { maxLength: 5 }), (patterns) => {
        const cubes = patterns.map(cubeFromPattern);
        const expected = new Uint32Array(2);
        for (const c of cubes) cubeToSet(6, c, expected);
        expect(equals(truthTable(sopToExpr(cubes, letterSignals(6)), 6), expected)).toBe(true);
      }),
    );
  });
});

describe('XOR form as an expression', () => {
  it('is an XOR of ANDs with monomial 0 as TRUE', () => {
    // a OR b = a XOR b XOR ab (the ANF of OR, a standard identity)
    expect(printSt(anfToExpr([0b10, 0b01, 0b11], letterSignals(2)))).toBe('a XOR b XOR (a AND b)');
    expect(printSt(anfToExpr([0, 0b100], abc))).toBe('TRUE XOR a');
  });

  it('no monomials is FALSE', () => {
    expect(printSt(anfToExpr([], abc))).toBe('FALSE');
  });

  it('prints the inputs of a set polarity bit as NOT name', () => {
    expect(printSt(anfToExpr([0b110, 0b001], abc, 0b100))).toBe('(NOT a AND b) XOR c');
  });

  it('is the subset-rule sum of its monomials: a polarity flips the table by that input (fast-check)', () => {
    fc.assert(
      fc.property(fc.uniqueArray(fc.nat({ max: 31 }), { maxLength: 8 }), fc.nat({ max: 31 }), (monos, polarity) => {
        const sigs = letterSignals(5);
        const plain = truthTable(anfToExpr(monos, sigs), 5);
        const flipped = truthTable(anfToExpr(monos, sigs, polarity), 5);
        // f_p(x) = f(x XOR p), read straight off the plain table.
        const expected: BitSet = new Uint32Array(1);
        for (const k of members(plain)) expected[0]! |= 1 << (k ^ polarity);
        expect(equals(flipped, expected)).toBe(true);
        // and the XOR of all monomials' tables is the plain table
        let acc: BitSet = new Uint32Array(1);
        for (const m of monos) acc = symmetricDifference(acc, truthTable(anfToExpr([m], sigs), 5));
        expect(equals(acc, plain)).toBe(true);
      }),
    );
  });
});
