// The only place where SheetJS parses a workbook file. On the command line it runs in a child
// process of its own (file-host.ts starts it with a time limit and a heap limit: an
// out-of-memory there ends that process, never ours); in the page in a Web Worker. xlsx 0.18.5
// has published advisories for crafted files (prototype pollution CVE-2023-30533, ReDoS
// CVE-2024-22363), so before SheetJS runs: the zip package is checked and bounded
// (zip-package.mjs), only the parts we read are handed on (no comments, drawings, links or
// macros: what SheetJS would carry from them cannot reach a sheet), and the prototypes of this
// realm are frozen, so that a crafted key such as "__proto__" cannot add to them. Only plain
// grids of numbers, booleans, strings, nulls, {error} and {date} and plain problems go back.
// (Results are written without SheetJS, at the package level: xlsx-package.ts.)
// Plain JavaScript importing only xlsx and our two .mjs helpers, so node, tsx and vitest run it as it is.
import { parentPort, workerData } from 'node:worker_threads';
import XLSX from 'xlsx';
import { attributes, columnName, encodeCell, MAX_ROWS, partText, scanSheet, sheetTables, workbookFacts } from './package-facts.mjs';
import { checkZip, storedEntry, writeZip } from './zip-package.mjs';

/**
 * job:
 *   mode 'grids':  { bytes: Uint8Array, budget, maxCells, errorNames }
 *                  -> { ok, sheets: [{ name, origin, cells | tooLarge | damaged, merges, problems }], tables, problems }
 *   budget: { maxEntryBytes, maxTotalBytes, maxRatio } (zip-package.mjs)
 *   testHook: 'pollute-prototype' | 'never-finish' | 'exhaust-heap' | 'crash' (tests of the isolation only)
 * A failure is { ok: false, message }.
 */

/** Problems of one kind in one sheet are listed one per run of cells up to this many; the rest in one. */
const LISTED_RUNS = 50;
const EMPTY_SHEET = new TextEncoder().encode('<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData/></worksheet>');

function runTestHook(hook) {
  if (hook === 'pollute-prototype') Object.prototype.polluted = 'in the parsing realm';
  if (hook === 'never-finish') for (;;);
  if (hook === 'exhaust-heap') {
    // A growing Map: in a worker thread its out-of-memory is fatal to the whole process.
    const hoard = new Map();
    for (let i = 0; ; i++) hoard.set(`k${i}`, { i });
  }
  if (hook === 'crash') process.abort();
}

class Refused extends Error {}

/** Freeze what a crafted key could add to; SheetJS assigns into plain objects only. */
function freezePrototypes() {
  for (const p of [Object.prototype, Array.prototype, Function.prototype, String.prototype, Number.prototype, Boolean.prototype]) Object.freeze(p);
}

/** Whether SheetJS needs the part to read values, names, dates and styles; everything else stays out. */
function neededPart(name, facts) {
  if (name === '[Content_Types].xml' || name === '_rels/.rels' || name === facts.main) return true;
  if (name === facts.main.replace(/[^/]*$/, (f) => `_rels/${f}.rels`)) return true;
  return facts.sheets.some((s) => s.part === name) || /^xl\/(sharedStrings|styles)\.xml$|^xl\/theme\/[^/]+\.xml$/i.test(name);
}

/** The parts SheetJS is given; the content types list only those, or it looks for the others. */
function partsForSheetJs(parts, facts) {
  const kept = [...parts].filter(([name]) => neededPart(name, facts)).map(([name, data]) => ({ name, data }));
  const types = kept.find((p) => p.name === '[Content_Types].xml');
  if (types) {
    const xml = new TextDecoder().decode(types.data).replace(/<(?:[\w.-]+:)?Override\b[^<>]*>/g, (tag) => {
      const part = (attributes(tag).PartName ?? '').replace(/^\//, '');
      return neededPart(part, facts) ? tag : '';
    });
    types.data = new TextEncoder().encode(xml);
  }
  return kept;
}

/** The checked package: parts by name, damaged ones apart; refused when it cannot be a workbook. */
async function openPackage(bytes, budget) {
  const zip = await checkZip(bytes, budget);
  if (!zip.ok) throw new Refused(zip.error.message);
  const parts = new Map();
  const damaged = new Map();
  for (const e of zip.value) {
    if (e.data) parts.set(e.name, e.data);
    else damaged.set(e.name, e.damaged);
  }
  const facts = workbookFacts(parts);
  // Our XML checks would see nothing in binary parts: nothing read may go unchecked.
  if (facts && !/\.xml$/i.test(facts.main)) throw new Refused(`the workbook is in the binary format (part ${facts.main}); save it as an .xlsx workbook`);
  if (!facts) {
    const main = [...damaged.keys()].find((n) => /workbook\.xml$/i.test(n));
    throw new Refused(main ? `part ${main} is damaged: ${damaged.get(main)}` : 'the zip package holds no workbook part (not an .xlsx workbook)');
  }
  for (const [name, why] of damaged)
    if (neededPart(name, facts) && !facts.sheets.some((s) => s.part === name)) throw new Refused(`part ${name} is damaged: ${why}`);
  return { parts, damaged, facts };
}

function readBook(zipBytes, options) {
  freezePrototypes();
  return XLSX.read(zipBytes, { type: 'array', ...options });
}

/** One SheetJS cell as a plain value; formulas give their cached value. */
function plainValue(cell, errorNames) {
  if (!cell) return null;
  switch (cell.t) {
    case 'n':
      return cell.z && XLSX.SSF.is_date(cell.z) ? { date: cell.v } : cell.v;
    case 'b':
      return cell.v === true;
    case 's':
      return String(cell.v);
    case 'e':
      return { error: errorNames[cell.v] ?? '#N/A' };
    case 'd':
      return { date: dateSerial(cell.v) };
    default:
      return null;
  }
}

/** Excel's serial number of a Date (1900 date system). */
function dateSerial(date) {
  return (date.getTime() - Date.UTC(1899, 11, 30)) / 86400000;
}

function holdsValue(cell) {
  return cell != null && cell.t !== 'z' && cell.v !== undefined && cell.v !== '';
}

/** The rectangle of cells that hold something, from the cells themselves (not '!ref'). */
function usedBox(rows) {
  let top = Infinity, left = Infinity, bottom = -1, right = -1;
  for (let r = 0; r < rows.length; r++) {
    const row = rows[r];
    if (!row) continue;
    for (let c = 0; c < row.length; c++) {
      if (!holdsValue(row[c])) continue;
      if (r < top) top = r;
      bottom = r;
      if (c < left) left = c;
      if (c > right) right = c;
    }
  }
  return bottom < 0 ? undefined : { top, left, bottom, right };
}

/** Cells (row-major order) as vertical runs: { c, top, bottom, first } per run. */
function columnRuns(cells) {
  const open = new Map();
  const out = [];
  for (const [r, c] of cells) {
    const run = open.get(c);
    if (run && run.bottom === r - 1) run.bottom = r;
    else {
      const next = { c, top: r, bottom: r };
      open.set(c, next);
      out.push(next);
    }
  }
  return out;
}

function runRange(run) {
  const top = encodeCell(run.top, run.c);
  return run.top === run.bottom ? top : `${top}:${encodeCell(run.bottom, run.c)}`;
}

/**
 * One problem per run of cells, at most LISTED_RUNS; past that one more for the rest, at the
 * rectangle holding them. `say(run, single)` words one.
 */
function runProblems(sheet, cells, severity, code, say, sayRest) {
  const runs = columnRuns(cells);
  const listed = runs.length > LISTED_RUNS ? runs.slice(0, LISTED_RUNS - 1) : runs;
  const out = listed.map((run) => ({ severity, code, sheet, cell: runRange(run), message: say(run, run.top === run.bottom) }));
  if (listed.length < runs.length) {
    const rest = runs.slice(listed.length);
    // Folded, not spread: the runs may be many.
    const top = rest.reduce((m, r) => Math.min(m, r.top), Infinity);
    const bottom = rest.reduce((m, r) => Math.max(m, r.bottom), -Infinity);
    const left = rest.reduce((m, r) => Math.min(m, r.c), Infinity);
    const right = rest.reduce((m, r) => Math.max(m, r.c), -Infinity);
    const count = rest.reduce((n, r) => n + r.bottom - r.top + 1, 0);
    out.push({ severity, code, sheet, cell: `${encodeCell(top, left)}:${encodeCell(bottom, right)}`, message: sayRest(count) });
  }
  return out;
}

function shown(value) {
  if (value === null) return 'empty';
  if (typeof value === 'string') return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}...` : value);
  if (typeof value === 'object') return 'error' in value ? value.error : `date ${value.date}`;
  return String(value);
}

/** What the sheet's XML says beside SheetJS's cells, as problems at their cells. */
function sheetProblems(name, xml, rows, sharedStrings, errorNames) {
  const badStrings = [];
  const unreadable = [];
  const formulas = [];
  const scan = scanSheet(xml, (r, c, cell) => {
    if (cell.sharedString !== undefined && (cell.sharedString < 0 || cell.sharedString >= sharedStrings)) badStrings.push([r, c]);
    else if (cell.value && !rows[r]?.[c]) unreadable.push([r, c]);
    if (cell.formula) formulas.push([r, c]);
  });
  const valueAt = (run) => plainValue(rows[run.top]?.[run.c], errorNames);
  const problems = [
    ...runProblems(name, badStrings, 'error', 'shared-string-out-of-range',
      (run, one) => `${one ? 'the cell refers' : 'these cells refer'} to a shared string the workbook does not have (it has ${sharedStrings}); ${one ? 'it was' : 'they were'} not read`,
      (n) => `${n} more cells refer to shared strings the workbook does not have; they were not read`),
    ...runProblems(name, unreadable, 'error', 'unreadable-cell',
      (run, one) => `${one ? 'the cell holds a value' : 'these cells hold values'} in the file that could not be read`,
      (n) => `${n} more cells hold values in the file that could not be read`),
    ...runProblems(name, formulas, 'warning', 'formula-cell',
      (run, one) => {
        const v = valueAt(run);
        if (one) return v === null ? 'formula cell: no computed value is stored in the file, so it was read as empty' : `formula cell: its last computed value ${shown(v)} was used (formulas are not recalculated here)`;
        return `formula cells: their last computed values were used, e.g. ${encodeCell(run.top, run.c)} = ${shown(v)} (formulas are not recalculated here)`;
      },
      (n) => `${n} more formula cells: their last computed values were used (formulas are not recalculated here)`),
  ];
  for (const [a, b] of scan.hiddenRows)
    problems.push({ severity: 'warning', code: 'hidden-rows', sheet: name, cell: `A${a + 1}:XFD${b + 1}`, message: `${a === b ? `row ${a + 1} is` : `rows ${a + 1} to ${b + 1} are`} hidden in Excel; read like any other row` });
  for (const [a, b] of scan.hiddenColumns)
    problems.push({ severity: 'warning', code: 'hidden-columns', sheet: name, cell: `${columnName(a)}1:${columnName(b)}${MAX_ROWS}`, message: `${a === b ? `column ${columnName(a)} is` : `columns ${columnName(a)} to ${columnName(b)} are`} hidden in Excel; read like any other column` });
  if (scan.pastLimits.count > 0)
    problems.push({ severity: 'error', code: 'cut-by-limit', sheet: name, cell: 'A1', message: `${scan.pastLimits.count} cell${scan.pastLimits.count === 1 ? '' : 's'} past Excel's last row or column (the first at ${scan.pastLimits.first}) could not be read` });
  return { problems, merges: scan.merges };
}

/** One sheet (SheetJS dense mode: an array of rows of cells) as a grid of plain values. */
function sheetGrid(name, rows, maxCells, errorNames) {
  const box = usedBox(rows);
  if (!box) return { name, origin: 'A1', cells: [] };
  const area = (box.bottom - box.top + 1) * (box.right - box.left + 1);
  const range = XLSX.utils.encode_range({ r: box.top, c: box.left }, { r: box.bottom, c: box.right });
  if (area > maxCells) return { name, origin: range, cells: null, tooLarge: area };
  const cells = [];
  for (let r = box.top; r <= box.bottom; r++) {
    const row = rows[r] ?? [];
    const out = new Array(box.right - box.left + 1);
    for (let c = box.left; c <= box.right; c++) out[c - box.left] = holdsValue(row[c]) ? plainValue(row[c], errorNames) : null;
    cells.push(out);
  }
  return { name, origin: XLSX.utils.encode_cell({ r: box.top, c: box.left }), cells };
}

async function grids(job) {
  const { parts, damaged, facts } = await openPackage(job.bytes, job.budget);
  const lost = new Map(); // sheet name -> why its part could not be read
  const forSheetJs = partsForSheetJs(parts, facts);
  for (const s of facts.sheets) {
    if (!s.part) lost.set(s.name, 'the workbook names no part for it');
    else if (damaged.has(s.part)) {
      lost.set(s.name, `part ${s.part} is damaged: ${damaged.get(s.part)}`);
      forSheetJs.push({ name: s.part, data: EMPTY_SHEET });
    } else if (!parts.has(s.part)) {
      lost.set(s.name, `part ${s.part} is missing from the package`);
      forSheetJs.push({ name: s.part, data: EMPTY_SHEET });
    }
  }
  const problems = [];
  for (const [name, why] of damaged) {
    if (facts.sheets.some((s) => s.part === name)) continue;
    problems.push({ severity: 'warning', code: 'damaged-part', sheet: facts.sheets[0]?.name ?? '', cell: 'A1', message: `part ${name} is damaged (${why}); it is not used for reading and not copied to results` });
  }
  const book = readBook(writeZip(forSheetJs.map((p) => storedEntry(p.name, p.data))), { dense: true, cellNF: true, cellFormula: false, cellHTML: false, cellText: false });
  const tables = [];
  const sheets = facts.sheets.map((s) => {
    if (s.state !== 'visible')
      problems.push({ severity: 'warning', code: 'hidden-sheet', sheet: s.name, cell: 'A1', message: s.state === 'veryHidden' ? 'the sheet is very hidden in Excel (only a macro shows it); read like any other sheet' : 'the sheet is hidden in Excel; read like any other sheet' });
    if (lost.has(s.name)) return { name: s.name, origin: 'A1', cells: null, damaged: lost.get(s.name) };
    for (const t of sheetTables(parts, s.part)) tables.push({ ...t, sheet: s.name });
    const rows = book.Sheets[s.name] ?? [];
    const grid = sheetGrid(s.name, rows, job.maxCells, job.errorNames);
    if (grid.tooLarge) return grid;
    const read = sheetProblems(s.name, partText(parts, s.part) ?? '', rows, facts.sharedStrings, job.errorNames);
    return { ...grid, merges: read.merges, problems: read.problems };
  });
  return { ok: true, sheets, tables, problems };
}

async function answer(job) {
  try {
    runTestHook(job.testHook);
    return await grids(job);
  } catch (e) {
    const message = e instanceof Refused ? e.message : `not a workbook that can be read (${e instanceof Error ? e.message : String(e)})`;
    return { ok: false, message };
  }
}

if (parentPort) {
  // A worker (the page's Web Worker through worker-threads-shim.ts): the job came as workerData.
  parentPort.postMessage(await answer(workerData));
} else {
  // A child process (file-host.ts): one job over the IPC channel, then exit.
  process.once('message', async (job) => {
    const a = await answer(job);
    process.send(a, () => process.exit(0));
  });
}
