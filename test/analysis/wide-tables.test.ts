// Tables of 25 to 64 inputs: read and analysed by the symbolic engine.
import { describe, expect, it } from 'vitest';
import { analyseTable } from '../../src/analysis/analyse.js';
import { analysisJson } from '../../src/report/analysis-json.js';
import type { WideTableJson } from '../../src/report/analysis-json-wide.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, SpecTable } from '../../src/table/types.js';

const names = (n: number, stem: string): string[] => Array.from({ length: n }, (_, i) => `${stem} ${i + 1}`);

function read(inputs: string[], output: string, rows: CellValue[][]) {
  return readSpecTables({ sheet: 'Burner', origin: 'A1', cells: [[...inputs.map(() => 'input'), 'output'], [...inputs, output], ...rows] });
}

function onlyTable(inputs: string[], output: string, rows: CellValue[][]): SpecTable {
  const r = read(inputs, output, rows);
  expect(r.tables).toHaveLength(1);
  return r.tables[0]!;
}

/** One row per cause (1, the rest '-'), and all causes at 0 is OFF. */
function orTrip(n: number): CellValue[][] {
  const causes = names(n, 'Cause');
  const rows = causes.map((_, i) => [...causes.map((_, j) => (j === i ? 1 : '-')), 1]);
  rows.push([...causes.map(() => 0), 0]);
  return rows;
}

const json = (t: SpecTable): WideTableJson => analysisJson(analyseTable(t)) as WideTableJson;

describe('a table of more than 24 inputs', () => {
  it('is read for the symbolic engine, with a note of what takes at most 24 inputs', () => {
    const t = onlyTable(names(40, 'Cause'), 'Trip', orTrip(40));
    expect(t.wide?.cubes).toHaveLength(41);
    expect(t.outputs).toEqual([]);
    expect(t.problems).toEqual([expect.objectContaining({ severity: 'info', cell: 'A1:AO43', message: expect.stringMatching(/40 inputs: analysed by the symbolic engine/) })]);
  });

  it('a 40-cause OR trip: 40 terms proven, 2^40 - 1 XOR terms, best polarity 2 terms, every combination checked', () => {
    const [out] = json(onlyTable(names(40, 'Cause'), 'Trip', orTrip(40))).outputs;
    expect(out).toMatchObject({ terms: 40, literals: 40, proven: true, xorTerms: 2 ** 40 - 1, degree: 40, gapCount: 0 });
    expect(out!.xor).toBe('1099511627775 terms: not printed (more than 64)');
    expect(out!.bestXor).toMatchObject({ terms: 2, exhaustive: false });
    expect(out!.bestXor!.complemented).toHaveLength(40);
    expect(out!.check).toEqual({ combinations: 2 ** 40, mismatchCount: 0, mismatches: [] });
  });

  it('writes counts past 2^53 as decimal strings', () => {
    const [out] = json(onlyTable(names(60, 'Cause'), 'Trip', orTrip(60))).outputs;
    expect(out!.xorTerms).toBe(((1n << 60n) - 1n).toString());
    expect(out!.check.combinations).toBe((1n << 60n).toString());
  });

  it('reports gaps once per table, with their exact count, and lists them as patterns', () => {
    const inputs = names(30, 'Cond');
    const t = onlyTable(inputs, 'Permit', [[...inputs.map((_, i) => (i < 2 ? 1 : '-')), 1], [...inputs.map((_, i) => (i === 0 ? 0 : '-')), 0]]);
    // Uncovered: first input 1, second 0: 2^28 combinations.
    expect(t.problems[0]).toMatchObject({ severity: 'warning', cell: 'A1:AE4' });
    expect(t.problems[0]!.message).toMatch(/^268435456 input combinations are covered by no row/);
    const [out] = json(t).outputs;
    expect(out!.gapCount).toBe(2 ** 28);
    expect(out!.gaps).toEqual(['10' + '-'.repeat(28)]);
    expect(out!.andOr).toBe('Cond_1 AND Cond_2');
  });

  it("reports a conflict at the later row's output cell, naming both rows", () => {
    const inputs = names(26, 'In');
    const t = onlyTable(inputs, 'Y', [[...inputs.map((_, i) => (i === 0 ? 1 : '-')), 1], [...inputs.map((_, i) => (i === 25 ? 1 : '-')), 0]]);
    const conflict = t.problems.find((p) => p.severity === 'error')!;
    expect(conflict.cell).toBe('AA4');
    expect(conflict.message).toMatch(/^rows A3:AA3 and A4:AA4 both cover In 1=1, In 26=1 but ask Y for 1 and 0; 16777216 combinations take the safe value 0/);
    const [out] = json(t).outputs;
    expect(out!.conflicts).toEqual([{ rows: ['A3:AA3', 'A4:AA4'], example: '1' + '0'.repeat(24) + '1', combinations: 2 ** 24 }]);
  });

  it('with no decision diagram of workable size in column order: analysed on its rows, its form proven equal, no XOR form', () => {
    // a1 b1 + a2 b2 + ... with all a's left of all b's: 2^32 nodes in this order (a textbook case).
    const inputs = [...names(32, 'A'), ...names(32, 'B')];
    const rows = names(32, 'A').map((_, i) => [...inputs.map((_, j) => (j === i || j === 32 + i ? 1 : '-')), 1]);
    const t = onlyTable(inputs, 'Y', rows);
    expect(t.problems.filter((p) => p.severity === 'error')).toEqual([]);
    expect(t.problems.find((p) => p.code === 'row-cube-engine')).toMatchObject({ cell: t.range, severity: 'info' });
    const analysis = analyseTable(t);
    const y = analysis.wide!.outputs[0]!;
    expect(analysis.wide!.engine).toBe('rows');
    // The 32 rows are the primes, each holding a combination no other holds: 32 terms at least.
    expect([y.andOr.terms, y.andOr.literals, y.andOr.lowerBound.terms, y.andOr.proof.mismatchCount, y.andOr.proof.combinations]).toEqual([32, 64, 32, 0n, 2n ** 64n]);
    expect([y.xor, y.bestXor, y.degree]).toEqual([null, null, null]);
    // Gaps: every combination with no pair a_i = b_i = 1, 3^32 of them (3 of the 4 values of each pair).
    const { atLeast, atMost } = analysis.wide!.gapCount;
    expect(atLeast <= 3n ** 32n && 3n ** 32n <= atMost).toBe(true);
  });
});
