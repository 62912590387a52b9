// The demo workbooks' sheets (built from sample-workbooks/source) read as spec tables.
import { describe, expect, it } from 'vitest';
import { SAMPLE_WORKBOOKS, sheetCells } from '../../scripts/make-samples.js';
import { allProblems, readSpecTables } from '../../src/table/read-tables.js';

function readSheet(file: string, name: string) {
  const sheet = SAMPLE_WORKBOOKS.find((w) => w.file === file)!.sheets.find((s) => s.name === name)!;
  return readSpecTables({ sheet: name, origin: 'A1', cells: sheetCells(sheet) });
}

describe('the capper cell demo workbook', () => {
  it('has two tables under a title on the Spindle sheet, told apart by role rows', () => {
    const read = readSheet('capper-cell.xlsx', 'Spindle');
    expect(read.tables.map((t) => [t.range, t.roleRule, t.inputs.length, t.rows.length])).toEqual([
      ['A3:H13', 'role-row', 7, 9],
      ['A16:D25', 'role-row', 3, 8],
    ]);
    expect(allProblems(read)).toEqual([]);
  });

  it('reads the chuck table by its separator column, with three outputs', () => {
    const read = readSheet('capper-cell.xlsx', 'Chuck and feeder');
    expect(read.tables.map((t) => [t.range, t.roleRule, t.inputs.length, t.outputs.length])).toEqual([
      ['B2:J34', 'separator-column', 5, 3],
    ]);
    expect(allProblems(read)).toEqual([]);
  });
});

describe('the broken demo workbook', () => {
  it('reports the Spindle conflict and the missing light-curtain row', () => {
    const problems = allProblems(readSheet('capper-cell-broken.xlsx', 'Spindle'));
    expect(problems.map((p) => [p.severity, p.cell])).toEqual([
      ['error', 'H13'],
      ['warning', 'A3:H13'],
    ]);
    expect(problems[0]!.message).toMatch(/^rows A12:H12 and A13:H13 both cover .*Mode setup=1, Jog pressed=0/);
    expect(problems[1]!.message).toMatch(/: 1101100$/);
  });

  it('names each spoilt cell of the air supply vote', () => {
    const problems = allProblems(readSheet('capper-cell-broken.xlsx', 'Air supply vote'));
    expect(problems.filter((p) => p.severity === 'error').map((p) => p.cell)).toEqual(['B4', 'A6', 'D8', 'C9']);
  });
});
