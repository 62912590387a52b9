import { describe, expect, it } from 'vitest';
import { and, not, or, variable, xor, type Expr } from '../../../src/logic/expr/ast.js';
import { EXCEL_MAX_FORMULA_CHARS, printExcel } from '../../../src/logic/expr/print-excel.js';

const ref = (input: number): string => `${String.fromCharCode(65 + input)}5`;
const a = variable(0, 'a');
const b = variable(1, 'b');
const c = variable(2, 'c');

function text(e: Expr, file = false): string {
  const r = printExcel(e, ref, { file });
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

/** Evaluate our formula text the way Excel would for numeric 0/1 cells (a tiny reader for tests). */
function evalFormula(formula: string, cells: Record<string, number>): boolean {
  let pos = 0;
  const value = (): boolean => {
    const m = /^(_xlfn\.)?(AND|OR|XOR|NOT)\(/.exec(formula.slice(pos));
    if (m) {
      pos += m[0].length;
      const args = [value()];
      while (formula[pos] === ',') {
        pos++;
        args.push(value());
      }
      pos++; // ')'
      if (m[2] === 'NOT') return !args[0];
      if (m[2] === 'AND') return args.every(Boolean);
      if (m[2] === 'OR') return args.some(Boolean);
      return args.filter(Boolean).length % 2 === 1;
    }
    const cell = /^\(--([A-Z]+\d+)=1\)/.exec(formula.slice(pos));
    if (cell) {
      pos += cell[0].length;
      return cells[cell[1]!] === 1;
    }
    const konst = /^(TRUE|FALSE)/.exec(formula.slice(pos))!;
    pos += konst[0].length;
    return konst[1] === 'TRUE';
  };
  return value();
}

describe('printing Excel formulas', () => {
  it('coerces each cell reference so that numbers, logical values and numeric text all count', () => {
    expect(text(a)).toBe('(--A5=1)');
  });

  it('uses AND, OR and NOT as functions', () => {
    expect(text(or(and(a, not(b)), c))).toBe('OR(AND((--A5=1),NOT((--B5=1))),(--C5=1))');
  });

  it('writes XOR as typed for Office.js and as _xlfn.XOR inside a file', () => {
    expect(text(xor(a, b))).toBe('XOR((--A5=1),(--B5=1))');
    expect(text(xor(a, b), true)).toBe('_xlfn.XOR((--A5=1),(--B5=1))');
  });

  it('splits an argument list longer than 255 into nested calls that mean the same', () => {
    const vars = Array.from({ length: 600 }, (_, i) => variable(i % 3, 'v'));
    const formula = text(or(...vars));
    expect(formula.startsWith('OR(OR(')).toBe(true);
    expect(evalFormula(formula, { A5: 0, B5: 0, C5: 1 })).toBe(true);
    expect(evalFormula(formula, { A5: 0, B5: 0, C5: 0 })).toBe(false);
  });

  it('splits XOR at 254 arguments and keeps the parity', () => {
    const formula = text(xor(...Array.from({ length: 255 }, () => a)));
    expect(formula.match(/XOR\(/g)!.length).toBe(2);
    expect(evalFormula(formula, { A5: 1 })).toBe(true);
  });

  it('fails with a clear message when the formula is longer than 8,192 characters', () => {
    const many = Array.from({ length: 300 }, () => and(a, b, c));
    const r = printExcel(or(...many), ref);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/characters long, more than Excel's 8192/);
    expect(EXCEL_MAX_FORMULA_CHARS).toBe(8192);
  });

  it('fails when functions nest deeper than 64 levels', () => {
    let e: Expr = a;
    for (let i = 0; i < 65; i++) e = not(e);
    const r = printExcel(e, ref);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error.message).toMatch(/nest 65 functions deep, more than Excel's 64/);
  });

  it('accepts exactly 64 levels of nesting', () => {
    let e: Expr = a;
    for (let i = 0; i < 64; i++) e = not(e);
    expect(printExcel(e, ref).ok).toBe(true);
  });
});
