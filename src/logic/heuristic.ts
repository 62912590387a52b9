// Heuristic covers for when an exact one is out of reach: expand, irredundant, reduce.
import { popcount, type BitSet } from './bits.js';
import { cube, type Cube } from './cube.js';
import { compareCovers, type CoverProblem } from './cover.js';
import { NEVER, type Deadline } from './deadline.js';
import { cubeInsideSet, cubeWithin } from './primes.js';

/**
 * Expand: drop literals, leftmost input first, while the cube stays inside `allowed`
 * (on ∪ dc). The result is a prime implicant: no literal of it can be dropped.
 */
export function expandToPrime(n: number, c: Cube, allowed: BitSet): Cube {
  let out = c;
  for (let i = n - 1; i >= 0; i--) {
    const bit = 1 << i;
    if (!(out.mask & bit)) continue;
    const wider = cube(out.mask & ~bit, out.bits);
    if (cubeInsideSet(n, wider, allowed)) out = wider;
  }
  return out;
}

/**
 * A cover of the on-set's cubes by implicants when there is no time for the cover matrix: each
 * cube (largest first) not inside one already taken is expanded to a prime while the clock allows, and taken
 * as it is after that (the cubes are disjoint, so no two taken are the same).
 */
export function expandCover(n: number, onCubes: readonly Cube[], allowed: BitSet, deadline: Deadline): Cube[] {
  const out: Cube[] = [];
  // Largest cubes first: their primes swallow more of the rest.
  for (const c of [...onCubes].sort((a, b) => popcount(a.mask) - popcount(b.mask))) {
    if (deadline.passed()) out.push(c);
    else if (!out.some((p) => cubeWithin(c, p))) out.push(expandToPrime(n, c, allowed));
  }
  return out;
}

/**
 * A lower bound on the terms of any cover when there are no primes: on-set combinations (one
 * per disjoint cube of the on-set) no two of which lie in one implicant, because the smallest
 * cube holding both meets the off-set. Each needs a term of its own. Grown while the clock
 * allows, but from at least 64 candidates (the deadline may have passed already).
 */
export function separatedCombinations(n: number, onCubes: readonly Cube[], allowed: BitSet, deadline: Deadline): number {
  const full = n === 32 ? -1 : (1 << n) - 1;
  const chosen: number[] = [];
  for (let i = 0; i < onCubes.length; i++) {
    if (i >= 64 && (i & 63) === 0 && deadline.passed()) break;
    const p = onCubes[i]!.bits;
    const apart = chosen.every((q) => {
      const mask = full & ~(p ^ q);
      return !cubeInsideSet(n, cube(mask, p & mask), allowed);
    });
    if (apart) chosen.push(p);
  }
  return chosen.length;
}

/**
 * A good cover (fewest columns, then lowest cost), not proven best, in three steps over the
 * cover matrix: a greedy start (most uncovered rows, then cheapest), irredundant (drop columns whose rows are all
 * covered twice, dearest first), then reduce and re-expand: shrink each chosen column to the rows
 * only it covers and put in the cheapest column that covers those and the most rows besides;
 * repeat irredundant while the cost falls.
 */
export function heuristicCover(problem: CoverProblem, deadline: Deadline = NEVER): number[] {
  const { rows, costs } = problem;
  const colRows: number[][] = costs.map(() => []);
  rows.forEach((cols, r) => cols.forEach((c) => colRows[c]!.push(r)));
  const chosen = greedy(problem, colRows, deadline);
  irredundant(problem, colRows, chosen);
  for (let before = [...chosen]; !deadline.passed(); ) {
    reexpand(problem, colRows, chosen, deadline);
    irredundant(problem, colRows, chosen);
    const after = [...chosen];
    if (compareCovers(problem, after, before) >= 0) break;
    before = after;
  }
  return [...chosen].sort((a, b) => a - b);
}

/** Most uncovered rows first; past the deadline, each row still open takes its first column. */
function greedy(problem: CoverProblem, colRows: number[][], deadline: Deadline): Set<number> {
  const { rows, costs } = problem;
  const open = colRows.map((rs) => rs.length);
  const covered = new Uint8Array(rows.length);
  const chosen = new Set<number>();
  const take = (c: number): void => {
    chosen.add(c);
    for (const r of colRows[c]!) {
      if (covered[r]) continue;
      covered[r] = 1;
      for (const c2 of rows[r]!) open[c2]!--;
    }
  };
  // Rows with a single column force it.
  for (const cols of rows) if (cols.length === 1 && !chosen.has(cols[0]!)) take(cols[0]!);
  for (;;) {
    if (deadline.passed()) {
      rows.forEach((cols, r) => covered[r] || take(cols[0]!));
      return chosen;
    }
    let best = -1;
    for (let c = 0; c < costs.length; c++)
      if (open[c]! > 0 && (best < 0 || open[c]! > open[best]! || (open[c] === open[best] && costs[c]! < costs[best]!))) best = c;
    if (best < 0) return chosen;
    take(best);
  }
}

/** Times each row is covered by the chosen columns. */
function multiplicity(problem: CoverProblem, colRows: number[][], chosen: Set<number>): Int32Array {
  const times = new Int32Array(problem.rows.length);
  for (const c of chosen) for (const r of colRows[c]!) times[r]!++;
  return times;
}

function irredundant(problem: CoverProblem, colRows: number[][], chosen: Set<number>): void {
  const times = multiplicity(problem, colRows, chosen);
  const dearestFirst = [...chosen].sort((a, b) => problem.costs[b]! - problem.costs[a]! || b - a);
  for (const c of dearestFirst) {
    if (colRows[c]!.every((r) => times[r]! >= 2)) {
      chosen.delete(c);
      for (const r of colRows[c]!) times[r]!--;
    }
  }
}

function reexpand(problem: CoverProblem, colRows: number[][], chosen: Set<number>, deadline: Deadline): void {
  const { rows, costs } = problem;
  const times = multiplicity(problem, colRows, chosen);
  for (const c of [...chosen]) {
    if (deadline.passed()) return;
    const own = colRows[c]!.filter((r) => times[r] === 1);
    if (own.length === 0) continue;
    // Candidates: columns covering every row only c covers.
    let best = c;
    let bestReach = colRows[c]!.length;
    for (const c2 of rows[own[0]!]!) {
      if (c2 === c || !own.every((r) => rows[r]!.includes(c2))) continue;
      const reach = colRows[c2]!.length;
      if (costs[c2]! < costs[best]! || (costs[c2]! === costs[best]! && reach > bestReach)) [best, bestReach] = [c2, reach];
    }
    if (best !== c) {
      chosen.delete(c);
      chosen.add(best);
      for (const r of colRows[c]!) times[r]!--;
      for (const r of colRows[best]!) times[r]!++;
    }
  }
}
