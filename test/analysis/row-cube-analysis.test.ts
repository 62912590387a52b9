// The bench's 64-input tables of 300 random rows, which have no decision diagram of workable
// size: analysed on their rows' cubes. The form is checked here independently of the engine's
// own proof: at random combinations, its expression's value against the rows read directly.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseTable } from '../../src/analysis/analyse.js';
import { wideContains } from '../../src/logic/wide-cube.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { wideRowCube } from '../../src/table/read-wide.js';
import { consistentRowsTable, randomRowsTable } from '../../bench/wide.bench.js';
import { valueAt } from '../logic/expr/reference-value.js';

describe('a 64 x 300 table of random rows', () => {
  const cells = consistentRowsTable(64, 300, 64300);
  const table = readSpecTables({ sheet: 'Cell', origin: 'A1', cells }).tables[0]!;
  const analysis = analyseTable(table);
  const rows = cells.slice(2);
  const on = rows.filter((r) => r[64] === 1).map((r) => wideRowCube(r.slice(0, 64) as (0 | 1 | '-')[]));

  it('is analysed on its rows: one AND/OR form, proven equal on all 2^64 combinations, its bound below it, no XOR form', () => {
    expect(analysis.wide!.engine).toBe('rows');
    const out = analysis.wide!.outputs[0]!;
    expect([out.andOr.proof.mismatchCount, out.andOr.proof.combinations, out.xor, out.bestXor]).toEqual([0n, 2n ** 64n, null, null]);
    expect(out.andOr.lowerBound.terms).toBeGreaterThan(0);
    expect(out.andOr.lowerBound.terms).toBeLessThanOrEqual(out.andOr.terms);
    expect(out.andOr.terms).toBeLessThanOrEqual(on.length);
  });

  it('gives a form whose value is the rows\u2019 at random combinations (evaluated from its expression)', () => {
    const { expr } = analysis.wide!.outputs[0]!.andOr;
    fc.assert(
      fc.property(fc.bigInt({ min: 0n, max: 2n ** 64n - 1n }), (k) => {
        expect(valueAt(expr, 64, k)).toBe(on.some((c) => wideContains(c, k)));
      }),
      { numRuns: 2000 },
    );
  });

  it('gives a form that is on at random combinations inside each ON row', () => {
    const { expr } = analysis.wide!.outputs[0]!.andOr;
    fc.assert(
      fc.property(fc.nat({ max: on.length - 1 }), fc.bigInt({ min: 0n, max: 2n ** 64n - 1n }), (r, free) => {
        const k = on[r]!.bits | (free & ~on[r]!.mask);
        expect(valueAt(expr, 64, k)).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('gives test steps that each expect what the rows give there', () => {
    const { steps } = analysis.wide!.outputs[0]!;
    expect(steps.length).toBeGreaterThan(0);
    for (const s of steps) expect(s.expected).toBe(on.some((c) => wideContains(c, s.combination)) ? 1 : 0);
  });

  it('when its rows contradict each other, names the pairs and derives no form', () => {
    const bad = readSpecTables({ sheet: 'Cell', origin: 'A1', cells: randomRowsTable(64, 300, 64300) }).tables[0]!;
    expect(bad.problems.filter((p) => p.code === 'conflict').length).toBeGreaterThan(0);
    const a = analyseTable(bad);
    expect(a.wide!.outputs).toEqual([]);
    expect(a.problems.find((p) => p.code === 'too-large')?.message).toMatch(/no form derived: its rows conflict/);
  });
});
