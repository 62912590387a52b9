import { describe, expect, it } from 'vitest';
import { has } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { printExcel } from '../../src/logic/expr/print-excel.js';
import { cellAddress, parseRange } from '../../src/table/grid.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import { LIVE_CHECK_MAX_INPUTS, resultsSheet } from '../../src/report/results-sheet.js';
import type { BlockCell, SheetBlock } from '../../src/report/sheet-block.js';
import { evaluateCell, evaluateFormula } from './excel-eval.js';
import { analysisOf, GUARD, VOTE, type TinySpec } from './fixtures.js';

const rowOf = (block: SheetBlock, first: string) => block.rows.find((r) => r[0]?.value === first);

/** The live check: rows from the column-title row ('#') to the end. */
function liveRows(block: SheetBlock): { top: number; rows: (readonly (BlockCell | null)[])[] } {
  const titles = block.rows.findIndex((r) => r[0]?.value === '#');
  return { top: titles + 1, rows: block.rows.slice(titles + 1) };
}

const CONFLICT: TinySpec = { sheet: 'Clash', inputs: ['A', 'B'], outputs: ['Y'], rows: ['1 - | 1', '- 1 | 0', '0 0 | 0'] };

describe('results sheet', () => {
  const guard = analysisOf(GUARD);

  it('opens with a title naming sheet and range, then the caution line by line', () => {
    const block = resultsSheet(guard, { source: 'capper-cell.xlsx' });
    expect(block.rows[0]![0]!.value).toBe("Interlock Algebra results: 'Guard logic'!A1:E6");
    expect(rowOf(block, 'Source')![1]!.value).toBe('capper-cell.xlsx');
    const caution = block.rows.flat().filter((c) => c?.style === 'caution').map((c) => c!.value);
    expect(caution).toEqual(CAUTION_LINES);
    expect(block.name.length).toBeLessThanOrEqual(31);
  });

  it('lists per output the three forms with cost, minimum and proof', () => {
    const block = resultsSheet(guard);
    const andOr = block.rows.filter((r) => r[0]?.value === 'AND/OR form').map((r) => r.map((c) => c?.value));
    expect(andOr).toEqual([
      ['AND/OR form', 'Guard_closed AND Two_hand_OK', '1 term, 2 literals', 'proven minimum', '8 combinations checked, 0 mismatches'],
      ['AND/OR form', 'NOT Guard_closed OR Mode_setup', '2 terms, 2 literals', 'proven minimum', '8 combinations checked, 0 mismatches'],
    ]);
    const xors = block.rows.filter((r) => r[0]?.value === 'best-polarity XOR form').map((r) => r[1]!.value);
    expect(xors).toEqual(guard.outputs.map((o) => o.bestXor.text));
  });

  it('names the inputs that do not matter and the gaps as patterns', () => {
    const block = resultsSheet(guard);
    expect(rowOf(block, 'Inputs that do not matter')![1]!.value).toBe('Mode (setup)');
    expect(rowOf(block, 'Gaps (take the safe value)')![1]!.value).toBe('1 combination: 100');
  });

  it('lists the don\'t-care combinations a form turns on', () => {
    const loose = analysisOf({ sheet: 'Loose', inputs: ['A', 'B'], outputs: ['Y'], rows: ['1 1 | 1', '1 0 | -', '0 - | 0'] });
    expect(loose.outputs[0]!.andOr.text).toBe('A');
    const block = resultsSheet(loose);
    expect(rowOf(block, "Don't-care combinations")![1]!.value).toBe('1');
    expect(rowOf(block, 'AND/OR form turns on')![1]!.value).toBe('10');
  });

  it('reports a conflict with both rows\' cells', () => {
    const block = resultsSheet(analysisOf(CONFLICT));
    const row = rowOf(block, 'Conflict (takes the safe value)')!;
    expect(row[1]!.value).toBe('rows A3:C3 and A4:C4 ask for 1 and 0 on 1 combination, e.g. 11');
  });

  it('maps every header to its identifier', () => {
    const block = resultsSheet(guard);
    expect(rowOf(block, 'Two-hand OK')!.map((c) => c?.value)).toEqual(['Two-hand OK', 'Two_hand_OK', 'input']);
    expect(rowOf(block, 'Motor permit')!.map((c) => c?.value)).toEqual(['Motor permit', 'Motor_permit', 'output, safe value 0']);
  });

  it('the live check has one row per combination: its number, the inputs as 0/1, the spec value', () => {
    const block = resultsSheet(guard);
    const { rows } = liveRows(block);
    expect(rows).toHaveLength(8);
    rows.forEach((row, k) => {
      expect(row[0]!.value).toBe(k);
      expect(row.slice(1, 4).map((c) => c!.value)).toEqual(k.toString(2).padStart(3, '0').split('').map(Number));
      const fn = guard.table.outputs[0]!.built.fn;
      expect(row[4]!.value).toBe(has(fn.dc, k) ? '-' : has(fn.on, k) ? 1 : 0);
    });
    expect(rows[4]![noteColumn(guard)]!.value).toContain('gap');
  });

  it('each form\'s formula, evaluated, gives its cached value and the form\'s value on that row', () => {
    const block = resultsSheet(guard);
    const { top, rows } = liveRows(block);
    const forms = guard.outputs.flatMap((o) => [o.andOr, o.xor, o.bestXor]);
    rows.forEach((row, k) => {
      forms.forEach((form, f) => {
        const col = 1 + 3 + Math.floor(f / 3) * 4 + 1 + (f % 3);
        const cell = row[col]!;
        const printed = printExcel(form.expr, (input) => cellAddress(top + k, 1 + input));
        if (!printed.ok) throw new Error(printed.error.message);
        expect(cell.formula).toBe(`IF(${printed.value},1,0)`);
        const expected = has(truthTable(form.expr, 3), k) ? 1 : 0;
        expect(cell.value).toBe(expected);
        expect(evaluateCell(block, cellAddress(top + k, col))).toBe(expected);
      });
    });
  });

  it('the status formulas read OK on every row, and the summary counts no DIFFERS', () => {
    const block = resultsSheet(guard);
    const { top, rows } = liveRows(block);
    const statusCol = 1 + 3 + 4 * 2;
    rows.forEach((row, k) => {
      expect(row[statusCol]!.value).toBe('OK');
      expect(evaluateCell(block, cellAddress(top + k, statusCol))).toBe('OK');
    });
    const summary = rowOf(block, 'Combinations that differ (live check)')![1]!;
    expect(summary.formula).toBe(`COUNTIF(${block.statusRanges![0]},"DIFFERS")`);
    expect(summary.value).toBe(0);
    expect(evaluateFormula(block, summary.formula!)).toBe(0);
  });

  it('a row whose spec value no longer matches the forms reads DIFFERS, and the summary counts it', () => {
    const block = resultsSheet(analysisOf(VOTE));
    const { top, rows } = liveRows(block);
    const spoilt: SheetBlock = {
      ...block,
      rows: block.rows.map((r, i) => (i === top + 3 ? r.map((c, col) => (col === 4 ? { value: 0 } : c)) : r)),
    };
    expect(rows[3]![4]!.value).toBe(1);
    expect(evaluateCell(spoilt, cellAddress(top + 3, 8))).toBe('DIFFERS');
    const summary = rowOf(spoilt, 'Combinations that differ (live check)')![1]!;
    expect(evaluateFormula(spoilt, summary.formula!)).toBe(1);
  });

  it('on a don\'t-care row any value of a form is OK', () => {
    const block = resultsSheet(guard);
    const { top, rows } = liveRows(block);
    const k = rows.findIndex((r) => r[4]!.value === '-');
    expect(k).toBeGreaterThanOrEqual(0);
    for (const value of [0, 1]) {
      const forced: SheetBlock = { ...block, rows: block.rows.map((r, i) => (i === top + k ? r.map((c, col) => (col >= 5 && col <= 7 ? { value } : c)) : r)) };
      expect(evaluateCell(forced, cellAddress(top + k, 12))).toBe('OK');
    }
  });

  it('the status column is the range given for the conditional format', () => {
    const block = resultsSheet(guard);
    const { top } = liveRows(block);
    expect(block.statusRanges).toEqual([`M${top + 1}:M${top + 8}`]);
    const range = parseRange(block.statusRanges![0]!)!;
    for (let r = range.top; r <= range.bottom; r++) expect(block.rows[r]![range.left]!.style).toBe('status');
  });

  it('formulas are written as typed: XOR, never _xlfn.XOR', () => {
    const formulas = resultsSheet(guard).rows.flat().flatMap((c) => (c?.formula ? [c.formula] : []));
    expect(formulas.some((f) => f.includes('XOR('))).toBe(true);
    expect(formulas.some((f) => f.includes('_xlfn'))).toBe(false);
  });

  it(`leaves the live check out above ${LIVE_CHECK_MAX_INPUTS} inputs and says why`, () => {
    const n = LIVE_CHECK_MAX_INPUTS + 1;
    const inputs = Array.from({ length: n }, (_, i) => `In ${i + 1}`);
    const wide = analysisOf({ sheet: 'Wide', inputs, outputs: ['Y'], rows: [`${'1 '.repeat(n)}| 1`, `0 ${'- '.repeat(n - 1)}| 0`] });
    const block = resultsSheet(wide);
    expect(block.statusRanges).toEqual([]);
    expect(block.rows.some((r) => r[0]?.value === '#')).toBe(false);
    expect(rowOf(block, 'Live check')![1]!.value).toBe(
      `Live check left out: ${n} inputs give ${2 ** n} combinations; the live check is written for tables of up to 12 inputs (4096 rows).`,
    );
  });

  it('a form too long for an Excel formula gets the reason in place of the formula; the status still checks the others', () => {
    const n = 9;
    const rows = Array.from({ length: 2 ** n }, (_, k) => {
      const bits = k.toString(2).padStart(n, '0').split('');
      return `${bits.join(' ')} | ${bits.filter((b) => b === '1').length % 2}`;
    });
    const parity = analysisOf({ sheet: 'Parity', inputs: Array.from({ length: n }, (_, i) => `P${i + 1}`), outputs: ['Odd'], rows });
    const block = resultsSheet(parity);
    const { top, rows: live } = liveRows(block);
    const andOrCell = live[0]![n + 2]!;
    expect(andOrCell.formula).toBeUndefined();
    expect(String(andOrCell.value)).toMatch(/^not written as a formula: the Excel formula would be \d+ characters long/);
    expect(live[5]![n + 3]!.formula).toBeDefined();
    for (const k of [0, 1, 200, 511]) expect(evaluateCell(block, cellAddress(top + k, n + 5))).toBe('OK');
  });
});

/** Column of the note beside the status (after #, inputs, and four columns per output). */
function noteColumn(a: { inputs: readonly unknown[]; outputs: readonly unknown[] }): number {
  return 1 + a.inputs.length + 4 * a.outputs.length + 1;
}
