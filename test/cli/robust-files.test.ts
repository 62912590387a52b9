// A file that cannot be read or written is the user's situation, not a crash: exit status 2,
// one line with the path and the reason in words (Node's code in brackets), no stack trace.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fileSystemErrorText } from '../../src/hosts/fs-errors.js';
import { CSV, runCli, scratch, type Run } from './run-cli.js';

/** A scratch folder holding a plain file `blocker`, which no path can go through. */
function withBlocker(): { dir: string; blocker: string } {
  const dir = scratch();
  const blocker = join(dir, 'blocker');
  writeFileSync(blocker, 'not a folder');
  return { dir, blocker };
}

function expectOneLine(run: Run, ...parts: string[]): void {
  expect(run.code).toBe(2);
  for (const part of parts) expect(run.err).toContain(part);
  expect(run.err).not.toMatch(/\n\s+at /);
  expect(run.err.trim().split('\n')).toHaveLength(1);
}

describe('an input that cannot be read', () => {
  it('a missing workbook: exit 2, the path and "no such file or folder (ENOENT)"', async () => {
    const missing = join(scratch(), 'none.csv');
    expectOneLine(await runCli('analyze', missing), missing, 'no such file or folder (ENOENT)');
  });

  it('a folder given as the workbook: exit 2 and "it is a folder, not a file (EISDIR)"', async () => {
    const folder = join(scratch(), 'table.csv');
    mkdirSync(folder);
    for (const command of ['analyze', 'export'])
      expectOneLine(await runCli(command, folder, ...(command === 'export' ? ['--st', join(scratch(), 'x.st')] : [])), folder, '(EISDIR)');
  });

  it('a workbook path through a file: exit 2 and "a part of the path is a file, not a folder (ENOTDIR)"', async () => {
    const { blocker } = withBlocker();
    expectOneLine(await runCli('analyze', join(blocker, 'table.csv')), 'a part of the path is a file, not a folder (ENOTDIR)');
  });

  for (const option of ['--impl', '--map']) {
    it(`a ${option} file that is a folder or lies under a file: exit 2, with the path`, async () => {
      const { dir, blocker } = withBlocker();
      const st = join(dir, 'ok.st');
      writeFileSync(st, 'PROGRAM P\nEND_PROGRAM\n');
      const base = option === '--map' ? ['--impl', st] : [];
      expectOneLine(await runCli('verify', CSV, ...base, option, dir), dir, 'is a folder (EISDIR)');
      const under = join(blocker, 'x.csv');
      expectOneLine(await runCli('verify', CSV, ...base, option, under), under, '(ENOTDIR)');
    });
  }
});

describe('an output that cannot be written', () => {
  it('-o whose folder is a file: exit 2, the path and what stands in the way', async () => {
    const { blocker } = withBlocker();
    expectOneLine(await runCli('analyze', CSV, '-o', join(blocker, 'results.xlsx')), blocker, 'a file of that name is in the way (EEXIST)');
    expectOneLine(await runCli('analyze', CSV, '-o', join(blocker, 'deeper', 'results.xlsx')), '(ENOTDIR)');
  });

  for (const option of ['--st', '--plcopen', '--steps']) {
    it(`export ${option} under a file: exit 2 with the path and the reason`, async () => {
      const { blocker } = withBlocker();
      expectOneLine(await runCli('export', CSV, option, join(blocker, 'pack.out')), blocker, '(EEXIST)');
    });
  }

  it('export --svg naming a file as the folder: exit 2 with the path and the reason', async () => {
    const { blocker } = withBlocker();
    expectOneLine(await runCli('export', CSV, '--svg', blocker), blocker, '(EEXIST)');
  });

  it('an output that is a folder: exit 2, "could not be written" with the reason', async () => {
    const dir = scratch();
    const target = join(dir, 'pack.st');
    mkdirSync(target);
    expectOneLine(await runCli('export', CSV, '--st', target), target, 'could not be written', '(EISDIR)');
  });
});

describe('file-system errors in words', () => {
  it('names what was being done, the path and the reason, with the code', () => {
    const denied = Object.assign(new Error('EACCES: permission denied'), { code: 'EACCES', syscall: 'open', path: '/plant/spec.xlsx' });
    expect(fileSystemErrorText(denied)).toBe('cannot open /plant/spec.xlsx: permission denied (EACCES)');
    const full = Object.assign(new Error('ENOSPC'), { code: 'ENOSPC', syscall: 'write' });
    expect(fileSystemErrorText(full, 'out/x.xlsx')).toBe('cannot write out/x.xlsx: no space left on the device (ENOSPC)');
  });
});
