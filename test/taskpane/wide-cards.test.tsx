// @vitest-environment happy-dom
// The pane on a table of 40 inputs (the symbolic engine's), read from the strict Office.js
// double and examined behind a worker stand-in (pane.ts): the result cards and the typed
// expression check rendered as in the pane.
import { render } from 'preact';
import { describe, expect, it, vi } from 'vitest';
import { ExpressionCheck } from '../../taskpane/check.js';
import { SpecTableView } from '../../taskpane/results.js';
import { CAUSES, TRIP_40 } from '../workflow/workbooks.js';
import { form, mount, paneOn } from './pane.js';

const N = CAUSES.length;
const ids = CAUSES.map((c) => c.replace(' ', '_'));

const paneOnTrip = () => paneOn('Trip', TRIP_40.sheets['Trip']!);

describe('the result card of a 40-input OR trip', () => {
  it('shows the AND/OR form of 40 terms, proven minimum, with its proof over all 2^40 combinations', async () => {
    const { view, table } = await paneOnTrip();
    const el = mount();
    render(<SpecTableView table={table} handOver={view.handOver} />, el);
    const andOr = form(el, 'AND/OR form');
    expect(andOr.querySelector('pre.expr')!.textContent).toBe(ids.join(' OR '));
    expect(andOr.querySelector('.badge')!.textContent).toBe('proven minimum');
    expect(andOr.querySelector('.meta')!.textContent).toBe('sum of products: 40 product terms, 40 literals; proven minimum');
    expect(andOr.querySelector('.proof')!.textContent).toBe('proof: all 1,099,511,627,776 combinations checked, every one agrees with the spec');
  });

  it('says the plain XOR form has 2^40 - 1 terms and is not printed, and prints the best-polarity one of 2 terms', async () => {
    const { view, table } = await paneOnTrip();
    const el = mount();
    render(<SpecTableView table={table} handOver={view.handOver} />, el);
    const xor = form(el, 'XOR form');
    expect(xor.querySelector('pre.expr')).toBeNull();
    expect(xor.querySelector('.not-printed')!.textContent).toBe('1099511627775 terms: not printed (more than 64)');
    expect(xor.querySelector('button')).toBeNull();
    expect(xor.querySelector('.meta')!.textContent).toBe(`algebraic normal form: 1,099,511,627,775 terms, degree ${N}`);
    const best = form(el, 'Best-polarity XOR form');
    expect(best.querySelector('pre.expr')!.textContent).toBe(`TRUE XOR (${ids.map((c) => `NOT ${c}`).join(' AND ')})`);
    expect(best.querySelector('.meta')!.textContent).toMatch(/^2 terms, 40 inputs complemented; /);
    expect(best.querySelector('.proof')!.textContent).toMatch(/^proof: all 1,099,511,627,776 combinations checked/);
  });

  it('lists what the table leaves open and the test steps, one ON step per cause and the OFF step', async () => {
    const { view, table } = await paneOnTrip();
    const el = mount();
    render(<SpecTableView table={table} handOver={view.handOver} />, el);
    const facts = [...el.querySelectorAll('dl.facts dd')].map((d) => d.textContent);
    // Rows each leave 39 causes open: every combination is covered.
    expect(facts).toEqual(['none: every input matters', 'none: every combination is covered by a row', 'none', "the AND/OR form turns on no don't-care combination"]);
    const steps = el.querySelectorAll('.steps-record tbody tr');
    expect(steps).toHaveLength(N + 1);
    expect(el.querySelector('.steps-record summary')!.textContent).toBe('Test steps (41 steps)');
  });
});

describe('a typed expression checked at 40 inputs', () => {
  async function typed(text: string): Promise<HTMLElement> {
    const { engine, table } = await paneOnTrip();
    const el = mount();
    render(<ExpressionCheck table={table} engine={engine} write={undefined} />, el);
    const box = el.querySelector('textarea')!;
    box.value = text;
    box.dispatchEvent(new Event('input', { bubbles: true }));
    await vi.waitFor(() => expect(el.querySelector<HTMLButtonElement>('button[type="submit"]')!.disabled).toBe(false));
    el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
    await vi.waitFor(() => expect(el.querySelector('.verdict, .error')).not.toBeNull(), { timeout: 30_000 });
    return el;
  }

  it('is EQUAL for the OR of every cause, on all 2^40 combinations', async () => {
    const el = await typed(ids.join(' | '));
    expect(el.querySelector('.verdict.equal')!.textContent).toBe('Equal: the expression agrees with the spec on all 1,099,511,627,776 combinations.');
  });

  it('DIFFERS for one cause short of the OR, with the exact counts, the sentence and the counterexample as inputs', async () => {
    const el = await typed(ids.slice(1).join(' OR '));
    const verdict = el.querySelector('.verdict.differs')!;
    expect(verdict.querySelector('p')!.textContent).toBe('Differs on 1 of 1,099,511,627,776 combinations. Counterexamples, unsafe first:');
    // No unsafe combination: the count is not marked.
    expect([...verdict.querySelectorAll('.side-counts .badge')].map((b) => [b.className, b.textContent])).toEqual([
      ['badge', '0 unsafe combinations'],
      ['badge spurious-count', '1 spurious trip'],
    ]);
    expect(verdict.querySelector('.side.spurious')!.textContent).toBe(`spurious trip exactly when ${ids.map((c, i) => `${c} = ${i === 0 ? 1 : 0}`).join(' AND ')}`);
    const rows = [...verdict.querySelectorAll('tbody tr')].map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent));
    expect(rows).toEqual([[...ids.map((_, i) => (i === 0 ? '1' : '0')), '1', '0', 'spurious trip']]);
  });

  it('DIFFERS both ways for an expression that runs with every cause healthy, the unsafe row first and marked', async () => {
    const el = await typed('Cause_1 OR NOT Cause_2');
    const verdict = el.querySelector('.verdict.differs')!;
    // All healthy: ON where the spec requires OFF (1 unsafe); Cause_1 = 0, Cause_2 = 1: OFF where it trips (2^38).
    expect(verdict.querySelector('p')!.textContent).toBe('Differs on 274,877,906,945 of 1,099,511,627,776 combinations. Counterexamples (the first of each kind), unsafe first:');
    expect(verdict.querySelector('.unsafe-count')!.textContent).toBe('1 unsafe combination');
    expect(verdict.querySelector('.spurious-count')!.textContent).toBe('274,877,906,944 spurious trips');
    const first = verdict.querySelector('tbody tr')!;
    expect(first.className).toBe('unsafe');
    expect([...first.querySelectorAll('td')].map((td) => td.textContent)).toEqual([...ids.map(() => '0'), '0', '1', 'unsafe']);
  });
});

describe('the result card of a 64-input table analysed on its rows (no decision diagram in column order)', () => {
  // a1 b1 + ... + a32 b32 with all a's left of all b's.
  const names = [...Array.from({ length: 32 }, (_, i) => `A${i + 1}`), ...Array.from({ length: 32 }, (_, i) => `B${i + 1}`)];
  const rows = [
    [...names.map(() => 'input'), 'output'],
    [...names, 'Run'],
    ...Array.from({ length: 32 }, (_, i) => [...names.map((_, j) => (j === i || j === 32 + i ? 1 : '-')), 1]),
  ];

  it('shows the AND/OR form as a heuristic with its bound and its proof, and says no XOR form was derived', async () => {
    const { view, table } = await paneOn('Pairs', rows);
    const el = mount();
    render(<SpecTableView table={table} handOver={view.handOver} />, el);
    const andOr = form(el, 'AND/OR form');
    expect(andOr.querySelector('.meta')!.textContent).toMatch(/^sum of products: 32 product terms, 64 literals; heuristic/);
    expect(andOr.querySelector('.proof')!.textContent).toBe('proof: all 18,446,744,073,709,551,616 combinations checked, every one agrees with the spec');
    expect(el.querySelector('[data-form="XOR form"]')).toBeNull();
    expect(el.textContent).toContain("XOR forms: not derived: an XOR form is computed from the function's decision diagram");
  });
});
