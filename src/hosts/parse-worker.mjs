// The only place where SheetJS parses a workbook file. It runs in its own worker thread
// (file-host.ts starts it with a time limit and a heap limit) because xlsx 0.18.5 has
// published advisories for crafted files (prototype pollution CVE-2023-30533, ReDoS
// CVE-2024-22363): whatever happens in here stays in this realm, and only plain grids of
// numbers, booleans, strings, nulls, {error} and {date} go back, by structured clone.
// Plain JavaScript importing only xlsx, so that node, tsx and vitest all run it as it is.
import { parentPort, workerData } from 'node:worker_threads';
import XLSX from 'xlsx';

/**
 * workerData:
 *   mode 'grids':  { bytes: Uint8Array, maxCells, errorNames }     -> { ok, sheets: [{ name, origin, cells }] }
 *   testHook: 'pollute-prototype' | 'never-finish' | 'exhaust-heap' (tests of the isolation only)
 */
const job = workerData;

function runTestHook(hook) {
  if (hook === 'pollute-prototype') Object.prototype.polluted = 'in the parsing realm';
  if (hook === 'never-finish') for (;;);
  if (hook === 'exhaust-heap') {
    const hoard = [];
    for (;;) hoard.push(new Array(1 << 16).fill(hoard.length));
  }
}

function readBook(bytes) {
  return XLSX.read(bytes, { type: 'array', dense: true, cellNF: true, cellFormula: false, cellHTML: false, cellText: false });
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

function grids() {
  const book = readBook(job.bytes);
  const sheets = book.SheetNames.map((name) => sheetGrid(name, book.Sheets[name] ?? [], job.maxCells, job.errorNames));
  return { ok: true, sheets };
}

try {
  runTestHook(job.testHook);
  parentPort.postMessage(grids());
} catch (e) {
  parentPort.postMessage({ ok: false, message: e instanceof Error ? e.message : String(e) });
}
