// The page's "Compare with another workbook…": the sample open (the new revision) against a copy
// with one spec cell flipped (the old one, made here with SheetJS). The page must show the
// changed combination under the kind `compare --json` gives it, with the dangerous direction first.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import XLSX from 'xlsx';
import { runCli } from '../cli/run-cli.js';
import { check, expect, ORIGIN, ROOT, same } from './harness.js';

const SAMPLE = join(ROOT, 'sample-workbooks/capper-cell.xlsx');
const SHEET = 'Spindle';
/** The row that permits the spindle (all guards closed, healthy, not setup, not jog): 0 in the old copy. */
const FLIPPED = 'H7';

interface KindJson {
  count: number;
  cubes: string[];
}

export async function compareChecks(page: Page, work: string): Promise<void> {
  const old = join(work, 'capper-cell-old.xlsx');
  const book = XLSX.read(readFileSync(SAMPLE));
  const cell = book.Sheets[SHEET]![FLIPPED] as XLSX.CellObject;
  cell.v = cell.v === 1 ? 0 : 1;
  writeFileSync(old, XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }) as Buffer);

  await check('comparing with a copy where one spec cell is flipped shows that combination under the kind compare --json gives it', async () => {
    const run = await runCli('compare', old, SAMPLE, '--sheet', SHEET, '--json');
    const doc = JSON.parse(run.out) as { tables: { outputs: ({ name: string } & Record<string, KindJson | null>)[] }[] };
    const changed = doc.tables[0]!.outputs.flatMap((o) =>
      (['nowPermits', 'nowTrips'] as const).flatMap((k) => (o[k] && o[k].count > 0 ? [{ output: o.name, kind: k === 'nowPermits' ? 'now permits' : 'now trips', cubes: o[k].cubes }] : [])),
    );
    expect(changed.length === 1, `compare --json gives ${JSON.stringify(changed)}: one changed kind expected`);

    await page.goto(`${ORIGIN.value}/standalone.html`);
    await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(SAMPLE);
    await page.getByText('Opened capper-cell.xlsx').waitFor({ timeout: 20_000 });
    await page.getByLabel('Sheet').selectOption(SHEET);
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('p.table-verdict').first().waitFor({ timeout: 60_000 });
    await page.locator('input[data-compare="old"]').setInputFiles(old);
    await page.locator('.compare-table').first().waitFor({ timeout: 60_000 });

    const { output, kind, cubes } = changed[0]!;
    const shown = page.locator(`[data-output="${output}"] [data-kind="${kind}"] tbody tr`);
    const rows = (await shown.evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent).join('')))) as string[];
    same(rows, cubes, `combinations under "${kind}" of ${output}`);
    const kinds = await page.locator(`[data-output="${output}"] [data-kind]`).evaluateAll((els) => els.map((e) => e.getAttribute('data-kind')));
    same(kinds, [kind], 'kinds shown');
    if (kind === 'now permits') expect(await page.locator(`[data-kind="now permits"].danger`).count() === 1, '"now permits" is not highlighted');
  });

  await check('the change record and the retest record go to the results workbook as new sheets', async () => {
    await page.getByRole('button', { name: 'Write change record and retest record' }).click();
    const said = (await page.locator('.card[aria-labelledby="compare-title"] .done').textContent({ timeout: 20_000 })) ?? '';
    expect(/Wrote sheet ".+" and sheet ".+"/.test(said), `the pane said: ${said}`);
  });
}
