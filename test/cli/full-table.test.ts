// A spec written out in full: every one of the 65,536 combinations of 16 inputs as its own
// row, as engineers sometimes paste from a generator. Its time is printed by
// `npm run bench -- cli`; here only what comes out.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const N = 16;

function fullTableCsv(): string {
  const inputs = Array.from({ length: N }, (_, i) => `Input ${i + 1}`);
  const lines = [[...inputs.map(() => 'input'), 'output', 'output'].join(';'), [...inputs, 'Permit', 'Parity alarm'].join(';')];
  for (let k = 0; k < 1 << N; k++) {
    const x = (i: number): number => (k >> (N - 1 - i)) & 1;
    const permit = x(0) & x(1) & (x(2) | x(3)) & (1 - x(4)) & x(5);
    const parity = x(6) ^ x(7) ^ x(8);
    lines.push([...Array.from({ length: N }, (_, i) => x(i)), permit, parity].join(';'));
  }
  return lines.join('\r\n') + '\r\n';
}

describe('a 16-input table of 65,536 rows through the command line', () => {
  it('gives the permit and the parity alarm their minimal forms, proven on every combination', async () => {
    const file = join(scratch(), 'full-16.csv');
    writeFileSync(file, fullTableCsv());
    const run = await runCli('analyze', file, '--json');
    expect(run.code).toBe(0);
    const [table] = JSON.parse(run.out).tables;
    const [permit, parity] = table.outputs;
    expect(permit.andOr).toBe(
      '(Input_1 AND Input_2 AND Input_3 AND NOT Input_5 AND Input_6) OR (Input_1 AND Input_2 AND Input_4 AND NOT Input_5 AND Input_6)',
    );
    expect([permit.terms, permit.literals, permit.proven]).toEqual([2, 10, true]);
    expect(parity.xor).toBe('Input_7 XOR Input_8 XOR Input_9');
    expect([parity.terms, parity.literals, parity.xorTerms]).toEqual([4, 12, 3]);
    for (const o of [permit, parity]) expect(o.check).toMatchObject({ combinations: 65536, mismatches: [] });
    expect(permit.unusedInputs).toEqual(Array.from({ length: 10 }, (_, i) => `Input ${i + 7}`));
  });
});
