// Minimal sums of products published in textbooks and reference articles, each named beside
// its check. Values are from memory where so marked; the counts were re-derived by hand.
import { describe, expect, it } from 'vitest';
import { add, emptySet } from '../../src/logic/bits.js';
import { cubeToPattern } from '../../src/logic/cube.js';
import type { BoolFunction } from '../../src/logic/boolfn.js';
import { minimiseSop } from '../../src/logic/sop.js';

function fn(n: number, on: number[], dc: number[] = []): BoolFunction {
  const f = { n, on: emptySet(n), dc: emptySet(n) };
  on.forEach((k) => add(f.on, k));
  dc.forEach((k) => add(f.dc, k));
  return f;
}

describe('textbook minimisation examples', () => {
  // T. R. Kuphaldt, "Lessons In Electric Circuits", Vol. IV (Digital), ch. 7 "Boolean Algebra",
  // the sum-of-products example of a burner with three flame sensors that stays enabled while
  // at least two of the three see a flame: Output = AB + BC + AC (from memory).
  it('Kuphaldt, Lessons In Electric Circuits Vol. IV ch. 7: 2-out-of-3 flame detection is AB + BC + AC', () => {
    const form = minimiseSop(fn(3, [3, 5, 6, 7]));
    expect(form.cubes.map((c) => cubeToPattern(3, c)).sort()).toEqual(['-11', '1-1', '11-']);
    expect([form.terms, form.literals, form.proven]).toEqual([3, 6, true]);
  });

  // Wikipedia, "Quine–McCluskey algorithm", worked example (from memory):
  // f(A,B,C,D) = Σm(4,8,10,11,12,15) + d(9,14). Essential primes BC'D' (covers m4 alone) and
  // AC (m15 alone); m8 then needs AB' or AD', equally cheap: 3 terms, 2 + 3 + 2 = 7 literals.
  it("Wikipedia 'Quine–McCluskey algorithm': Σm(4,8,10,11,12,15) + d(9,14) is AB' + BC'D' + AC", () => {
    const form = minimiseSop(fn(4, [4, 8, 10, 11, 12, 15], [9, 14]));
    const printed = form.cubes.map((c) => cubeToPattern(4, c));
    expect(printed).toContain('-100');
    expect(printed).toContain('1-1-');
    expect(printed.some((p) => p === '10--' || p === '1--0')).toBe(true);
    expect([form.terms, form.literals, form.proven]).toEqual([3, 7, true]);
  });

  // Wikipedia, "Petrick's method", worked example (from memory): f(A,B,C) = Σm(0,1,2,5,6,7)
  // has six primes, none essential (a cyclic core); two minimum covers, A'B' + BC' + AC and
  // A'C' + B'C + AB, of 3 terms and 6 literals.
  it("Wikipedia 'Petrick's method': the cyclic Σm(0,1,2,5,6,7) needs 3 terms and 6 literals", () => {
    const form = minimiseSop(fn(3, [0, 1, 2, 5, 6, 7]));
    const printed = form.cubes.map((c) => cubeToPattern(3, c)).sort();
    expect([['-10', '00-', '1-1'], ['-01', '0-0', '11-']]).toContainEqual(printed);
    expect([form.terms, form.literals, form.proven]).toEqual([3, 6, true]);
  });
});
