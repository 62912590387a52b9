import { describe, expect, it } from 'vitest';
import { FALSE, TRUE, and, not, or, variable, xor } from '../../../src/logic/expr/ast.js';
import { printSt } from '../../../src/logic/expr/print-st.js';

const a = variable(0, 'a');
const b = variable(1, 'b');
const c = variable(2, 'c');

describe('printing Structured Text', () => {
  it('prints names and the constants TRUE and FALSE', () => {
    expect(printSt(a)).toBe('a');
    expect(printSt(TRUE)).toBe('TRUE');
    expect(printSt(FALSE)).toBe('FALSE');
  });

  it('prints NOT of a name without parentheses', () => {
    expect(printSt(not(a))).toBe('NOT a');
    expect(printSt(and(not(a), b))).toBe('NOT a AND b');
  });

  it('puts the operand of NOT in parentheses when it is a group or another NOT', () => {
    expect(printSt(not(and(a, b)))).toBe('NOT (a AND b)');
    expect(printSt(not(not(a)))).toBe('NOT (NOT a)');
  });

  it('always parenthesises an AND group inside OR and inside XOR', () => {
    expect(printSt(or(and(a, b), c))).toBe('(a AND b) OR c');
    expect(printSt(xor(a, and(b, c)))).toBe('a XOR (b AND c)');
  });

  it('parenthesises a XOR group inside OR and an OR group inside AND', () => {
    expect(printSt(or(xor(a, b), c))).toBe('(a XOR b) OR c');
    expect(printSt(and(or(a, b), c))).toBe('(a OR b) AND c');
  });

  it('keeps a nested group of the same operator in parentheses, as built', () => {
    expect(printSt(and(a, and(b, c)))).toBe('a AND (b AND c)');
  });

  it('prints a group of one operand as that operand, and empty groups as their identity', () => {
    expect(printSt({ kind: 'or', args: [and(a, b)] })).toBe('a AND b');
    expect(printSt(not({ kind: 'and', args: [a] }))).toBe('NOT a');
    expect(printSt({ kind: 'and', args: [] })).toBe('TRUE');
    expect(printSt({ kind: 'xor', args: [] })).toBe('FALSE');
  });
});
