// `npm run test:libreoffice`: a spreadsheet program other than ours computes the live check
// of a results workbook from its cells. Needs Debian's `libreoffice-calc-nogui` (soffice).
//
// Every cached value of every formula is removed first, so whatever LibreOffice shows was
// computed by LibreOffice; one spec cell is spoilt on purpose, so the status formulas must
// react to the cells rather than echo a value. Prints `N passed, N failed`; exits 1 on failure.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { main } from '../../src/cli/main.js';
import { fileFormula } from '../../src/hosts/xlsx-package.js';
import { csvRecords } from '../../src/table/csv.js';

const work = mkdtempSync(join(tmpdir(), 'interlock-lo-'));
let passed = 0;
let failed = 0;
function check(name: string, ok: boolean, detail = ''): void {
  if (ok) passed++;
  else failed++;
  console.log(`  ${ok ? 'ok  ' : 'FAIL'}  ${name}${ok || !detail ? '' : `\n        ${detail}`}`);
}

/** LibreOffice recalculates an .xlsx on load only when its profile says so. */
function profileAlwaysRecalculating(dir: string): string {
  const user = join(dir, 'user');
  execFileSync('mkdir', ['-p', user]);
  writeFileSync(
    join(user, 'registrymodifications.xcu'),
    `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`,
  );
  return `file://${dir}`;
}

interface LiveBlock {
  readonly sheet: string;
  /** 0-based row of the block's header row. */
  readonly headerRow: number;
  readonly header: string[];
  readonly rows: number;
}

function liveBlock(book: XLSX.WorkBook, sheet: string): LiveBlock | undefined {
  const rows = XLSX.utils.sheet_to_json<unknown[]>(book.Sheets[sheet]!, { header: 1, defval: '', blankrows: true });
  const headerRow = rows.findIndex((r) => r[0] === '#' && r.includes('Status'));
  if (headerRow < 0) return undefined;
  let n = 0;
  while (typeof rows[headerRow + 1 + n]?.[0] === 'number') n++;
  return { sheet, headerRow, header: rows[headerRow]!.map(String), rows: n };
}

const resultsPath = join(work, 'results.xlsx');
const io = { out: () => {}, err: () => {} };
const status = await main(['analyze', 'sample-workbooks/capper-cell.xlsx', '-o', resultsPath], io);
check('the command line writes a results workbook of the sample', status === 0 && readdirSync(work).includes('results.xlsx'));

const original = XLSX.readFile(resultsPath, { cellFormula: true });
const blocks = original.SheetNames.map((s) => liveBlock(original, s)).filter((b): b is LiveBlock => b !== undefined);
check('every results sheet of the sample has a live check block', blocks.length === 4, `found ${blocks.length}`);

// Strip every cached value of a formula cell and spoil one spec value.
const edited = XLSX.readFile(resultsPath, { cellFormula: true });
let formulas = 0;
for (const name of edited.SheetNames) {
  const ws = edited.Sheets[name]!;
  for (const [addr, cell] of Object.entries(ws)) {
    if (addr.startsWith('!')) continue;
    const c = cell as XLSX.CellObject;
    if (c.f) {
      // SheetJS drops the `_xlfn.` prefix on reading; put it back as our writer does.
      c.f = fileFormula(c.f);
      delete c.v;
      delete c.w;
      c.t = 'z' as XLSX.ExcelDataType;
      formulas++;
    }
  }
}
const spoilt = blocks[0]!;
const specColumn = spoilt.header.findIndex((h) => h.endsWith(' spec'));
const spoiltRow = spoilt.headerRow + 1; // first combination
const spoiltAddr = XLSX.utils.encode_cell({ r: spoiltRow, c: specColumn });
const before = edited.Sheets[spoilt.sheet]![spoiltAddr] as XLSX.CellObject;
const flipped = before.v === 1 ? 0 : 1;
edited.Sheets[spoilt.sheet]![spoiltAddr] = { t: 'n', v: flipped };
const editedPath = join(work, 'edited.xlsx');
XLSX.writeFile(edited, editedPath);
check('the edited copy has no cached formula values left', formulas > 100, `${formulas} formulas`);

const profile = profileAlwaysRecalculating(join(work, 'profile'));
execFileSync(
  'soffice',
  [
    `-env:UserInstallation=${profile}`,
    '--headless',
    '--convert-to',
    // CSV, comma, double quote, UTF-8, first line 1, ..., -1 = every sheet to its own file.
    'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1',
    '--outdir',
    work,
    editedPath,
  ],
  { stdio: 'ignore', timeout: 180_000 },
);

function sheetCsv(sheet: string): string[][] {
  const file = readdirSync(work).find((f) => f === `edited-${sheet}.csv`);
  if (!file) return [];
  const records = csvRecords(readFileSync(join(work, file), 'utf8'), ',');
  return records.ok ? records.value.map((r) => r.fields) : [];
}

for (const block of blocks) {
  const computed = sheetCsv(block.sheet);
  check(`LibreOffice exported "${block.sheet}"`, computed.length > block.headerRow + block.rows);
  const ws = original.Sheets[block.sheet]!;
  const statusCol = block.header.indexOf('Status');
  let formsAgree = true;
  let firstDisagreement = '';
  const statuses: string[] = [];
  for (let r = block.headerRow + 1; r <= block.headerRow + block.rows; r++) {
    for (let c = 0; c < block.header.length; c++) {
      const cell = ws[XLSX.utils.encode_cell({ r, c })] as XLSX.CellObject | undefined;
      if (!cell?.f || c === statusCol) continue;
      const got = computed[r]?.[c] ?? '';
      if (got !== String(cell.v)) {
        formsAgree = false;
        firstDisagreement ||= `${XLSX.utils.encode_cell({ r, c })}: LibreOffice ${got}, ours ${String(cell.v)}`;
      }
    }
    statuses.push(computed[r]?.[statusCol] ?? '');
  }
  check(`"${block.sheet}": every form cell computed by LibreOffice equals our cached value`, formsAgree, firstDisagreement);
  const wanted = statuses.map((_, i) => (block === spoilt && i === 0 ? 'DIFFERS' : 'OK'));
  check(
    `"${block.sheet}": the status column reads ${block === spoilt ? 'DIFFERS on the spoilt row only' : 'OK on every row'}`,
    JSON.stringify(statuses) === JSON.stringify(wanted),
    `got ${statuses.filter((s) => s !== 'OK').length} not OK; first values ${statuses.slice(0, 4).join(', ')}`,
  );
  const summary = computed.find((r) => r[0]?.startsWith('Combinations that differ'));
  check(`"${block.sheet}": the summary counts ${block === spoilt ? 1 : 0} differing combination(s)`, summary?.[1] === (block === spoilt ? '1' : '0'), `got ${summary?.[1]}`);
}

// Print setup: the results of the 7-input sample CSV as a PDF. Its source sheet prints as
// LibreOffice's default (portrait); our results and steps sheets landscape, one page wide.
const csvResults = join(work, 'spindle-results.xlsx');
const csvStatus = await main(['analyze', 'sample-workbooks/spindle-permit.csv', '-o', csvResults], io);
check('the command line writes a results workbook of the sample CSV', csvStatus === 0);
execFileSync('soffice', [`-env:UserInstallation=${profile}`, '--headless', '--convert-to', 'pdf', '--outdir', work, csvResults], { stdio: 'ignore', timeout: 180_000 });
const pdf = readFileSync(join(work, 'spindle-results.pdf'), 'latin1');
// Page objects carry their own MediaBox in LibreOffice's PDF; the page tree's comes first.
const pages = [...pdf.matchAll(/\/Type\/Page\b(?!s)[\s\S]*?\/MediaBox\[\s*([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s*\]/g)].map((m) => ({
  width: Number(m[3]) - Number(m[1]),
  height: Number(m[4]) - Number(m[2]),
}));
const landscape = pages.filter((p) => p.width > p.height).length;
console.log(`  (the sample CSV's results workbook prints on ${pages.length} pages: ${landscape} landscape for the results and steps sheets, ${pages.length - landscape} for the source sheet)`);
check('the results and test-steps sheets print landscape', landscape >= 2, `${landscape} of ${pages.length} pages landscape`);
// One page wide: the live check's 20-odd columns do not spill onto pages to the right (before: 21 pages for one sheet).
check('the results and steps sheets print one page wide, on a few pages', landscape <= 6, `${landscape} landscape pages`);

rmSync(work, { recursive: true, force: true });
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed === 0 ? 0 : 1);
