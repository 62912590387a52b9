// Minimal AND/OR forms over up to 64 inputs: primes from the BDD, exact covering over pieces
// of the on-set (cover.ts), a heuristic cover when the primes or the matrix are out of reach.
import { DdTooLarge, FALSE, TRUE, type Dd, type Node } from './bdd.js';
import { exactCover, type CoverProblem } from './cover.js';
import { heuristicCover } from './heuristic.js';
import { deadlineAt, now } from './deadline.js';
import { DEFAULT_BUDGET_MS, type FormBound } from './sop.js';
import type { WideFunction } from './wide-fn.js';
import { compareWidePrinted, inputBit, wideContains, wideCube, wideLiterals, wideWithin, type WideCube } from './wide-cube.js';

/** Beyond this many primes the cover is heuristic. */
export const WIDE_PRIME_LIMIT = 20_000;

/** A heuristic cover starts from at most this many disjoint cubes of the on-set. */
export const WIDE_PATH_LIMIT = 100_000;

export interface WideSopForm {
  readonly cubes: WideCube[];
  readonly proven: boolean;
  readonly terms: number;
  readonly literals: number;
  /** Proven lower bound: every form has at least `terms` terms; one with that many at least `literals` literals. */
  readonly lowerBound: FormBound;
}

/**
 * Every prime implicant of the function `allowed`, recursively on its BDD: with f0, f1 the
 * halves on the top input x, the primes are those of f0·f1, then x'p for each prime p of f0
 * that is no implicant of f1, and xp for each prime p of f1 that is no implicant of f0 (such
 * a p would be an implicant of f0·f1 without x). Null past the deadline or the limit.
 */
export function widePrimes(dd: Dd, allowed: Node, deadline = Infinity, limit = WIDE_PRIME_LIMIT): WideCube[] | null {
  const memo = new Map<Node, WideCube[]>();
  let aborted = false;
  const walk = (f: Node): WideCube[] => {
    if (f === FALSE || aborted) return [];
    if (f === TRUE) return [{ mask: 0n, bits: 0n }];
    const known = memo.get(f);
    if (known) return known;
    if (now() > deadline) {
      aborted = true;
      return [];
    }
    const v = dd.level(f);
    const f0 = dd.lo(f);
    const f1 = dd.hi(f);
    const bit = inputBit(dd.n, v);
    const out = [...walk(dd.and(f0, f1))];
    for (const p of walk(f0)) if (!dd.implies(p, f1)) out.push({ mask: p.mask | bit, bits: p.bits });
    for (const p of walk(f1)) if (!dd.implies(p, f0)) out.push({ mask: p.mask | bit, bits: p.bits | bit });
    if (out.length > limit) aborted = true;
    memo.set(f, out);
    return out;
  };
  const primes = walk(allowed);
  return aborted ? null : primes;
}

/**
 * Cover the on-set (don't-cares may be used) with primes, fewest terms then fewest literals.
 * The cover matrix is grown row by row (`wideCover`); proven when the exact cover of the rows
 * taken finished within the budget and covers the whole on-set; else heuristic.
 */
export function minimiseWide(fn: WideFunction, options: { budgetMs?: number } = {}): WideSopForm {
  const { dd } = fn;
  const budget = options.budgetMs ?? DEFAULT_BUDGET_MS;
  const deadline = now() + budget;
  const halfway = deadline - budget / 2;
  if (fn.on === FALSE) return form(dd.n, [], { terms: 0, literals: 0 }, true);
  const allowed = dd.or(fn.on, fn.dc);
  if (allowed === TRUE) return form(dd.n, [{ mask: 0n, bits: 0n }], { terms: 1, literals: 0 }, true);
  const found = widePrimes(dd, allowed, halfway);
  const primes = found && found.filter((p) => dd.meets(p, fn.on));
  // Without the primes only the trivial bound is known: a non-empty on-set needs a term.
  if (!primes) return form(dd.n, wideExpandCover(fn, allowed, deadline), { terms: 1, literals: 0 }, false);
  const cover = wideCover(fn, primes, deadline);
  return form(dd.n, cover.columns.map((c) => primes[c]!), cover.lowerBound, cover.proven);
}

function form(n: number, cubes: WideCube[], lowerBound: FormBound, proven: boolean): WideSopForm {
  const sorted = [...cubes].sort(compareWidePrinted(n));
  return { cubes: sorted, proven, terms: sorted.length, literals: sorted.reduce((k, c) => k + wideLiterals(c), 0), lowerBound };
}

/**
 * An exact cover of the on-set by the primes without listing the on-set: a row is one on-set
 * combination with the primes that hold it. Start from one combination per path of the
 * on-set's BDD, solve, and add a combination of each path of what the chosen primes leave
 * uncovered until nothing is left. The rows taken are a subset of all rows, so a cover proven
 * best for them and covering everything is the best cover of all (row generation). Past the
 * deadline what is left is covered greedily and the cover is not proven.
 */
export function wideCover(
  fn: WideFunction,
  primes: readonly WideCube[],
  deadline: number,
): { columns: number[]; proven: boolean; lowerBound: FormBound } {
  const stop = deadlineAt(deadline);
  const { dd } = fn;
  const primeNodes = primes.map((p) => dd.cube(p));
  const costs = primes.map(wideLiterals);
  const rows = new Map<string, number[]>();
  const addRows = (set: Node): void => {
    for (const c of dd.pathCubes(set, ROWS_PER_ROUND).cubes) {
      const k = c.bits;
      const cols: number[] = [];
      for (let j = 0; j < primes.length; j++) if (wideContains(primes[j]!, k)) cols.push(j);
      rows.set(cols.join(','), cols);
    }
  };
  addRows(fn.on);
  for (;;) {
    const problem: CoverProblem = { rows: [...rows.values()], costs };
    const result = exactCover(problem, stop, heuristicCover(problem, stop));
    // The rows taken are some of all rows: a bound for them bounds the whole problem too.
    const lowerBound = { terms: result.lowerBound.columns, literals: result.lowerBound.cost };
    const left = dd.minus(fn.on, dd.orAll(result.columns.map((j) => primeNodes[j]!)));
    if (left === FALSE) return { columns: result.columns, proven: result.proven, lowerBound };
    if (now() > deadline) return { columns: greedyRest(dd, primes, primeNodes, result.columns, left), proven: false, lowerBound };
    addRows(left);
  }
}

/** Combinations taken into the cover matrix per round, one per path of what is left. */
const ROWS_PER_ROUND = 2000;

/** Cover what is left with, per combination left, the cheapest prime holding it. */
function greedyRest(dd: Dd, primes: readonly WideCube[], primeNodes: readonly Node[], chosen: readonly number[], left: Node): number[] {
  const out = [...chosen];
  for (let rest = left; rest !== FALSE; ) {
    const k = dd.minterms(rest, 1)[0]!;
    let best = -1;
    for (let j = 0; j < primes.length; j++)
      if (wideContains(primes[j]!, k) && (best < 0 || wideLiterals(primes[j]!) < wideLiterals(primes[best]!))) best = j;
    out.push(best);
    rest = dd.minus(rest, primeNodes[best]!);
  }
  return out.sort((a, b) => a - b);
}

/** Drop literals, leftmost input first, while the cube stays inside `allowed`: a prime. */
export function wideExpandToPrime(dd: Dd, c: WideCube, allowed: Node): WideCube {
  let out = c;
  for (let i = 0; i < dd.n; i++) {
    const bit = inputBit(dd.n, i);
    if (!(out.mask & bit)) continue;
    const wider = wideCube(out.mask & ~bit, out.bits);
    if (dd.implies(wider, allowed)) out = wider;
  }
  return out;
}

/**
 * The heuristic cover: the on-set's paths (largest first), each not yet covered expanded to a
 * prime, then every term whose on-set part the others cover dropped (fewest literals kept).
 * Past the deadline a path is taken as it is.
 */
function wideExpandCover(fn: WideFunction, allowed: Node, deadline: number): WideCube[] {
  const { dd } = fn;
  const found = dd.pathCubes(fn.on, WIDE_PATH_LIMIT);
  if (!found.complete) throw new DdTooLarge(`the on-set has more than ${WIDE_PATH_LIMIT.toLocaleString('en-US')} disjoint cubes and its primes are out of reach`);
  const paths = found.cubes.sort((a, b) => wideLiterals(a) - wideLiterals(b));
  const taken: WideCube[] = [];
  let covered: Node = FALSE;
  for (const c of paths) {
    if (taken.some((p) => wideWithin(c, p))) continue;
    if (now() <= deadline && dd.implies(c, covered)) continue;
    const prime = now() > deadline ? c : wideExpandToPrime(dd, c, allowed);
    taken.push(prime);
    covered = dd.or(covered, dd.cube(prime));
  }
  if (now() > deadline) return taken;
  // Irredundant: the dearest terms are tried first.
  const order = taken.map((_, i) => i).sort((a, b) => wideLiterals(taken[b]!) - wideLiterals(taken[a]!));
  const kept = new Set(taken.map((_, i) => i));
  for (const i of order) {
    if (now() > deadline) break;
    kept.delete(i);
    const rest = dd.orAll([...kept].map((j) => dd.cube(taken[j]!)));
    if (dd.minus(dd.and(dd.cube(taken[i]!), fn.on), rest) !== FALSE) kept.add(i);
  }
  return [...kept].map((i) => taken[i]!);
}
