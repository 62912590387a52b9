import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  cellAddress,
  columnIndex,
  columnLetters,
  parseA1,
  parseRange,
  qualifiedAddress,
  rangeAddress,
  restrictGrid,
} from '../../src/table/grid.js';

describe('column letters', () => {
  it('run A..Z, then AA, and end at XFD, the last column of a sheet', () => {
    expect([0, 1, 25, 26, 27, 51, 52, 701, 702, 16383].map(columnLetters)).toEqual([
      'A', 'B', 'Z', 'AA', 'AB', 'AZ', 'BA', 'ZZ', 'AAA', 'XFD',
    ]);
  });

  it('convert back to the same index, in any case', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 16383 }), (col) => {
      expect(columnIndex(columnLetters(col))).toBe(col);
      expect(columnIndex(columnLetters(col).toLowerCase())).toBe(col);
    }));
  });

  it('beyond XFD are not a column', () => {
    expect(columnIndex('XFE')).toBeUndefined();
    expect(columnIndex('AAAA')).toBeUndefined();
    expect(columnIndex('A1')).toBeUndefined();
  });
});

describe('A1 addresses', () => {
  it('name a cell by 0-based row and column', () => {
    expect(cellAddress(0, 0)).toBe('A1');
    expect(cellAddress(2, 1)).toBe('B3');
    expect(cellAddress(1048575, 16383)).toBe('XFD1048576');
  });

  it('parse back, with or without $ signs', () => {
    expect(parseA1('B3')).toEqual({ row: 2, col: 1 });
    expect(parseA1('$b$3')).toEqual({ row: 2, col: 1 });
    fc.assert(fc.property(fc.integer({ min: 0, max: 1048575 }), fc.integer({ min: 0, max: 16383 }), (row, col) => {
      expect(parseA1(cellAddress(row, col))).toEqual({ row, col });
    }));
  });

  it('reject what is not a cell of a sheet', () => {
    for (const bad of ['', 'B', '3', 'B0', 'XFE1', 'A1048577', 'B3:C4', 'Sheet1!B3']) expect(parseA1(bad)).toBeUndefined();
  });

  it('carry the sheet name, quoted when it has blanks', () => {
    expect(qualifiedAddress('Capper', 'D7')).toBe('Capper!D7');
    expect(qualifiedAddress('Chuck and feeder', 'D7')).toBe("'Chuck and feeder'!D7");
    expect(qualifiedAddress("Bob's", 'A1')).toBe("'Bob''s'!A1");
  });
});

describe('ranges', () => {
  it('read "A1:H20" with corners in any order, and a single cell as a range of one', () => {
    expect(parseRange('A1:H20')).toEqual({ top: 0, left: 0, bottom: 19, right: 7 });
    expect(parseRange('H20:A1')).toEqual({ top: 0, left: 0, bottom: 19, right: 7 });
    expect(parseRange('C4')).toEqual({ top: 3, left: 2, bottom: 3, right: 2 });
    expect(parseRange('A1:B2:C3')).toBeUndefined();
  });

  it('print as "B3:H20", or as one address for one cell', () => {
    expect(rangeAddress({ top: 2, left: 1, bottom: 19, right: 7 })).toBe('B3:H20');
    expect(rangeAddress({ top: 2, left: 1, bottom: 2, right: 1 })).toBe('B3');
  });
});

describe('restricting a grid to a range', () => {
  const grid = { sheet: 'S', origin: 'B2', cells: [['a', 'b', 'c'], ['d', 'e', 'f'], ['g', 'h', 'i']] };

  it('keeps the cells inside the range, with the origin moved to its corner', () => {
    const inside = restrictGrid(grid, parseRange('C3:Z9')!);
    expect(inside).toEqual({ sheet: 'S', origin: 'C3', cells: [['e', 'f'], ['h', 'i']] });
  });

  it('gives nothing when the range misses the grid', () => {
    expect(restrictGrid(grid, parseRange('F1:G9')!)).toBeUndefined();
  });

  it('fills the short rows of a ragged grid with empty cells', () => {
    const ragged = { sheet: 'S', origin: 'A1', cells: [['a', 'b'], ['c']] };
    expect(restrictGrid(ragged, parseRange('A1:B2')!)!.cells).toEqual([['a', 'b'], ['c', null]]);
  });
});
