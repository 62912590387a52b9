import { describe, expect, it } from 'vitest';
import { members } from '../../src/logic/bits.js';
import { cubeToPattern } from '../../src/logic/cube.js';
import { allProblems, problemText, readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, Grid, Problem, SpecOptions, SpecTable } from '../../src/table/types.js';

const grid = (cells: CellValue[][], origin = 'A1', sheet = 'Capper'): Grid => ({ sheet, origin, cells });

/** The only table of a grid (fails the test when there is not exactly one). */
function onlyTable(cells: CellValue[][], options?: SpecOptions, origin?: string): SpecTable {
  const read = readSpecTables(grid(cells, origin), options);
  expect(read.tables.length, JSON.stringify(read.problems)).toBe(1);
  return read.tables[0]!;
}

const errors = (problems: readonly Problem[]): Problem[] => problems.filter((p) => p.severity === 'error');

const ROLES = ['input', 'input', 'output'];
const HEADERS = ['GuardA', 'GuardB', 'Motor_Permit'];
const AND_ROWS: CellValue[][] = [
  [0, '-', 0],
  [1, 0, 0],
  [1, 1, 1],
];

describe('telling inputs from outputs', () => {
  it('a role row above the headers decides, in any case and as in/out', () => {
    const t = onlyTable([[' Input', 'IN', 'Out'], HEADERS, ...AND_ROWS]);
    expect(t.roleRule).toBe('role-row');
    expect(t.inputs.map((s) => s.header)).toEqual(['GuardA', 'GuardB']);
    expect(t.outputs.map((o) => o.signal.header)).toEqual(['Motor_Permit']);
    expect(t.range).toBe('A1:C5');
    expect(t.problems).toEqual([]);
  });

  it('a blank role cell takes the role of the role cell on its left, as under a merged cell', () => {
    const t = onlyTable([['Inputs', null, 'Outputs'], HEADERS, ...AND_ROWS]);
    expect(t.inputs.length).toBe(2);
    expect(t.outputs.length).toBe(1);
  });

  it('an empty separator column puts inputs on its left and outputs on its right, in one table', () => {
    const t = onlyTable([
      ['GuardA', 'GuardB', null, 'Motor_Permit'],
      [0, '-', null, 0],
      [1, 0, null, 0],
      [1, 1, null, 1],
    ]);
    expect(t.roleRule).toBe('separator-column');
    expect(t.inputs.map((s) => s.header)).toEqual(['GuardA', 'GuardB']);
    expect(t.range).toBe('A1:D4');
    expect(t.rows[2]!.cells).toBe('A4:D4');
    expect(t.headerCells).toEqual(['A1', 'B1', 'D1']);
  });

  it("the user's count of inputs decides when the sheet does not", () => {
    const t = onlyTable([HEADERS, ...AND_ROWS], { inputCount: 2 });
    expect(t.roleRule).toBe('user-choice');
    expect(t.inputs.length).toBe(2);
  });

  it('with no rule at all, an error names the header row and says how to mark roles', () => {
    const read = readSpecTables(grid([HEADERS, ...AND_ROWS], 'B3'));
    expect(read.tables).toEqual([]);
    expect(read.problems).toHaveLength(1);
    expect(read.problems[0]).toMatchObject({ severity: 'error', sheet: 'Capper', cell: 'B3:D3' });
    expect(read.problems[0]!.message).toMatch(/input \/ output.*empty column.*how many/);
  });

  it('a role row beats a separator column and the user count', () => {
    const t = onlyTable(
      [
        ['input', null, 'output', 'output'],
        ['GuardA', null, 'Motor_Permit', 'Lamp'],
        [1, null, 1, 0],
        [0, null, 0, 1],
      ],
      { inputCount: 2 },
    );
    expect(t.roleRule).toBe('role-row');
    expect(t.outputs.map((o) => o.signal.header)).toEqual(['Motor_Permit', 'Lamp']);
  });

  it('a role cell that is neither input nor output is an error naming it', () => {
    const read = readSpecTables(grid([['input', 'inptu', 'output'], HEADERS, ...AND_ROWS]));
    expect(read.tables).toEqual([]);
    expect(read.problems.map((p) => p.cell)).toEqual(['B1']);
  });

  it('a user count that leaves no output is an error', () => {
    const read = readSpecTables(grid([HEADERS, ...AND_ROWS]), { inputCount: 3 });
    expect(errors(read.problems).map((p) => p.cell)).toEqual(['A1:C1']);
  });
});

describe('reading data cells', () => {
  it('takes 1/0 as numbers, as Excel booleans and as text in any case, with blanks around', () => {
    const t = onlyTable([ROLES, HEADERS, [true, ' TRUE ', 1], ['0', 'false', false], [0, 1, '1 ']]);
    expect(t.rows.map((r) => cubeToPattern(2, r.cube))).toEqual(['11', '00', '01']);
    expect(t.rows.map((r) => r.values[0])).toEqual([1, 0, 1]);
    expect(t.problems.filter((p) => p.severity !== 'warning')).toEqual([]);
  });

  it("reads '-' in an input as any value and in an output as don't-care", () => {
    const t = onlyTable([ROLES, HEADERS, ['-', 1, '-'], [1, 0, 1], [0, 0, 0]]);
    expect(cubeToPattern(2, t.rows[0]!.cube)).toBe('-1');
    const fn = t.outputs[0]!.built.fn;
    expect(members(fn.dc)).toEqual([1, 3]);
    expect(members(fn.on)).toEqual([2]);
  });

  it('puts the leftmost input in the most significant bit', () => {
    const t = onlyTable([['input', 'input', 'input', 'output'], ['A', 'B', 'C', 'Y'], [1, 1, 0, 1]]);
    expect(members(t.outputs[0]!.built.fn.on)).toEqual([6]);
  });

  it("rejects 'X' by default, saying it is ambiguous and how to accept it", () => {
    const read = readSpecTables(grid([ROLES, HEADERS, ['X', 1, 1], [0, 0, 0]]));
    const [p] = errors(allProblems(read));
    expect(p).toMatchObject({ cell: 'A3' });
    expect(p!.message).toMatch(/ambiguous/);
    expect(p!.message).toMatch(/tick 'X means don't-care' \(command line: --x-means-dont-care\)/);
    expect(p!.setting).toBe('x-means-dont-care');
    expect(read.tables[0]!.xReading).toBe('none');
  });

  it("reads 'X' as '-' under the setting, and the table says so", () => {
    const t = onlyTable([ROLES, HEADERS, ['x', 1, 1], [0, 0, 'X']], { xReading: 'dont-care' });
    expect(t.xReading).toBe('dont-care');
    expect(cubeToPattern(2, t.rows[0]!.cube)).toBe('-1');
    expect(t.rows[1]!.values).toEqual(['-']);
    expect(errors(t.problems)).toEqual([]);
    expect(t.problems.some((p) => p.severity === 'info' && /2 cells reading X/.test(p.message))).toBe(true);
  });

  const badCells: [string, CellValue, RegExp][] = [
    ['a blank cell', null, /blank cell in a data row; write 1, 0 or -/],
    ['a text of blanks', '  ', /blank cell/],
    ['the number 2', 2, /number 2 is not a truth value/],
    ['the number 0.5', 0.5, /number 0.5/],
    ['a date', { date: 45000 }, /date/],
    ['an error value', { error: '#N/A' }, /error value #N\/A/],
    ['other text', 'maybe', /"maybe" is not a truth value/],
  ];
  for (const [what, value, reason] of badCells) {
    it(`${what} in a data row is an error naming its cell`, () => {
      const read = readSpecTables(grid([ROLES, HEADERS, [1, 1, 1], [0, value, 0]], 'C5'));
      const errs = errors(allProblems(read));
      expect(errs).toHaveLength(1);
      expect(errs[0]).toMatchObject({ sheet: 'Capper', cell: 'D8' });
      expect(errs[0]!.message).toMatch(reason);
    });
  }

  it('leaves a row with an unreadable cell out of the functions, so its combinations are gaps', () => {
    const t = onlyTable([ROLES, HEADERS, [1, 1, 1], [0, 'maybe', 0]]);
    expect(t.rows).toHaveLength(1);
    expect(members(t.outputs[0]!.built.gaps)).toEqual([0, 1, 2]);
  });
});

describe('conflicts and gaps', () => {
  it('rows asking one output for 1 and 0 on the same combination are an error naming both rows', () => {
    const t = onlyTable(
      [
        ['input', 'input', 'input', 'output'],
        ['GuardA', 'GuardB', 'Mode', 'Motor_Permit'],
        [1, '-', '-', 1],
        [0, '-', '-', 0],
        ['-', 0, 1, 0],
      ],
      undefined,
      'B3',
    );
    const [p] = errors(t.problems);
    expect(p!.cell).toBe('E7');
    expect(p!.message).toBe(
      'rows B5:E5 and B7:E7 both cover GuardA=1, GuardB=0, Mode=1 but ask Motor_Permit for 1 and 0; ' +
        '1 combination takes the safe value 0',
    );
    expect(members(t.outputs[0]!.built.fn.on)).toEqual([4, 6, 7]);
  });

  it('combinations no row covers are one warning with their count and patterns, and take the safe value 0', () => {
    const t = onlyTable([ROLES, HEADERS, [1, 1, 1], [0, 0, 0]]);
    const gaps = t.problems.filter((p) => p.severity === 'warning');
    expect(gaps).toHaveLength(1);
    expect(gaps[0]!.cell).toBe('A1:C4');
    expect(gaps[0]!.message).toMatch(/^2 input combinations are covered by no row/);
    expect(gaps[0]!.message).toMatch(/Motor_Permit 0/);
    expect(gaps[0]!.message).toMatch(/over GuardA, GuardB \(- = any\): 01, 10$/);
    expect(members(t.outputs[0]!.built.fn.on)).toEqual([3]);
  });

  it('gaps take the safe value 1 when it is set for the output, by header or identifier', () => {
    const cells = [ROLES, HEADERS, [1, 1, 0], [0, 0, 0]];
    for (const key of ['motor_permit', 'Motor_Permit']) {
      const t = onlyTable(cells, { safeValues: { [key]: 1 } });
      expect(t.outputs[0]!.safe).toBe(1);
      expect(members(t.outputs[0]!.built.fn.on)).toEqual([1, 2]);
    }
  });

  it('a long gap list is cut short with a count of the rest', () => {
    const inputs = 'ABCDEFGHIJ'.split('');
    const t = onlyTable([[...inputs.map(() => 'input'), 'output'], [...inputs, 'Y'], [...inputs.map(() => 1), 1]]);
    const gap = t.problems.find((p) => p.severity === 'warning')!;
    expect(gap.message).toMatch(/^1023 input combinations/);
    expect(gap.message).toMatch(/: (\S+, ){7}\S+ and 2 more$/);
  });
});

describe('signal names', () => {
  it('a name used twice, ignoring case, is an error at the second cell naming the first', () => {
    const t = onlyTable([ROLES, ['GuardA', 'guarda', 'Y'], ...AND_ROWS]);
    const [p] = errors(t.problems);
    expect(p!.cell).toBe('B2');
    expect(p!.message).toMatch(/already used at A2/);
    expect(new Set(t.inputs.map((s) => s.identifier.toLowerCase())).size).toBe(2);
  });

  it('an empty name above a data column is an error naming the header cell', () => {
    const t = onlyTable([ROLES, ['GuardA', null, 'Y'], ...AND_ROWS], undefined, 'C2');
    const [p] = errors(t.problems);
    expect(p).toMatchObject({ cell: 'D3', message: expect.stringMatching(/empty signal name/) });
    expect(t.inputs[1]!.header).toBe('Column D');
  });

  it('every signal has an identifier, and the table maps header to identifier', () => {
    const t = onlyTable([ROLES, ['Guard door A closed', 'E-stop healthy', 'Spindle run permit'], ...AND_ROWS]);
    for (const s of [...t.inputs, ...t.outputs.map((o) => o.signal)]) expect(s.identifier).toMatch(/^[A-Za-z][A-Za-z0-9_]*$/);
    expect(t.inputs[0]!.header).toBe('Guard door A closed');
  });
});

describe('the shape of a table', () => {
  it('more than 64 inputs is an error naming the input header cells', () => {
    const headers = Array.from({ length: 65 }, (_, i) => `In${i + 1}`);
    const read = readSpecTables(grid([[...headers.map(() => 'input'), 'output'], [...headers, 'Y'], [...headers.map(() => 1), 1]]));
    expect(read.tables).toEqual([]);
    expect(read.problems[0]).toMatchObject({ severity: 'error', cell: 'A2:BM2' });
    expect(read.problems[0]!.message).toMatch(/65 inputs: at most 64/);
  });

  it('no output column is an error naming the header row', () => {
    const read = readSpecTables(grid([['input', 'input'], ['A', 'B'], [1, 0]]));
    expect(read.problems[0]).toMatchObject({ severity: 'error', cell: 'A2:B2', message: expect.stringMatching(/no output column/) });
  });

  it('no input column is an error naming the header row', () => {
    const read = readSpecTables(grid([['output', 'output'], ['A', 'B'], [1, 0]]));
    expect(read.problems[0]).toMatchObject({ severity: 'error', cell: 'A2:B2', message: expect.stringMatching(/no input column/) });
  });

  it('a header with no data rows below is an error', () => {
    const t = onlyTable([ROLES, HEADERS]);
    expect(errors(t.problems)).toEqual([
      { severity: 'error', code: 'no-data-rows', sheet: 'Capper', cell: 'A2:C2', message: 'no data rows below the header row' },
    ]);
  });

  it('a problem reads as one line with its sheet and cell', () => {
    const read = readSpecTables(grid([ROLES, HEADERS, [1, null, 1]], 'C5', 'Capper cell'));
    expect(problemText(errors(allProblems(read))[0]!)).toBe("'Capper cell'!D7: blank cell in a data row; write 1, 0 or -");
  });

  it('a block of data with no header row is an error naming its first row', () => {
    const read = readSpecTables(grid([[1, 0, 1], [0, 0, 1]]), { inputCount: 2 });
    expect(read.problems).toMatchObject([{ severity: 'error', cell: 'A1:C1', message: expect.stringMatching(/no header row/) }]);
  });

  it('rows cut off from a table by an empty row are an error that says to delete the empty row', () => {
    const read = readSpecTables(grid([ROLES, HEADERS, [1, 1, 1], [null, null, null], [0, 0, 0]]));
    expect(read.tables.map((t) => t.range)).toEqual(['A1:C3']);
    expect(read.problems).toMatchObject([{ cell: 'A5:C5', message: expect.stringMatching(/delete the empty row between them$/) }]);
  });
});

describe('finding tables on a sheet', () => {
  const sheet: CellValue[][] = [
    ['Capper cell interlocks (demo)', null, null, null, null, null, null],
    [null, null, null, null, null, null, null],
    ['input', 'input', 'output', null, null, null, null],
    ['GuardA', 'GuardB', 'Motor_Permit', null, 'input', 'output', 'output'],
    [1, 1, 1, null, 'Jog', 'Lamp', 'Horn'],
    [0, '-', 0, null, 1, 1, 0],
    ['-', 0, 0, null, 0, 0, 1],
    [null, null, null, null, null, null, null],
    ['A', 'B', null, 'Y', null, null, null],
    [1, 1, null, 1, null, null, null],
    [0, 0, null, 0, null, null, null],
  ];

  it('finds each block separated by empty rows or columns, in reading order', () => {
    const read = readSpecTables(grid(sheet));
    expect(read.tables.map((t) => [t.range, t.roleRule])).toEqual([
      ['A3:C7', 'role-row'],
      ['E4:G7', 'role-row'],
      ['A9:D11', 'separator-column'],
    ]);
  });

  it('ignores a one-cell title above a table', () => {
    const read = readSpecTables(grid(sheet));
    expect(read.problems).toEqual([]);
  });

  it('looks only inside the range given, and addresses stay those of the sheet', () => {
    const read = readSpecTables(grid(sheet), { range: 'E1:G20' });
    expect(read.tables.map((t) => t.range)).toEqual(['E4:G7']);
    expect(read.tables[0]!.headerCells).toEqual(['E5', 'F5', 'G5']);
  });

  it('a range that is not an A1 range is an error', () => {
    const read = readSpecTables(grid(sheet), { range: 'nowhere' });
    expect(read.problems).toMatchObject([{ severity: 'error', message: expect.stringMatching(/not an A1 range/) }]);
  });

  it('says so when no table is found', () => {
    const read = readSpecTables(grid([['just a note'], [null]]));
    expect(read.tables).toEqual([]);
    expect(read.problems).toMatchObject([{ severity: 'warning', message: expect.stringMatching(/no spec table found/) }]);
  });

  it('two tables one empty column apart, each with its own role row, stay two tables', () => {
    const read = readSpecTables(
      grid([
        ['input', 'output', null, 'input', 'output'],
        ['A', 'Y', null, 'B', 'Z'],
        [1, 1, null, 0, 0],
      ]),
    );
    expect(read.tables.map((t) => t.range)).toEqual(['A1:B3', 'D1:E3']);
  });

  it('a separator column joins blocks whose data rows differ in length, and the missing cells are errors', () => {
    const read = readSpecTables(grid([['A', 'B', null, 'Y'], [1, 1, null, 1], [0, 0, null, null]]));
    expect(read.tables).toHaveLength(1);
    expect(errors(read.tables[0]!.problems).map((p) => p.cell)).toEqual(['D3']);
  });
});

describe("the host's reading problems", () => {
  const cells = [ROLES, HEADERS, ...AND_ROWS];
  const hostProblem = (cell: string): Problem => ({
    severity: 'error',
    code: 'formula-cell',
    sheet: 'Capper',
    cell,
    message: 'test problem from the host',
  });

  it('a problem at a cell inside a table belongs to that table', () => {
    const read = readSpecTables({ ...grid(cells), readProblems: [hostProblem('B4')] });
    expect(read.tables[0]!.problems).toContainEqual(hostProblem('B4'));
    expect(read.problems).toEqual([]);
  });

  it('a problem outside every table stays beside the tables', () => {
    const read = readSpecTables({ ...grid(cells), readProblems: [hostProblem('H40')] });
    expect(read.tables[0]!.problems).not.toContainEqual(hostProblem('H40'));
    expect(read.problems).toContainEqual(hostProblem('H40'));
  });

  it('a problem over a range that overlaps a table belongs to it', () => {
    const read = readSpecTables({ ...grid(cells), readProblems: [hostProblem('A5:Z9')] });
    expect(read.tables[0]!.problems).toContainEqual(hostProblem('A5:Z9'));
  });
});
