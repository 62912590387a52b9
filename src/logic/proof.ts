// Proof of a form against its spec: every one of the 2^n combinations checked.
import { count, inputValue, intersect, members, minus, symmetricDifference, type BitSet, type Combination } from './bits.js';
import type { BoolFunction } from './boolfn.js';

/** How many combinations a proof or check lists by name; the counts are always complete. */
export const LISTED = 50;

export interface Proof {
  /** 2^n: every combination was checked. */
  readonly combinations: number;
  /** Specified combinations (not don't-care) where the form's value differs from the spec. */
  readonly mismatchCount: number;
  /** The first LISTED of them, in increasing order. */
  readonly mismatches: Combination[];
  /** Don't-care combinations the form turns ON: the first LISTED of them. */
  readonly permitsAlso: Combination[];
  readonly permitsAlsoCount: number;
}

/** Check the values of a form (its truth table over fn.n inputs) against the spec fn. */
export function prove(fn: BoolFunction, values: BitSet): Proof {
  const wrong = minus(symmetricDifference(values, fn.on), fn.dc);
  const permits = intersect(values, fn.dc);
  return {
    combinations: 2 ** fn.n,
    mismatchCount: count(wrong),
    mismatches: members(wrong, LISTED),
    permitsAlso: members(permits, LISTED),
    permitsAlsoCount: count(permits),
  };
}

/** The input values of combination k, leftmost input first: a counterexample as a table row. */
export function inputValues(n: number, k: Combination): (0 | 1)[] {
  const row: (0 | 1)[] = [];
  for (let i = 0; i < n; i++) row.push(inputValue(n, k, i));
  return row;
}
