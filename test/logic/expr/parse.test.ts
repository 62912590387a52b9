import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { equals } from '../../../src/logic/bits.js';
import { FALSE, TRUE, and, not, or, variable, xor, type Expr } from '../../../src/logic/expr/ast.js';
import { truthTable } from '../../../src/logic/expr/evaluate.js';
import { MAX_NESTING, parseExpression } from '../../../src/logic/expr/parse.js';
import { printSt } from '../../../src/logic/expr/print-st.js';
import type { Signal } from '../../../src/logic/signals.js';
import { exprArb, letterSignals } from './arbitraries.js';

const signals: Signal[] = [
  { header: 'Guard A closed', identifier: 'Guard_A_closed' },
  { header: 'E-stop healthy', identifier: 'E_stop_healthy' },
  { header: 'Setup mode', identifier: 'Setup_mode' },
];
const g = variable(0, 'Guard_A_closed');
const e = variable(1, 'E_stop_healthy');
const s = variable(2, 'Setup_mode');

function parsed(text: string): Expr {
  const r = parseExpression(text, signals);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

function error(text: string) {
  const r = parseExpression(text, signals);
  if (r.ok) throw new Error(`expected an error for ${text}`);
  return r.error;
}

describe('parsing Structured Text', () => {
  it('reads NOT, AND, XOR, OR with NOT binding tightest and OR loosest', () => {
    expect(parsed('Guard_A_closed OR E_stop_healthy XOR Setup_mode AND NOT Guard_A_closed')).toEqual(
      or(g, xor(e, and(s, not(g)))),
    );
  });

  it('builds one group for a chain of the same operator', () => {
    expect(parsed('Guard_A_closed AND E_stop_healthy AND Setup_mode')).toEqual(and(g, e, s));
  });

  it('reads keywords and names in any case, and names print as the identifier', () => {
    expect(parsed('guard_a_closed and not SETUP_MODE')).toEqual(and(g, not(s)));
  });

  it('reads TRUE, FALSE, 1 and 0 as constants', () => {
    expect(parsed('true OR 0')).toEqual(or(TRUE, FALSE));
    expect(parsed('(1) and False')).toEqual(and(TRUE, FALSE));
  });

  it('lets parentheses override the binding', () => {
    expect(parsed('(Guard_A_closed OR E_stop_healthy) AND Setup_mode')).toEqual(and(or(g, e), s));
  });
});

describe('parsing the shorthands engineers type', () => {
  it('reads & * · as AND, + | as OR, ^ ⊕ as XOR', () => {
    expect(parsed('Guard_A_closed & E_stop_healthy * Setup_mode · Guard_A_closed')).toEqual(and(g, e, s, g));
    expect(parsed('Guard_A_closed + E_stop_healthy | Setup_mode')).toEqual(or(g, e, s));
    expect(parsed('Guard_A_closed ^ E_stop_healthy ⊕ Setup_mode')).toEqual(xor(g, e, s));
  });

  it('keeps the binding of the words for the symbols: a + b * c is a OR (b AND c)', () => {
    expect(parsed('Guard_A_closed + E_stop_healthy * Setup_mode')).toEqual(or(g, and(e, s)));
  });

  it("reads ! ~ / as prefix NOT and ' as postfix NOT", () => {
    for (const text of ['!Guard_A_closed', '~Guard_A_closed', '/Guard_A_closed', "Guard_A_closed'"]) {
      expect(parsed(text)).toEqual(not(g));
    }
    expect(parsed("(Guard_A_closed & E_stop_healthy)'")).toEqual(not(and(g, e)));
  });

  it('reduces repeated NOTs by parity', () => {
    expect(parsed('NOT NOT Guard_A_closed')).toEqual(g);
    expect(parsed("!Guard_A_closed'")).toEqual(g);
  });

  it('reads Excel-style AND(), OR(), XOR() with any number of arguments, and NOT()', () => {
    expect(parsed('AND(Guard_A_closed, OR(E_stop_healthy, Setup_mode), NOT(Setup_mode))')).toEqual(
      and(g, or(e, s), not(s)),
    );
    expect(parsed('xor(Guard_A_closed,E_stop_healthy)')).toEqual(xor(g, e));
    expect(parsed('NOT(Guard_A_closed) AND Setup_mode')).toEqual(and(not(g), s));
  });

  it('matches a quoted header with spaces, in double quotes, backticks or curly quotes', () => {
    expect(parsed('"Guard A closed" AND `E-stop healthy`')).toEqual(and(g, e));
    expect(parsed('“setup MODE”')).toEqual(s);
  });

  it('matches an unquoted header that has no spaces or symbols in it', () => {
    const r = parseExpression('Start', [{ header: 'start', identifier: 'Start_Sig' }]);
    expect(r.ok && r.value).toEqual(variable(0, 'Start_Sig'));
  });
});

describe('parse errors', () => {
  it('says where an operand was expected and what came instead', () => {
    const err = error('Guard_A_closed AND )');
    expect(err.position).toBe(19);
    expect(err.expected).toBe("a signal name, '(' or NOT");
    expect(err.message).toBe("position 19: expected a signal name, '(' or NOT, found ')'");
  });

  it('reports an empty expression at position 0', () => {
    const err = error('   ');
    expect(err.position).toBe(3);
    expect(err.message).toMatch(/found the end of the expression/);
    expect(error('').position).toBe(0);
  });

  it('names an unknown signal as written and guesses nothing', () => {
    const err = error('Guard_A_closed AND Guard_B');
    expect(err.position).toBe(19);
    expect(err.message).toMatch(/no input signal is named 'Guard_B'/);
    expect(err.message).not.toMatch(/Guard_A_closed|did you mean/i);
  });

  it('does not join operands by juxtaposition', () => {
    const err = error('Guard_A_closed Setup_mode');
    expect(err.position).toBe(15);
    expect(err.expected).toMatch(/an operator/);
  });

  it("asks for ')' when a group is not closed", () => {
    const err = error('(Guard_A_closed OR Setup_mode');
    expect(err.expected).toBe("')'");
    expect(err.position).toBe(29);
  });

  it('reports a quoted name without its closing quote at the opening quote', () => {
    const err = error('Setup_mode AND "Guard A closed');
    expect(err.position).toBe(15);
    expect(err.expected).toBe('a closing "');
  });

  it('reports a character that is not part of any expression where it stands', () => {
    const err = error('Setup_mode $ Guard_A_closed');
    expect(err.position).toBe(11);
    expect(err.message).toMatch(/found '\$'/);
  });

  it('refuses nesting deeper than the limit instead of overflowing the stack', () => {
    const deep = '('.repeat(MAX_NESTING + 1) + 'Setup_mode' + ')'.repeat(MAX_NESTING + 1);
    expect(error(deep).message).toMatch(/nests deeper than 100/);
    const fine = '('.repeat(MAX_NESTING) + 'Setup_mode' + ')'.repeat(MAX_NESTING);
    expect(parsed(fine)).toEqual(s);
  });

  it('never throws, whatever the text (fast-check)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 60 }), (text) => {
        parseExpression(text, signals);
      }),
      { numRuns: 2000 },
    );
    const alphabet = fc.constantFrom('(', ')', ',', 'AND', 'or', 'NOT', "'", '!', '"', '`', 'Setup_mode', 'x', ' ', '1', '⊕', '&');
    fc.assert(
      fc.property(fc.array(alphabet, { maxLength: 40 }), (parts) => {
        const r = parseExpression(parts.join(''), signals);
        if (!r.ok) expect(r.error.position).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('printing and parsing back', () => {
  it('Structured Text printed from any expression parses back to the same truth table (fast-check)', () => {
    const sigs = letterSignals(5);
    fc.assert(
      fc.property(exprArb(sigs), (expr) => {
        const back = parseExpression(printSt(expr), sigs);
        expect(back.ok).toBe(true);
        if (back.ok) expect(equals(truthTable(back.value, 5), truthTable(expr, 5))).toBe(true);
      }),
      { numRuns: 500 },
    );
  });
});
