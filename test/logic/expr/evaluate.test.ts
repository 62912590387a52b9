import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has, members } from '../../../src/logic/bits.js';
import { FALSE, TRUE, and, not, or, variable, xor } from '../../../src/logic/expr/ast.js';
import { truthTable } from '../../../src/logic/expr/evaluate.js';
import { exprArb, letterSignals } from './arbitraries.js';
import { valueAt } from './reference-value.js';

const a = variable(0, 'a');
const b = variable(1, 'b');
const c = variable(2, 'c');


describe('truth tables of expressions', () => {
  it('the leftmost input is the most significant bit of a combination', () => {
    expect(members(truthTable(a, 3))).toEqual([4, 5, 6, 7]);
    expect(members(truthTable(c, 3))).toEqual([1, 3, 5, 7]);
  });

  it('gives the textbook tables of AND, OR, XOR and NOT over two inputs', () => {
    expect(members(truthTable(and(a, b), 2))).toEqual([3]);
    expect(members(truthTable(or(a, b), 2))).toEqual([1, 2, 3]);
    expect(members(truthTable(xor(a, b), 2))).toEqual([1, 2]);
    expect(members(truthTable(not(a), 2))).toEqual([0, 1]);
  });

  it('TRUE is every combination and FALSE none', () => {
    expect(members(truthTable(TRUE, 2))).toEqual([0, 1, 2, 3]);
    expect(members(truthTable(FALSE, 7))).toEqual([]);
  });

  it('agrees with evaluating one combination at a time, across word boundaries (fast-check)', () => {
    const sigs = letterSignals(7);
    fc.assert(
      fc.property(exprArb(sigs), (expr) => {
        const table = truthTable(expr, 7);
        const wrong = Array.from({ length: 128 }, (_, k) => k).filter((k) => has(table, k) !== valueAt(expr, 7, k));
        expect(wrong).toEqual([]);
      }),
      { numRuns: 200 },
    );
  });

  it('treats a variable beyond the function\'s inputs as a bug', () => {
    expect(() => truthTable(variable(3, 'd'), 3)).toThrow(/bug/);
  });
});
