// What one cell of a spec table says: a signal name, a role word, or a data value.
import type { OutputValue } from '../logic/boolfn.js';
import type { CellValue, XReading } from './types.js';

/** Empty, or text of blanks only. */
export function isBlank(v: CellValue): boolean {
  return v === null || (typeof v === 'string' && v.trim() === '');
}

/** Text that is not blank. */
export function isText(v: CellValue): v is string {
  return typeof v === 'string' && v.trim() !== '';
}

/** 'input' / 'output' for the words of a role row (in, out, inputs, outputs; any case). */
export function roleWord(v: CellValue): 'input' | 'output' | undefined {
  if (typeof v !== 'string') return undefined;
  const w = v.trim().toLowerCase();
  if (w === 'input' || w === 'inputs' || w === 'in') return 'input';
  if (w === 'output' || w === 'outputs' || w === 'out') return 'output';
  return undefined;
}

const DATA_WORDS = new Set(['1', '0', 'true', 'false', '-', 'x']);

/** A value that a data cell may hold (1/0, TRUE/FALSE, '-', 'X'), as number, boolean or text. */
export function looksLikeData(v: CellValue): boolean {
  if (typeof v === 'number' || typeof v === 'boolean') return true;
  return typeof v === 'string' && DATA_WORDS.has(v.trim().toLowerCase());
}

/** A data cell read: its value, whether it was an 'X', or why it cannot be read. */
export type DataCell =
  | { readonly ok: true; readonly value: OutputValue; readonly x: boolean }
  | { readonly ok: false; readonly reason: string };

const HOW = 'write 1, 0 or -';

/** What a data cell means ('-' is "any" in an input and don't-care in an output). */
export function readDataCell(v: CellValue, xReading: XReading): DataCell {
  if (v === null) return { ok: false, reason: `blank cell in a data row; ${HOW}` };
  if (typeof v === 'boolean') return { ok: true, value: v ? 1 : 0, x: false };
  if (typeof v === 'number') {
    if (v === 1 || v === 0) return { ok: true, value: v, x: false };
    return { ok: false, reason: `the number ${v} is not a truth value; ${HOW}` };
  }
  if (typeof v === 'object') {
    if ('error' in v) return { ok: false, reason: `the cell shows the error value ${v.error}; ${HOW}` };
    return { ok: false, reason: `the cell holds a date; ${HOW}` };
  }
  const w = v.trim().toLowerCase();
  if (w === '') return { ok: false, reason: `blank cell in a data row; ${HOW}` };
  if (w === '1' || w === 'true') return { ok: true, value: 1, x: false };
  if (w === '0' || w === 'false') return { ok: true, value: 0, x: false };
  if (w === '-') return { ok: true, value: '-', x: false };
  if (w === 'x') {
    if (xReading === 'dont-care') return { ok: true, value: '-', x: true };
    return {
      ok: false,
      reason:
        "'X' is ambiguous (don't-care in a truth table, \"acts\" in a cause-and-effect matrix); " +
        "write - for any / don't-care, or turn on the setting that reads X as don't-care",
    };
  }
  return { ok: false, reason: `the text "${clip(v.trim())}" is not a truth value; ${HOW}` };
}

/** Short enough to quote in a message. */
export function clip(text: string, max = 40): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}
