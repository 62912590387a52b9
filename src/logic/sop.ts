// Minimal AND/OR forms (sum of products): fewest product terms, then fewest literals.
import { count, popcount, union } from './bits.js';
import { cube, type Cube } from './cube.js';
import type { BoolFunction } from './boolfn.js';
import { exactCover, type CoverProblem } from './cover.js';
import { expandCover, heuristicCover, separatedCombinations } from './heuristic.js';
import { deadlineAt, NEVER, now, type Clock, type Deadline } from './deadline.js';
import { comparePrinted, cubesDisjoint, primesWithin, setToCubes } from './primes.js';

export { primeImplicants } from './primes.js';

/** A proven lower bound on a form's cost: every form has at least `terms` terms, and one with
 * that many at least `literals` literals. */
export interface FormBound {
  readonly terms: number;
  readonly literals: number;
}

export interface SopForm {
  /** Product terms in printed order (see `comparePrinted` in primes.ts). */
  readonly cubes: Cube[];
  /**
   * True when no form with fewer terms, or as many terms and fewer literals, exists: the
   * search ran to its end and `lowerBound` equals (terms, literals).
   */
  readonly proven: boolean;
  readonly terms: number;
  readonly literals: number;
  /**
   * What was proven: every sum of products of the function has at least `terms` product
   * terms, and every one with the fewest terms at least `literals` literals.
   */
  readonly lowerBound: FormBound;
}

export interface SopOptions {
  /** Time for finding primes and proving the cover minimal (default 2000 ms). */
  readonly budgetMs?: number;
  /** The clock the budget is read from (tests give one that does not depend on the machine). */
  readonly clock?: Clock;
}

export const DEFAULT_BUDGET_MS = 2000;

/**
 * Cover the on-set (don't-cares may be used, need not be covered) with prime implicants,
 * minimising product terms, then literals. Within the budget the cover is found by exact
 * covering and proven; otherwise it comes from the heuristic and says proven: false.
 * FALSE is the form with no terms; TRUE is one term with no literals.
 */
export function minimiseSop(fn: BoolFunction, options: SopOptions = {}): SopForm {
  const budget = options.budgetMs ?? DEFAULT_BUDGET_MS;
  const clock = options.clock ?? now;
  const deadline = deadlineAt(clock() + budget, clock);
  // Primes and the cover matrix get three quarters of the budget (a cover from them beats the
  // fallback by far), leaving the rest for a cheaper cover.
  const matrixDeadline = deadline.at(clock() + budget * 0.75);
  const { n } = fn;
  if (count(fn.on) === 0) return form(n, [], { terms: 0, literals: 0 }, true);
  const allowed = union(fn.on, fn.dc);
  if (count(allowed) === 2 ** n) return form(n, [cube(0, 0)], { terms: 1, literals: 0 }, true);
  const onCubes = setToCubes(n, fn.on);
  const primes = primesWithin(fn, matrixDeadline);
  const problem = primes && coverProblem(onCubes, primes, matrixDeadline);
  if (!primes || !problem) {
    const cubes = expandCover(n, onCubes, allowed, deadline);
    // Without the matrix: terms from combinations no implicant joins, each at least a literal.
    const terms = Math.max(1, separatedCombinations(n, onCubes, allowed, deadline));
    return form(n, cubes, { terms, literals: terms }, false);
  }
  const result = exactCover(problem, deadline, heuristicCover(problem, deadline));
  const { columns, cost } = result.lowerBound;
  return form(n, result.columns.map((c) => primes[c]!), { terms: columns, literals: cost }, result.proven);
}

function form(n: number, cubes: Cube[], lowerBound: FormBound, proven: boolean): SopForm {
  const sorted = [...cubes].sort(comparePrinted(n));
  return { cubes: sorted, proven, terms: sorted.length, literals: sorted.reduce((k, c) => k + popcount(c.mask), 0), lowerBound };
}

/**
 * Rows: the on-set split into pieces that each column either holds whole or misses, one row
 * per distinct set of columns (so rows stay few when the on-set is large). Each disjoint cube
 * of the on-set is split by the columns that meet it only. A column costs its literals; the
 * cover search counts columns (product terms) first. Null past the deadline.
 */
export function coverProblem(onCubes: readonly Cube[], columns: readonly Cube[], deadline: Deadline = NEVER): CoverProblem | null {
  const rows = new Map<string, number[]>();
  for (const q0 of onCubes) {
    if (deadline.passed()) return null;
    let pieces = [{ c: q0, cols: [] as number[] }];
    for (let j = 0; j < columns.length; j++) {
      const p = columns[j]!;
      if (cubesDisjoint(q0, p)) continue;
      const next: typeof pieces = [];
      for (const piece of pieces) {
        const q = piece.c;
        if (cubesDisjoint(q, p)) {
          next.push(piece);
          continue;
        }
        // Split q into its part inside p and disjoint parts outside, one input of p at a time.
        let inside = q;
        for (let free = p.mask & ~q.mask; free !== 0; free &= free - 1) {
          const bit = free & -free;
          next.push({ c: cube(inside.mask | bit, inside.bits | (~p.bits & bit)), cols: piece.cols.slice() });
          inside = cube(inside.mask | bit, inside.bits | (p.bits & bit));
        }
        piece.cols.push(j);
        next.push({ c: inside, cols: piece.cols });
      }
      pieces = next;
    }
    for (const { cols } of pieces) rows.set(cols.join(','), cols);
  }
  return { rows: [...rows.values()], costs: columns.map((p) => popcount(p.mask)) };
}
