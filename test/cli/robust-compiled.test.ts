// The installed command runs compiled JavaScript (build/cli, from scripts/build-cli.mjs) as a
// process of its own: no TypeScript loader, the SheetJS parse worker found beside the bundle.
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { CAPPER, scratch } from './run-cli.js';

const ROOT = join(import.meta.dirname, '..', '..');
const BIN = join(ROOT, 'bin', 'interlock-algebra.mjs');

function command(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  return spawnSync(process.execPath, [BIN, ...args], { cwd: ROOT, encoding: 'utf8' });
}

describe('the compiled command', () => {
  it('prints its usage (exit 0); the build it runs loads no TypeScript loader', () => {
    const run = command('--help');
    expect(run.status).toBe(0);
    expect(run.stdout).toMatch(/^Usage:/);
    const built = join(ROOT, 'build', 'cli');
    for (const file of readdirSync(built)) expect(readFileSync(join(built, file), 'utf8')).not.toMatch(/from ["']tsx|tsx\/esm/);
  });

  it('reads a workbook through the parse worker beside the bundle (exit 0, every table)', () => {
    const run = command('analyze', CAPPER, '--json');
    expect(run.status).toBe(0);
    expect((JSON.parse(run.stdout) as { tables: unknown[] }).tables).toHaveLength(4);
  });

  it('says what is wrong with a missing file in one line, exit 2, as a process too', () => {
    const run = command('analyze', join(scratch(), 'none.xlsx'));
    expect(run.status).toBe(2);
    expect(run.stderr.trim().split('\n')).toEqual([expect.stringContaining('no such file or folder (ENOENT)')]);
  });
});
