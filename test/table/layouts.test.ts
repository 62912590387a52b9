// Spec tables typed as engineers type them: what exactly is read from each layout.
import { describe, expect, it } from 'vitest';
import { members } from '../../src/logic/bits.js';
import { cubeToPattern } from '../../src/logic/cube.js';
import { readImplementation } from '../../src/impl/read.js';
import { verifyImplementation } from '../../src/impl/verify.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { analysisJson } from '../../src/report/analysis-json.js';
import { allProblems, readSpecTables, type SpecTablesRead } from '../../src/table/read-tables.js';
import type { CellValue, Grid, Problem, SpecOptions, SpecTable } from '../../src/table/types.js';
import { LAYOUT_WORKBOOKS, layoutGrid } from '../../scripts/make-samples.js';

const sampleSheet = (name: string) => LAYOUT_WORKBOOKS.flatMap((w) => w.sheets).find((s) => s.name === name)!;
const readSample = (name: string, options?: SpecOptions): SpecTablesRead => readSpecTables(layoutGrid(sampleSheet(name)), options);
const grid = (cells: CellValue[][], merges?: string[]): Grid => ({ sheet: 'Cell', origin: 'A1', cells, ...(merges ? { merges } : {}) });
const codes = (problems: readonly Problem[]): string[] => problems.map((p) => `${p.severity} ${p.code} ${p.cell}`);
const headers = (t: SpecTable): [string[], string[]] => [t.inputs.map((s) => s.header), t.outputs.map((o) => o.signal.header)];

describe('the press sample: merged role cells and a remarks column', () => {
  const read = readSample('Press P-1');
  const [t] = read.tables;

  it('reads one table whose signals are exactly the merged INPUTS and OUTPUTS columns', () => {
    expect(read.tables.map((x) => [x.range, x.roleRule, x.rows.length])).toEqual([['A3:H11', 'role-row', 7]]);
    expect(headers(t!)).toEqual([
      ['Two-hand control OK', 'Guard door closed', 'Light curtain clear', 'Light curtain muting', 'Light curtain muting active'],
      ['Stroke permit', 'Ready lamp'],
    ]);
  });

  it('takes the remarks as an annotation column, shown beside each row, never as an error', () => {
    expect(t!.annotations).toEqual([{ header: 'Remarks for the fitter', cell: 'H4', reason: 'free-text' }]);
    expect(t!.rows[0]!.note).toBe('guard door open: nothing moves');
    expect(allProblems(read).filter((p) => p.severity === 'error')).toEqual([]);
  });

  it('reads ON/OFF cells and says so; a long header keeps whole words and stays distinct', () => {
    expect(t!.readings).toEqual(['ON/OFF', '-']);
    expect(t!.inputs.slice(3).map((s) => s.identifier)).toEqual(['Light_curtain_muting', 'Light_curtain_active']);
    expect(codes(allProblems(read))).toEqual([
      'warning identifier-changed E4',
      'info values-read A3:H11',
      'info annotation H4',
    ]);
    expect(allProblems(read)[0]!.message).toMatch(/"Light curtain muting active" -> Light_curtain_active; .*add a tag row/);
  });

  it('gives the Stroke permit as two-hand and guard closed and (curtain clear or muted)', () => {
    const on = members(t!.outputs[0]!.built.fn.on);
    expect(on.map((k) => k.toString(2).padStart(5, '0')).every((p) => p.startsWith('11'))).toBe(true);
    expect(on).toHaveLength(5);
  });
});

describe('role cells cover exactly their columns', () => {
  it('a column right of a merged OUTPUTS cell holding notes is an annotation, outside the roles', () => {
    const t = readSpecTables(
      grid([['INPUTS', null, 'OUTPUTS', null], ['A', 'B', 'Y', 'Fitter'], [1, 1, 1, 'ok'], [0, '-', 0, null], [1, 0, 0, 'x2']], ['A1:B1', 'C1:C1']),
    ).tables[0]!;
    expect(headers(t)).toEqual([['A', 'B'], ['Y']]);
    expect(t.annotations).toEqual([{ header: 'Fitter', cell: 'D2', reason: 'outside-roles' }]);
  });

  it('a column of truth values that no role cell covers is an error saying how to mark it', () => {
    const read = readSpecTables(grid([['IN', null, 'OUT', null], ['A', 'B', 'Y', 'Z'], [1, 1, 1, 0], [0, 0, 0, 1]], ['A1:B1']));
    expect(codes(allProblems(read)).filter((c) => c.startsWith('error'))).toEqual(['error no-role D2']);
  });

  it('repeated role words (I I Q) give each column its own role, and a blank one is outside', () => {
    const t = readSpecTables(grid([['I', 'I', 'Q', null], ['A', 'B', 'Y', 'Remarks'], [1, 1, 1, 'first'], [0, '-', 0, null]])).tables[0]!;
    expect(headers(t)).toEqual([['A', 'B'], ['Y']]);
    expect(t.annotations?.map((a) => a.reason)).toEqual(['note-header']);
  });

  it('with no merges and a single word, blank role cells take the role on their left, but a Notes column stays notes', () => {
    const t = readSpecTables(grid([['input', null, 'output', null], ['A', 'B', 'Y', 'Notes'], [1, 1, 1, 'both'], [0, '-', 0, null]])).tables[0]!;
    expect(headers(t)).toEqual([['A', 'B'], ['Y']]);
    expect(t.annotations).toEqual([{ header: 'Notes', cell: 'D2', reason: 'note-header' }]);
  });

  it("a row's note is shown in a conflict message about it", () => {
    const read = readSpecTables(grid([['in', 'in', 'out', 'notes'], ['A', 'B', 'Y', 'Notes'], [1, '-', 1, 'run'], [1, 1, 0, 'jam stop']]));
    const conflict = allProblems(read).find((p) => p.code === 'conflict')!;
    expect(conflict.message).toMatch(/rows A3:D3 \("run"\) and A4:D4 \("jam stop"\) both cover/);
    const json = analysisJson(analyseTable(read.tables[0]!));
    expect(json.outputs[0]!.conflicts[0]!.notes).toEqual(['run', 'jam stop']);
    expect(json.annotations).toEqual([{ header: 'Notes', cell: 'D2', reason: 'note-header' }]);
  });

  it('annotation text of any kind never becomes an error', () => {
    const read = readSpecTables(grid([['in', 'out', null], ['A', 'Y', 'Comment'], [1, 1, { error: '#N/A' }], [0, 0, 7]]));
    expect(allProblems(read).filter((p) => p.severity === 'error')).toEqual([]);
    expect(read.tables[0]!.annotations?.map((a) => a.header)).toEqual(['Comment']);
  });
});

describe('the conveyor sample: titled tables side by side, I/Q rows, Y/N cells and tag rows', () => {
  const read = readSample('Conveyor CV-3');

  it('reads two tables, each under its own title, not one joined table', () => {
    expect(read.tables.map((t) => [t.range, t.roleRule, t.rows.length, t.tagRow])).toEqual([
      ['A2:E8', 'role-row', 4, 'A4:E4'],
      ['G2:K8', 'role-row', 4, 'G4:K4'],
    ]);
    expect(read.tables.map(headers)).toEqual([
      [['E-stop healthy', 'Pull-cord OK', 'Downstream ready'], ['Belt run']],
      [['Gate home', 'Parcel at diverter', 'Reject requested'], ['Divert solenoid']],
    ]);
    expect(read.tables.every((t) => !t.inputs.some((s) => /^Column /.test(s.header)))).toBe(true);
  });

  it('takes each identifier from the tag row, the header being its description', () => {
    expect(read.tables[1]!.inputs.map((s) => s.identifier)).toEqual(['GS_301', 'PE_302', 'RQ_303']);
    expect(read.tables[1]!.outputs[0]!.signal).toEqual({ header: 'Divert solenoid', identifier: 'Y_DIV' });
  });

  it('reads Y/N cells, and the label column holding the word Tag is an annotation', () => {
    expect(read.tables.map((t) => t.readings)).toEqual([['Y/N', '-'], ['Y/N', '-']]);
    expect(read.tables[0]!.annotations).toEqual([{ header: '', cell: 'A3', reason: 'outside-roles' }]);
    expect(codes(allProblems(read))).toEqual(['info values-read A2:E8', 'info annotation A3', 'info values-read G2:K8', 'info annotation G3']);
  });

  it('verifies a program that uses the tags, with no mapping file', () => {
    const st = 'PROGRAM Diverter\nVAR_INPUT GS_301, PE_302, RQ_303 : BOOL; END_VAR\nVAR_OUTPUT Y_DIV : BOOL; END_VAR\nY_DIV := GS_301 AND PE_302 AND RQ_303;\nEND_PROGRAM\n';
    const program = readImplementation('diverter.st', st);
    expect(program.ok).toBe(true);
    if (!program.ok) return;
    const report = verifyImplementation([read.tables[1]!], program.value);
    expect(report.outputs.map((o) => [o.output.identifier, o.status])).toEqual([['Y_DIV', 'equal']]);
  });

  it('a tag used twice is an error at the second tag', () => {
    const read2 = readSpecTables(grid([[null, 'I', 'I', 'Q'], [null, 'A', 'B', 'Y'], ['tag', 'K1', 'k1', 'Q1'], [null, 1, 1, 1], [null, 0, '-', 0], [null, 1, 0, 0]]));
    expect(codes(allProblems(read2)).filter((c) => c.startsWith('error'))).toEqual(['error duplicate-tag C3']);
  });
});

describe('the burner sample: group titles, X cells, a blank row inside the range', () => {
  const sheet = sampleSheet('Burner purge');

  it('given its range and the X setting, is one table of 12 rows under the group titles; the blank row is skipped', () => {
    const read = readSample('Burner purge', { range: sheet.range!, xReading: 'dont-care' });
    expect(read.tables.map((t) => [t.range, t.rows.length, t.readings])).toEqual([['A3:G18', 12, ['1/0', 'X']]]);
    const [t] = read.tables;
    expect(headers(t!)[0]).toEqual(['Combustion fan running', 'Air flow proven', 'Damper at high fire', 'Fuel valves closed', 'Flame detected']);
    expect(codes(allProblems(read))).toEqual(['info blank-rows-skipped A15:G15', 'info x-read A3:G18']);
    expect(allProblems(read)[0]!.cells).toEqual(['A15:G15']);
    expect(t!.outputs[0]!.built.gaps.every((w) => w === 0)).toBe(true);
  });

  it('without the range, the rows below the blank row are an error that says to delete it', () => {
    const read = readSample('Burner purge', { xReading: 'dont-care' });
    expect(codes(read.problems)).toEqual(['error no-header-row A16:G16']);
    expect(read.problems[0]!.message).toMatch(/delete the empty row/);
  });

  it('without the X setting, the X cells are one error with their range and count, naming the option of the host', () => {
    const cli = readSample('Burner purge', { range: sheet.range!, host: 'cli' });
    const xs = allProblems(cli).filter((p) => p.code === 'bad-cell');
    expect(xs).toHaveLength(1);
    expect(xs[0]).toMatchObject({ severity: 'error', cell: 'B6:E18', setting: 'x-means-dont-care' });
    expect(xs[0]!.cells).toHaveLength(13);
    expect(xs[0]!.message).toMatch(/^13 cells in B6:E18 hold X: .* or give --x-means-dont-care$/);
    const pane = readSample('Burner purge', { range: sheet.range!, host: 'pane' });
    expect(allProblems(pane).find((p) => p.code === 'bad-cell')!.message).toMatch(/or tick 'X means don't-care'$/);
  });
});

describe('values', () => {
  it('reads 1/0, TRUE/FALSE, ON/OFF, Y/N, YES/NO in any case, trimmed, and lists the readings', () => {
    const t = readSpecTables(
      grid([['in', 'in', 'out'], ['A', 'B', 'Y'], [' on ', 'Yes', 'TRUE'], ['OFF', 'no', 'n'], ['y', 'N', 0], [true, '-', ' 1']]),
    ).tables[0]!;
    expect(t.rows.map((r) => cubeToPattern(2, r.cube))).toEqual(['11', '00', '10', '1-']);
    expect(t.rows.map((r) => r.values[0])).toEqual([1, 0, 0, 1]);
    expect(t.readings).toEqual(['1/0', 'TRUE/FALSE', 'ON/OFF', 'Y/N', 'YES/NO', '-']);
  });

  it('several bad cells of one kind are one problem listing every cell', () => {
    const read = readSpecTables(grid([['in', 'in', 'out'], ['A', 'B', 'Y'], [null, 1, 1], [0, null, 0], [1, 0, 'maybe']]));
    expect(codes(allProblems(read)).filter((c) => c.startsWith('error'))).toEqual(['error bad-cell A3:B4', 'error bad-cell C5']);
    expect(allProblems(read)[0]!.cells).toEqual(['A3', 'B4']);
    expect(allProblems(read)[0]!.message).toMatch(/^2 cells in A3:B4 are blank: write 1, 0 or -$/);
  });
});

describe('layouts the reader cannot decide', () => {
  it('no role row, no separator and no count of inputs is one error naming the option that decides', () => {
    const read = readSpecTables(grid([['A', 'B', 'Y'], [1, 1, 1], [0, 0, 0]]), { host: 'cli' });
    expect(codes(read.problems)).toEqual(['error roles-unknown A1:C1']);
    expect(read.problems[0]).toMatchObject({ setting: 'inputs', message: expect.stringMatching(/give --inputs N$/) });
  });

  it('a two-line header with group titles but no role row is read once the count of inputs is given', () => {
    const t = readSpecTables(grid([['Guards', null, 'Drive'], ['A', 'B', 'Y'], [1, 1, 1], [0, '-', 0], [1, 0, 0]], ['A1:B1']), { inputCount: 2 }).tables[0]!;
    expect([t.range, ...headers(t)]).toEqual(['A1:C5', ['A', 'B'], ['Y']]);
    expect(t.rows).toHaveLength(3);
  });
});
