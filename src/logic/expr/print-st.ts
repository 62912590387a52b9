// Expressions as IEC 61131-3 Structured Text (DESIGN.md section 3).
import type { Expr } from './ast.js';

const KEYWORD = { and: ' AND ', or: ' OR ', xor: ' XOR ' } as const;

/**
 * Structured Text for an expression: NOT, AND, XOR, OR (binding in that order), TRUE/FALSE.
 * Parentheses go wherever a reader could doubt the grouping: every AND, XOR or OR group that
 * stands inside another operator, and the operand of NOT unless it is a name or a constant.
 * So `a OR (b AND c)` and `NOT (a AND b)`, but `NOT a AND b`.
 *
 * The text is emitted piece by piece from an explicit stack and joined once: linear in the
 * size of the expression, whatever its depth or width.
 */
export function printSt(expr: Expr): string {
  const pieces: string[] = [];
  // Work items: a piece of text to emit, or an expression to expand. Popped from the end.
  const work: (string | Expr)[] = [expr];
  while (work.length > 0) {
    const item = work.pop()!;
    if (typeof item === 'string') {
      pieces.push(item);
      continue;
    }
    const e = unwrap(item);
    switch (e.kind) {
      case 'const':
        pieces.push(e.value ? 'TRUE' : 'FALSE');
        break;
      case 'var':
        pieces.push(e.name);
        break;
      case 'not':
        if (isGroup(e.arg) || unwrap(e.arg).kind === 'not') work.push(')', e.arg, 'NOT (');
        else work.push(e.arg, 'NOT ');
        break;
      default:
        if (e.args.length === 0) {
          pieces.push(e.kind === 'and' ? 'TRUE' : 'FALSE');
          break;
        }
        for (let i = e.args.length - 1; i >= 0; i--) {
          const a = e.args[i]!;
          if (isGroup(a)) work.push(')', a, '(');
          else work.push(a);
          if (i > 0) work.push(KEYWORD[e.kind]);
        }
    }
  }
  return pieces.join('');
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
