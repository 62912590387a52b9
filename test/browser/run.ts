// Browser tests (`npm run test:browser`): build the pages with webpack (production), serve them
// from a tiny static server on 127.0.0.1, and drive Debian's chromium with playwright-core.
// Needs /usr/bin/chromium (apt-get install chromium); does not skip without it, it fails.
// Expected results are computed here, in Node, by the same engine the page runs in its worker.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { extname, join, normalize } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import XLSX from 'xlsx';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { verifyExpression } from '../../src/impl/verify.js';
import { openFile } from '../../src/hosts/file-host.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import { checkSheet } from '../../src/report/check-sheet.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';
import { exportSt } from '../../src/report/st-export.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { TableAnalysis } from '../../src/analysis/analysis-types.js';
import { cliOutcome, WORKBOOKS, xlsxBytes, xlsxSheets, type Outcome } from '../workflow/workbooks.js';
import { check, expect, ORIGIN, results, ROOT, same, SHOTS } from './harness.js';
import { compareChecks } from './compare.js';
import { mappingChecks } from './mapping.js';
import { recordChecks, settingsChecks, wideLadderChecks } from './settings-records.js';
import { wideTableChecks } from './wide.js';

const SAMPLE = join(ROOT, 'sample-workbooks/capper-cell.xlsx');
const CHROMIUM = '/usr/bin/chromium';

/**
 * Outside Office, office.js takes the Office 2013 path (o15apptofilemappingtable.js) and after
 * 3 s adds a hidden frame to its telemetry service (ULSEndpointProxy in that file). The page's
 * Content-Security-Policy refuses the frame and its inline style; Chromium logs both refusals.
 * They are the policy working, so they are the only console errors allowed, on the pane only.
 */
const OFFICE_TELEMETRY_REFUSED = [
  /^taskpane console: Framing 'https:\/\/telemetryservice\.firstpartyapps\.oaspapps\.com\/' violates the following Content Security Policy directive/,
  /^taskpane console: Applying inline style violates the following Content Security Policy directive 'style-src 'self''/,
];

function build(out: string): void {
  const r = spawnSync('npm', ['run', 'build'], { cwd: ROOT, env: { ...process.env, IA_OUT_DIR: out }, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`webpack failed:\n${r.stdout}\n${r.stderr}`);
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
  '.xml': 'application/xml',
  '.json': 'application/json',
};

/** Serves `dir` read-only; remembers every path asked for and what it answered. */
function serve(dir: string): Promise<{ server: Server; origin: string; log: { path: string; status: number }[] }> {
  const log: { path: string; status: number }[] = [];
  const server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    const file = normalize(join(dir, path));
    const inside = file.startsWith(dir) && existsSync(file) && statSync(file).isFile();
    const status = inside ? 200 : 404;
    log.push({ path, status });
    if (!inside) {
      res.writeHead(404).end('not found');
      return;
    }
    res.writeHead(200, { 'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream', 'Cache-Control': 'no-store' });
    res.end(readFileSync(file));
  });
  return new Promise((done) =>
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      const port = typeof address === 'object' && address ? address.port : 0;
      done({ server, origin: `http://127.0.0.1:${port}`, log });
    }),
  );
}

/** What the engine makes of the sample workbook, in Node (file host + spec reader + analysis). */
async function expected(sheet: string): Promise<TableAnalysis[]> {
  const host = await openFile(SAMPLE);
  if (!host.ok) throw new Error(host.error.message);
  const read = readSpecTables(await host.value.readGrid(sheet));
  return read.tables.map((t) => analyseTable(t));
}

async function main(): Promise<number> {
  if (!existsSync(CHROMIUM)) {
    console.log(`${CHROMIUM} is missing: install Debian's chromium (apt-get install -y chromium).`);
    console.log('0 passed, 1 failed');
    return 1;
  }
  if (!existsSync(SAMPLE)) {
    console.log(`${SAMPLE} is missing: run npm run samples.`);
    console.log('0 passed, 1 failed');
    return 1;
  }
  mkdirSync(SHOTS, { recursive: true });
  const work = mkdtempSync(join(tmpdir(), 'ia-browser-'));
  const dist = join(work, 'dist');
  console.log('building the pages (webpack, production) ...');
  build(dist);
  const { server, origin, log } = await serve(dist);
  const foreign: string[] = [];
  const pageErrors: string[] = [];
  let context: BrowserContext | undefined;
  try {
    context = await chromium.launchPersistentContext(join(work, 'profile'), {
      executablePath: CHROMIUM,
      headless: true,
      acceptDownloads: true,
      viewport: { width: 800, height: 1000 },
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-quic'],
    });
    // Every request of the pages and their workers: anything not from our origin is refused and noted.
    await context.route('**/*', (route) => {
      const url = route.request().url();
      if (url.startsWith(`${origin}/`) || url.startsWith('blob:') || url.startsWith('data:')) return route.continue();
      foreign.push(url);
      return route.abort();
    });
    context.on('request', (r) => {
      const url = r.url();
      if (!url.startsWith(`${origin}/`) && !url.startsWith('blob:') && !url.startsWith('data:')) foreign.push(url);
    });
    const page = context.pages()[0] ?? (await context.newPage());
    page.on('pageerror', (e) => pageErrors.push(`standalone: ${e.message}`));
    page.on('console', (m) => {
      if (m.type() === 'error') pageErrors.push(`standalone console: ${m.text()}`);
    });
    await standaloneChecks(page, origin, work);
    ORIGIN.value = origin;
    await workflowChecks(page, work);
    await screenshots(page, 'standalone-not-analysed');
    await settingsChecks(page, work);
    await recordChecks(page, work);
    await wideLadderChecks(page, work);
    await wideTableChecks(page, work);
    await compareChecks(page, work);
    await mappingChecks(page, work);
    await taskpaneChecks(context, origin, pageErrors);
    await check('no request left the page’s own origin', async () => {
      same(foreign, [], 'requests to other origins');
      expect(log.length > 10, `the server saw only ${log.length} requests`);
    });
    await check('no script error or console error on either page, but our policy refusing office.js telemetry', async () => {
      same(pageErrors.filter((e) => !OFFICE_TELEMETRY_REFUSED.some((known) => known.test(e))), [], 'errors');
    });
  } finally {
    await context?.close();
    server.close();
    rmSync(work, { recursive: true, force: true });
  }
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed;
  console.log(`screenshots in ${SHOTS}`);
  console.log(`${passed} passed, ${failed} failed`);
  return failed === 0 ? 0 : 1;
}

async function standaloneChecks(page: Page, origin: string, work: string): Promise<void> {
  const spindle = await expected('Spindle');
  let shown = false;
  await check('the standalone page opens the sample workbook and lists its sheets', async () => {
    await page.goto(`${origin}/standalone.html`);
    await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(SAMPLE);
    await page.getByText('Opened capper-cell.xlsx').waitFor({ timeout: 20_000 });
    const sheets = await page.getByLabel('Sheet').locator('option').allTextContents();
    expect(sheets.includes('Spindle') && sheets.includes('Channels'), `sheets listed: ${sheets.join(', ')}`);
  });

  await check('deriving shows the forms the engine computes, for every table of the sheet', async () => {
    await page.getByLabel('Sheet').selectOption('Spindle');
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('section.output').first().waitFor({ timeout: 60_000 });
    const options = await page.getByLabel('Spec table').locator('option').count();
    same(options, spindle.length, 'spec tables offered');
    for (let t = 0; t < spindle.length; t++) {
      await page.getByLabel('Spec table').selectOption(String(t));
      const want = spindle[t]!.outputs.flatMap((o) => [o.andOr.text, o.xor.text, o.bestXor.text]);
      const got = await page.locator('pre.expr').allTextContents();
      same(got, want, `forms of table ${t + 1}`);
      const proofs = await page.locator('p.proof').allTextContents();
      expect(proofs.every((p) => p.includes('every one agrees')), `proof lines: ${proofs.join(' | ')}`);
    }
    shown = true;
  });

  await check('the 2-out-of-3 air vote gives three two-literal terms and a three-term XOR form (majority function)', async () => {
    // Majority of three: sum of products ab + ac + bc, algebraic normal form ab ⊕ ac ⊕ bc
    // (a standard identity of Boolean algebra, from memory).
    const vote = spindle.findIndex((a) => a.inputs.length === 3);
    expect(vote >= 0, 'no three-input table on the Spindle sheet');
    await page.getByLabel('Spec table').selectOption(String(vote));
    const meta = await page.locator('.form[data-form="AND/OR form"] p.meta').first().textContent();
    expect(meta?.includes('3 product terms, 6 literals') === true, `AND/OR form: ${meta}`);
    const xorText = await page.locator('.form[data-form="XOR form"] pre.expr').first().textContent();
    same((xorText ?? '').split(' XOR ').length, 3, `XOR form ${xorText}: terms`);
  });

  const permit = spindle.findIndex((a) => a.inputs.length === 7);
  let checkBlock: SheetBlock | undefined;
  await check('an implementation check of a wrong expression shows its counterexamples', async () => {
    expect(shown && permit >= 0, 'no results to check against');
    await page.getByLabel('Spec table').selectOption(String(permit));
    const analysis = spindle[permit]!;
    const wrong = `${analysis.inputs[3]!.identifier} AND ${analysis.inputs[4]!.identifier}`;
    await page.getByLabel('Expression').fill(wrong);
    await page.getByRole('button', { name: 'Check against the spec' }).click();
    const verdict = page.locator('.verdict.differs');
    await verdict.waitFor({ timeout: 30_000 });
    const parsed = parseExpression(wrong, analysis.inputs);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const want = verifyExpression(analysis.table, 0, parsed.value);
    const head = await verdict.locator('p').first().textContent();
    expect(head?.startsWith(`Differs on ${want.mismatchCount} of ${want.combinations} combinations`) === true, `verdict: ${head}`);
    const rows = await verdict.locator('tbody tr').evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent)));
    const word = { unsafe: 'unsafe', 'spurious-trip': 'spurious trip' } as const;
    const wantRows = want.counterexamples.map((c) => [...c.inputs.map(String), String(c.expected), String(c.actual), word[c.kind]]);
    same(rows, wantRows, 'counterexample rows, unsafe first');
    same(await verdict.locator('tbody tr.unsafe').count(), want.counterexamples.filter((c) => c.kind === 'unsafe').length, 'unsafe rows marked');
    same(await verdict.locator('.unsafe-count').textContent(), `${want.unsafeCount} unsafe combination${want.unsafeCount === 1 ? '' : 's'}`, 'unsafe count');
    checkBlock = checkSheet({ kind: 'expression', table: analysis.table, expression: wrong, verdict: want });
  });

  await check('the counterexamples are written to a new sheet of the results workbook, which says so', async () => {
    expect(checkBlock !== undefined, 'no check to write');
    await page.getByRole('button', { name: 'Write counterexamples to a new sheet' }).click();
    const said = await page.locator('p.done').filter({ hasText: 'to the results workbook' }).first().textContent({ timeout: 10_000 });
    expect(said?.includes(`sheet "${checkBlock!.name}"`) === true, `message: ${said}`);
  });

  await check('the ladder picture of an output shows as an image', async () => {
    const ladder = page.locator('details.ladder').first();
    await ladder.locator('summary').click();
    const img = ladder.locator('img');
    await img.waitFor({ timeout: 10_000 });
    const size = await img.evaluate((i: HTMLImageElement) => (i.complete ? i.naturalWidth : 0));
    expect(size > 0, 'the ladder picture did not load');
  });

  await check('a bad expression is answered with the position of the error', async () => {
    await page.getByLabel('Expression').fill('Guard_door_A_closed AND (');
    await page.getByRole('button', { name: 'Check against the spec' }).click();
    await page.locator('pre.caret').waitFor({ timeout: 10_000 });
  });

  await screenshots(page, 'standalone');

  await check('the results workbook downloads and reads back with the results sheets and the check sheet after the user’s own', async () => {
    const [file] = await Promise.all([
      page.waitForEvent('download', { timeout: 30_000 }),
      page.getByRole('button', { name: 'Download results workbook' }).click(),
    ]);
    same(file.suggestedFilename(), 'capper-cell-results.xlsx', 'file name');
    const path = join(work, 'results.xlsx');
    await file.saveAs(path);
    const book = XLSX.read(readFileSync(path), { type: 'buffer', cellFormula: true });
    const source = XLSX.read(readFileSync(SAMPLE), { type: 'buffer' });
    same(book.SheetNames.slice(0, source.SheetNames.length), source.SheetNames, 'the user’s sheets first, unchanged in order');
    const added = book.SheetNames.slice(source.SheetNames.length).filter((name) => name !== checkBlock?.name);
    same(added.length, 3 * spindle.length, 'a results sheet, its live check and a test record per table');
    const text = (name: string) =>
      Object.entries(book.Sheets[name]!)
        .filter(([k]) => !k.startsWith('!'))
        .map(([, c]) => String((c as XLSX.CellObject).v ?? ''));
    // The live check is written before the results sheet that counts its DIFFERS.
    const resultsName = added.find((n) => n.endsWith(' results'))!;
    const liveName = added.find((n) => n.endsWith(' live check'))!;
    const first = text(resultsName);
    expect(first.includes(CAUTION_LINES[0]!), 'the caution is on the results sheet');
    expect(first.some((v) => v.includes(spindle[0]!.outputs[0]!.andOr.text)), 'the AND/OR form is on the results sheet');
    const formulas = Object.values(book.Sheets[liveName]!).filter((c) => typeof c === 'object' && c !== null && 'f' in c).length;
    expect(formulas > 0, 'the live check sheet has live formulas');
    const summary = Object.values(book.Sheets[resultsName]!).find((c) => typeof c === 'object' && c !== null && String((c as XLSX.CellObject).f ?? '').startsWith('COUNTIF('));
    expect(String((summary as XLSX.CellObject | undefined)?.f).startsWith(`COUNTIF('${liveName.replace(/'/g, "''")}'!`), `the results sheet's summary counts on ${liveName}`);
    const userCells = (s: XLSX.WorkSheet) => XLSX.utils.sheet_to_json(s, { header: 1, raw: true, defval: null });
    same(userCells(book.Sheets['Spindle']!), userCells(source.Sheets['Spindle']!), 'the Spindle sheet is unchanged');
    // The check sheet written earlier, cell for cell as the engine builds it in Node.
    expect(checkBlock !== undefined && book.SheetNames.includes(checkBlock.name), `no sheet ${checkBlock?.name} among ${book.SheetNames.join(', ')}`);
    const filled = (rows: readonly (readonly unknown[])[]) =>
      rows
        .map((r) => {
          const cells = r.map((v) => v ?? null);
          while (cells.length > 0 && cells[cells.length - 1] === null) cells.pop();
          return cells;
        })
        .filter((r) => r.length > 0);
    const written = userCells(book.Sheets[checkBlock!.name]!) as unknown[][];
    same(filled(written), filled(checkBlock!.rows.map((r) => r.map((c) => c?.value ?? null))), 'the check sheet');
  });

  await check('a program file written from the derived forms checks equal for every output', async () => {
    const path = join(work, 'from-forms.st');
    writeFileSync(path, exportSt(spindle, { source: { workbook: 'capper-cell.xlsx' } }));
    await page.locator('input[type=file][accept*=".st"]').setInputFiles(path);
    await page.locator('ul.verdicts li').first().waitFor({ timeout: 30_000 });
    const lines = await page.locator('ul.verdicts li').allTextContents();
    same(lines.length, spindle.reduce((n, a) => n + a.outputs.length, 0), 'one verdict per output');
    expect(lines.every((l) => l.includes(': EQUAL')), `verdicts: ${lines.join(' | ')}`);
  });

  await check('the Structured Text hand-over downloads with the caution in its header', async () => {
    const [file] = await Promise.all([
      page.waitForEvent('download', { timeout: 30_000 }),
      page.getByRole('button', { name: 'Structured Text (.st)', exact: true }).click(),
    ]);
    const path = join(work, 'interlocks.st');
    await file.saveAs(path);
    const st = readFileSync(path, 'utf8');
    expect(st.includes(CAUTION_LINES[0]!), 'caution in the ST file');
    expect(st.includes('FUNCTION_BLOCK'), 'a FUNCTION_BLOCK in the ST file');
  });

  await check('a CSV file is read in the page\'s worker: the sample analyses, a row of 2 million separators is an error', async () => {
    await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(join(ROOT, 'sample-workbooks/spindle-permit.csv'));
    await page.getByText('Opened spindle-permit.csv').waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('section.output').first().waitFor({ timeout: 60_000 });
    const wide = join(work, 'wide.csv');
    writeFileSync(wide, `${';'.repeat(2_000_000)}\n`);
    await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(wide);
    await page.getByText('has 2,000,001 columns; at most 16,384').waitFor({ timeout: 20_000 });
  });
}

/** What the page shows and does with one sheet of a workbook, as the command line's Outcome. */
async function pageOutcome(page: Page, path: string, fileName: string, sheet: string, sourceSheets: number, work: string): Promise<Outcome> {
  await page.goto(`${ORIGIN.value}/standalone.html`);
  await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(path);
  await page.getByText(`Opened ${fileName}`).waitFor({ timeout: 20_000 });
  await page.getByLabel('Sheet').selectOption(sheet);
  await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
  await page.locator('p.table-verdict').first().waitFor({ timeout: 60_000 });
  const picker = page.getByLabel('Spec table');
  const tables = (await picker.count()) > 0 ? await picker.locator('option').count() : 1;
  const verdicts: string[][] = [];
  for (let t = 0; t < tables; t++) {
    if (tables > 1) await picker.selectOption(String(t));
    const table = (await page.locator('p.table-verdict .badge').textContent()) ?? '';
    const outputs = await page.locator('.form[data-form="AND/OR form"] .badge').allTextContents();
    const proofs = await page.locator('p.proof').count();
    if (table.startsWith('not analysed')) {
      expect(outputs.length === 0 && proofs === 0, `a table ${table} shows ${outputs.length} form badges and ${proofs} proof lines`);
      const n = (await page.locator('table.signals td:nth-child(2)').allTextContents()).filter((r) => r === 'output').length;
      verdicts.push([table, ...Array.from({ length: n }, () => table)]);
    } else verdicts.push([table, ...outputs]);
  }
  const handedOver = await page.getByRole('button', { name: 'Structured Text (.st)', exact: true }).isEnabled();
  const [file] = await Promise.all([
    page.waitForEvent('download', { timeout: 30_000 }),
    page.getByRole('button', { name: 'Download results workbook' }).click(),
  ]);
  const saved = join(work, `page-${fileName}`);
  await file.saveAs(saved);
  return { verdicts, sheets: xlsxSheets(new Uint8Array(readFileSync(saved)), sourceSheets), handedOver };
}

/** The good, error-cell and Notes-column workbooks: the page agrees with the command line. */
async function workflowChecks(page: Page, work: string): Promise<void> {
  for (const book of WORKBOOKS) {
    const path = join(work, book.file);
    writeFileSync(path, xlsxBytes(book));
    for (const sheet of Object.keys(book.sheets)) {
      await check(`${book.name} workbook, sheet ${sheet}: the page shows the verdicts, writes the sheets and decides the hand-over as the command line`, async () => {
        const cli = await cliOutcome(book, sheet);
        const shown = await pageOutcome(page, path, book.file, sheet, Object.keys(book.sheets).length, work);
        same(shown.verdicts, cli.verdicts, 'verdicts');
        same(shown.handedOver, cli.handedOver, 'hand-over allowed');
        same(shown.sheets.map((x) => x.name), cli.sheets.map((x) => x.name), 'sheets written');
        same(shown.sheets, cli.sheets, 'cells of the sheets written');
      });
    }
  }
}

async function screenshots(page: Page, name: string): Promise<void> {
  await check(`screenshots of the ${name} page at 320 px and 800 px wide`, async () => {
    for (const width of [320, 800]) {
      await page.setViewportSize({ width, height: 1000 });
      await page.waitForTimeout(200);
      const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
      await page.screenshot({ path: join(SHOTS, `${name}-${width}.png`), fullPage: true });
      expect(overflow <= 0, `the page is ${overflow} px wider than the ${width} px window`);
    }
    // Dark colour scheme at the narrowest width, to see that it stays legible.
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.setViewportSize({ width: 320, height: 1000 });
    await page.screenshot({ path: join(SHOTS, `${name}-320-dark.png`), fullPage: true });
    await page.emulateMedia({ colorScheme: 'light' });
    await page.setViewportSize({ width: 800, height: 1000 });
  });
}

async function taskpaneChecks(context: BrowserContext, origin: string, pageErrors: string[]): Promise<void> {
  const page = await context.newPage();
  page.on('pageerror', (e) => pageErrors.push(`taskpane: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') pageErrors.push(`taskpane console: ${m.text()}`);
  });
  await check('the task pane loads outside Office and says it is running outside Excel', async () => {
    await page.goto(`${origin}/taskpane.html`);
    await page.getByRole('heading', { name: 'Running outside Excel' }).waitFor({ timeout: 20_000 });
    const caution = await page.locator('footer.caution summary').textContent();
    same(caution, CAUTION_LINES[0], 'caution in the footer');
    // office.js acts 3 s after loading outside Office (see OFFICE_TELEMETRY_REFUSED): let it,
    // so that the origin check below covers what it tries.
    await page.waitForTimeout(4000);
  });
  await screenshots(page, 'taskpane-outside-excel');
  await check('the standalone page does not load office.js', async () => {
    const p = await context.newPage();
    const seen: string[] = [];
    p.on('request', (r) => seen.push(r.url()));
    await p.goto(`${origin}/standalone.html`);
    await p.getByText('Open a workbook').waitFor();
    expect(!seen.some((u) => u.includes('office')), `requests: ${seen.join(', ')}`);
    await p.close();
  });
}

process.exitCode = await main();
