// Proof of a form against its spec over every one of the 2^n combinations, symbolically: the
// form's BDD against the spec's, counts exact in BigInt.
import { FALSE, TRUE, type Dd, type Node } from './bdd.js';
import type { Expr } from './expr/ast.js';
import { LISTED } from './proof.js';
import { postOrder } from './implcheck.js';
import type { WideFunction } from './wide-fn.js';
import type { WideCombination } from './wide-cube.js';

export interface WideProof {
  /** 2^n: every combination was checked. */
  readonly combinations: bigint;
  readonly mismatchCount: bigint;
  /** The first LISTED mismatches, in increasing order. */
  readonly mismatches: WideCombination[];
  readonly permitsAlso: WideCombination[];
  readonly permitsAlsoCount: bigint;
}

/**
 * The BDD of an expression over the Dd's inputs. Each distinct node once, operands first, no
 * recursion: programs read back share subtrees and chain them as deep as the program is long.
 */
export function exprToBdd(dd: Dd, expr: Expr): Node {
  const values = new Map<Expr, Node>();
  for (const x of postOrder([expr])) {
    let f: Node;
    if (x.kind === 'const') f = x.value ? TRUE : FALSE;
    else if (x.kind === 'var') {
      if (!Number.isInteger(x.input) || x.input < 0 || x.input >= dd.n) throw new Error(`bug: expression uses input ${x.input} of ${dd.n}`);
      f = dd.variable(x.input);
    } else if (x.kind === 'not') f = dd.not(values.get(x.arg)!);
    else {
      const args = x.args.map((a) => values.get(a)!);
      f = x.kind === 'and' ? args.reduce((g, a) => dd.and(g, a), TRUE) : x.kind === 'or' ? dd.orAll(args) : dd.xorAll(args);
    }
    values.set(x, f);
  }
  return values.get(expr)!;
}

/**
 * Check a form (its BDD) against the spec: mismatches on the care set, or on every combination
 * against `resolved` (the spec's don't-cares resolved) when given; don't-cares turned ON.
 */
export function proveWide(fn: WideFunction, values: Node, resolved?: Node): WideProof {
  const { dd } = fn;
  const wrong = resolved === undefined ? dd.minus(dd.xor(values, fn.on), fn.dc) : dd.xor(values, resolved);
  const permits = dd.and(values, fn.dc);
  return {
    combinations: 1n << BigInt(dd.n),
    mismatchCount: dd.satCount(wrong),
    mismatches: dd.minterms(wrong, LISTED),
    permitsAlso: dd.minterms(permits, LISTED),
    permitsAlsoCount: dd.satCount(permits),
  };
}
