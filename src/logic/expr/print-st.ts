// Expressions as IEC 61131-3 Structured Text (DESIGN.md section 3).
import type { Expr } from './ast.js';

const KEYWORD = { and: 'AND', or: 'OR', xor: 'XOR' } as const;

/**
 * Structured Text for an expression: NOT, AND, XOR, OR (binding in that order), TRUE/FALSE.
 * Parentheses go wherever a reader could doubt the grouping: every AND, XOR or OR group that
 * stands inside another operator, and the operand of NOT unless it is a name or a constant.
 * So `a OR (b AND c)` and `NOT (a AND b)`, but `NOT a AND b`.
 */
export function printSt(expr: Expr): string {
  const e = unwrap(expr);
  switch (e.kind) {
    case 'const':
      return e.value ? 'TRUE' : 'FALSE';
    case 'var':
      return e.name;
    case 'not':
      return isGroup(e.arg) || unwrap(e.arg).kind === 'not' ? `NOT (${printSt(e.arg)})` : `NOT ${printSt(e.arg)}`;
    default:
      if (e.args.length === 0) return e.kind === 'and' ? 'TRUE' : 'FALSE';
      return e.args.map((a) => (isGroup(a) ? `(${printSt(a)})` : printSt(a))).join(` ${KEYWORD[e.kind]} `);
  }
}

/** An AND/XOR/OR of one operand is that operand. */
function unwrap(e: Expr): Expr {
  while ((e.kind === 'and' || e.kind === 'or' || e.kind === 'xor') && e.args.length === 1) e = e.args[0]!;
  return e;
}

/** An AND, XOR or OR of two or more operands. */
function isGroup(e: Expr): boolean {
  const u = unwrap(e);
  return (u.kind === 'and' || u.kind === 'or' || u.kind === 'xor') && u.args.length > 1;
}
