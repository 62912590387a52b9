import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has } from '../../src/logic/bits.js';
import { buildFunction, type BoolFunction, type TableRow } from '../../src/logic/boolfn.js';
import { cubeFromPattern } from '../../src/logic/cube.js';
import { xor, type Expr } from '../../src/logic/expr/ast.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { anfToExpr } from '../../src/logic/expr/forms.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { checkImplementation } from '../../src/logic/implcheck.js';
import { prove } from '../../src/logic/proof.js';
import { exprArb, letterSignals, specArb } from './expr/arbitraries.js';

const row = (pattern: string, value: 0 | 1 | '-'): TableRow => ({ cube: cubeFromPattern(pattern), value });
const abc = letterSignals(3);

function spec(n: number, rows: TableRow[]): BoolFunction {
  const built = buildFunction(n, rows);
  if (!built.ok) throw new Error(built.error.message);
  return built.value.fn;
}

function impl(text: string): Expr {
  const r = parseExpression(text, abc);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

// out = (a AND NOT c) OR (b AND c): on at 3, 4, 6, 7; off at 0, 1, 2, 5.
const rows = [row('1-0', 1), row('-11', 1), row('0-0', 0), row('001', 0)];

describe('implementation check', () => {
  it('finds an implementation equal to the spec on every combination', () => {
    const check = checkImplementation(impl('(a AND NOT c) OR (b AND c)'), spec(3, [...rows, row('101', 0)]));
    expect(check.equal).toBe(true);
    expect(check.combinations).toBe(8);
    expect(check.mismatchCount).toBe(0);
    expect(check.counterexamples).toEqual([]);
    expect(check.differenceMonomials).toEqual([]);
  });

  it('gives each counterexample as input values with the expected and the actual output', () => {
    const check = checkImplementation(impl('a OR (b AND c)'), spec(3, [...rows, row('101', 0)]));
    expect(check.equal).toBe(false);
    expect(check.mismatchCount).toBe(1);
    expect(check.counterexamples).toEqual([{ combination: 5, inputs: [1, 0, 1], expected: 0, actual: 1, kind: 'unsafe' }]);
  });

  it('gives the ANF monomials by which they differ: a AND NOT b AND c = ac XOR abc', () => {
    const check = checkImplementation(impl('a OR (b AND c)'), spec(3, [...rows, row('101', 0)]));
    expect(check.differenceMonomials).toEqual([0b101, 0b111]);
    expect(check.differenceMonomialCount).toBe(2);
  });

  it("does not count a don't-care the implementation turns on as a difference, but reports it", () => {
    const check = checkImplementation(impl('a OR (b AND c)'), spec(3, [...rows, row('101', '-')]));
    expect(check.equal).toBe(true);
    expect(check.dontCareOn).toBe(1);
    expect(check.differenceMonomials).toEqual([]);
  });

  it('agrees with the proof, and the difference monomials correct the implementation to the spec (fast-check)', () => {
    const sigs = letterSignals(6);
    fc.assert(
      fc.property(specArb(6, 6, 6), exprArb(sigs), (s, e) => {
        const check = checkImplementation(e, s.fn);
        const proof = prove(s.fn, truthTable(e, 6));
        expect(check.mismatchCount).toBe(proof.mismatchCount);
        expect(check.equal).toBe(proof.mismatchCount === 0);
        for (const c of check.counterexamples) {
          expect(c.expected).toBe(has(s.fn.on, c.combination) ? 1 : 0);
          expect(c.actual).toBe(has(truthTable(e, 6), c.combination) ? 1 : 0);
        }
        if (check.differenceMonomialCount <= check.differenceMonomials.length) {
          const corrected = xor(e, anfToExpr(check.differenceMonomials, sigs));
          expect(prove(s.fn, truthTable(corrected, 6)).mismatchCount).toBe(0);
        }
      }),
      { numRuns: 300 },
    );
  });
});
