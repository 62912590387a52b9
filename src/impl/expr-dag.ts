// Walks over the expressions a program is read back into. They are DAGs: an intermediate
// variable used twice is one shared subtree, and a chain of assignments is as deep as the
// program is long. So every walk goes once per distinct node and none recurses.
import { not, postOrder, type Expr } from '../logic/index.js';

type Var = Extract<Expr, { kind: 'var' }>;

/** The same expression with each variable replaced by `leaf(v)`; shared subtrees stay shared (also across calls with one `memo`). */
export function mapVars(root: Expr, leaf: (v: Var) => Expr, memo = new Map<Expr, Expr>()): Expr {
  const todo = postOrder([root], (x) => memo.has(x));
  for (const x of todo) {
    let r: Expr;
    if (x.kind === 'var') r = leaf(x);
    else if (x.kind === 'const') r = x;
    else if (x.kind === 'not') r = not(memo.get(x.arg)!);
    else r = { kind: x.kind, args: x.args.map((a) => memo.get(a)!) };
    memo.set(x, r);
  }
  return memo.get(root)!;
}

/** The variable indices an expression uses, in increasing order. */
export function varsOf(root: Expr): number[] {
  const out = new Set<number>();
  for (const x of postOrder([root])) if (x.kind === 'var') out.add(x.input);
  return [...out].sort((a, b) => a - b);
}

/** Distinct nodes of the expression (what evaluating it costs, per 32 combinations). */
export function nodeCount(root: Expr): number {
  return postOrder([root]).length;
}
