import { describe, expect, it } from 'vitest';
import XLSX from 'xlsx';
import { addSheets, newWorkbook } from '../../src/hosts/xlsx-package.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';
import { nodeInflate, partsOf, USER_PARTS, userWorkbook } from './workbook-parts.js';

const RESULTS: SheetBlock = {
  name: 'Results',
  rows: [
    [{ value: 'Interlock Algebra results: Purge!A2:C5', style: 'title' }],
    [{ value: 'CAUTION: a design aid', style: 'caution' }],
    [{ value: 'Form', style: 'heading' }, { value: 'Air_flow_OK AND Fuel_valve_closed', style: 'code' }],
    [{ value: 1, style: 'input' }, { value: true, formula: 'AND(A4=1,TRUE)' }, { value: 'OK', formula: 'IF(XOR(A4=1,FALSE),"OK","DIFFERS")', style: 'status' }],
    [null, { value: '=not a formula' }],
  ],
  columnWidths: [12, 40, 10],
  statusRanges: ['C4:C4'],
  print: { landscape: true, fitToWidth: true, titleRows: { first: 1, last: 2 }, footer: 'Purge!A2:C5 & revision 1a2b' },
};

const decode = (b: Uint8Array | undefined): string => new TextDecoder().decode(b);

describe('adding results sheets to a copy of the user workbook', () => {
  it("keeps every part of the user's workbook byte-identical except those that list the sheets and the styles", async () => {
    const before = partsOf(userWorkbook());
    const out = await addSheets(userWorkbook(), [{ name: 'Results', block: RESULTS }], nodeInflate);
    if (!out.ok) throw new Error(out.error.message);
    const after = partsOf(out.value);
    const listing = new Set(['[Content_Types].xml', 'xl/workbook.xml', 'xl/_rels/workbook.xml.rels', 'xl/styles.xml']);
    for (const [name, bytes] of before) if (!listing.has(name)) expect(after.get(name), name).toEqual(bytes);
    expect([...after.keys()].filter((k) => !before.has(k))).toEqual(['xl/worksheets/sheet2.xml']);
  });

  it('only appends to the styles part: the original styles keep their ids and content', async () => {
    const out = await addSheets(userWorkbook(), [{ name: 'Results', block: RESULTS }], nodeInflate);
    const styles = decode(partsOf(out.ok ? out.value : new Uint8Array()).get('xl/styles.xml'));
    const original = USER_PARTS['xl/styles.xml']!;
    for (const kept of [
      '<font><b/><sz val="11"/><color rgb="FF0000FF"/><name val="Calibri"/></font>',
      '<fill><patternFill patternType="solid"><fgColor rgb="FFFFFF00"/><bgColor indexed="64"/></patternFill></fill>',
      '<xf numFmtId="0" fontId="1" fillId="2" borderId="0" xfId="0" applyFont="1" applyFill="1"/>',
    ]) {
      expect(original).toContain(kept);
      expect(styles.indexOf(kept)).toBeGreaterThan(0);
    }
    // The user's second cell format is still the second one.
    const xfs = styles.slice(styles.indexOf('<cellXfs'), styles.indexOf('</cellXfs>'));
    expect(xfs.match(/<xf /g)![1]).toBeDefined();
    expect(xfs.indexOf('fontId="1" fillId="2"')).toBeLessThan(xfs.indexOf('fontId="2"'));
    expect(styles).toMatch(/<cellXfs count="(\d+)"/);
    expect(Number(/<cellXfs count="(\d+)"/.exec(styles)![1])).toBe(xfs.match(/<xf /g)!.length);
    expect(styles).toMatch(/<dxfs count="2">/);
  });

  it('lists the new sheet after the user sheets, with print titles as a defined name beside the user ones', async () => {
    const out = await addSheets(userWorkbook(), [{ name: "Results (2)", block: RESULTS }], nodeInflate);
    const workbook = decode(partsOf(out.ok ? out.value : new Uint8Array()).get('xl/workbook.xml'));
    expect(workbook.indexOf('name="Purge"')).toBeLessThan(workbook.indexOf('name="Results (2)"'));
    expect(workbook).toContain('<definedName name="PurgeTable">Purge!$A$2:$C$5</definedName>');
    expect(workbook).toContain(`<definedName name="_xlnm.Print_Titles" localSheetId="1">'Results (2)'!$1:$2</definedName>`);
    expect(workbook.indexOf('</definedNames>')).toBeLessThan(workbook.indexOf('<calcPr'));
  });

  it('writes values, formulas with _xlfn.XOR and their cached values, text that looks like a formula as text', async () => {
    const out = await addSheets(userWorkbook(), [{ name: 'Results', block: RESULTS }], nodeInflate);
    const book = XLSX.read(out.ok ? out.value : new Uint8Array(), { type: 'array', cellFormula: true });
    expect(book.SheetNames).toEqual(['Purge', 'Results']);
    const sheet = book.Sheets['Results']!;
    expect(sheet['A1'].v).toBe('Interlock Algebra results: Purge!A2:C5');
    expect(sheet['A4'].v).toBe(1);
    expect(sheet['B4']).toMatchObject({ v: true, f: 'AND(A4=1,TRUE)' });
    expect(sheet['C4'].v).toBe('OK');
    expect(sheet['B5']).toMatchObject({ t: 's', v: '=not a formula' });
    expect(sheet['B5'].f).toBeUndefined();
    const xml = decode(partsOf(out.ok ? out.value : new Uint8Array()).get('xl/worksheets/sheet2.xml'));
    expect(xml).toContain("<f>IF(_xlfn.XOR(A4=1,FALSE),&#34;OK&#34;,&#34;DIFFERS&#34;)</f>");
    expect(book.Sheets['Purge']!['C2'].v).toBe('Purge permit');
  });

  it('sets the print up: landscape, one page wide, a footer with the table, conditional formats on the status cells', async () => {
    const out = await addSheets(userWorkbook(), [{ name: 'Results', block: RESULTS }], nodeInflate);
    const xml = decode(partsOf(out.ok ? out.value : new Uint8Array()).get('xl/worksheets/sheet2.xml'));
    expect(xml).toContain('<pageSetUpPr fitToPage="1"/>');
    expect(xml).toContain('<pageSetup orientation="landscape" fitToWidth="1" fitToHeight="0"/>');
    expect(xml).toContain('<oddFooter>&#38;LPurge!A2:C5 &#38;&#38; revision 1a2b&#38;RPage &#38;P of &#38;N</oddFooter>');
    expect(xml).toMatch(/<conditionalFormatting sqref="C4:C4"><cfRule type="containsText" dxfId="0" [^>]*text="DIFFERS">/);
    expect(xml).toContain('<col min="2" max="2" width="41" customWidth="1"/>');
  });

  it('freezes the rows above the steps as a frozen pane below them, and none when the block asks for none', async () => {
    const out = await addSheets(userWorkbook(), [{ name: 'Results', block: { ...RESULTS, freezeRows: 3 } }, { name: 'Plain', block: RESULTS }], nodeInflate);
    const parts = partsOf(out.ok ? out.value : new Uint8Array());
    expect(decode(parts.get('xl/worksheets/sheet2.xml'))).toContain(
      '<sheetViews><sheetView workbookViewId="0"><pane ySplit="3" topLeftCell="A4" activePane="bottomLeft" state="frozen"/></sheetView></sheetViews>',
    );
    expect(decode(parts.get('xl/worksheets/sheet3.xml'))).toContain('<sheetViews><sheetView workbookViewId="0"></sheetView></sheetViews>');
  });

  it('refuses what is not a workbook package, with a reason', async () => {
    const out = await addSheets(new TextEncoder().encode('Air flow OK;Purge permit\n1;1\n'), [{ name: 'Results', block: RESULTS }], nodeInflate);
    expect(out.ok).toBe(false);
    if (!out.ok) expect(out.error.message).toMatch(/not a zip package/);
  });
});

describe('a new workbook for a CSV source', () => {
  it('holds the source cells at their place, then our sheets', async () => {
    const out = await newWorkbook([{ name: 'spindle-permit', origin: 'A1', cells: [['Guard', 'Permit'], [1, 1], [0, 0]] }], [{ name: 'Results', block: RESULTS }]);
    if (!out.ok) throw new Error(out.error.message);
    const book = XLSX.read(out.value, { type: 'array' });
    expect(book.SheetNames).toEqual(['spindle-permit', 'Results']);
    expect(XLSX.utils.sheet_to_json(book.Sheets['spindle-permit']!, { header: 1 })).toEqual([['Guard', 'Permit'], [1, 1], [0, 0]]);
  });
});
