// CSV text -> rows of cells. Our own small parser (RFC 4180 quoting), so that a CSV file never
// goes through SheetJS. Excel writes ';' where the decimal mark is ',', so both are detected.
import { fail, ok, type Result } from '../logic/result.js';
import type { CellValue } from '../spec/types.js';

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

/**
 * The records of a CSV text (a leading byte-order mark is dropped). Quoted fields may hold
 * delimiters, line breaks and doubled quotes.
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
    if (ch === '"' && atFieldStart) {
      quoted = true;
      quoteLine = line;
      atFieldStart = false;
    } else if (ch === delimiter) {
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
    fields.push(field);
    records.push({ line: start, fields });
  }
  return ok(records);
}

/** Rows of cells from CSV text, padded to the widest row. */
export function parseCsv(text: string, delimiter: Delimiter = detectDelimiter(text)): Result<CellValue[][]> {
  const records = csvRecords(text, delimiter);
  if (!records.ok) return records;
  const width = records.value.reduce((w, r) => Math.max(w, r.fields.length), 0);
  return ok(records.value.map((r) => Array.from({ length: width }, (_, c) => csvValue(r.fields[c] ?? ''))));
}
