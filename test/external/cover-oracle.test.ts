// The minimum cost of a cover by prime implicants, decided by a SAT solver rather than by our
// covering search. Source of the check: npm `logic-solver` 2.0.1 (MiniSat compiled to
// JavaScript), `Solver#minimizeWeightedSum`: one variable per prime, one clause per on-set
// combination (some prime holding it is taken); first the fewest primes, then, with that
// count required, the fewest literals. Whenever our form says proven it must cost exactly
// that; it may never cost less (that would be a cover the solver missed, i.e. a wrong one),
// and its lower bound may never be above it.
import { describe, expect, it } from 'vitest';
import Logic from 'logic-solver';
import { add, emptySet, has, members, popcount } from '../../src/logic/bits.js';
import type { BoolFunction } from '../../src/logic/boolfn.js';
import { cubeMembers } from '../../src/logic/cube.js';
import { minimiseSop, primeImplicants, type SopForm } from '../../src/logic/sop.js';

function seededFunction(n: number, seed: number, on: number, dc: number): BoolFunction {
  let state = seed >>> 0;
  const next = (): number => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const f = { n, on: emptySet(n), dc: emptySet(n) };
  for (let k = 0; k < 1 << n; k++) {
    const r = next();
    if (r < on) add(f.on, k);
    else if (r < on + dc) add(f.dc, k);
  }
  return f;
}

/** [terms, literals] of a best cover by primes, by the SAT solver. */
function satMinimum(f: BoolFunction): [number, number] {
  const primes = primeImplicants(f);
  const vars = primes.map((_, j) => `p${j}`);
  const holders = new Map<number, string[]>(members(f.on).map((k) => [k, []]));
  primes.forEach((p, j) => cubeMembers(f.n, p).forEach((k) => has(f.on, k) && holders.get(k)!.push(vars[j]!)));
  const solver = new Logic.Solver();
  for (const held of holders.values()) solver.require(Logic.or(held));
  const ones = vars.map(() => 1);
  const literals = primes.map((p) => popcount(p.mask));
  let solution = solver.solve()!;
  solution = solver.minimizeWeightedSum(solution, vars, ones);
  const terms = solution.getWeightedSum(vars, ones);
  solution = solver.minimizeWeightedSum(solution, vars, literals);
  return [terms, solution.getWeightedSum(vars, literals)];
}

function expectConsistent(form: SopForm, [terms, literals]: [number, number]): void {
  expect(form.terms > terms || (form.terms === terms && form.literals >= literals)).toBe(true);
  expect(form.lowerBound.terms).toBeLessThanOrEqual(terms);
  expect(form.lowerBound.literals).toBeLessThanOrEqual(literals);
  if (form.proven) expect([form.terms, form.literals]).toEqual([terms, literals]);
}

// Densities that keep the solver quick: dense 6- and 7-input functions (the search branches),
// sparse 8- and 10-input ones.
const cases: [n: number, seeds: number[], on: number, dc: number][] = [
  [6, [1, 2, 3, 4, 5, 6], 0.45, 0.1],
  [7, [1, 2, 4, 5], 0.63, 0.17],
  [8, [1, 2, 3], 0.15, 0.05],
  [10, [1, 2, 3], 0.05, 0.03],
];

describe('minimum covers by prime implicants against MiniSat (logic-solver)', () => {
  for (const [n, seeds, on, dc] of cases)
    it(`${n} inputs, ${Math.round(on * 100)} % on, ${Math.round(dc * 100)} % don't-care: proven forms cost the solver's minimum, cut ones never less`, () => {
      for (const seed of seeds) {
        const f = seededFunction(n, seed, on, dc);
        const minimum = satMinimum(f);
        const full = minimiseSop(f, { budgetMs: Infinity });
        expect(full.proven).toBe(true);
        expectConsistent(full, minimum);
        // Cut at a quarter, half and three quarters of the work (a clock stepping per reading).
        let readings = 0;
        minimiseSop(f, { budgetMs: Infinity, clock: () => ++readings });
        for (const share of [0.25, 0.5, 0.75]) {
          let t = 0;
          expectConsistent(minimiseSop(f, { budgetMs: Math.round(share * readings), clock: () => ++t }), minimum);
        }
      }
    });
});
