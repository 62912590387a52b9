// The wide bench's consistent table of random rows: what its generator promises (rows of 3-10
// literals, no ON row meeting an OFF row), checked pairwise and by the table reader.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { wideDisjoint } from '../../src/logic/wide-cube.js';
import { wideRowCube } from '../../src/table/read-wide.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { consistentRowsTable } from '../../bench/wide.bench.js';

describe('the consistent bench table', () => {
  it('has 300 rows of 3 to 10 literals over 64 inputs, and no ON row meets an OFF row', () => {
    const cells = consistentRowsTable(64, 300, 64300);
    const rows = cells.slice(2);
    expect(rows).toHaveLength(300);
    const literals = rows.map((r) => r.slice(0, 64).filter((v) => v !== '-').length);
    expect(Math.min(...literals)).toBeGreaterThanOrEqual(3);
    expect(Math.max(...literals)).toBeLessThanOrEqual(10);
    const cube = (r: (typeof rows)[number]) => wideRowCube(r.slice(0, 64) as (0 | 1 | '-')[]);
    const on = rows.filter((r) => r[64] === 1).map(cube);
    const off = rows.filter((r) => r[64] === 0).map(cube);
    expect(on.length + off.length).toBe(300);
    expect(on.filter((a) => off.some((b) => !wideDisjoint(a, b)))).toEqual([]);
  });

  it('reads without a conflict or any other error at any size and seed', () => {
    fc.assert(
      fc.property(fc.integer({ min: 10, max: 16 }), fc.integer({ min: 1, max: 40 }), fc.nat(), (n, count, seed) => {
        const read = readSpecTables({ sheet: 'Bench', origin: 'A1', cells: consistentRowsTable(n, count, seed) });
        expect(read.tables).toHaveLength(1);
        expect(read.tables[0]!.rows).toHaveLength(count);
        expect(read.tables[0]!.problems.filter((p) => p.severity === 'error')).toEqual([]);
      }),
      { numRuns: 40 },
    );
  });
});
