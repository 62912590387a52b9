// Statement-level tokens of Structured Text (IEC 61131-3). Expressions themselves are parsed
// by the engine's parser: these tokens only find statements, their extents and the parts of
// an expression a truth table cannot judge.
import { fail, ok, type Result } from '../logic/index.js';

export type TokenKind =
  | 'ident'
  /** Numbers and typed literals: 12, 2.5, 16#FF, T#2s, BOOL#1. */
  | 'literal'
  | 'string'
  /** Direct addresses: %IX0.1. */
  | 'address'
  | 'op';

export interface Token {
  readonly kind: TokenKind;
  readonly text: string;
  /** Offset in the source text. */
  readonly start: number;
  readonly end: number;
  /** 1-based line in the file. */
  readonly line: number;
}

/** Integer (with base), real or exponent form: 1_000, 16#FF, 2.5, 1.0E-3. */
const NUMBER = /[0-9][0-9_]*(?:#[0-9A-Fa-f_]+|(?:\.[0-9_]+)?(?:[eE][+-]?[0-9]+)?)/y;

const OPS = [':=', '=>', '<>', '<=', '>=', '**', '..', '(', ')', '[', ']', ',', ';', ':', '.', '+', '-', '*', '/', '=', '<', '>', '&', '^', '#'];

/**
 * Tokens of `text`, comments dropped: `(* *)` (nesting allowed), `/* *\/` and `//`.
 * `firstLine` is the file line of the text's first character (ST bodies inside XML).
 */
export function tokenize(text: string, firstLine = 1): Result<Token[]> {
  const out: Token[] = [];
  let i = 0;
  let line = firstLine;
  const n = text.length;
  while (i < n) {
    const c = text[i]!;
    if (c === '\n') {
      line++;
      i++;
    } else if (/\s/.test(c)) i++;
    else if (text.startsWith('(*', i) || text.startsWith('/*', i)) {
      const open = text.slice(i, i + 2);
      const close = open === '(*' ? '*)' : '*/';
      const startLine = line;
      let depth = 1;
      i += 2;
      while (i < n && depth > 0) {
        if (text[i] === '\n') line++;
        if (text.startsWith(close, i)) {
          depth--;
          i += 2;
        } else if (open === '(*' && text.startsWith('(*', i)) {
          depth++;
          i += 2;
        } else i++;
      }
      if (depth > 0) return fail({ message: `line ${startLine}: comment ${open} is not closed` });
    } else if (text.startsWith('//', i)) {
      while (i < n && text[i] !== '\n') i++;
    } else if (/[A-Za-z_]/.test(c)) {
      let j = i + 1;
      while (j < n && /[A-Za-z0-9_]/.test(text[j]!)) j++;
      if (text[j] === '#') {
        j++;
        while (j < n && /[A-Za-z0-9_.:+\-]/.test(text[j]!)) j++;
        out.push({ kind: 'literal', text: text.slice(i, j), start: i, end: j, line });
      } else out.push({ kind: 'ident', text: text.slice(i, j), start: i, end: j, line });
      i = j;
    } else if (/[0-9]/.test(c)) {
      NUMBER.lastIndex = i;
      const j = i + NUMBER.exec(text)![0].length;
      out.push({ kind: 'literal', text: text.slice(i, j), start: i, end: j, line });
      i = j;
    } else if (c === "'" || c === '"') {
      let j = i + 1;
      while (j < n && text[j] !== c && text[j] !== '\n') j += text[j] === '$' ? 2 : 1;
      if (text[j] !== c) return fail({ message: `line ${line}: string is not closed` });
      out.push({ kind: 'string', text: text.slice(i, j + 1), start: i, end: j + 1, line });
      i = j + 1;
    } else if (c === '%') {
      let j = i + 1;
      while (j < n && /[A-Za-z0-9_.]/.test(text[j]!)) j++;
      out.push({ kind: 'address', text: text.slice(i, j), start: i, end: j, line });
      i = j;
    } else {
      const op = OPS.find((o) => text.startsWith(o, i));
      if (!op) return fail({ message: `line ${line}: unexpected character '${c}'` });
      out.push({ kind: 'op', text: op, start: i, end: i + op.length, line });
      i += op.length;
    }
  }
  return ok(out);
}

/** A keyword or identifier test, case-insensitive (ST is not case-sensitive). */
export function isWord(t: Token | undefined, ...words: string[]): boolean {
  return t !== undefined && t.kind === 'ident' && words.includes(t.text.toUpperCase());
}

export function isOp(t: Token | undefined, op: string): boolean {
  return t !== undefined && t.kind === 'op' && t.text === op;
}
