// A 40-cause OR trip (a burner trip table) through the command line: the symbolic engine's
// forms in the readable report and in the JSON document, and the verdict counts them.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const N = 40;

function tripCsv(): string {
  const causes = Array.from({ length: N }, (_, i) => `Cause ${i + 1}`);
  const lines = [[...causes.map(() => 'input'), 'output'].join(','), [...causes, 'Trip'].join(',')];
  causes.forEach((_, i) => lines.push([...causes.map((_, j) => (j === i ? 1 : '-')), 1].join(',')));
  lines.push([...causes.map(() => 0), 0].join(','));
  return lines.join('\n') + '\n';
}

describe('a 40-input trip table through the command line', () => {
  const file = join(scratch(), 'trip-40.csv');
  writeFileSync(file, tripCsv());

  it('prints its forms and proofs in the report, the long XOR form named, not written as a statement', async () => {
    const run = await runCli('analyze', file);
    expect(run.code).toBe(0);
    expect(run.out).toMatch(/Output Trip \(Trip\), safe value 0 \(symbolic engine\)/);
    expect(run.out).toMatch(/AND\/OR form, proven minimum: 40 terms, 40 literals/);
    expect(run.out).toMatch(/\(1099511627775 terms: not printed \(more than 64\); its terms were proven\)/);
    expect(run.out).toMatch(/Proof over all 1099511627776 combinations: AND\/OR OK, XOR OK, best XOR OK/);
    expect(run.out).toMatch(/Every form derived \(3\) was proven/);
  });

  it('exports its Structured Text, the AND/OR form proven on all 2^40 combinations', async () => {
    const st = join(scratch(), 'trip.st');
    const run = await runCli('export', file, '--st', st);
    expect(run.code).toBe(0);
    expect(readFileSync(st, 'utf8')).toContain('Trip: AND/OR form (40 terms, 40 literals, proven minimum): equal to the spec on all 1099511627776 combinations');
  });

  it('writes the AND/OR form where the XOR form asked for is too long to print, and says why', async () => {
    const st = join(scratch(), 'trip-xor.st');
    expect((await runCli('export', file, '--form', 'xor', '--st', st)).code).toBe(0);
    const text = readFileSync(st, 'utf8');
    expect(text).toContain('Trip: AND/OR form (the XOR form has 1099511627775 terms, too many to print) (40 terms, 40 literals, proven minimum)');
    expect(text).toContain('Trip := Cause_1 OR Cause_2');
  });

  it('writes the JSON document with the symbolic engine named', async () => {
    const run = await runCli('analyze', file, '--json');
    expect(run.code).toBe(0);
    const [table] = JSON.parse(run.out).tables;
    expect(table.engine).toBe('symbolic');
    expect(table.outputs[0]).toMatchObject({ name: 'Trip', terms: 40, proven: true, xorTerms: 2 ** 40 - 1, bestXor: { terms: 2 }, dontCares: 'minimal' });
    expect(table.outputs[0].check).toEqual({ combinations: 2 ** 40, mismatchCount: 0, mismatches: [] });
    expect(table.outputs[0].verdict).toEqual({ kind: 'proven', text: 'proven minimum' });
    expect(table.verdict.kind).toBe('proven');
    expect(table.outputs[0].steps).toHaveLength(41);
    expect(table.outputs[0].steps[0]).toEqual({ combination: '1'.padEnd(40, '0'), expected: 1, reason: 'term 1 alone: Cause_1' });
    expect(table.problems.map((p: { code: string }) => p.code)).toContain('symbolic-engine');
  });
});
