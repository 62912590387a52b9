// Parsing the expressions engineers type or PLC code holds (DESIGN.md section 3).
import { fail, ok, type EngineError, type Result } from '../result.js';
import { signalFinder, type Signal } from '../signals.js';
import { FALSE, TRUE, not, variable, type Expr } from './ast.js';

/**
 * Parse an expression over the given input signals. Accepted, binding tightest first:
 *
 * - operands: a signal name (its identifier or header, any case), `TRUE`/`FALSE`/`1`/`0`,
 *   `( ... )`, and the function forms `AND(a, b, ...)`, `OR(...)`, `XOR(...)`, `NOT(a)`;
 *   a header with spaces or symbols is written in double quotes or backticks:
 *   `"Guard A closed" AND x`, `` `E-stop healthy` `` (“curly” quotes also work);
 * - NOT: `NOT a`, `!a`, `~a`, `/a`, and `a'` (postfix);
 * - AND: `AND`, `&`, `*`, `·`;
 * - XOR: `XOR`, `^`, `⊕`;
 * - OR: `OR`, `+`, `|`.
 *
 * Keywords are case-insensitive. Operands are never joined by juxtaposition: `a b` is an error.
 * Errors carry the 0-based position (a UTF-16 index into `text`) and what was expected there;
 * an unknown name is reported as written, with no guess at what was meant. Never throws.
 */
export function parseExpression(text: string, signals: readonly Signal[]): Result<Expr> {
  const parser = new Parser(text, signals);
  try {
    const expr = parser.expression();
    parser.expectEnd();
    return ok(expr);
  } catch (e) {
    if (e instanceof ParseFailure) return fail(e.error);
    throw e;
  }
}

/** Parentheses and function calls nest at most this deep (a bound on recursion). */
export const MAX_NESTING = 100;

const OPERAND = "a signal name, '(' or NOT";

type TokenKind = 'and' | 'or' | 'xor' | 'not' | 'postnot' | '(' | ')' | ',' | 'const' | 'name' | 'invalid' | 'end';

interface Token {
  readonly kind: TokenKind;
  readonly start: number;
  readonly end: number;
  /** The text as written (a quoted name without its quotes). */
  readonly text: string;
  /** A keyword operator written as a word (AND, OR, XOR, NOT): it may start a function call. */
  readonly word?: boolean;
  readonly value?: boolean;
}

class ParseFailure {
  constructor(readonly error: EngineError) {}
}

const SYMBOLS: Record<string, TokenKind> = {
  '&': 'and', '*': 'and', '·': 'and',
  '+': 'or', '|': 'or',
  '^': 'xor', '⊕': 'xor',
  '!': 'not', '~': 'not', '/': 'not',
  "'": 'postnot',
  '(': '(', ')': ')', ',': ',',
};

const KEYWORDS: Record<string, TokenKind> = { and: 'and', or: 'or', xor: 'xor', not: 'not' };

const CLOSING_QUOTE: Record<string, string> = { '"': '"', '`': '`', '“': '”' };

const WORD = /[\p{L}\p{N}_][\p{L}\p{N}_.]*/uy;
const SPACE = /\s*/uy;

class Parser {
  private pos = 0;
  private lookahead: Token | undefined;
  private depth = 0;
  private readonly find: (name: string) => number;

  constructor(
    private readonly text: string,
    private readonly signals: readonly Signal[],
  ) {
    this.find = signalFinder(signals);
  }

  /** OR binds loosest: or := xor (OR xor)*. */
  expression(): Expr {
    return this.chain('or', () => this.chain('xor', () => this.chain('and', () => this.unary())));
  }

  expectEnd(): void {
    const t = this.peek();
    if (t.kind !== 'end') this.failAt(t, 'an operator (AND, OR, XOR) or the end of the expression');
  }

  private chain(kind: 'and' | 'or' | 'xor', operand: () => Expr): Expr {
    const args = [operand()];
    while (this.peek().kind === kind) {
      this.next();
      args.push(operand());
    }
    return args.length === 1 ? args[0]! : { kind, args };
  }

  /** Any number of prefix and postfix NOTs around one primary; only their parity matters. */
  private unary(): Expr {
    let negate = false;
    while (this.peek().kind === 'not' && !this.startsCall(this.peek())) {
      this.next();
      negate = !negate;
    }
    const base = this.primary();
    while (this.peek().kind === 'postnot') {
      this.next();
      negate = !negate;
    }
    return negate ? not(base) : base;
  }

  private primary(): Expr {
    const t = this.next();
    switch (t.kind) {
      case 'const':
        return t.value ? TRUE : FALSE;
      case 'name': {
        const index = this.find(t.text);
        if (index < 0) {
          this.failWith(
            t.start,
            'a signal name',
            `no input signal is named '${t.text}' (position ${t.start}); a name matches a header or an identifier, and a header with spaces or symbols goes in double quotes`,
          );
        }
        return variable(index, this.signals[index]!.identifier);
      }
      case '(': {
        const inner = this.nested(() => this.expression());
        this.expect(')', "')'");
        return inner;
      }
      case 'and':
      case 'or':
      case 'xor':
      case 'not':
        if (t.word && this.peek().kind === '(') return this.call(t);
        return this.failAt(t, OPERAND);
      default:
        return this.failAt(t, OPERAND);
    }
  }

  /** `AND(a, b, ...)` and its kin, the function forms of Excel; NOT takes one argument. */
  private call(fn: Token): Expr {
    this.next();
    return this.nested(() => {
      const args = [this.expression()];
      if (fn.kind !== 'not') {
        while (this.peek().kind === ',') {
          this.next();
          args.push(this.expression());
        }
      }
      this.expect(')', fn.kind === 'not' ? "')' (NOT takes one operand)" : "',' or ')'");
      if (fn.kind === 'not') return not(args[0]!);
      return args.length === 1 ? args[0]! : { kind: fn.kind as 'and' | 'or' | 'xor', args };
    });
  }

  private startsCall(t: Token): boolean {
    if (!t.word) return false;
    const save = { pos: this.pos, lookahead: this.lookahead };
    this.next();
    const follows = this.peek().kind === '(';
    this.pos = save.pos;
    this.lookahead = save.lookahead;
    return follows;
  }

  private nested<T>(inner: () => T): T {
    if (++this.depth > MAX_NESTING) {
      this.failWith(this.peek().start, OPERAND, `the expression nests deeper than ${MAX_NESTING} levels of parentheses`);
    }
    const value = inner();
    this.depth--;
    return value;
  }

  private expect(kind: TokenKind, expected: string): void {
    const t = this.peek();
    if (t.kind !== kind) this.failAt(t, expected);
    this.next();
  }

  private failAt(t: Token, expected: string): never {
    const found = t.kind === 'end' ? 'the end of the expression' : `'${this.text.slice(t.start, t.end)}'`;
    return this.failWith(t.start, expected, `position ${t.start}: expected ${expected}, found ${found}`);
  }

  private failWith(position: number, expected: string, message: string): never {
    throw new ParseFailure({ message, position, expected });
  }

  private peek(): Token {
    this.lookahead ??= this.scan();
    return this.lookahead;
  }

  private next(): Token {
    const t = this.peek();
    this.lookahead = undefined;
    return t;
  }

  private scan(): Token {
    SPACE.lastIndex = this.pos;
    SPACE.exec(this.text);
    const start = SPACE.lastIndex;
    const text = this.text;
    if (start >= text.length) return this.token('end', start, start, '');
    const ch = text[start]!;
    const symbol = SYMBOLS[ch];
    if (symbol) return this.token(symbol, start, start + 1, ch);
    const closing = CLOSING_QUOTE[ch];
    if (closing) {
      const stop = text.indexOf(closing, start + 1);
      if (stop < 0) this.failWith(start, `a closing ${closing}`, `position ${start}: the name opened by ${ch} has no closing ${closing}`);
      return this.token('name', start, stop + 1, text.slice(start + 1, stop));
    }
    WORD.lastIndex = start;
    const word = WORD.exec(text);
    if (word) {
      const end = start + word[0].length;
      const lower = word[0].toLowerCase();
      if (lower === 'true' || lower === '1') return { ...this.token('const', start, end, word[0]), value: true };
      if (lower === 'false' || lower === '0') return { ...this.token('const', start, end, word[0]), value: false };
      const keyword = KEYWORDS[lower];
      if (keyword) return { ...this.token(keyword, start, end, word[0]), word: true };
      return this.token('name', start, end, word[0]);
    }
    // Any other character: the parser says what it expected instead.
    return this.token('invalid', start, start + String.fromCodePoint(text.codePointAt(start)!).length, ch);
  }

  private token(kind: TokenKind, start: number, end: number, text: string): Token {
    this.pos = end;
    return { kind, start, end, text };
  }
}
