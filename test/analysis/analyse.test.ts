import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has, members } from '../../src/logic/bits.js';
import { cubeMembers, cubeToPattern } from '../../src/logic/cube.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { analysisJson } from '../../src/report/analysis-json.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, SpecOptions, SpecTable } from '../../src/table/types.js';

/** A table with a role row: inputs named first, then outputs, then the data rows. */
function table(inputs: string[], outputs: string[], rows: CellValue[][], options?: SpecOptions): SpecTable {
  const cells = [[...inputs.map(() => 'input'), ...outputs.map(() => 'output')], [...inputs, ...outputs], ...rows];
  const read = readSpecTables({ sheet: 'Capper', origin: 'B3', cells }, options);
  expect(read.tables).toHaveLength(1);
  return read.tables[0]!;
}

/** Every combination of n inputs, leftmost input most significant, with the output f(bits). */
function fullTable(n: number, f: (bits: number[]) => CellValue): CellValue[][] {
  return Array.from({ length: 2 ** n }, (_, k) => {
    const bits = Array.from({ length: n }, (_, i) => (k >> (n - 1 - i)) & 1);
    return [...bits, f(bits)];
  });
}

const majority = table(['A', 'B', 'C'], ['Vote'], fullTable(3, ([a, b, c]) => Number(a! + b! + c! >= 2)));

// The majority of three is AB + AC + BC as a sum of products, and AB xor AC xor BC as an
// algebraic normal form: standard identities (from memory; any Boolean-function text).
describe('the 2-out-of-3 majority vote', () => {
  const [vote] = analyseTable(majority).outputs;

  it('has an AND/OR form of 3 terms and 6 literals, a proven minimum', () => {
    expect(vote!.andOr.terms).toBe(3);
    expect(vote!.andOr.literals).toBe(6);
    expect(vote!.andOr.proven).toBe(true);
    expect(vote!.andOr.text).toBe('(A AND B) OR (A AND C) OR (B AND C)');
  });

  it('has the XOR form AB xor AC xor BC: 3 terms of degree 2, all inputs used', () => {
    expect(vote!.xor.terms).toBe(3);
    expect(vote!.xor.text).toBe('(A AND B) XOR (A AND C) XOR (B AND C)');
    expect(vote!.degree).toBe(2);
    expect(vote!.unusedInputs).toEqual([]);
  });

  it('has every form checked on all 8 combinations without a mismatch', () => {
    for (const form of [vote!.andOr, vote!.xor, vote!.bestXor]) {
      expect(form.proof.combinations).toBe(8);
      expect(form.proof.mismatchCount).toBe(0);
    }
    expect(vote!.bestXor.terms).toBeLessThanOrEqual(3);
  });

  it('has no gaps, conflicts or don\'t-cares', () => {
    expect([vote!.gaps, vote!.gapCount, vote!.conflicts, vote!.dontCareCount]).toEqual([[], 0, [], 0]);
  });
});

describe("don't-cares", () => {
  const t = table(['A', 'B'], ['Y'], [[1, 1, 1], [1, 0, '-'], [0, '-', 0]]);
  const [y] = analyseTable(t).outputs;

  it('may be used by the AND/OR form, which lists those it turns on', () => {
    expect(y!.andOr.text).toBe('A');
    expect(y!.andOr.permitsAlso).toEqual([2]);
    expect(y!.andOr.permitsAlsoCount).toBe(1);
    expect(y!.dontCareCount).toBe(1);
  });

  it('are resolved once: the XOR forms are of the same function as the AND/OR form', () => {
    expect(y!.dontCares).toBe('minimal');
    expect(y!.xor.text).toBe('A');
    expect(y!.bestXor.permitsAlso).toEqual([2]);
    expect(members(y!.resolved.on)).toEqual([2, 3]);
  });

  it('turned ON are a warning at the output header, with one column per input', () => {
    const p = analyseTable(t).problems.find((q) => q.code === 'permits-also');
    expect(p).toMatchObject({ severity: 'warning', cell: 'D4', patterns: { headers: ['A', 'B'], rows: [['1', '0']] } });
    expect(p!.message).toMatch(/^Y permits also 1 don't-care combination .*ON with A=1, B=0/);
  });

  it("under the policy 'safe' all take the safe value, in every form, and nothing is permitted also", () => {
    const safe = table(['A', 'B'], ['Y'], [[1, 1, 1], [1, 0, '-'], [0, '-', 0]], { dontCares: 'safe' });
    const [s] = analyseTable(safe).outputs;
    expect([s!.andOr.text, s!.xor.text, s!.permitsAlsoCount]).toEqual(['A AND B', 'A AND B', 0]);
    expect(analyseTable(safe).problems.some((q) => q.code === 'permits-also')).toBe(false);
  });
});

describe('gaps and conflicts', () => {
  it('gaps are listed as disjoint cubes and take the safe value 1 when it is set', () => {
    const t = table(['A', 'B'], ['Y'], [[1, 1, 0]], { safeValues: { Y: 1 } });
    const [y] = analyseTable(t).outputs;
    expect(y!.gapCount).toBe(3);
    expect(y!.gaps.map((c) => cubeToPattern(2, c))).toEqual(['0-', '10']);
    expect(y!.andOr.text).toBe('NOT A OR NOT B');
  });

  it('the gap cubes cover each uncovered combination exactly once', () => {
    const cell = fc.constantFrom<CellValue>(0, 1, '-');
    fc.assert(
      fc.property(fc.array(fc.array(cell, { minLength: 5, maxLength: 5 }), { minLength: 1, maxLength: 8 }), (rows) => {
        const t = table(['A', 'B', 'C', 'D'], ['Y'], rows);
        const [y] = analyseTable(t).outputs;
        const listed = y!.gaps.flatMap((c) => cubeMembers(4, c)).sort((a, b) => a - b);
        expect(listed).toEqual(members(t.outputs[0]!.built.gaps));
        expect(y!.gapCount).toBe(listed.length);
      }),
      { numRuns: 100 },
    );
  });

  it('conflicts name the two rows by their cells', () => {
    const t = table(['A', 'B'], ['Y'], [[1, '-', 1], ['-', 1, 0], [0, 0, 0]]);
    const [y] = analyseTable(t).outputs;
    expect(y!.conflicts).toEqual([{ rowCellsA: 'B5:D5', rowCellsB: 'B6:D6', example: 3, combinations: 1 }]);
  });
});

describe('what an output depends on', () => {
  it('an input that appears in no XOR term is unused, and the problems say so at the output header', () => {
    const analysis = analyseTable(table(['A', 'B'], ['Y'], fullTable(2, ([a]) => a!)));
    expect(analysis.outputs[0]!.unusedInputs).toEqual([1]);
    expect(analysis.problems).toContainEqual({ severity: 'info', code: 'unused-inputs', sheet: 'Capper', cell: 'D4', message: 'Y does not depend on B' });
  });
});

describe('test steps', () => {
  it('expect what the table asks on each step', () => {
    const [vote] = analyseTable(majority).outputs;
    const fn = majority.outputs[0]!.built.fn;
    expect(vote!.steps.length).toBeGreaterThan(0);
    for (const s of vote!.steps) expect(s.expected).toBe(has(fn.on, s.combination) ? 1 : 0);
  });
});

describe('progress', () => {
  it('counts up to the total, one call per step, saying what was done', () => {
    const calls: [number, number, string][] = [];
    analyseTable(table(['A', 'B'], ['Y', 'Z'], [[1, 1, 1, 0], [0, '-', 0, 1]]), { onProgress: (d, t, w) => calls.push([d, t, w]) });
    expect(calls.map(([d]) => d)).toEqual(calls.map((_, i) => i + 1));
    expect(calls.every(([, t]) => t === calls.length)).toBe(true);
    expect(calls.map(([, , w]) => w)).toContain('Z: XOR form');
  });
});

describe('an analysis as data', () => {
  it('survives structured cloning unchanged, so it crosses a worker boundary', () => {
    const analysis = analyseTable(majority);
    expect(structuredClone(analysis)).toEqual(analysis);
  });
});

describe('the JSON of an analysis', () => {
  const json = analysisJson(analyseTable(table(['Guard A', 'Guard B'], ['Motor permit'], [[1, 1, 1], [1, 0, '-'], [0, 0, 0]])));

  it('has the fields of the --json contract', () => {
    expect(json).toMatchObject({ sheet: 'Capper', range: 'B3:D7', inputs: ['Guard A', 'Guard B'] });
    expect(json.outputs[0]).toMatchObject({
      name: 'Motor permit',
      identifier: 'Motor_permit',
      andOr: 'Guard_A',
      xor: 'Guard_A',
      proven: true,
      terms: 1,
      literals: 1,
      xorTerms: 1,
      check: { combinations: 4, mismatchCount: 0, mismatches: [] },
    });
    expect(json.problems).toContainEqual({ severity: 'warning', code: 'gaps', cell: 'B3:D7', message: expect.stringMatching(/^1 input combination/) });
  });

  it('writes combinations as patterns over the inputs, leftmost first', () => {
    const out = json.outputs[0]!;
    expect(out.permitsAlso).toEqual(['10']);
    expect(out.gaps).toEqual(['01']);
    expect(out.steps.every((s) => /^[01]{2}$/.test(s.combination))).toBe(true);
  });

  it('maps every header to its identifier, and says how roles and X were read', () => {
    expect(json.identifiers).toEqual({ 'Guard A': 'Guard_A', 'Guard B': 'Guard_B', 'Motor permit': 'Motor_permit' });
    expect([json.roleRule, json.xReading]).toEqual(['role-row', 'none']);
  });
});

describe('every form of any small table', () => {
  it('matches the table on every specified combination', () => {
    const cell = fc.constantFrom<CellValue>(0, 1, '-');
    const rows = fc.integer({ min: 1, max: 5 }).chain((n) =>
      fc.array(fc.array(cell, { minLength: n + 2, maxLength: n + 2 }), { minLength: 1, maxLength: 10 }).map((r) => ({ n, r })),
    );
    fc.assert(
      fc.property(rows, fc.constantFrom<0 | 1>(0, 1), ({ n, r }, safe) => {
        const inputs = Array.from({ length: n }, (_, i) => `I${i}`);
        const t = table(inputs, ['Y', 'Z'], r, { safeValues: { Z: safe } });
        for (const o of analyseTable(t).outputs)
          for (const form of [o.andOr, o.xor, o.bestXor]) {
            expect(form.proof.combinations).toBe(2 ** n);
            expect(form.proof.mismatchCount).toBe(0);
          }
      }),
      { numRuns: 60 },
    );
  });
});
