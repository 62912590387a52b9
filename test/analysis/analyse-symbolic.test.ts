// Tables of up to 24 inputs through the symbolic engine give what the bit-set engine gives, in
// the same types (from SYMBOLIC_FROM_INPUTS inputs on it is the default).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseTable } from '../../src/analysis/analyse.js';
import { SYMBOLIC_FROM_INPUTS } from '../../src/logic/wide-cube.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { equals } from '../../src/logic/bits.js';
import type { CellValue, DontCarePolicy, SpecTable } from '../../src/table/types.js';

function read(n: number, rows: CellValue[][], dontCares: DontCarePolicy = 'minimal'): SpecTable {
  const inputs = Array.from({ length: n }, (_, i) => `In ${i + 1}`);
  const r = readSpecTables({ sheet: 'Cell', origin: 'A1', cells: [[...inputs.map(() => 'input'), 'output', 'output'], [...inputs, 'Run', 'Stop'], ...rows] }, { dontCares });
  return r.tables[0]!;
}

/** Random tables of `min` to `max` inputs, a few rows of few literals, read with the policy. */
function tablesOf(min: number, max: number, maxRows: number, dontCares: DontCarePolicy, literal: fc.Arbitrary<CellValue>): fc.Arbitrary<SpecTable> {
  return fc.integer({ min, max }).chain((n) =>
    fc
      .array(fc.tuple(fc.array(literal, { minLength: n, maxLength: n }), fc.constantFrom<CellValue>(1, 0, '-'), fc.constantFrom<CellValue>(1, 0)), {
        minLength: 1,
        maxLength: maxRows,
      })
      .map((rows) => read(n, rows.map(([cells, run, stop]) => [...cells, run, stop]), dontCares)),
  );
}

const tables = tablesOf(4, 10, 8, 'safe', fc.constantFrom<CellValue>(1, 0, '-', '-'));

describe('the symbolic engine in the bit-set types', () => {
  it('agrees with the bit-set engine on gaps, conflicts, XOR terms and degree, proofs and proven costs, don\'t-cares at the safe value (property)', () => {
    fc.assert(
      fc.property(tables, (t) => {
        const ours = analyseTable(t, { engine: 'symbolic' });
        const theirs = analyseTable(t, { engine: 'bit-set' });
        expect(ours.problems.filter((p) => p.severity !== 'info')).toEqual(theirs.problems.filter((p) => p.severity !== 'info'));
        ours.outputs.forEach((o, j) => {
          const b = theirs.outputs[j]!;
          expect([o.gapCount, o.gaps, o.conflicts, o.dontCareCount]).toEqual([b.gapCount, b.gaps, b.conflicts, b.dontCareCount]);
          expect([o.xor.terms, o.xor.monomials, o.xor.text, o.degree, o.unusedInputs]).toEqual([b.xor.terms, b.xor.monomials, b.xor.text, b.degree, b.unusedInputs]);
          expect(o.bestXor.terms).toBe(b.bestXor.terms);
          for (const f of [o.andOr, o.xor, o.bestXor]) expect(f.proof).toMatchObject({ combinations: 2 ** t.inputs.length, mismatchCount: 0 });
          if (o.andOr.proven && b.andOr.proven) expect([o.andOr.terms, o.andOr.literals]).toEqual([b.andOr.terms, b.andOr.literals]);
          for (const s of o.steps) expect(s.expected === 0 || s.expected === 1).toBe(true);
        });
      }),
      { numRuns: 60 },
    );
  });

  // 20 to 24 inputs, where the symbolic engine is the default: both paths give one resolved function.
  const sparse = fc.constantFrom<CellValue>(1, 0, ...Array.from({ length: 14 }, () => '-' as const));
  it("resolves the don't-cares at the safe value into the function the bit-set path resolves and gives its test steps, at 20 to 24 inputs (property)", () => {
    fc.assert(
      fc.property(tablesOf(SYMBOLIC_FROM_INPUTS, 24, 4, 'safe', sparse), (t) => {
        const ours = analyseTable(t);
        const theirs = analyseTable(t, { engine: 'bit-set' });
        ours.outputs.forEach((o, j) => {
          const b = theirs.outputs[j]!;
          expect(o.dontCares).toBe('safe');
          expect(equals(o.resolved.on, b.resolved.on)).toBe(true);
          // The plain XOR form is determined by the function; best polarity searches differ past 16 inputs.
          expect([o.permitsAlsoCount, o.xor.terms, o.xor.text]).toEqual([b.permitsAlsoCount, b.xor.terms, b.xor.text]);
          // Test steps from the BDDs: the bit-set path's steps for the same form.
          if (o.andOr.text === b.andOr.text) expect(o.steps).toEqual(b.steps);
        });
      }),
      { numRuns: 6 },
    );
  });

  it("resolves the don't-cares as the minimal AND/OR form uses them into the bit-set path's function when both take the same form, at 20 to 24 inputs (property)", () => {
    fc.assert(
      fc.property(tablesOf(SYMBOLIC_FROM_INPUTS, 24, 4, 'minimal', sparse), (t) => {
        const ours = analyseTable(t);
        const theirs = analyseTable(t, { engine: 'bit-set' });
        ours.outputs.forEach((o, j) => {
          const b = theirs.outputs[j]!;
          expect(o.dontCares).toBe('minimal');
          for (const f of [o.andOr, o.xor, o.bestXor]) expect(f.proof.mismatchCount).toBe(0);
          // Equally cheap minimal forms may use different don't-cares; the same form, the same function.
          if (o.andOr.text === b.andOr.text) {
            expect(equals(o.resolved.on, b.resolved.on)).toBe(true);
            expect([o.permitsAlsoCount, o.xor.text]).toEqual([b.permitsAlsoCount, b.xor.text]);
          } else if (o.andOr.proven && b.andOr.proven) expect([o.andOr.terms, o.andOr.literals]).toEqual([b.andOr.terms, b.andOr.literals]);
        });
      }),
      { numRuns: 6 },
    );
  });

  it(`is the default from ${SYMBOLIC_FROM_INPUTS} inputs: a sparse permissive is proven as the bit-set engine proves it`, () => {
    const n = SYMBOLIC_FROM_INPUTS;
    const row = (lits: Record<number, CellValue>, run: CellValue, stop: CellValue): CellValue[] => [...Array.from({ length: n }, (_, i) => lits[i] ?? '-'), run, stop];
    const t = read(n, [row({ 0: 1, 1: 1, 5: 0 }, 1, 0), row({ 0: 0 }, 0, 1), row({ 1: 0 }, 0, 1), row({ 0: 1, 1: 1, 5: 1, 9: 1 }, 1, 0)]);
    const [run, stop] = analyseTable(t).outputs;
    expect(run!.andOr.text).toBe('(In_1 AND In_2 AND NOT In_6) OR (In_1 AND In_2 AND In_10)');
    expect(run!.andOr.proven).toBe(true);
    expect(stop!.andOr.text).toBe('NOT In_1 OR NOT In_2');
    expect(run!.gapCount).toBe(analyseTable(t, { engine: 'bit-set' }).outputs[0]!.gapCount);
  });
});
