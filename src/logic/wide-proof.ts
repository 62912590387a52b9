// Proof of a form against its spec over every one of the 2^n combinations, symbolically: the
// form's BDD against the spec's, counts exact in BigInt.
import { FALSE, TRUE, type Dd, type Node } from './bdd.js';
import type { Expr } from './expr/ast.js';
import { LISTED } from './proof.js';
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

/** The BDD of an expression over the Dd's inputs. */
export function exprToBdd(dd: Dd, expr: Expr): Node {
  switch (expr.kind) {
    case 'const':
      return expr.value ? TRUE : FALSE;
    case 'var':
      return dd.variable(expr.input);
    case 'not':
      return dd.not(exprToBdd(dd, expr.arg));
    case 'and':
      return expr.args.reduce((f, a) => dd.and(f, exprToBdd(dd, a)), TRUE);
    case 'or':
      return dd.orAll(expr.args.map((a) => exprToBdd(dd, a)));
    case 'xor':
      return dd.xorAll(expr.args.map((a) => exprToBdd(dd, a)));
  }
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
