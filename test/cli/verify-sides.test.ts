// `verify` says which side each difference falls on: unsafe (the spec requires the safe value,
// the program gives the other) or a spurious trip (the other way), counted over every
// combination and described in a plain sentence; an output whose safe value is ON (a brake
// that must be applied) turns the sides round.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

// Run permit = guard closed AND run; the brake is released (0) only while running healthy.
const SPEC = `input;input;input;output;output
Guard_closed;Run;Healthy;Run_permit;Brake_applied
0;0;0;0;1
0;0;1;0;1
0;1;0;0;1
0;1;1;0;0
1;0;0;0;1
1;0;1;0;1
1;1;0;1;1
1;1;1;1;0
`;

// Run_permit: ON at 011 where the spec requires OFF (unsafe), OFF at 111 (spurious trip).
// Brake_applied: released whenever running, also at x10 where the spec requires it applied (unsafe).
const PROGRAM = `PROGRAM Cell
VAR_INPUT Guard_closed : BOOL; Run : BOOL; Healthy : BOOL; END_VAR
VAR_OUTPUT Run_permit : BOOL; Brake_applied : BOOL; END_VAR
Run_permit := Run AND (Guard_closed XOR Healthy);
Brake_applied := NOT Run;
END_PROGRAM
`;

async function verify(...options: string[]) {
  const dir = scratch();
  writeFileSync(join(dir, 'spec.csv'), SPEC);
  writeFileSync(join(dir, 'cell.st'), PROGRAM);
  return runCli('verify', join(dir, 'spec.csv'), '--impl', join(dir, 'cell.st'), '--safe', 'Brake_applied=1', ...options);
}

interface OutputJson {
  name: string;
  unsafeCount: number;
  spuriousTripCount: number;
  unsafeWhen?: { sentence: string; condition: string; proven: boolean };
  spuriousTripWhen?: { sentence: string };
  counterexamples: { combination: number; kind: string; expected: number; actual: number }[];
}

describe('verify: unsafe combinations and spurious trips', () => {
  it('the JSON counts both sides per output and labels each counterexample, unsafe first', async () => {
    const r = await verify('--json');
    expect(r.code).toBe(1);
    const outputs = (JSON.parse(r.out) as { outputs: OutputJson[] }).outputs;
    const permit = outputs[0];
    expect([permit!.unsafeCount, permit!.spuriousTripCount]).toEqual([1, 1]);
    expect(permit!.counterexamples.map((c) => [c.combination, c.kind])).toEqual([
      [0b011, 'unsafe'],
      [0b111, 'spurious-trip'],
    ]);
    expect(permit!.unsafeWhen).toEqual({
      condition: 'Guard_closed = 0 AND Run = 1 AND Healthy = 1',
      sentence: 'unsafe exactly when Guard_closed = 0 AND Run = 1 AND Healthy = 1',
      proven: true,
      coversUnjudged: false,
    });
    expect(permit!.spuriousTripWhen?.sentence).toBe('spurious trip exactly when Guard_closed = 1 AND Run = 1 AND Healthy = 1');
  });

  it('with safe value ON, the program OFF where the spec requires ON is unsafe', async () => {
    const brake = (JSON.parse((await verify('--json')).out) as { outputs: OutputJson[] }).outputs[1]!;
    expect(brake.name).toBe('Brake_applied');
    expect([brake.unsafeCount, brake.spuriousTripCount]).toEqual([2, 0]);
    expect(brake.counterexamples.every((c) => c.kind === 'unsafe' && c.expected === 1 && c.actual === 0)).toBe(true);
    expect(brake.unsafeWhen?.sentence).toBe('unsafe exactly when Run = 1 AND Healthy = 0');
    expect(brake.spuriousTripWhen).toBeUndefined();
  });

  it('the text gives the counts, the sentence of each side, unsafe rows marked !!, and the ANF terms as a detail below', async () => {
    const text = (await verify()).out;
    const permit = text.slice(text.indexOf('DIFFERS  Run_permit'), text.indexOf('DIFFERS  Brake_applied'));
    expect(permit).toContain('differs on 2 of 8 combinations (safe value 0): 1 unsafe combination, 1 spurious trip');
    const lines = permit.split('\n');
    const at = (start: string) => lines.findIndex((l) => l.trimStart().startsWith(start));
    expect(lines[at('!! unsafe exactly when')]).toBe('  !! unsafe exactly when Guard_closed = 0 AND Run = 1 AND Healthy = 1');
    expect(at('spurious trip exactly when')).toBeGreaterThan(at('!! unsafe exactly when'));
    expect(at('!! unsafe ')).toBeLessThan(at('spurious trip  '));
    expect(at('detail: spec and program differ by the XOR of these ANF monomials')).toBeGreaterThan(at('spurious trip  '));
    expect(text).toContain('Result: 0 equal, 2 differ, 0 unchecked, 0 not found of 2 outputs; 3 unsafe combinations, 1 spurious trip in all.');
  });
});
