// Expressions far larger than any typed by hand: the width of a flat AND read back from a
// program, or the depth of a chain of statements, must neither overflow the stack nor take
// time beyond linear (speed itself is measured in `npm run bench`, not here).
import { describe, expect, it } from 'vitest';
import { members } from '../../../src/logic/bits.js';
import { group, not, variable, type Expr } from '../../../src/logic/expr/ast.js';
import { truthTable } from '../../../src/logic/expr/evaluate.js';
import { sopToExpr } from '../../../src/logic/expr/forms.js';
import { MAX_NESTING, parseExpression } from '../../../src/logic/expr/parse.js';
import { printExcel } from '../../../src/logic/expr/print-excel.js';
import { printSt } from '../../../src/logic/expr/print-st.js';
import { cube } from '../../../src/logic/cube.js';
import { letterSignals } from './arbitraries.js';

const WIDE = 100_000;
const DEEP = 100_000;

/** NOT (a AND NOT (a AND NOT (...))) nested `depth` times around b. */
function deepChain(depth: number): Expr {
  let e: Expr = variable(1, 'b');
  for (let i = 0; i < depth; i++) e = not(group('and', [variable(0, 'a'), e]));
  return e;
}

describe('expressions of input size', () => {
  it('parses a flat AND of 100,000 operands, each a different name, into one AND node', () => {
    const signals = Array.from({ length: WIDE }, (_, i) => ({ header: `p${i}`, identifier: `p${i}` }));
    const parsed = parseExpression(signals.map((s) => s.identifier).join(' AND '), signals);
    expect(parsed.ok && parsed.value.kind === 'and' && parsed.value.args.length).toBe(WIDE);
  });

  it('evaluates and prints a flat OR of 100,000 operands', () => {
    const e = group('or', Array.from({ length: WIDE }, (_, i) => variable(i % 3, 'abc'[i % 3]!)));
    expect(members(truthTable(e, 3))).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(printSt(e).length).toBe(WIDE + (WIDE - 1) * ' OR '.length);
  });

  it('builds a sum of products of 200,000 terms without spreading them into a call', () => {
    const cubes = Array.from({ length: 200_000 }, () => cube(0b10, 0b10));
    const e = sopToExpr(cubes, letterSignals(2));
    expect(e.kind === 'or' && e.args.length).toBe(200_000);
  });

  it('evaluates and prints an expression nested 100,000 levels deep', () => {
    const e = deepChain(DEEP);
    // With a = 1 each level flips the value; with a = 0 the outermost NOT gives 1.
    expect(members(truthTable(e, 2))).toEqual(DEEP % 2 === 0 ? [0, 1, 3] : [0, 1, 2]);
    const st = printSt(e);
    expect(st.startsWith('NOT (a AND NOT (a AND')).toBe(true);
    expect(st.endsWith(`b${')'.repeat(DEEP)}`)).toBe(true);
  });

  it('refuses an Excel formula nested that deep with the figure, rather than overflowing', () => {
    const r = printExcel(deepChain(DEEP), (i) => `A${i + 1}`);
    expect(!r.ok && r.error.message).toContain(`nest ${2 * DEEP} functions deep`);
  });

  it('still caps real nesting in typed text at the documented depth', () => {
    const signals = letterSignals(1);
    expect(parseExpression(`${'('.repeat(MAX_NESTING)}a${')'.repeat(MAX_NESTING)}`, signals).ok).toBe(true);
    const deeper = parseExpression(`${'('.repeat(MAX_NESTING + 1)}a${')'.repeat(MAX_NESTING + 1)}`, signals);
    expect(!deeper.ok && deeper.error.message).toContain(`deeper than ${MAX_NESTING} levels`);
  });
});
