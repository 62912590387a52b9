// Cells between Office.js and our types, and the split of big ranges into requests that fit.
import type { BlockCell } from '../report/index.js';
import type { CellValue } from '../table/index.js';
import type { XlValue } from './excel-api.js';

/**
 * Excel on the web refuses a request or a response over 5 MB ("Resource limits and performance
 * optimization for Office Add-ins", learn.microsoft.com). We aim well under it: our byte
 * figures are estimates of the JSON Office.js sends.
 */
export const PAYLOAD_LIMIT = 5 * 1024 * 1024;
export const PAYLOAD_BUDGET = 4 * 1024 * 1024;

/** Bytes a read of one cell costs (value, value type and number format), a generous estimate. */
export const READ_BYTES_PER_CELL = 96;

/** Whether a number format shows a date or time: d, m, y, h or s outside quotes, escapes and [..]. */
export function isDateFormat(format: string): boolean {
  const bare = format.replace(/"[^"]*"/g, '').replace(/\\./g, '').replace(/\[[^\]]*\]/g, '');
  return /[dmyhs]/i.test(bare) && !/^general$/i.test(bare.trim());
}

/** One cell as Office.js reports it -> our CellValue (DESIGN.md: errors keep their text, dates their serial). */
export function cellFromExcel(value: XlValue, valueType: string, numberFormat: string): CellValue {
  switch (valueType) {
    case 'Empty':
      return null;
    case 'Error':
      return { error: String(value) };
    case 'Boolean':
      return Boolean(value);
    case 'Double':
    case 'Integer':
      return typeof value === 'number' && isDateFormat(numberFormat) ? { date: value } : Number(value);
    default:
      return value === '' ? null : value;
  }
}

/**
 * Text Excel would turn into something else when written (a formula, a number, a boolean, a
 * date) gets the leading apostrophe that keeps it text — common practice, as when typing.
 */
function keepText(text: string): string {
  const reinterpreted =
    /^[=+\-@']/.test(text) || (text.trim() !== '' && !Number.isNaN(Number(text))) || /^(true|false)$/i.test(text.trim()) ||
    /^\d{1,4}[/.-]\d{1,2}([/.-]\d{1,4})?$/.test(text.trim()) || /^\d{1,2}:\d{2}/.test(text.trim());
  return reinterpreted ? `'${text}` : text;
}

/** What to put in `range.formulas` for a block cell: '=' + formula, a constant, or '' for empty. */
export function formulaInput(cell: BlockCell | null): XlValue {
  if (cell === null) return '';
  if (cell.formula !== undefined) return `=${cell.formula}`;
  if (cell.value === null) return '';
  return typeof cell.value === 'string' ? keepText(cell.value) : cell.value;
}

/** Estimated request bytes of writing one row of inputs (JSON text plus per-cell framing). */
export function rowWriteBytes(row: readonly XlValue[]): number {
  return JSON.stringify(row).length * 2 + 16;
}

/**
 * Split rows into consecutive blocks whose byte estimates stay within `budget`; a single row
 * over the budget gets a block of its own (the caller reports it if Excel still refuses it).
 */
export function rowBlocks(byteCounts: readonly number[], budget = PAYLOAD_BUDGET): { start: number; count: number }[] {
  const blocks: { start: number; count: number }[] = [];
  let start = 0;
  let bytes = 0;
  byteCounts.forEach((b, i) => {
    if (i > start && bytes + b > budget) {
      blocks.push({ start, count: i - start });
      start = i;
      bytes = 0;
    }
    bytes += b;
  });
  if (byteCounts.length > start) blocks.push({ start, count: byteCounts.length - start });
  return blocks;
}

/** Rows per read request for a range `columns` wide. */
export function readBlockRows(columns: number, budget = PAYLOAD_BUDGET): number {
  return Math.max(1, Math.floor(budget / (Math.max(1, columns) * READ_BYTES_PER_CELL)));
}

/** "B3" from an Office.js address "Sheet1!B3:D9" or "'My sheet'!B3". */
export function topLeftOf(address: string): string {
  const local = address.slice(address.lastIndexOf('!') + 1);
  return local.split(':')[0]!.replace(/\$/g, '');
}

/** "B3:D9" from "Sheet1!B3:D9". */
export function localAddress(address: string): string {
  return address.slice(address.lastIndexOf('!') + 1).replace(/\$/g, '');
}
