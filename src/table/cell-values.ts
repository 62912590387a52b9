// What one cell of a spec table says: a signal name, a role word, or a data value.
import type { OutputValue } from '../logic/index.js';
import type { CellValue, ValueReading, XReading } from './types.js';

/** Empty, or text of blanks only. */
export function isBlank(v: CellValue): boolean {
  return v === null || (typeof v === 'string' && v.trim() === '');
}

/** Text that is not blank. */
export function isText(v: CellValue): v is string {
  return typeof v === 'string' && v.trim() !== '';
}

/** Trimmed, lower case, without a trailing colon: how words of the sheet are compared. */
function word(v: CellValue): string | undefined {
  return typeof v === 'string' ? v.trim().toLowerCase().replace(/\s*:$/, '') : undefined;
}

const INPUT_WORDS = new Set(['input', 'inputs', 'in', 'i']);
const OUTPUT_WORDS = new Set(['output', 'outputs', 'out', 'q']);

/** 'input' / 'output' for the words of a role row (input(s), in, I; output(s), out, Q; any case). */
export function roleWord(v: CellValue): 'input' | 'output' | undefined {
  const w = word(v);
  if (w === undefined) return undefined;
  if (INPUT_WORDS.has(w)) return 'input';
  if (OUTPUT_WORDS.has(w)) return 'output';
  return undefined;
}

/** The word that marks a tag row (each signal's program name): tag, tags, tag name. */
export function isTagWord(v: CellValue): boolean {
  const w = word(v);
  return w === 'tag' || w === 'tags' || w === 'tag name' || w === 'tagname';
}

/** Headers of columns that hold notes beside the rows, not signals (words no signal is named by alone). */
const NOTE_WORDS = new Set([
  'note', 'notes', 'comment', 'comments', 'remark', 'remarks', 'description', 'descriptions',
  'reference', 'references', 'explanation', 'explanations', 'annotation', 'annotations',
]);

/** A header that names a column of notes (Notes, Comment, Remarks, Description, Reference, ...). */
export function isNoteWord(v: CellValue): boolean {
  const w = word(v);
  return w !== undefined && NOTE_WORDS.has(w);
}

/** Text spellings of truth values, and the reading each belongs to. */
const VALUE_WORDS: Readonly<Record<string, { value: 0 | 1; reading: ValueReading }>> = {
  '1': { value: 1, reading: '1/0' },
  '0': { value: 0, reading: '1/0' },
  true: { value: 1, reading: 'TRUE/FALSE' },
  false: { value: 0, reading: 'TRUE/FALSE' },
  on: { value: 1, reading: 'ON/OFF' },
  off: { value: 0, reading: 'ON/OFF' },
  y: { value: 1, reading: 'Y/N' },
  n: { value: 0, reading: 'Y/N' },
  yes: { value: 1, reading: 'YES/NO' },
  no: { value: 0, reading: 'YES/NO' },
};

/** A value that a data cell may hold (1/0, TRUE/FALSE, ON/OFF, Y/N, YES/NO, '-', 'X'), as number, boolean or text. */
export function looksLikeData(v: CellValue): boolean {
  if (typeof v === 'number' || typeof v === 'boolean') return true;
  if (typeof v !== 'string') return false;
  const w = v.trim().toLowerCase();
  return w in VALUE_WORDS || w === '-' || w === 'x';
}

/** What kind of cell could not be read: problems of one kind in one table are reported together. */
export type BadCellKind = 'blank' | 'x' | 'number' | 'error' | 'date' | 'text';

/** A data cell read: its value, how it was written, whether it was an 'X', or why it cannot be read. */
export type DataCell =
  | { readonly ok: true; readonly value: OutputValue; readonly x: boolean; readonly reading: ValueReading }
  | { readonly ok: false; readonly kind: BadCellKind; readonly reason: string };

export const HOW_TO_WRITE = 'write 1, 0 or -';

/** The reason an 'X' is refused, ending where the setting that accepts it is to be named. */
export const X_REFUSED = "'X' is ambiguous (don't-care in a truth table, \"acts\" in a cause-and-effect matrix); write - for any / don't-care, or";

/** What a data cell means ('-' is "any" in an input and don't-care in an output). */
export function readDataCell(v: CellValue, xReading: XReading): DataCell {
  const bad = (kind: BadCellKind, reason: string): DataCell => ({ ok: false, kind, reason });
  if (v === null) return bad('blank', `blank cell in a data row; ${HOW_TO_WRITE}`);
  if (typeof v === 'boolean') return { ok: true, value: v ? 1 : 0, x: false, reading: 'TRUE/FALSE' };
  if (typeof v === 'number') {
    if (v === 1 || v === 0) return { ok: true, value: v, x: false, reading: '1/0' };
    return bad('number', `the number ${v} is not a truth value; ${HOW_TO_WRITE}`);
  }
  if (typeof v === 'object') {
    if ('error' in v) return bad('error', `the cell shows the error value ${v.error}; ${HOW_TO_WRITE}`);
    return bad('date', `the cell holds a date; ${HOW_TO_WRITE}`);
  }
  const w = v.trim().toLowerCase();
  if (w === '') return bad('blank', `blank cell in a data row; ${HOW_TO_WRITE}`);
  const known = VALUE_WORDS[w];
  if (known) return { ok: true, value: known.value, x: false, reading: known.reading };
  if (w === '-') return { ok: true, value: '-', x: false, reading: '-' };
  if (w === 'x') {
    if (xReading === 'dont-care') return { ok: true, value: '-', x: true, reading: 'X' };
    return bad('x', X_REFUSED);
  }
  return bad('text', `the text "${clip(v.trim())}" is not a truth value; ${HOW_TO_WRITE}`);
}

/** Text of a notes column rather than a value typed wrong: a number other than 0/1, or words (a space, or long). */
export function isFreeText(v: CellValue): boolean {
  if (typeof v === 'number') return v !== 0 && v !== 1;
  return isText(v) && !looksLikeData(v) && (/\s/.test(v.trim()) || v.trim().length > 12);
}

/** Short enough to quote in a message. */
export function clip(text: string, max = 40): string {
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
}
