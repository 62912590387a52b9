// A 64-input table whose rows have no decision diagram of workable size in column order
// (a1·b1 + ... + a32·b32, all a's left of all b's) through the command line: analysed on its
// rows' cubes, every report says which forms were derived and proven, and that no XOR form was.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const PAIRS = 32;

function pairsCsv(): string {
  const names = [...Array.from({ length: PAIRS }, (_, i) => `A${i + 1}`), ...Array.from({ length: PAIRS }, (_, i) => `B${i + 1}`)];
  const lines = [[...names.map(() => 'input'), 'output'].join(','), [...names, 'Run'].join(',')];
  for (let i = 0; i < PAIRS; i++) lines.push([...names.map((_, j) => (j === i || j === PAIRS + i ? 1 : '-')), 1].join(','));
  return lines.join('\n') + '\n';
}

describe('a 64-input table analysed on its rows', () => {
  const file = join(scratch(), 'pairs-64.csv');
  writeFileSync(file, pairsCsv());

  it('reports the AND/OR form proven equal on all 2^64 combinations, its lower bound, and no XOR form', async () => {
    const run = await runCli('analyze', file);
    expect(run.code).toBe(0);
    expect(run.out).toMatch(/Output Run \(Run\), safe value 0 \(row-cube engine/);
    expect(run.out).toMatch(/AND\/OR form, heuristic \(not proven minimal; every form has at least 32 terms\): 32 terms, 64 literals/);
    expect(run.out).toMatch(/XOR forms: not derived/);
    expect(run.out).toMatch(/Proof over all 18446744073709551616 combinations: AND\/OR OK\n/);
    expect(run.out).toMatch(/Every form derived \(1\) was proven against its spec table, every input combination checked; no XOR forms for 1 output analysed on its rows' cubes/);
  });

  it('writes null XOR fields and the engine in the JSON document', async () => {
    const run = await runCli('analyze', file, '--json');
    const table = JSON.parse(run.out).tables[0];
    expect(table.engine).toBe('row-cubes');
    expect(table.outputs[0]).toMatchObject({ xor: null, xorTerms: null, bestXor: null, degree: null, termsAtLeast: 32, terms: 32 });
  });

  it('exports the AND/OR form when the XOR form is asked for, and says it was not derived', async () => {
    const st = join(scratch(), 'pairs-xor.st');
    const run = await runCli('export', file, '--st', st, '--form', 'xor');
    expect(run.code).toBe(0);
    expect(readFileSync(st, 'utf8')).toContain("Run: AND/OR form (the XOR form was not derived: the table was analysed on its rows' cubes)");
  });

  it('leaves a program unchecked against it, with the reason', async () => {
    const program = join(scratch(), 'pairs.st');
    const terms = Array.from({ length: PAIRS }, (_, i) => `(A${i + 1} AND B${i + 1})`).join(' OR ');
    const vars = Array.from({ length: PAIRS }, (_, i) => `A${i + 1}, B${i + 1}`).join(', ');
    writeFileSync(program, `PROGRAM P\nVAR_INPUT ${vars} : BOOL; END_VAR\nVAR_OUTPUT Run : BOOL; END_VAR\nRun := ${terms};\nEND_PROGRAM\n`);
    const run = await runCli('verify', file, '--impl', program);
    expect(run.code).toBe(1);
    expect(run.out).toMatch(/UNCHECKED +Run/);
    expect(run.out).toMatch(/too large to compare symbolically over 64 inputs/);
  });
});
