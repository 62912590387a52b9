// Browser checks of the settings card, the test-record check and a wide ladder picture on the
// standalone page. Expected results are computed here, in Node, by the same engine and the
// same workflow the page runs (the CLI's `record` for the records).
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import XLSX from 'xlsx';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { SpecOptions } from '../../src/table/types.js';
import { runCli } from '../cli/run-cli.js';
import { gridOf, GOOD, xlsxBytes, type Rows, type TestWorkbook } from '../workflow/workbooks.js';
import { check, expect, ORIGIN, same, SHOTS } from './harness.js';

/** No role row, no separator column: only the count of inputs decides. A don't-care output row and a gap (1 0 1). Invented data. */
const UNDECIDED: TestWorkbook = {
  name: 'undecided roles',
  file: 'undecided.xlsx',
  sheets: {
    Permit: [
      ['Guard A closed', 'Guard B closed', 'Reset held', 'Permit'],
      [1, 1, 0, 1],
      [1, 1, 1, '-'],
      [0, '-', '-', 0],
      [1, 0, 0, 0],
    ],
  },
};

const LONG_HEADERS = ['Guard door A closed', 'Guard door B closed', 'Light curtain clear', 'Two-hand station released', 'Air pressure healthy', 'Mode selector in AUTO', 'Emergency stop circuit healthy'];

/** Seven inputs, all needed at once: one product term of seven literals. Invented data. */
const SEVEN_IN_ONE_TERM: TestWorkbook = {
  name: 'seven inputs in one term',
  file: 'seven.xlsx',
  sheets: {
    Spindle: [
      [...LONG_HEADERS.map(() => 'input'), 'output'],
      [...LONG_HEADERS, 'Spindle run permit'],
      [...LONG_HEADERS.map(() => 1), 1],
      ...LONG_HEADERS.map((_, i) => [...LONG_HEADERS.map((__, j) => (i === j ? 0 : '-')), 0]),
    ] as Rows,
  },
};

/** The three forms of every output, as the engine in Node gives them for these options. */
function formsInNode(book: TestWorkbook, sheet: string, options: SpecOptions): string[] {
  const read = readSpecTables(gridOf(sheet, book.sheets[sheet]!), { xReading: 'none', ...options });
  return read.tables.flatMap((t) => analyseTable(t).outputs.flatMap((o) => [o.andOr.text, o.xor.text, o.bestXor.text]));
}

export async function openBook(page: Page, path: string, fileName: string): Promise<void> {
  await page.goto(`${ORIGIN.value}/standalone.html`);
  await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(path);
  await page.getByText(`Opened ${fileName}`).waitFor({ timeout: 20_000 });
}

/** Waits until the page shows exactly these forms (the read after a change runs in the worker). */
async function formsBecome(page: Page, want: string[], what: string): Promise<void> {
  let got: string[] = [];
  for (let i = 0; i < 300; i++) {
    got = await page.locator('pre.expr').allTextContents();
    if (JSON.stringify(got) === JSON.stringify(want)) return;
    await page.waitForTimeout(100);
  }
  same(got, want, what);
}

export async function settingsChecks(page: Page, work: string): Promise<void> {
  const path = join(work, UNDECIDED.file);
  writeFileSync(path, xlsxBytes(UNDECIDED));
  const steps: { what: string; options: SpecOptions }[] = [
    { what: 'inputs 3', options: { inputCount: 3 } },
    { what: "inputs 3, don't-cares at the safe value", options: { inputCount: 3, dontCares: 'safe' } },
    { what: "inputs 3, don't-cares at the safe value, safe value 1", options: { inputCount: 3, dontCares: 'safe', safeValues: { Permit: 1 } } },
  ];
  const want = steps.map((s) => formsInNode(UNDECIDED, 'Permit', s.options));
  await check('the test data: each setting changes the forms the engine derives', async () => {
    same(new Set(want.map((w) => JSON.stringify(w))).size, steps.length, 'distinct forms per setting');
  });

  await check('a table no rule decides asks for the count of inputs by the label of its control on the page', async () => {
    await openBook(page, path, UNDECIDED.file);
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    const problem = page.locator('li.problem.error').filter({ hasText: 'Inputs: the first N columns' });
    await problem.first().waitFor({ timeout: 30_000 });
    const text = (await problem.first().textContent()) ?? '';
    expect(!text.includes('--inputs'), `the page names a command-line option: ${text}`);
    expect((await page.locator('section.output').count()) === 0, 'forms shown for a table whose roles are unknown');
  });

  await check('setting the count of inputs on the page reads the table with that many inputs', async () => {
    await page.getByRole('spinbutton', { name: /Inputs: the first N columns/ }).fill('3');
    await page.getByRole('button', { name: 'Apply' }).click();
    await formsBecome(page, want[0]!, steps[0]!.what);
  });

  await check("choosing 'Don't-cares: safe value' changes the result to the engine's under that policy", async () => {
    await page.getByLabel("Don't-cares").selectOption('safe');
    await formsBecome(page, want[1]!, steps[1]!.what);
  });

  await check('the safe value of an output set on the page changes the result to the engine’s with that safe value', async () => {
    await page.getByLabel('Safe value of Permit').selectOption('1');
    await formsBecome(page, want[2]!, steps[2]!.what);
  });

  await check('the settings are remembered while the page stays open: reading the sheet again uses them', async () => {
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await formsBecome(page, want[2]!, 'read again');
    same(await page.getByRole('spinbutton', { name: /Inputs: the first N columns/ }).inputValue(), '3', 'count of inputs shown');
  });
  await shot(page, 'section.settings', 'settings-card');
  await sideBySideChecks(page, work);
}

/**
 * Two tables side by side, two empty columns apart, each with its role row. The left one has
 * gaps (its safe value decides them), the right one a don't-care (its policy decides it). Invented data.
 */
const SIDE_BY_SIDE: TestWorkbook = {
  name: 'two tables side by side',
  file: 'side-by-side.xlsx',
  sheets: {
    Press: [
      ['input', 'input', 'output', '', '', 'input', 'input', 'output'],
      ['Guard closed', 'Two-hand OK', 'Stroke permit', '', '', 'Air OK', 'Lube OK', 'Pump permit'],
      [1, 1, 1, '', '', 1, 1, 1],
      [0, 0, 0, '', '', 0, '-', 0],
      ['', '', '', '', '', 1, 0, '-'],
    ],
  },
};

async function sideBySideChecks(page: Page, work: string): Promise<void> {
  const path = join(work, SIDE_BY_SIDE.file);
  writeFileSync(path, xlsxBytes(SIDE_BY_SIDE));
  type Side = { readonly range: string; readonly own: SpecOptions; readonly other: SpecOptions };
  const left: Side = { range: 'A1:C4', own: { safeValues: { Stroke_permit: 1 } }, other: { dontCares: 'safe' } };
  const right: Side = { range: 'F1:H5', own: { dontCares: 'safe' }, other: { safeValues: { Pump_permit: 1 } } };
  const forms = (t: Side, options: SpecOptions) => formsInNode(SIDE_BY_SIDE, 'Press', { ...options, range: t.range });
  await check('the test data: each table\'s own setting changes its forms, the other table\'s does not', async () => {
    for (const t of [left, right]) {
      expect(JSON.stringify(forms(t, t.own)) !== JSON.stringify(forms(t, {})), `${t.range}: its own setting changes nothing`);
      same(forms(t, t.other), forms(t, {}), `${t.range} under the other table's setting`);
    }
  });

  await check('a sheet with two tables side by side shows a settings card for each table', async () => {
    await openBook(page, path, SIDE_BY_SIDE.file);
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('section.settings').nth(1).waitFor({ timeout: 30_000 });
    same(await page.locator('section.settings h2').allTextContents(), ['Settings for the table at Press!A1:C4', 'Settings for the table at Press!F1:H5'], 'card headings');
  });

  const card = (t: Side) => page.locator('section.settings').filter({ hasText: `Press!${t.range}` });
  const showTable = async (index: number) => page.getByLabel('Spec table').selectOption({ index });

  await check('a safe value set on the left table\'s card and a policy set on the right one\'s give each table the engine\'s forms under its own settings', async () => {
    await card(left).getByLabel('Safe value of Stroke_permit').selectOption('1');
    await formsBecome(page, forms(left, left.own), 'left table, safe value 1');
    await card(right).getByLabel("Don't-cares").selectOption('safe');
    await showTable(1);
    await formsBecome(page, forms(right, right.own), "right table, don't-cares at the safe value");
    await showTable(0);
    await formsBecome(page, forms(left, left.own), 'left table, still safe value 1 and minimal');
    same(await card(left).getByLabel("Don't-cares").inputValue(), 'minimal', "the left card's policy");
    same(await card(right).getByLabel('Safe value of Pump_permit').inputValue(), '0', "the right card's safe value");
  });

  await check('each table\'s settings are remembered while the page stays open: reading the sheet again uses them', async () => {
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await formsBecome(page, forms(left, left.own), 'left table read again');
    await showTable(1);
    await formsBecome(page, forms(right, right.own), 'right table read again');
  });
  await shot(page, 'main', 'settings-two-tables');
}

/** The record sheets of a results workbook (first cell "Commissioning test record: ..."). */
function recordSheets(book: XLSX.WorkBook): string[] {
  return book.SheetNames.filter((n) => String(book.Sheets[n]!['A1']?.v ?? '').startsWith('Commissioning test record:'));
}

/** A copy of the results workbook with each record's Pass/Fail cells filled by `word`, and `edit` applied. */
function filled(results: string, out: string, word: (sheet: string, step: number) => string, edit: (book: XLSX.WorkBook) => void = () => {}): string {
  const book = XLSX.read(readFileSync(results), { type: 'buffer' });
  for (const name of recordSheets(book)) {
    const ws = book.Sheets[name]!;
    const rows = XLSX.utils.sheet_to_json<unknown[]>(ws, { header: 1, defval: '', blankrows: true });
    const header = rows.findIndex((r) => r[0] === 'Step' && r[1] === 'Test ID');
    const col = rows[header]!.indexOf('Pass/Fail');
    rows.slice(header + 1).forEach((r, i) => {
      if (typeof r[0] === 'number') ws[XLSX.utils.encode_cell({ r: header + 1 + i, c: col })] = { t: 's', v: word(name, i) };
    });
  }
  edit(book);
  XLSX.writeFile(book, out);
  return out;
}

interface RecordLine {
  sheet: string;
  state: string;
  counts: string;
}

async function recordsOnPage(page: Page, path: string, fileName: string): Promise<RecordLine[]> {
  await openBook(page, path, fileName);
  await page.getByRole('button', { name: 'Check a filled-in test record' }).click();
  await page.locator('article.record').first().waitFor({ timeout: 60_000 });
  return page.locator('article.record').evaluateAll((els) =>
    els.map((e) => ({
      sheet: (e.getAttribute('aria-label') ?? '').replace(/^Test record /, ''),
      state: e.querySelector('.record-state .badge')?.textContent ?? '',
      counts: e.querySelector('.record-counts')?.textContent ?? '',
    })),
  );
}

interface RecordDoc {
  records: { sheet: string; current: boolean; passed: number; failed: number; notRun: number; steps: unknown[] }[];
}

async function recordsOfCli(path: string): Promise<RecordLine[]> {
  const doc = JSON.parse((await runCli('record', path, '--json')).out) as RecordDoc;
  return doc.records.map((r) => ({
    sheet: r.sheet,
    state: r.current ? 'current' : 'stale',
    counts: `${r.passed} passed, ${r.failed} failed, ${r.notRun} not run, of ${r.steps.length} steps`,
  }));
}

export async function recordChecks(page: Page, work: string): Promise<void> {
  const source = join(work, `records-${GOOD.file}`);
  writeFileSync(source, xlsxBytes(GOOD));
  const results = join(work, 'records-results.xlsx');
  const made = await runCli('analyze', source, '-o', results);
  const cases: { name: string; file: string; state: string[]; failed: boolean }[] = [];
  await check('the test data: analyze -o writes a test record per table', async () => {
    same(made.code, 0, 'exit status of analyze');
    const book = XLSX.read(readFileSync(results), { type: 'buffer' });
    const records = recordSheets(book);
    same(records.length, Object.keys(GOOD.sheets).length, 'record sheets');
    cases.push(
      { name: 'every step passed', file: filled(results, join(work, 'passed.xlsx'), () => 'Pass'), state: ['current', 'current'], failed: false },
      { name: 'a step failed', file: filled(results, join(work, 'failed.xlsx'), (sheet, i) => (sheet === records[0] && i === 0 ? 'Fail' : 'Pass')), state: ['current', 'current'], failed: true },
      {
        name: 'the table changed since (stale)',
        // Cell!D3: the first row's output 1 -> 0.
        file: filled(results, join(work, 'stale.xlsx'), () => 'Pass', (b) => void (b.Sheets['Cell']!['D3'] = { t: 'n', v: 0 })),
        state: ['stale', 'current'],
        failed: false,
      },
    );
  });
  for (const c of cases) {
    await check(`the record check on a filled record, ${c.name}: the page shows what the command line's record says`, async () => {
      const cli = await recordsOfCli(c.file);
      const shown = await recordsOnPage(page, c.file, c.file.split('/').pop()!);
      same(shown, cli, 'records');
      same(shown.map((r) => r.state), c.state, 'current / stale');
      expect(shown.some((r) => / [1-9]\d* failed/.test(r.counts)) === c.failed, `counts: ${shown.map((r) => r.counts).join(' | ')}`);
      if (c.failed) expect((await page.locator('article.record .badge.bad', { hasText: 'failed' }).count()) === 1, 'one step shown failed');
    });
  }
  await shot(page, 'section.records', 'record-check');
}

/** A screenshot of one part of the page at 320 and 800 px wide. */
export async function shot(page: Page, selector: string, name: string): Promise<void> {
  await check(`screenshots of the ${name} at 320 px and 800 px wide`, async () => {
    for (const width of [320, 800]) {
      await page.setViewportSize({ width, height: 1000 });
      await page.waitForTimeout(200);
      // The caution footer sticks to the window's bottom and would cover the part shot (an
      // inline style would be refused by the page's policy: the attribute hides it instead).
      await page.evaluate("document.querySelector('footer.caution').hidden = true");
      await page.locator(selector).first().screenshot({ path: join(SHOTS, `${name}-${width}.png`) });
      await page.evaluate("document.querySelector('footer.caution').hidden = false");
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      expect(overflow <= 0, `the page is ${overflow} px wider than the ${width} px window`);
    }
    await page.setViewportSize({ width: 800, height: 1000 });
  });
}

export async function wideLadderChecks(page: Page, work: string): Promise<void> {
  const path = join(work, SEVEN_IN_ONE_TERM.file);
  writeFileSync(path, xlsxBytes(SEVEN_IN_ONE_TERM));
  await check('a rung of seven contacts in one term wraps, and scrolls sideways in a 320 px pane without widening the page', async () => {
    same(formsInNode(SEVEN_IN_ONE_TERM, 'Spindle', {})[0]!.split(' AND ').length, 7, 'literals of the AND/OR form');
    await openBook(page, path, SEVEN_IN_ONE_TERM.file);
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    const ladder = page.locator('details.ladder').first();
    await ladder.waitFor({ timeout: 60_000 });
    await ladder.locator('summary').click();
    const img = ladder.locator('img');
    await img.waitFor({ timeout: 10_000 });
    await page.waitForFunction(() => (document.querySelector('details.ladder img') as HTMLImageElement | null)?.complete === true);
    await page.setViewportSize({ width: 320, height: 1000 });
    await page.waitForTimeout(200);
    const box = await page.locator('.ladder-picture').evaluate((e) => ({ scroll: e.scrollWidth, client: e.clientWidth, img: (e.querySelector('img') as HTMLImageElement).naturalWidth }));
    expect(box.scroll > box.client, `the picture (${box.img} px) does not scroll in its ${box.client} px box`);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow <= 0, `the page is ${overflow} px wider than the 320 px window`);
    await page.setViewportSize({ width: 800, height: 1000 });
  });
  await shot(page, 'section.output', 'ladder-wrapped');

  await check('printing one output shows its forms, proof, ladder picture, test steps and the caution, without controls', async () => {
    const card = page.locator('section.output').first();
    await card.evaluate((el) => {
      // What "Print this output" does before window.print(), which a headless browser does not show.
      for (const d of [...el.querySelectorAll('details'), ...document.querySelectorAll('footer.caution details')]) (d as HTMLDetailsElement).open = true;
      el.classList.add('print-this');
      document.body.classList.add('print-one');
    });
    await page.emulateMedia({ media: 'print' });
    // A4 at 96 px per inch, less the page margins.
    await page.setViewportSize({ width: 700, height: 1000 });
    await page.waitForTimeout(200);
    try {
      const kinds = { outputs: 'section.output', forms: 'pre.expr', proofs: 'p.proof', ladder: '.ladder img', steps: '.steps-record table', buttons: 'button', sources: 'section[aria-labelledby="source-title"]', caution: 'footer.caution p' };
      const visible: Record<string, number> = {};
      // A plain expression per kind (a function passed here would carry tsx's name helper).
      for (const [kind, sel] of Object.entries(kinds))
        visible[kind] = await page.evaluate(`[...document.querySelectorAll(${JSON.stringify(sel)})].filter((e) => e.getClientRects().length > 0).length`);
      same(visible, { outputs: 1, forms: 3, proofs: 3, ladder: 1, steps: 1, buttons: 0, sources: 0, caution: 1 }, 'what prints');
      await page.screenshot({ path: join(SHOTS, 'print-one-output.png'), fullPage: true });
    } finally {
      await page.evaluate("document.body.classList.remove('print-one'); document.querySelectorAll('.print-this').forEach((e) => e.classList.remove('print-this'))");
      await page.emulateMedia({ media: 'screen' });
      await page.setViewportSize({ width: 800, height: 1000 });
    }
  });
}
