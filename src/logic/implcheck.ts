// Implementation check: logic already written (parsed to an expression) against the spec.
import { anfDifference, type Monomial } from './anf.js';
import { has, intersect, union, type Combination } from './bits.js';
import type { BoolFunction } from './boolfn.js';
import type { Expr } from './expr/ast.js';
import { truthTable } from './expr/evaluate.js';
import { LISTED, inputValues, prove } from './proof.js';

export interface Counterexample {
  readonly combination: Combination;
  /** Input values, leftmost input first. */
  readonly inputs: (0 | 1)[];
  /** What the spec asks for. */
  readonly expected: 0 | 1;
  /** What the implementation gives. */
  readonly actual: 0 | 1;
}

export interface ImplCheck {
  /** The implementation agrees with the spec on every specified combination. */
  readonly equal: boolean;
  /** 2^n: every combination was checked. */
  readonly combinations: number;
  readonly mismatchCount: number;
  /** The first LISTED disagreements, in increasing order of combination. */
  readonly counterexamples: Counterexample[];
  /**
   * The first LISTED monomials of the ANF of (spec XOR implementation), where the spec's
   * don't-cares take the implementation's value: so only real disagreements show. Their XOR
   * is exactly the correction that turns the implementation into the spec.
   */
  readonly differenceMonomials: Monomial[];
  readonly differenceMonomialCount: number;
  /** Don't-care combinations the implementation turns ON. */
  readonly dontCareOn: number;
}

/** Check an implementation (an expression over fn's inputs) against the spec fn. */
export function checkImplementation(expr: Expr, fn: BoolFunction): ImplCheck {
  const impl = truthTable(expr, fn.n);
  const proof = prove(fn, impl);
  const counterexamples = proof.mismatches.map((k) => {
    const expected: 0 | 1 = has(fn.on, k) ? 1 : 0;
    return { combination: k, inputs: inputValues(fn.n, k), expected, actual: (1 - expected) as 0 | 1 };
  });
  // Don't-cares take the implementation's value, so they never count as a difference.
  const completed = union(fn.on, intersect(impl, fn.dc));
  const difference = proof.mismatchCount === 0 ? [] : anfDifference(completed, impl, fn.n);
  return {
    equal: proof.mismatchCount === 0,
    combinations: proof.combinations,
    mismatchCount: proof.mismatchCount,
    counterexamples,
    differenceMonomials: difference.slice(0, LISTED),
    differenceMonomialCount: difference.length,
    dontCareOn: proof.permitsAlsoCount,
  };
}
