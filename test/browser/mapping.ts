// The page's "Check a program file" with names that differ: a program using plant tags shows
// its output not found without a mapping, and EQUAL or DIFFERS with a mapping file or a
// mapping sheet of the workbook, as `verify --map --json` says, with the unsafe count and the
// sentence of the unsafe side marked.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import XLSX from 'xlsx';
import { runCli } from '../cli/run-cli.js';
import { check, expect, ORIGIN, same, SHOTS } from './harness.js';

const SPEC = [
  ['input', 'input', 'output'],
  ['Guard closed', 'Start pressed', 'Run permit'],
  [1, 1, 1],
  [0, '-', 0],
  [1, 0, 0],
];
const MAP = [
  ['Spec signal', 'Program variable'],
  ['Guard closed', 'I_Guard_A'],
  ['Start pressed', 'I_Start'],
  ['Run permit', 'Q_Run'],
];
const program = (body: string) => `PROGRAM Cell
VAR_INPUT I_Guard_A : BOOL; I_Start : BOOL; END_VAR
VAR_OUTPUT Q_Run : BOOL; END_VAR
Q_Run := ${body};
END_PROGRAM
`;

interface OutputJson {
  status: string;
  unsafeCount: number;
  spuriousTripCount: number;
  unsafeWhen?: { sentence: string };
}

export async function mappingChecks(page: Page, work: string): Promise<void> {
  const book = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(SPEC), 'Cell');
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(MAP), 'Map');
  XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet([MAP[1]!, ['Start pressed', null]]), 'BadMap');
  const workbook = join(work, 'tags.xlsx');
  writeFileSync(workbook, XLSX.write(book, { type: 'buffer', bookType: 'xlsx' }) as Buffer);
  const right = join(work, 'tags-right.st');
  const wrong = join(work, 'tags-wrong.st');
  const csv = join(work, 'tags-map.csv');
  writeFileSync(right, program('I_Guard_A AND I_Start'));
  writeFileSync(wrong, program('I_Start'));
  writeFileSync(csv, MAP.map((r) => r.join(',')).join('\n') + '\n');
  const cli = async (impl: string): Promise<OutputJson> => {
    const r = await runCli('verify', workbook, '--sheet', 'Cell', '--impl', impl, '--map', csv, '--json');
    return (JSON.parse(r.out) as { outputs: OutputJson[] }).outputs[0]!;
  };
  const line = page.locator('ul.verdicts li').first();
  const pickProgram = async (path: string) => {
    await page.locator('input[type=file][accept*=".st"]').setInputFiles(path);
    await page.locator('p[role=status]', { hasText: 'Checking…' }).waitFor({ state: 'detached', timeout: 30_000 });
  };

  await check('a program using plant tags shows its output not found on the page without a mapping', async () => {
    await page.goto(`${ORIGIN.value}/standalone.html`);
    await page.locator('input[type=file][accept*="xlsx"]:not([data-compare])').setInputFiles(workbook);
    await page.getByText('Opened tags.xlsx').waitFor({ timeout: 20_000 });
    await page.getByLabel('Sheet').selectOption('Cell');
    await page.getByRole('button', { name: 'Find and analyse spec tables' }).click();
    await page.locator('p.table-verdict').first().waitFor({ timeout: 60_000 });
    await pickProgram(right);
    await line.waitFor({ timeout: 30_000 });
    expect((await line.getAttribute('class'))?.includes('not-found') === true, `verdict line: ${await line.textContent()}`);
    expect((await line.textContent())?.includes('Run_permit: NOT FOUND') === true, `verdict line: ${await line.textContent()}`);
  });

  await check('with the mapping file the same program is EQUAL, as verify --map says', async () => {
    same((await cli(right)).status, 'equal', 'the command line');
    await page.locator('input[type=file][data-mapping]').setInputFiles(csv);
    await page.locator('ul.verdicts li.equal').waitFor({ timeout: 30_000 });
    expect((await line.textContent())?.includes('Run_permit: EQUAL') === true, `verdict line: ${await line.textContent()}`);
    expect((await page.locator('.card[aria-labelledby="file-check-title"]').textContent())?.includes('Names mapped by tags-map.csv') === true, 'the mapping is named');
  });

  await check('with the mapping sheet instead, a wrong program DIFFERS with the unsafe count and sentence verify --map gives, marked', async () => {
    const want = await cli(wrong);
    same([want.status, want.unsafeCount, want.spuriousTripCount], ['differs', 1, 0], 'the command line');
    await page.locator('input[type=file][data-mapping]').setInputFiles([]);
    await page.getByLabel('Mapping sheet').selectOption('Map');
    await pickProgram(wrong);
    await page.locator('ul.verdicts li.differs').waitFor({ timeout: 30_000 });
    same(await line.locator('.unsafe-count').textContent(), `${want.unsafeCount} unsafe combination`, 'unsafe count');
    same(await line.locator('.spurious-count').textContent(), `${want.spuriousTripCount} spurious trips`, 'spurious-trip count');
    same(await line.locator('p.side.unsafe').textContent(), want.unsafeWhen?.sentence, 'the unsafe sentence');
    expect((await line.getAttribute('class'))?.includes('has-unsafe') === true, 'the output with an unsafe combination is marked');
    const card = page.locator('.card[aria-labelledby="file-check-title"]');
    expect((await card.textContent())?.includes('Names mapped by sheet Map') === true, 'the mapping sheet is named');
    await card.screenshot({ path: join(SHOTS, 'check-mapping-sheet-differs.png') });
  });

  await check('a mapping sheet with a blank program variable is an error at its cell', async () => {
    await page.getByLabel('Mapping sheet').selectOption('BadMap');
    const error = page.locator('.card[aria-labelledby="file-check-title"] p.error');
    await error.waitFor({ timeout: 30_000 });
    same(await error.textContent(), "BadMap!B2: no program variable for spec signal 'Start pressed'", 'the error');
    await page.getByLabel('Mapping sheet').selectOption('');
  });
}
