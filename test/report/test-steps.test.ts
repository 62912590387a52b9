import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has } from '../../src/logic/bits.js';
import { CAUTION, CAUTION_LINES } from '../../src/report/caution.js';
import { csvField, FILL_IN_COLUMNS, FULL_TABLE_MAX_INPUTS, RECORD_TITLE, stepsCsv, stepTable, testRecordSheet } from '../../src/report/test-steps.js';
import { analysisOf, GUARD, VOTE } from './fixtures.js';

/** RFC 4180 reading: fields split at commas, quoted fields may hold commas, quotes ("") and line breaks. */
function parseCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i]!;
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') (field += '"'), i++;
      else if (ch === '"') quoted = false;
      else field += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') row.push(field), (field = '');
    else if (ch === '\r' && text[i + 1] === '\n') {
      row.push(field), rows.push(row), (row = []), (field = ''), i++;
    } else field += ch;
  }
  if (field !== '' || row.length > 0) row.push(field), rows.push(row);
  return rows;
}

describe('commissioning test steps', () => {
  const guard = analysisOf(GUARD);

  it('the CSV starts with the caution, then the title, source, revision stamp, settings, tool and date, then the columns', () => {
    const rows = parseCsv(stepsCsv(guard, { source: 'guards.xlsx', date: '2026-12-01' }));
    expect(rows[0]).toEqual([CAUTION]);
    expect(rows[1]).toEqual([`${RECORD_TITLE}: 'Guard logic'!A1:E6`]);
    expect(rows.slice(2, 7).map((r) => r[0])).toEqual(['Source', 'Revision stamp', 'Settings', 'Tool', 'Made']);
    expect(rows[2]![1]).toBe("guards.xlsx, 'Guard logic'!A1:E6");
    expect(rows[3]![1]).toMatch(/^sha256:[0-9a-f]{64}$/);
    expect(rows[6]![1]).toBe('2026-12-01');
    expect(rows[7]).toEqual([
      'Step', 'Test ID', 'Output', 'Preconditions', 'Action', 'Expected Motor permit', 'Expected Lamp', 'Actual Motor permit', 'Actual Lamp',
      'Pass/Fail', 'Punch item', 'Performed by', 'Witnessed by', 'Date', 'Why this step',
    ]);
  });

  it('each step names the inputs to change from the previous step and leaves the others as preconditions', () => {
    const rows = stepTable(guard).rows;
    let before = [0, 0, 0];
    for (const r of rows) {
      const headers = guard.inputs.map((s) => s.header);
      const changed = headers.filter((_, i) => r.inputs[i] !== before[i]);
      for (const h of changed) expect(r.action).toContain(`set ${h} to ${r.inputs[headers.indexOf(h)]}`);
      for (const h of headers.filter((x) => !changed.includes(x))) expect(r.preconditions).toContain(`${h} = ${r.inputs[headers.indexOf(h)]}`);
      before = [...r.inputs];
    }
  });

  it('a test ID is the pattern of the step\'s inputs, the same in every revision that keeps the step', () => {
    for (const r of stepTable(guard).rows) expect(r.testId).toBe(`T-${r.inputs.join('')}`);
  });

  it('by default gives the unique-cause steps of every output, each combination once, numbered from 1', () => {
    const table = stepTable(guard);
    const wanted = new Set(guard.outputs.flatMap((o) => o.steps.map((s) => s.combination)));
    expect(new Set(table.rows.map((r) => r.combination))).toEqual(wanted);
    expect(table.rows.map((r) => r.step)).toEqual(table.rows.map((_, i) => i + 1));
  });

  it('each step sets the inputs of its combination and expects the resolved function: the spec, a don\'t-care as resolved', () => {
    for (const r of stepTable(guard).rows) {
      expect(r.inputs.join('')).toBe(r.combination.toString(2).padStart(3, '0'));
      guard.outputs.forEach((o, j) => {
        const fn = guard.table.outputs[j]!.built.fn;
        expect(r.expected[j]).toBe(has(o.resolved.on, r.combination) ? 1 : 0);
        if (!has(fn.dc, r.combination)) expect(r.expected[j]).toBe(has(fn.on, r.combination) ? 1 : 0);
      });
    }
  });

  it('a step the unique-cause selection made for an output expects what that step says', () => {
    const table = stepTable(guard);
    guard.outputs.forEach((o, j) => {
      for (const s of o.steps) expect(table.rows.find((r) => r.combination === s.combination)!.expected[j]).toBe(s.expected);
    });
  });

  it('says why: the selection\'s reason, gaps and don\'t-cares', () => {
    const rows = stepTable(guard).rows;
    const gapRow = rows.find((r) => r.combination === 0b100)!;
    expect(gapRow.why).toContain('gap: no row covers this combination');
    expect(rows[0]!.why).toContain('Motor_permit: term 1 alone: Guard_closed AND Two_hand_OK');
  });

  it('the columns a commissioning engineer fills in are left empty', () => {
    const m = guard.outputs.length;
    const rows = parseCsv(stepsCsv(guard)).slice(8);
    for (const r of rows) expect(r.slice(5 + m, 5 + 2 * m + FILL_IN_COLUMNS.length)).toEqual(Array.from({ length: m + FILL_IN_COLUMNS.length }, () => ''));
    const sheet = testRecordSheet(guard);
    const data = sheet.rows.slice(sheet.rows.findIndex((r) => r[0]?.value === 'Step') + 1);
    expect(data.length).toBe(stepTable(guard).rows.length);
    for (const r of data) expect(r.slice(5 + m, 5 + 2 * m + FILL_IN_COLUMNS.length)).toEqual(Array.from({ length: m + FILL_IN_COLUMNS.length }, () => null));
  });

  it('the column titles stay in view: title, caution in three rows, five facts, then the titles at row 10, frozen', () => {
    const sheet = testRecordSheet(guard);
    expect(sheet.rows.findIndex((r) => r[0]?.value === 'Step') + 1).toBe(10);
    expect(sheet.freezeRows).toBe(10);
    expect(sheet.rows.slice(4, 9).map((r) => r[0]!.value)).toEqual(['Source', 'Revision stamp', 'Settings', 'Tool', 'Made']);
  });

  it('with the note on a full table left out, the titles are at row 11 and still frozen', () => {
    const n = FULL_TABLE_MAX_INPUTS + 1;
    const wide = analysisOf({ sheet: 'Wide', inputs: Array.from({ length: n }, (_, i) => `In ${i + 1}`), outputs: ['Y'], rows: [`${'1 '.repeat(n)}| 1`] });
    const sheet = testRecordSheet(wide, { full: true });
    expect(sheet.rows[9]![0]!.value).toMatch(/^Full table left out/);
    expect(sheet.freezeRows).toBe(11);
    expect(sheet.rows[10]![0]!.value).toBe('Step');
  });

  it('the full table, on request, is every combination in order', () => {
    const vote = analysisOf(VOTE);
    const table = stepTable(vote, { full: true });
    expect(table.rows.map((r) => r.combination)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
    expect(table.rows.map((r) => r.expected[0])).toEqual([0, 0, 0, 1, 0, 1, 1, 1]);
  });

  it(`above ${FULL_TABLE_MAX_INPUTS} inputs the full table is refused with a note, and unique-cause steps given`, () => {
    const n = FULL_TABLE_MAX_INPUTS + 1;
    const wide = analysisOf({ sheet: 'Wide', inputs: Array.from({ length: n }, (_, i) => `In ${i + 1}`), outputs: ['Y'], rows: [`${'1 '.repeat(n)}| 1`] });
    const table = stepTable(wide, { full: true });
    expect(table.note).toMatch(/^Full table left out: 17 inputs/);
    expect(table.rows.length).toBe(wide.outputs[0]!.steps.length);
    expect(parseCsv(stepsCsv(wide, { full: true }))[7]![0]).toBe(table.note);
  });

  it('CSV fields read back as written, whatever they hold (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.string({ unit: 'grapheme', maxLength: 12 }), { minLength: 1, maxLength: 6 }), (fields) => {
        const safe = fields.filter((f) => !/^[=+@\t\r-]/.test(f));
        if (safe.length === 0) return;
        const line = safe.map(csvField).join(',') + '\r\n';
        expect(parseCsv(line)).toEqual([safe]);
      }),
    );
  });

  it('CSV quoting of commas, quotes and line breaks (known answers)', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField(' edge')).toBe('" edge"');
    expect(csvField('plain')).toBe('plain');
    expect(csvField(7)).toBe('7');
  });

  it('text a spreadsheet would run as a formula is written with a leading apostrophe; a lone "-" stays', () => {
    expect(csvField('=SUM(A1)')).toBe("'=SUM(A1)");
    expect(csvField('+1')).toBe("'+1");
    expect(csvField('@x')).toBe("'@x");
    expect(csvField('-2')).toBe("'-2");
    expect(csvField('-')).toBe('-');
  });

  it('the sheet carries a title, the whole caution two lines to a row, and a name of at most 31 characters', () => {
    const sheet = testRecordSheet(analysisOf({ ...VOTE, sheet: 'A sheet name that is rather long' }));
    expect(sheet.name.length).toBeLessThanOrEqual(31);
    expect(sheet.name.endsWith(' record')).toBe(true);
    const caution = sheet.rows.slice(1, 4).map((r) => r[0]!);
    expect(caution.every((c) => c.style === 'caution')).toBe(true);
    expect(caution.map((c) => c.value).join(' ')).toBe(CAUTION_LINES.join(' '));
  });
});
