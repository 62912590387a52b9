import { describe, expect, it } from 'vitest';
import { cubeToPattern } from '../../src/logic/cube.js';
import { compareTables, comparisonJson, comparisonText } from '../../src/compare/index.js';
import { ISSUED, revised, tinyTable } from './fixtures.js';

const compare = (rows: readonly string[], changes = {}) => compareTables(tinyTable(ISSUED), tinyTable(revised(rows, changes)));

describe('comparing two revisions of a spec table', () => {
  it('rows reordered and a "-" row split into two: no behaviour change, the rows listed as context', () => {
    const c = compare(['1 0 - | 0', '0 1 - | 0', '1 1 - | 1', '0 0 - | 0']);
    expect(c.changed).toBe(false);
    const o = c.outputs[0]!;
    expect(o.status).toBe('compared');
    for (const kind of ['nowPermits', 'nowTrips', 'dontCareChanged', 'gapsOpened', 'gapsClosed'] as const) expect(o.change![kind].count).toBe(0);
    expect(c.rows.map((r) => [r.kind, r.pattern])).toEqual([
      ['removed', '0--'],
      ['added', '01-'],
      ['added', '00-'],
    ]);
    expect(o.before!.text).toBe(o.after!.text);
  });

  it('one output cell flipped from the safe value to 1: exactly those combinations now permit', () => {
    const c = compare(['1 1 - | 1', '0 - - | 0', '1 0 - | 1']);
    const o = c.outputs[0]!;
    expect(c.changed).toBe(true);
    expect(o.change!.nowPermits.count).toBe(2);
    expect(o.change!.nowPermits.cubes.map((x) => cubeToPattern(3, x))).toEqual(['10-']);
    expect(o.change!.nowTrips.count).toBe(0);
    expect(c.rows).toEqual([{ kind: 'changed', pattern: '10-', oldCells: 'A5:D5', newCells: 'A5:D5', oldValues: '0', newValues: '1' }]);
    expect(o.before!.text).toBe('Guard_closed AND Two_hand_OK');
    expect(o.after!.text).toBe('Guard_closed');
  });

  it('one output cell flipped to the safe value: those combinations now trip, and the text lists now-permits first', () => {
    const c = compare(['1 1 0 | 1', '1 1 1 | 0', '0 - - | 0', '1 0 - | 1']);
    const o = c.outputs[0]!;
    expect(o.change!.nowTrips.cubes.map((x) => cubeToPattern(3, x))).toEqual(['111']);
    expect(o.change!.nowPermits.cubes.map((x) => cubeToPattern(3, x))).toEqual(['10-']);
    const text = comparisonText(c);
    expect(text.indexOf('NOW PERMITS')).toBeLessThan(text.indexOf('Now trips'));
    expect(text).toContain('!! NOW PERMITS (safe value 0 -> 1): 2 combinations');
    expect(text).toMatch(/Guard closed \| Two-hand OK \| Setup mode\n\s+1\s+\| 0\s+\| -/);
  });

  it('a row taken away opens a gap; a gap at the safe value changes no behaviour', () => {
    const c = compare(['1 1 - | 1', '0 - - | 0']);
    const o = c.outputs[0]!;
    expect(o.change!.gapsOpened.cubes.map((x) => cubeToPattern(3, x))).toEqual(['10-']);
    expect(c.changed).toBe(false);
  });

  it("a row asking for '-' makes a don't-care change", () => {
    const c = compare(['1 1 - | 1', '0 - - | 0', '1 0 - | -']);
    expect(c.outputs[0]!.change!.dontCareChanged.count).toBe(2);
    expect(c.changed).toBe(true);
  });

  it('an input added: the change is stated over the joint inputs, and the old table did not depend on it', () => {
    const c = compareTables(
      tinyTable(ISSUED),
      tinyTable(revised(['1 1 - 1 | 1', '1 1 - 0 | 0', '0 - - - | 0', '1 0 - - | 0'], { inputs: [...ISSUED.inputs, 'Light curtain clear'] })),
    );
    expect(c.inputMatch.added.map((a) => a.signal.header)).toEqual(['Light curtain clear']);
    expect(c.inputs.map((s) => s.header)).toEqual([...ISSUED.inputs, 'Light curtain clear']);
    expect(c.outputs[0]!.change!.nowTrips.cubes.map((x) => cubeToPattern(4, x))).toEqual(['11-0']);
    expect(c.outputs[0]!.change!.nowPermits.count).toBe(0);
  });

  it('an input renamed (same identifier, new header) and moved: matched, reported as renamed, no behaviour change', () => {
    const c = compareTables(
      tinyTable(ISSUED),
      tinyTable({ ...ISSUED, inputs: ['Setup mode', 'Guard-closed', 'Two-hand OK'], rows: ['- 1 1 | 1', '- 0 - | 0', '- 1 0 | 0'] }),
    );
    expect(c.inputMatch.pairs.filter((p) => p.renamed).map((p) => [p.old.header, p.new.header])).toEqual([['Guard closed', 'Guard-closed']]);
    expect(c.changed).toBe(false);
    expect(c.rows).toEqual([]);
    expect(comparisonJson(c).signals.renamed).toEqual([{ role: 'input', identifier: 'Guard_closed', old: 'Guard closed', new: 'Guard-closed' }]);
  });

  it('an input removed that the old table did not depend on is compared as any', () => {
    const c = compareTables(tinyTable(ISSUED), tinyTable({ ...ISSUED, inputs: ['Guard closed', 'Two-hand OK'], rows: ['1 1 | 1', '0 - | 0', '1 0 | 0'] }));
    expect(c.inputMatch.removed.map((r) => r.signal.header)).toEqual(['Setup mode']);
    expect(c.problems).toEqual([]);
    expect(c.changed).toBe(false);
  });

  it('an input removed that the old table used with both values: one problem saying what to give, the output not compared', () => {
    const old = tinyTable({ ...ISSUED, rows: ['1 1 0 | 1', '1 1 1 | 0', '0 - - | 0', '1 0 - | 0'] });
    const c = compareTables(old, tinyTable({ ...ISSUED, inputs: ['Guard closed', 'Two-hand OK'], rows: ['1 1 | 1', '0 - | 0', '1 0 | 0'] }));
    expect(c.problems.map((p) => [p.code, p.cell])).toEqual([['removed-input-used', 'C2']]);
    expect(c.problems[0]!.message).toMatch(/Setup mode.*--old-range/);
    expect(c.outputs[0]!.status).toBe('not-compared');
    expect(c.changed).toBe(true);
  });

  it('the used input under another name in the new table: with a rename given, compared, no problem', () => {
    const old = tinyTable({ ...ISSUED, rows: ['1 1 0 | 1', '1 1 1 | 0', '0 - - | 0', '1 0 - | 0'] });
    const next = tinyTable({ ...ISSUED, inputs: ['Guard closed', 'Two-hand OK', 'Adjust mode'], rows: ['1 1 0 | 1', '1 1 1 | 0', '0 - - | 0', '1 0 - | 0'] });
    expect(compareTables(old, next).problems.map((p) => p.code)).toEqual(['removed-input-used']);
    const c = compareTables(old, next, { renames: [['Setup mode', 'Adjust mode']] });
    expect(c.problems).toEqual([]);
    expect(c.changed).toBe(false);
    expect(c.inputMatch.pairs.map((p) => p.renamed)).toEqual([false, false, true]);
  });

  it('a rename naming no signal is a problem', () => {
    const c = compareTables(tinyTable(ISSUED), tinyTable(ISSUED), { renames: [['Nothing', 'Setup mode']] });
    expect(c.problems.map((p) => p.code)).toEqual(['rename-unknown']);
  });

  it('an output added and one removed are changes; an output renamed is matched', () => {
    const c = compareTables(
      tinyTable({ ...ISSUED, outputs: ['Stroke permit', 'Lamp'], rows: ['1 1 - | 1 1', '0 - - | 0 0', '1 0 - | 0 1'] }),
      tinyTable({ ...ISSUED, outputs: ['Stroke-permit', 'Horn'], rows: ['1 1 - | 1 0', '0 - - | 0 1', '1 0 - | 0 0'] }),
    );
    expect(c.outputs.map((o) => [o.name, o.status, o.renamedFrom])).toEqual([
      ['Stroke-permit', 'compared', 'Stroke permit'],
      ['Lamp', 'removed', undefined],
      ['Horn', 'added', undefined],
    ]);
    expect(c.outputs[0]!.changed).toBe(false);
    expect(c.changed).toBe(true);
  });

  it('a conflict made by an edit is reported as new, and the conflicted combinations take the safe value', () => {
    const c = compare(['1 1 - | 1', '0 - - | 0', '1 0 - | 0', '1 1 1 | 0']);
    const o = c.outputs[0]!;
    expect(o.change!.conflictsNew.cubes.map((x) => cubeToPattern(3, x))).toEqual(['111']);
    expect(o.change!.nowTrips.cubes.map((x) => cubeToPattern(3, x))).toEqual(['111']);
  });

  it('tables that share no signal: one problem saying what to give', () => {
    const c = compareTables(tinyTable(ISSUED), tinyTable({ sheet: 'Press', inputs: ['X1', 'X2'], outputs: ['Y'], rows: ['1 1 | 1'] }));
    expect(c.problems.filter((p) => p.code === 'tables-unrelated')).toHaveLength(1);
    expect(c.problems.find((p) => p.code === 'tables-unrelated')!.message).toContain('--old-sheet/--old-range and --new-sheet/--new-range');
  });

  it('the JSON gives per output the five kinds as counts and patterns over the joint inputs', () => {
    const json = comparisonJson(compare(['1 1 - | 1', '0 - - | 0', '1 0 - | 1']));
    expect(json.outputs[0]).toMatchObject({
      name: 'Stroke permit',
      nowPermits: { count: 2, cubes: ['10-'] },
      nowTrips: { count: 0, cubes: [] },
      dontCareChanged: { count: 0, cubes: [] },
      gapsOpened: { count: 0, cubes: [] },
      gapsClosed: { count: 0, cubes: [] },
    });
    expect(json.caution).toMatch(/^CAUTION/);
  });
});
