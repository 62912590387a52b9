import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cellAddress, gridExtent, parseRange, type RangeRef } from '../../src/table/grid.js';
import { allProblems, readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, Grid, SpecOptions } from '../../src/table/types.js';

const cellValue: fc.Arbitrary<CellValue> = fc.oneof(
  { weight: 4, arbitrary: fc.constant(null) },
  { weight: 4, arbitrary: fc.constantFrom<CellValue>(0, 1, true, false, '1', '0', '-', 'TRUE', 'false', ' 1 ') },
  { weight: 2, arbitrary: fc.constantFrom<CellValue>('input', 'OUTPUT', ' in', 'out', 'Inputs') },
  { weight: 2, arbitrary: fc.constantFrom<CellValue>('GuardA', 'guarda', 'Motor Permit', 'E-stop', '1st', 'X', 'x', '', '  ') },
  { weight: 1, arbitrary: fc.oneof(fc.string({ maxLength: 6 }), fc.double(), fc.integer()) },
  { weight: 1, arbitrary: fc.constantFrom<CellValue>({ error: '#N/A' }, { error: '#REF!' }, { date: 45000.5 }, 2, 0.5) },
);

/** A sheet of up to 14 x 12 random cells. */
const junkGrids: fc.Arbitrary<Grid> = fc
  .record({
    rows: fc.array(fc.array(cellValue, { maxLength: 12 }), { maxLength: 14 }),
    row: fc.oneof(fc.integer({ min: 0, max: 50 }), fc.constant(1048570)),
    col: fc.oneof(fc.integer({ min: 0, max: 30 }), fc.constant(16380)),
  })
  .map(({ rows, row, col }): Grid => ({ sheet: 'Fuzz', origin: cellAddress(row, col), cells: rows }));

/** A table-like block (optional role row, names, rows of data with some junk) set into blanks. */
const tableish: fc.Arbitrary<Grid> = fc
  .record({
    width: fc.integer({ min: 1, max: 7 }),
    roleRow: fc.boolean(),
    separator: fc.option(fc.integer({ min: 1, max: 6 })),
    data: fc.array(fc.array(fc.oneof({ weight: 8, arbitrary: fc.constantFrom<CellValue>(0, 1, '-', true, 'FALSE') }, { weight: 1, arbitrary: cellValue }), { minLength: 7, maxLength: 7 }), { maxLength: 6 }),
    names: fc.array(fc.constantFrom<CellValue>('GuardA', 'GuardB', 'guarda', 'Mode', 'Permit', null, 'out'), { minLength: 7, maxLength: 7 }),
    at: fc.record({ row: fc.integer({ min: 0, max: 3 }), col: fc.integer({ min: 0, max: 3 }) }),
  })
  .map(({ width, roleRow, separator, data, names, at }) => {
    const lay = (row: readonly CellValue[]): CellValue[] => {
      const cells = row.slice(0, width);
      if (separator !== null && separator < width) cells.splice(separator, 0, null);
      return [...Array<CellValue>(at.col).fill(null), ...cells];
    };
    const roles = names.map((_, i) => (i < width / 2 ? 'input' : 'output'));
    const rows = [...(roleRow ? [roles] : []), names, ...data].map(lay);
    return { sheet: 'Fuzz', origin: 'C2', cells: [...Array.from({ length: at.row }, () => []), ...rows] };
  });

const options: fc.Arbitrary<SpecOptions> = fc.record(
  {
    range: fc.oneof(fc.constantFrom('A1:Z60', 'B2:F9', 'C3', 'XFA1048570:XFD1048576', 'not a range'), fc.string({ maxLength: 5 })),
    xReading: fc.constantFrom('none' as const, 'dont-care' as const),
    inputCount: fc.integer({ min: -1, max: 13 }),
    safeValues: fc.constant({ GuardA: 1 as const, motor_permit: 0 as const }),
  },
  { requiredKeys: [] },
);

const grids = fc.oneof(junkGrids, tableish);

const within = (inner: RangeRef, outer: RangeRef): boolean =>
  inner.top >= outer.top && inner.left >= outer.left && inner.bottom <= outer.bottom && inner.right <= outer.right;

describe('reading random sheets', () => {
  it('never throws, and every problem and table address lies inside the grid', () => {
    fc.assert(
      fc.property(grids, options, (grid, opts) => {
        const read = readSpecTables(grid, opts);
        const extent = gridExtent(grid);
        const places = [
          ...allProblems(read).map((p) => p.cell),
          ...read.tables.flatMap((t) => [t.range, ...t.headerCells, ...t.rows.flatMap((r) => [r.cells, ...r.inputCells, ...r.outputCells])]),
        ];
        for (const place of places) {
          const range = parseRange(place);
          expect(range, place).toBeDefined();
          if (extent) expect(within(range!, extent), `${place} in ${grid.origin}`).toBe(true);
          else expect(place).toBe(grid.origin);
        }
        for (const p of allProblems(read)) {
          expect(p.sheet).toBe('Fuzz');
          expect(p.message.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 400 },
    );
  });

  it('every table returned has 1 to 24 inputs, an output, and one value per output in each row', () => {
    fc.assert(
      fc.property(grids, options, (grid, opts) => {
        for (const t of readSpecTables(grid, opts).tables) {
          expect(t.inputs.length).toBeGreaterThanOrEqual(1);
          expect(t.inputs.length).toBeLessThanOrEqual(24);
          expect(t.outputs.length).toBeGreaterThanOrEqual(1);
          for (const r of t.rows) expect(r.values.length).toBe(t.outputs.length);
        }
      }),
      { numRuns: 300 },
    );
  });
});
