// @vitest-environment happy-dom
// The pane's result card of a small table (the bit-set engine's), read from the strict
// Office.js double and examined behind a worker stand-in (pane.ts): the same card as a wide
// table's, from the same output views.
import { render } from 'preact';
import { describe, expect, it } from 'vitest';
import { analyseTable } from '../../src/analysis/index.js';
import { stepTable } from '../../src/report/index.js';
import { readSpecTables } from '../../src/table/index.js';
import { SpecTableView } from '../../taskpane/results.js';
import type { SeedCell } from '../hosts/excel-double.js';
import { form, mount, paneOn } from './pane.js';

// Motor permit = guard closed AND two-hand OK; no row covers 1 0 0 (a gap); with Mode (setup)
// = 1 the permit is a don't-care, except 1 1 1, which asks for 1.
const GUARD: SeedCell[][] = [
  ['input', 'input', 'input', 'output'],
  ['Guard closed', 'Two-hand OK', 'Mode (setup)', 'Motor permit'],
  [1, 1, 0, 1],
  [0, '-', 0, 0],
  ['-', '-', 1, '-'],
  [1, 1, 1, 1],
];

async function card(): Promise<Element> {
  const { view, table } = await paneOn('Guard', GUARD);
  const el = mount();
  render(<SpecTableView table={table} handOver={view.handOver} />, el);
  return el.querySelector('section.output')!;
}

describe('the result card of a 3-input guard table', () => {
  it('shows the AND/OR form, proven minimum, and its proof over all 8 combinations', async () => {
    const c = await card();
    expect(form(c, 'AND/OR form').querySelector('pre.expr')!.textContent).toBe('Guard_closed AND Two_hand_OK');
    expect(form(c, 'AND/OR form').querySelector('.meta')!.textContent).toBe('sum of products: 1 product term, 2 literals; proven minimum');
    expect(form(c, 'AND/OR form').querySelector('.proof')!.textContent).toBe('proof: all 8 combinations checked, every one agrees with the spec');
  });

  it('names the gap in words and the safe value it takes', async () => {
    const c = await card();
    const [, gaps] = [...c.querySelectorAll('dl.facts dd')];
    expect(gaps!.textContent).toBe('1 combination no row covers; they take the safe value 0:Guard closed=1, Two-hand OK=0, Mode (setup)=0');
  });

  it("counts the don't-cares and turns none of them on", async () => {
    const c = await card();
    expect(c.querySelector('p.meta:not(.print-only)')!.textContent).toBe("safe value 0; 3 don't-care combinations");
    expect([...c.querySelectorAll('dl.facts dd')][3]!.textContent).toBe("the AND/OR form turns on no don't-care combination");
  });

  it('gives its test steps with the IDs and expected values of the test record', async () => {
    const c = await card();
    const shown = [...c.querySelectorAll('.steps-record tbody tr')].map((tr) => [...tr.querySelectorAll('td')].slice(3, 5).map((td) => td.textContent));
    const record = stepTable(analyseTable(readSpecTables({ sheet: 'Guard', origin: 'A1', cells: GUARD }).tables[0]!));
    expect(shown).not.toEqual([]);
    expect(shown).toEqual(record.rows.map((r) => [r.testId, String(r.expected[0])]));
  });
});
