// Helpers of the CLI tests: run the command line in-process and collect what it prints.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../src/cli/main.js';

export const SAMPLES = join(import.meta.dirname, '..', '..', 'sample-workbooks');
export const CAPPER = join(SAMPLES, 'capper-cell.xlsx');
export const BROKEN = join(SAMPLES, 'capper-cell-broken.xlsx');
export const CSV = join(SAMPLES, 'spindle-permit.csv');

export interface Run {
  readonly code: number;
  readonly out: string;
  readonly err: string;
}

export async function runCli(...argv: string[]): Promise<Run> {
  let out = '';
  let err = '';
  const code = await main(argv, { out: (t) => void (out += t), err: (t) => void (err += t) });
  return { code, out, err };
}

export function scratch(): string {
  return mkdtempSync(join(tmpdir(), 'cli-'));
}
