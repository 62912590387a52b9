// What the pane remembers with the workbook in Excel (document settings), over the strict
// settings double: kept only once saved, every key in one setting, a refused save an error.
import { describe, expect, it } from 'vitest';
import { documentValues } from '../../src/hosts/excel-settings.js';
import { SettingsDouble } from './excel-double.js';

const FAILED = 'failed';

describe('values remembered in the document settings', () => {
  it('a value set and saved is there when the add-in opens the workbook again', async () => {
    const doc = new SettingsDouble();
    await documentValues(doc, 'ia', FAILED).set('Cell', { inputCount: 3 });
    expect(documentValues(doc.reopened(), 'ia', FAILED).get('Cell')).toEqual({ inputCount: 3 });
  });

  it('values under different keys are kept side by side', async () => {
    const doc = new SettingsDouble();
    const values = documentValues(doc, 'ia', FAILED);
    await values.set('Cell', 1);
    await values.set("'Vote sheet'!A1:D8", 2);
    const again = documentValues(doc.reopened(), 'ia', FAILED);
    expect([again.get('Cell'), again.get("'Vote sheet'!A1:D8"), again.get('Other')]).toEqual([1, 2, undefined]);
    expect(again.keys()).toEqual(['Cell', "'Vote sheet'!A1:D8"]);
  });

  it('a set without a save is not in the document (Office keeps it in memory only)', () => {
    const doc = new SettingsDouble();
    doc.set('ia', { Cell: 1 });
    expect(documentValues(doc, 'ia', FAILED).get('Cell')).toBe(1);
    expect(documentValues(doc.reopened(), 'ia', FAILED).get('Cell')).toBeUndefined();
  });

  it('a save Office refuses is an error that says Excel did not save', async () => {
    const doc = new SettingsDouble();
    doc.refuseSaves = true;
    await expect(documentValues(doc, 'ia', FAILED).set('Cell', 1)).rejects.toThrow(/Excel did not save the settings: The settings could not be saved/);
    expect(documentValues(doc.reopened(), 'ia', FAILED).get('Cell')).toBeUndefined();
  });

  it('a setting of another shape in the document reads as nothing remembered', () => {
    const doc = new SettingsDouble();
    doc.set('ia', ['not', 'ours']);
    expect(documentValues(doc, 'ia', FAILED).get('0')).toBeUndefined();
  });

  it('the double refuses a value JSON cannot hold, as Office.js does', () => {
    expect(() => new SettingsDouble().set('ia', undefined)).toThrow(/argument is invalid/);
  });
});
