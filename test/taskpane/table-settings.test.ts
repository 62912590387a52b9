// The settings of a reading: read back from wherever they were remembered (anything else reads
// as the defaults), and turned into the reader's options worded for the pane or the page.
import { describe, expect, it } from 'vitest';
import { readSpecTables } from '../../src/table/read-tables.js';
import { DEFAULT_SETTINGS, pageValues, settingsFrom, specOptions } from '../../taskpane/table-settings.js';
import { gridOf } from '../workflow/workbooks.js';

/** Three signals, no role row, no separator column: only the count of inputs decides. */
const UNDECIDED = gridOf('Cell', [
  ['Guard closed', 'E-stop healthy', 'Motor permit'],
  [1, 1, 1],
  [0, '-', 0],
  [1, 0, 0],
]);

describe('the settings of a reading', () => {
  it('settings as saved read back the same', () => {
    const s = { inputCount: 2, safeValues: { Motor_permit: 1 as const }, xMeansDontCare: true, dontCares: 'safe' as const };
    expect(settingsFrom(structuredClone(s))).toEqual(s);
  });

  it.each([null, 'text', 7, [], { inputCount: 0, safeValues: { A: 2 }, xMeansDontCare: 'yes', dontCares: 'other' }])('what is not ours (%j) reads as the defaults', (v) => {
    expect(settingsFrom(v)).toEqual(DEFAULT_SETTINGS);
  });

  it('the defaults read X as a bad cell, resolve don\'t-cares minimally, and leave the roles to the table', () => {
    expect(specOptions(DEFAULT_SETTINGS, 'pane')).toEqual({ host: 'pane', xReading: 'none', dontCares: 'minimal' });
  });

  it('without a count of inputs an undecided table asks for the setting by its label on the card', () => {
    const read = readSpecTables(UNDECIDED, specOptions(DEFAULT_SETTINGS, 'page'));
    const problem = read.problems.find((p) => p.code === 'roles-unknown');
    expect(problem?.setting).toBe('inputs');
    expect(problem?.message).toContain("set 'Inputs: the first N columns'");
    expect(problem?.message).not.toContain('--inputs');
  });

  it('with the count of inputs set the same table is read with that many inputs', () => {
    const read = readSpecTables(UNDECIDED, specOptions({ ...DEFAULT_SETTINGS, inputCount: 2 }, 'page'));
    expect(read.tables.map((t) => [t.inputs.length, t.outputs.length, t.roleRule])).toEqual([[2, 1, 'user-choice']]);
  });

  it('values kept on the page are there for the same key while the page stays open', async () => {
    const kept = pageValues();
    await kept.set('Cell', { inputCount: 2 });
    expect([kept.get('Cell'), kept.get('Other')]).toEqual([{ inputCount: 2 }, undefined]);
  });
});
