// `interlock-algebra compare OLD NEW` run in-process on revisions of the sample workbook.
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { openFile, type FileHost } from '../../src/hosts/file-host.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import { CAPPER, CSV, runCli, scratch } from '../cli/run-cli.js';
import { SPINDLE, writeRevision, writeRows } from './sample-revision.js';

const dir = scratch();

describe('compare on the command line', () => {
  it('the same workbook twice: behaviour identical, exit 0, every old step still valid', async () => {
    const run = await runCli('compare', CAPPER, CAPPER);
    expect(run.code).toBe(0);
    expect(run.out.startsWith(CAUTION_LINES[0]!)).toBe(true);
    expect(run.out).toContain('Behaviour identical on every combination of every output (cells may differ).');
    expect(run.out).toContain('repeat: none');
  });

  it('rows reordered and a "-" row split into two: cells differ, behaviour does not, exit 0', async () => {
    const file = writeRows(join(dir, 'reordered.xlsx'), SPINDLE, (rows) => [
      ...rows.slice(1).reverse(),
      '- - - 0 - - 0 | 0',
      '- - - 0 - - 1 | 0',
    ]);
    const run = await runCli('compare', CAPPER, file, '--json');
    expect(run.code).toBe(0);
    const spindle = JSON.parse(run.out).tables[0];
    expect(spindle.changed).toBe(false);
    expect(spindle.rows.map((r: { kind: string }) => r.kind).sort()).toEqual(['added', 'added', 'removed']);
  });

  it('one cell flipped: exit 1, the combinations that now permit, as patterns over the inputs', async () => {
    // "setup, jog released" now permits the spindle.
    const file = writeRevision(join(dir, 'flipped.xlsx'), SPINDLE, 8, '- - - 1 1 1 0 | 1');
    const run = await runCli('compare', CAPPER, file, '--json');
    expect(run.code).toBe(1);
    const out = JSON.parse(run.out).tables[0].outputs[0];
    expect(out).toMatchObject({ name: 'Spindle run permit', nowPermits: { count: 8, cubes: ['---1110'] }, nowTrips: { count: 0, cubes: [] } });
    // The changed combination is tested again: an old step repeated or a new step.
    expect([...out.retest.repeat, ...out.retest.newSteps]).toContain('T-0001110');
    expect(out.retest.repeat.length).toBeGreaterThan(0);
  });

  it('with -o, the change record and the new record with its Retest column go beside the new workbook', async () => {
    const file = writeRevision(join(dir, 'flipped-o.xlsx'), SPINDLE, 8, '- - - 1 1 1 0 | 1');
    const out = join(dir, 'change.xlsx');
    const run = await runCli('compare', CAPPER, file, '-o', out);
    expect(run.code).toBe(1);
    expect(run.out).toContain(`Change record written: ${out}`);
    const host = (await openFile(out)) as { ok: true; value: FileHost };
    const sheets = await host.value.listSheets();
    expect(sheets).toEqual(expect.arrayContaining(['Spindle change', 'Spindle retest']));
    const cells = (await host.value.readGrid('Spindle change')).cells.map((r) => r.map((v) => (v === null ? '' : String(v))));
    const labels = cells.map((r) => r[0]);
    expect(labels).toEqual(expect.arrayContaining(['Old revision', 'New revision', 'Originator', 'Reason for the change', 'Reviewer', 'Approver', 'Date']));
    expect(cells.find((r) => r[0] === 'Old revision')![2]).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(cells.find((r) => r[0] === 'Originator')![1] ?? '').toBe('');
    expect(cells.flat().some((v) => v.startsWith('CAUTION'))).toBe(true);
  });

  it('tables that cannot be paired: one problem per sheet saying what to give, exit 1', async () => {
    const run = await runCli('compare', CAPPER, CSV);
    expect(run.code).toBe(1);
    expect(run.err).toMatch(/--old-sheet\/--old-range and --new-sheet\/--new-range/);
  });

  it('--old-sheet and --old-range pick the table to pair with the only one of the other file', async () => {
    const run = await runCli('compare', CAPPER, CSV, '--old-sheet', 'Spindle', '--old-range', 'A3:H13');
    expect(run.code).toBe(0);
  });

  it('usage errors exit 2: one file, a rename without =, or -o naming an input', async () => {
    expect((await runCli('compare', CAPPER)).code).toBe(2);
    expect((await runCli('compare', CAPPER, CSV, '--rename', 'Jog')).err).toContain('--rename needs OLD=NEW');
    const same = await runCli('compare', CAPPER, CSV, '-o', CSV);
    expect(same.code).toBe(2);
    expect(same.err).toContain('is an input file');
  });
});
