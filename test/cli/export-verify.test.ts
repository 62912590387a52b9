// `export` writes the hand-over pack only from a clean, proven spec and never over its input;
// `verify` checks a program against the spec (here the pack's own Structured Text).
import { existsSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { BROKEN, CSV, runCli, scratch, type Run } from './run-cli.js';

describe('export', () => {
  let dir: string;
  let run: Run;
  beforeAll(async () => {
    dir = scratch();
    run = await runCli(
      'export', CSV,
      '--st', join(dir, 'spindle.st'),
      '--plcopen', join(dir, 'spindle.xml'),
      '--svg', join(dir, 'ladder'),
      '--steps', join(dir, 'steps.csv'),
    );
  });

  it('writes every file asked for and names each', () => {
    expect(run.code).toBe(0);
    for (const f of ['spindle.st', 'spindle.xml', 'steps.csv']) expect(run.out).toContain(join(dir, f));
    expect(readdirSync(join(dir, 'ladder'))).toEqual(['spindle-permit-Spindle_run_permit.svg']);
  });

  it('puts the caution and the proven AND/OR form in the Structured Text', () => {
    const st = readFileSync(join(dir, 'spindle.st'), 'utf8');
    expect(st).toContain('CAUTION');
    expect(st).toContain('Spindle_run_permit := (Guard_door_A_closed AND Guard_door_B_closed');
  });

  it('writes PLCopen XML and test steps that carry the caution', () => {
    expect(readFileSync(join(dir, 'spindle.xml'), 'utf8')).toContain('http://www.plcopen.org/xml/tc6_0201');
    expect(readFileSync(join(dir, 'steps.csv'), 'utf8')).toMatch(/^"?CAUTION/);
  });

  it('writes nothing from a spec with errors, and exits 1', async () => {
    const out = join(scratch(), 'broken.st');
    const r = await runCli('export', BROKEN, '--st', out);
    expect(r.code).toBe(1);
    expect(r.err).toContain('Nothing was exported');
    expect(existsSync(out)).toBe(false);
  });

  it('refuses the input as an output file before writing anything', async () => {
    const d = scratch();
    const input = join(d, 'table.csv');
    writeFileSync(input, readFileSync(CSV));
    const r = await runCli('export', input, '--st', join(d, 'first.st'), '--steps', input);
    expect(r.code).toBe(2);
    expect(r.err).toContain('is the input file');
    expect(readFileSync(input).equals(readFileSync(CSV))).toBe(true);
    expect(existsSync(join(d, 'first.st'))).toBe(false);
  });

  it('needs at least one thing to export', async () => {
    const r = await runCli('export', CSV);
    expect(r.code).toBe(2);
    expect(r.err).toContain('export needs at least one of --st, --plcopen, --svg, --steps');
  });
});

describe('verify', () => {
  let st: string;
  beforeAll(async () => {
    st = join(scratch(), 'spindle.st');
    await runCli('export', CSV, '--st', st);
  });

  it('finds the exported Structured Text equal to the spec: exit 0', async () => {
    const r = await runCli('verify', CSV, '--impl', st);
    expect(r.code).toBe(0);
    expect(r.out).toContain('CAUTION');
  });

  it('finds a program with one operator changed different, with counterexamples: exit 1', async () => {
    const wrong = join(scratch(), 'wrong.st');
    writeFileSync(wrong, readFileSync(st, 'utf8').replace('AND NOT Mode_setup', 'AND Mode_setup'));
    const r = await runCli('verify', CSV, '--impl', wrong, '--json');
    expect(r.code).toBe(1);
    const doc = JSON.parse(r.out) as { allEqual: boolean; outputs: { status: string; mismatchCount: number }[] };
    expect(doc.allEqual).toBe(false);
    expect(doc.outputs[0]!.status).toBe('differs');
    expect(doc.outputs[0]!.mismatchCount).toBeGreaterThan(0);
  });

  it('needs --impl, and an implementation file that exists', async () => {
    expect((await runCli('verify', CSV)).code).toBe(2);
    const r = await runCli('verify', CSV, '--impl', join(scratch(), 'none.st'));
    expect(r.code).toBe(2);
    expect(r.err).toContain('the implementation file cannot be read: no such file or folder (ENOENT)');
  });
});
