// The settings of a reading: read back from wherever they were remembered (anything else reads
// as the defaults), and turned into the reader's options worded for the pane or the page.
import { describe, expect, it } from 'vitest';
import { readSpecTables } from '../../src/table/read-tables.js';
import { documentValues } from '../../src/hosts/excel-settings.js';
import { readTables } from '../../src/workflow/index.js';
import { DEFAULT_SETTINGS, pageValues, rememberTable, settingsFrom, specOptions, tableChoices, tableKey, tableSettings } from '../../taskpane/table-settings.js';
import { SettingsDouble } from '../hosts/excel-double.js';
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

/** Two tables side by side on one sheet, two empty columns apart, each with its role row. Invented data. */
const SIDE_BY_SIDE = gridOf('Press', [
  ['input', 'input', 'output', '', '', 'input', 'input', 'output'],
  ['Guard closed', 'Two-hand OK', 'Stroke permit', '', '', 'Air OK', 'Lube OK', 'Pump permit'],
  [1, 1, 1, '', '', 1, 1, 1],
  [0, '-', 0, '', '', 0, '-', '-'],
  [1, 0, '-', '', '', 1, 0, '-'],
]);

describe('the settings of one table', () => {
  it('are remembered under the sheet and the top-left cell of the table, or the name of an Excel table', () => {
    expect(tableKey({ sheet: 'Press', range: 'F1:H5' })).toBe('table@Press!F1');
    expect(tableKey({ sheet: 'Press line 2', range: 'B3:D9' })).toBe("table@'Press line 2'!B3");
    expect(tableKey({ sheet: 'Press', range: 'B3:D9', excelTable: 'tblPress' })).toBe('table@tblPress');
  });

  it('two tables side by side keep their own settings, and each is read with its own', async () => {
    const store = pageValues();
    const left = { sheet: 'Press', range: 'A1:C5' };
    const right = { sheet: 'Press', range: 'F1:H5' };
    await rememberTable(store, left, { ...DEFAULT_SETTINGS, safeValues: { Stroke_permit: 1 } });
    await rememberTable(store, right, { ...DEFAULT_SETTINGS, dontCares: 'safe' });
    expect([tableSettings(store, left)?.safeValues, tableSettings(store, right)?.dontCares]).toEqual([{ Stroke_permit: 1 }, 'safe']);
    const read = readTables({ grids: [SIDE_BY_SIDE], problems: [] }, { ...specOptions(DEFAULT_SETTINGS, 'page'), tables: tableChoices(store, 'Press', 'page') });
    if (!read.ok) throw new Error(read.error.message);
    expect(read.value.tables.map((t) => [t.range, t.outputs[0]!.safe, t.dontCares ?? 'minimal'])).toEqual([
      ['A1:C5', 1, 'minimal'],
      ['F1:H5', 0, 'safe'],
    ]);
  });

  it('a table without settings of its own is read with those of the reading; tables of other sheets are not asked for', async () => {
    const store = pageValues();
    await rememberTable(store, { sheet: 'Other', range: 'A1:C5' }, { ...DEFAULT_SETTINGS, dontCares: 'safe' });
    expect(tableChoices(store, 'Press', 'page')).toEqual([]);
    expect(tableSettings(store, { sheet: 'Press', range: 'A1:C5' })).toBeUndefined();
    const read = readTables({ grids: [SIDE_BY_SIDE], problems: [] }, { ...specOptions({ ...DEFAULT_SETTINGS, dontCares: 'safe' }, 'page'), tables: tableChoices(store, 'Press', 'page') });
    if (!read.ok) throw new Error(read.error.message);
    expect(read.value.tables.map((t) => t.dontCares)).toEqual(['safe', 'safe']);
  });

  it('an Excel table is found where it is now, by its name, though it was somewhere else when its settings were set', async () => {
    const store = pageValues();
    await rememberTable(store, { sheet: 'Press', range: 'B2:D6', excelTable: 'tblPress' }, { ...DEFAULT_SETTINGS, dontCares: 'safe' });
    expect(tableChoices(store, 'Press', 'pane', { sheet: 'Press', range: 'F1:H5', excelTable: 'tblPress' })).toEqual([{ sheet: 'Press', cell: 'F1', options: { xReading: 'none', dontCares: 'safe' } }]);
  });

  it('in Excel, the settings of each table are in the document when it is opened again', async () => {
    const doc = new SettingsDouble();
    await rememberTable(documentValues(doc, 'ia', 'failed'), { sheet: 'Press', range: 'F1:H5' }, { ...DEFAULT_SETTINGS, xMeansDontCare: true });
    const again = documentValues(doc.reopened(), 'ia', 'failed');
    expect(tableSettings(again, { sheet: 'Press', range: 'F1:H5' })?.xMeansDontCare).toBe(true);
    expect(tableChoices(again, undefined, 'pane')).toEqual([{ sheet: 'Press', cell: 'F1', options: { xReading: 'dont-care', dontCares: 'minimal' } }]);
  });

  it('what the store holds under a table key that is not ours is no table settings', async () => {
    const store = pageValues();
    await store.set('table@Press!A1', { sheet: 'Press', cell: '=A1', settings: {} });
    await store.set('table@Press!F1', 'text');
    expect(tableChoices(store, undefined, 'page')).toEqual([]);
    expect(tableSettings(store, { sheet: 'Press', range: 'F1:H5' })).toBeUndefined();
  });
});
