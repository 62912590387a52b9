// Each output has one function, its don't-cares resolved once by the policy: every form,
// the proof and the test steps are of that function (fast-check over random tables).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { count, equals, has, intersect, minus, union } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, DontCarePolicy } from '../../src/table/types.js';

const policies: DontCarePolicy[] = ['minimal', 'safe'];

/** Random tables of 1-5 inputs and two outputs (the second with safe value `safe`), rows of 0/1/-. */
const tables = fc.integer({ min: 1, max: 5 }).chain((n) =>
  fc
    .array(fc.array(fc.constantFrom<CellValue>(0, 1, '-', '-'), { minLength: n + 2, maxLength: n + 2 }), { minLength: 1, maxLength: 12 })
    .map((rows) => ({ n, rows })),
);

function analysed(n: number, rows: CellValue[][], safe: 0 | 1, policy: DontCarePolicy) {
  const inputs = Array.from({ length: n }, (_, i) => `I${i}`);
  const cells = [[...inputs.map(() => 'input'), 'output', 'output'], [...inputs, 'Y', 'Z'], ...rows];
  const read = readSpecTables({ sheet: 'Fuzz', origin: 'A1', cells }, { safeValues: { Z: safe }, dontCares: policy });
  return analyseTable(read.tables[0]!);
}

describe("one function per output, under both don't-care policies", () => {
  it('the AND/OR form and both XOR forms agree on all 2^n combinations, and the test steps expect that function', () => {
    fc.assert(
      fc.property(tables, fc.constantFrom<0 | 1>(0, 1), fc.constantFrom(...policies), ({ n, rows }, safe, policy) => {
        const a = analysed(n, rows, safe, policy);
        a.outputs.forEach((o, j) => {
          expect(o.dontCares).toBe(policy);
          for (const form of [o.andOr, o.xor, o.bestXor]) {
            expect(equals(truthTable(form.expr, n), o.resolved.on)).toBe(true);
            expect(form.proof.mismatchCount).toBe(0);
          }
          for (const step of o.steps) expect(step.expected).toBe(has(o.resolved.on, step.combination) ? 1 : 0);
          // The resolved function keeps every specified value; only don't-cares were decided.
          const spec = a.table.outputs[j]!.built.fn;
          expect(equals(minus(o.resolved.on, spec.dc), spec.on)).toBe(true);
          if (policy === 'safe') expect(equals(o.resolved.on, o.safe === 1 ? union(spec.on, spec.dc) : spec.on)).toBe(true);
          expect(o.permitsAlsoCount).toBe(count(intersect(o.resolved.on, spec.dc)));
        });
      }),
      { numRuns: 300 },
    );
  });

  it("under 'minimal' the resolved function is the minimal AND/OR form's, under 'safe' the don't-cares take the safe value", () => {
    const rows: CellValue[][] = [[1, 1, 1, 0], [1, 0, '-', '-'], [0, '-', 0, 0]];
    const [minimal] = analysed(2, rows, 0, 'minimal').outputs;
    const [safe] = analysed(2, rows, 0, 'safe').outputs;
    expect([minimal!.andOr.text, minimal!.xor.text, minimal!.bestXor.text]).toEqual(['I0', 'I0', 'I0']);
    expect([safe!.andOr.text, safe!.xor.text, safe!.bestXor.text]).toEqual(['I0 AND I1', 'I0 AND I1', 'I0 AND I1']);
  });
});
