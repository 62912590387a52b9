// CSV text -> rows of cells. Our own small parser (RFC 4180 quoting), so that a CSV file never
// goes through SheetJS. Excel writes ';' where the decimal mark is ',', so both are detected.
import { fail, ok, type Result } from '../logic/index.js';
import type { CellValue } from './types.js';
import { MAX_COLUMNS, MAX_ROWS } from './grid.js';

export type Delimiter = ',' | ';' | '\t';

const DELIMITERS: readonly Delimiter[] = [',', ';', '\t'];

/** The delimiter used most often outside quotes on the first non-blank line (',' on a tie). */
export function detectDelimiter(text: string): Delimiter {
  const counts = new Map<Delimiter, number>(DELIMITERS.map((d) => [d, 0]));
  let quoted = false;
  let seenText = false;
  for (const ch of text) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) {
      if (seenText) break;
    } else if (!quoted && counts.has(ch as Delimiter)) counts.set(ch as Delimiter, counts.get(ch as Delimiter)! + 1);
    if (ch.trim() !== '') seenText = true;
  }
  let best: Delimiter = ',';
  for (const d of DELIMITERS) if (counts.get(d)! > counts.get(best)!) best = d;
  return best;
}

/** What a field becomes: empty -> null, a number -> number, TRUE/FALSE -> boolean, else text. */
export function csvValue(field: string): CellValue {
  const t = field.trim();
  if (t === '') return null;
  if (/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t)) return Number(t);
  const lower = t.toLowerCase();
  if (lower === 'true' || lower === 'false') return lower === 'true';
  return field;
}

/** One record of a CSV text: its fields as written, and the line it starts on (1-based). */
export interface CsvRecord {
  readonly line: number;
  readonly fields: string[];
}

/** "1048576" -> "1,048,576" (messages only). */
function counted(n: number): string {
  return n.toLocaleString('en-US');
}

/** Delimiters outside quotes from `from` to the end of its record (a record too wide is counted, not built). */
function fieldsToRecordEnd(src: string, from: number, delimiter: Delimiter): number {
  let n = 0;
  let quoted = false;
  for (let i = from; i < src.length; i++) {
    const ch = src[i]!;
    if (ch === '"') quoted = !quoted;
    else if (!quoted && ch === delimiter) n++;
    else if (!quoted && (ch === '\n' || ch === '\r')) break;
  }
  return n;
}

/**
 * The records of a CSV text (a leading byte-order mark is dropped). Quoted fields may hold
 * delimiters, line breaks and doubled quotes. Bounded by Excel's sheet (DESIGN.md section 3):
 * a record of more than 16,384 fields or a text of more than 1,048,576 records is an error
 * naming the row, found before the record is built; one pass, linear in the text.
 */
export function csvRecords(text: string, delimiter: Delimiter = detectDelimiter(text)): Result<CsvRecord[]> {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const records: CsvRecord[] = [];
  let fields: string[] = [];
  let field = '';
  let quoted = false;
  let line = 1;
  let start = 1;
  let quoteLine = 0;
  let atFieldStart = true;
  const tooWide = (i: number) => {
    const n = MAX_COLUMNS + 1 + fieldsToRecordEnd(src, i + 1, delimiter);
    return fail({ message: `row ${counted(records.length + 1)} (line ${start}) has ${counted(n)} columns; at most ${counted(MAX_COLUMNS)}` });
  };
  const tooLong = () => fail({ message: `row ${counted(MAX_ROWS + 1)} (line ${start}) is past Excel's last row: at most ${counted(MAX_ROWS)} rows` });
  for (let i = 0; i < src.length; i++) {
    const ch = src[i]!;
    if (quoted) {
      if (ch === '"' && src[i + 1] === '"') {
        field += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else {
        if (ch === '\n') line++;
        field += ch;
      }
      continue;
    }
    if (records.length === MAX_ROWS) return tooLong();
    if (ch === '"' && atFieldStart) {
      quoted = true;
      quoteLine = line;
      atFieldStart = false;
    } else if (ch === delimiter) {
      if (fields.length + 1 === MAX_COLUMNS) return tooWide(i);
      fields.push(field);
      field = '';
      atFieldStart = true;
    } else if (ch === '\n' || ch === '\r') {
      if (ch === '\r' && src[i + 1] === '\n') i++;
      fields.push(field);
      records.push({ line: start, fields });
      fields = [];
      field = '';
      atFieldStart = true;
      start = ++line;
    } else {
      field += ch;
      atFieldStart = false;
    }
  }
  if (quoted) return fail({ message: `line ${quoteLine}: a quoted field is not closed` });
  if (field !== '' || fields.length > 0) {
    if (records.length === MAX_ROWS) return tooLong();
    fields.push(field);
    records.push({ line: start, fields });
  }
  return ok(records);
}

/**
 * Rows of cells from CSV text, padded to the widest row; more than `maxCells` cells once padded
 * is an error given before any padding.
 */
export function parseCsv(text: string, delimiter: Delimiter = detectDelimiter(text), maxCells = Infinity): Result<CellValue[][]> {
  const records = csvRecords(text, delimiter);
  if (!records.ok) return records;
  const width = records.value.reduce((w, r) => Math.max(w, r.fields.length), 0);
  const cells = width * records.value.length;
  if (cells > maxCells)
    return fail({ message: `${counted(records.value.length)} rows of ${counted(width)} columns are ${counted(cells)} cells, more than the limit of ${counted(maxCells)}` });
  return ok(records.value.map((r) => Array.from({ length: width }, (_, c) => csvValue(r.fields[c] ?? ''))));
}
