// Browser checks of a table of 40 inputs on the standalone page (the symbolic engine's): its
// result card shows the forms the engine gives in Node (the plain XOR form counted, not
// printed), and a typed expression is checked at 40 inputs, EQUAL or DIFFERS with the exact
// counts, as `verifyExpression` says in Node. The page stays within a 320 px window.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { analyseTable } from '../../src/analysis/analyse.js';
import { verifyExpression } from '../../src/impl/verify.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { CAUSES, gridOf, TRIP_40, xlsxBytes } from '../workflow/workbooks.js';
import { check, expect, same } from './harness.js';
import { openBook, shot } from './settings-records.js';

export async function wideTableChecks(page: Page, work: string): Promise<void> {
  const path = join(work, TRIP_40.file);
  writeFileSync(path, xlsxBytes(TRIP_40));
  const table = readSpecTables(gridOf('Trip', TRIP_40.sheets['Trip']!)).tables[0]!;
  const trip = analyseTable(table).wide!.outputs[0]!;
  const typed = (text: string) => {
    const parsed = parseExpression(text, table.inputs);
    if (!parsed.ok) throw new Error(parsed.error.message);
    return verifyExpression(table, 0, parsed.value);
  };

  await check('a 40-input table shows its card: AND/OR and best-polarity forms printed, the plain XOR form counted', async () => {
    await openBook(page, path, TRIP_40.file);
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('section.output').first().waitFor({ timeout: 60_000 });
    same(await page.locator('pre.expr').allTextContents(), [trip.andOr.text, trip.bestXor!.text], 'printed forms');
    same(await page.locator('.form[data-form="XOR form"] .not-printed').textContent(), trip.xor!.text, 'the XOR form in words');
    const proofs = await page.locator('p.proof').allTextContents();
    expect(proofs.length === 3 && proofs.every((p) => p.includes('all 1,099,511,627,776 combinations checked')), `proof lines: ${proofs.join(' | ')}`);
  });
  await shot(page, 'section.output', 'wide-card');

  for (const [what, text] of [
    ['the OR of every cause is EQUAL', CAUSES.map((c) => c.replace(' ', '_')).join(' OR ')],
    ['an expression wrong both ways DIFFERS with both exact counts', 'Cause_1 OR NOT Cause_2'],
  ] as const) {
    await check(`a typed expression at 40 inputs: ${what}, as in Node`, async () => {
      const want = typed(text);
      await page.getByLabel('Expression').fill(text);
      await page.getByRole('button', { name: 'Check against the spec' }).click();
      const verdict = page.locator(want.status === 'equal' ? '.verdict.equal' : '.verdict.differs');
      await verdict.waitFor({ timeout: 30_000 });
      const head = (await verdict.textContent()) ?? '';
      const counts = want.status === 'equal' ? `all ${want.combinations.toLocaleString('en')} combinations` : `Differs on ${want.mismatchCount.toLocaleString('en')} of ${want.combinations.toLocaleString('en')}`;
      expect(head.includes(counts), `verdict: ${head}`);
      if (want.status === 'differs') {
        same(await verdict.locator('tbody tr').count(), want.counterexamples.length, 'counterexample rows');
        same(await verdict.locator('tbody tr.unsafe').count(), want.counterexamples.filter((c) => c.kind === 'unsafe').length, 'unsafe rows marked');
      }
    });
  }
  await shot(page, 'section[aria-labelledby="check-title"]', 'wide-check');
}
