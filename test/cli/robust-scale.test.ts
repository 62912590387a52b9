// Inputs of a size no hand-made test reaches, through the command in-process: the report
// and the JSON come out whole, no call overflows the stack on an input-sized list.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const BAD_ROWS = 150_000;

/** A two-input table of 150,000 rows, each with a bad input cell: 150,000 problems. */
function manyProblems(): string {
  const file = join(scratch(), 'many-problems.csv');
  const rows = ['input;input;output', 'Guard A;Guard B;Permit'];
  for (let i = 0; i < BAD_ROWS; i++) rows.push('2;1;1');
  writeFileSync(file, rows.join('\n') + '\n');
  return file;
}

describe('a table with 150,000 problems', () => {
  const file = manyProblems();

  it('the readable report summarises the bad cells in one problem over their range and ends with the caution (exit 1)', async () => {
    const run = await runCli('analyze', file);
    expect(run.code).toBe(1);
    expect(run.out).toContain(`${BAD_ROWS} cells in A3:A${BAD_ROWS + 2}`);
    expect(run.out).toContain('CAUTION');
  });

  it('the JSON document lists every bad cell', async () => {
    const run = await runCli('analyze', file, '--json');
    const doc = JSON.parse(run.out) as { tables: { problems: { code: string; cells?: string[] }[] }[] };
    const bad = doc.tables[0]!.problems.filter((p) => p.code === 'bad-cell');
    expect(bad).toHaveLength(1);
    expect(bad[0]!.cells).toHaveLength(BAD_ROWS);
    expect(bad[0]!.cells![BAD_ROWS - 1]).toBe(`A${BAD_ROWS + 2}`);
  });
});

describe('a program with a flat AND of 200,000 operands', () => {
  it('verify reads it and reports the difference (exit 1)', async () => {
    const dir = scratch();
    const spec = join(dir, 'spec.csv');
    writeFileSync(spec, 'input;input;output\nA;B;Permit\n1;1;1\n1;0;0\n0;1;0\n0;0;0\n');
    const st = join(dir, 'flat.st');
    const operands = Array.from({ length: 200_000 }, (_, i) => (i % 2 === 0 ? 'A' : 'B')).join(' AND ');
    writeFileSync(st, `PROGRAM P\nVAR_INPUT A, B : BOOL; END_VAR\nVAR_OUTPUT Permit : BOOL; END_VAR\nPermit := ${operands} AND NOT A;\nEND_PROGRAM\n`);
    const run = await runCli('verify', spec, '--impl', st);
    expect(run.code).toBe(1);
    expect(run.out).toContain('1 differ');
  });
});
