import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { Dd, DdTooLarge, FALSE, TRUE, type Node } from '../../src/logic/bdd.js';
import { inputBit, widePattern, wideCube } from '../../src/logic/wide-cube.js';

/** OR / AND / XOR of inputs 0..k-1 of a manager of n inputs. */
function fold(dd: Dd, k: number, op: 'or' | 'and' | 'xor'): Node {
  let f = op === 'and' ? TRUE : FALSE;
  for (let i = 0; i < k; i++) f = dd[op](f, dd.variable(i));
  return f;
}

describe('the decision diagram manager', () => {
  it('shares nodes: the same function built two ways is the same node', () => {
    const dd = new Dd(8);
    const [a, b, c] = [dd.variable(0), dd.variable(1), dd.variable(2)];
    expect(dd.and(a, dd.or(b, c))).toBe(dd.or(dd.and(a, b), dd.and(a, c)));
    expect(dd.not(dd.and(a, b))).toBe(dd.or(dd.not(a), dd.not(b)));
    expect(dd.xor(a, a)).toBe(FALSE);
  });

  it('counts the combinations of a cube exactly past 2^53', () => {
    const dd = new Dd(64);
    expect(dd.satCount(TRUE)).toBe(1n << 64n);
    expect(dd.satCount(dd.cube(wideCube(inputBit(64, 0) | inputBit(64, 63), inputBit(64, 0))))).toBe(1n << 62n);
  });

  it('cuts a function into disjoint cubes along its paths, lo branch first', () => {
    const dd = new Dd(3);
    const f = dd.or(dd.variable(0), dd.variable(2));
    expect(dd.pathCubes(f).cubes.map((c) => widePattern(3, c))).toEqual(['0-1', '1--']);
  });

  it('lists the first combinations in increasing order', () => {
    const dd = new Dd(3);
    expect(dd.minterms(dd.variable(1), 3)).toEqual([2n, 3n, 6n]);
  });

  it('stops at its node budget with DdTooLarge', () => {
    const dd = new Dd(20, 50);
    expect(() => dd.orAll(Array.from({ length: 10 }, (_, i) => dd.and(dd.variable(i), dd.variable(i + 10))))).toThrow(DdTooLarge);
  });

  it('evaluates like its definition: a random expression on random combinations (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: 0, max: 9 }), fc.integer({ min: 0, max: 9 }), fc.constantFrom('and', 'or', 'xor')), { maxLength: 12 }), fc.bigInt({ min: 0n, max: 1023n }), (steps, k) => {
        const dd = new Dd(10);
        let f = dd.variable(0);
        let value = (k & inputBit(10, 0)) !== 0n;
        for (const [i, j, op] of steps) {
          const g = dd.and(dd.variable(i), dd.not(dd.variable(j)));
          const gv = (k & inputBit(10, i)) !== 0n && (k & inputBit(10, j)) === 0n;
          f = dd[op as 'and'](f, g);
          value = op === 'and' ? value && gv : op === 'or' ? value || gv : value !== gv;
        }
        expect(dd.evaluate(f, k)).toBe(value);
      }),
    );
  });
});

// Algebraic normal forms of standard functions (from memory; any Boolean-function text):
// OR of n inputs = XOR of all 2^n - 1 non-empty monomials; AND = one monomial of degree n;
// parity = the n monomials of degree 1; majority of 3 = ab ⊕ ac ⊕ bc.
describe('the ANF as a ZDD: known term counts and degrees', () => {
  it('OR of 40 inputs: 2^40 - 1 terms of degree up to 40', () => {
    const dd = new Dd(40);
    const z = dd.anf(fold(dd, 40, 'or'));
    expect(dd.zCount(z)).toBe((1n << 40n) - 1n);
    expect(dd.zDegree(z)).toBe(40);
  });

  it('AND of 40 inputs: one term of degree 40', () => {
    const dd = new Dd(40);
    const z = dd.anf(fold(dd, 40, 'and'));
    expect(dd.zCount(z)).toBe(1n);
    expect(dd.zDegree(z)).toBe(40);
    expect(dd.zMembers(z, 2)).toEqual([(1n << 40n) - 1n]);
  });

  it('parity of 30 inputs: 30 terms of degree 1', () => {
    const dd = new Dd(30);
    const z = dd.anf(fold(dd, 30, 'xor'));
    expect(dd.zCount(z)).toBe(30n);
    expect(dd.zDegree(z)).toBe(1);
  });

  it('majority of 3: ab ⊕ ac ⊕ bc', () => {
    const dd = new Dd(3);
    const [a, b, c] = [0, 1, 2].map((i) => dd.variable(i));
    const z = dd.anf(dd.orAll([dd.and(a!, b!), dd.and(a!, c!), dd.and(b!, c!)]));
    expect(dd.zMembers(z, 10).sort()).toEqual([0b011n, 0b101n, 0b110n].sort());
  });

  it('the ZDD turned back into a function is the function (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.bigInt({ min: 0n, max: 255n }), fc.bigInt({ min: 0n, max: 255n })), { maxLength: 8 }), (cubes) => {
        const dd = new Dd(8);
        const f = dd.orAll(cubes.map(([m, b]) => dd.cube(wideCube(m, b))));
        expect(dd.zToBdd(dd.anf(f))).toBe(f);
      }),
    );
  });
});
