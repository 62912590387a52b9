// The derived forms as expressions over the signals' identifiers.
import type { Monomial } from '../anf.js';
import type { Cube } from '../cube.js';
import type { Signal } from '../signals.js';
import { FALSE, TRUE, group, not, variable, type Expr } from './ast.js';

/**
 * A sum of products: OR of one AND per cube; a literal is the input's identifier, or NOT it
 * where the cube asks for 0. No cubes is FALSE; a cube with no literals is TRUE.
 * Literals come in the order of the inputs (leftmost column first).
 */
export function sopToExpr(cubes: readonly Cube[], signals: readonly Signal[]): Expr {
  if (cubes.length === 0) return FALSE;
  return group('or', cubes.map((c) => productTerm(c.mask, (i) => (c.bits & bitOf(signals.length, i)) === 0, signals)));
}

/**
 * An algebraic normal form: XOR of one AND per monomial; monomial 0 is TRUE; no monomials is
 * FALSE. With a polarity (bit set = that input is used complemented, Combination positions),
 * the inputs whose bit is set are printed `NOT name`.
 */
export function anfToExpr(monos: readonly Monomial[], signals: readonly Signal[], polarity = 0): Expr {
  if (monos.length === 0) return FALSE;
  return group('xor', monos.map((m) => productTerm(m, (i) => (polarity & bitOf(signals.length, i)) !== 0, signals)));
}

/** AND of the inputs in `mask` (Combination positions), in input order. */
function productTerm(mask: number, negated: (input: number) => boolean, signals: readonly Signal[]): Expr {
  const n = signals.length;
  if (mask === 0) return TRUE;
  const literals: Expr[] = [];
  for (let i = 0; i < n; i++) {
    if ((mask & bitOf(n, i)) === 0) continue;
    const v = variable(i, signals[i]!.identifier);
    literals.push(negated(i) ? not(v) : v);
  }
  return group('and', literals);
}

function bitOf(n: number, input: number): number {
  return 1 << (n - 1 - input);
}
