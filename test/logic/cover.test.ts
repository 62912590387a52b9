import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareCovers, coverCost, exactCover, isCover, type CoverProblem } from '../../src/logic/cover.js';
import { heuristicCover } from '../../src/logic/heuristic.js';
import { deadlineAt, NEVER } from '../../src/logic/deadline.js';

/** The best cover by trying every subset of columns (fewest columns, then lowest cost). */
function bruteForceBest(problem: CoverProblem): number[] {
  const rowMasks = problem.rows.map((cols) => cols.reduce((m, c) => m | (1 << c), 0));
  let best: number[] | undefined;
  for (let subset = 0; subset < 1 << problem.costs.length; subset++) {
    if (!rowMasks.every((m) => m & subset)) continue;
    const cols = problem.costs.map((_, c) => c).filter((c) => subset & (1 << c));
    if (!best || compareCovers(problem, cols, best) < 0) best = cols;
  }
  return best!;
}

/** A clock that moves one step per reading: a deadline falls at the same point on any machine. */
function steppingClock(): { clock: () => number; readings: () => number } {
  let t = 0;
  return { clock: () => ++t, readings: () => t };
}

/** Seeded rows of 2-5 columns out of `cols`, costs 1-6. */
function seededProblem(seed: number, cols: number, rowCount: number): CoverProblem {
  let state = seed >>> 0;
  const next = (): number => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const costs = Array.from({ length: cols }, () => 1 + Math.floor(next() * 6));
  const rows = Array.from({ length: rowCount }, () => {
    const k = 2 + Math.floor(next() * 4);
    const row = new Set<number>();
    while (row.size < k) row.add(Math.floor(next() * cols));
    return [...row];
  });
  return { rows, costs };
}

/** A random feasible problem: up to 12 columns, every row covered by at least one. */
const randomProblem = fc
  .integer({ min: 1, max: 12 })
  .chain((cols) =>
    fc.record({
      rows: fc.array(fc.uniqueArray(fc.integer({ min: 0, max: cols - 1 }), { minLength: 1, maxLength: cols }), { minLength: 1, maxLength: 16 }),
      costs: fc.array(fc.integer({ min: 1, max: 6 }), { minLength: cols, maxLength: cols }),
    }),
  );

describe('exact covering', () => {
  it('a column that alone covers a row is taken', () => {
    const problem = { rows: [[0], [0, 1], [1, 2]], costs: [1, 1, 2] };
    expect(exactCover(problem, NEVER, [0, 1, 2])).toMatchObject({ columns: [0, 1], proven: true });
  });

  it('a cyclic problem with no essential column finds its two-column cover', () => {
    // Rows on a ring of four columns, each row covered by two neighbours; columns 0 and 2 cover all.
    const problem = { rows: [[0, 1], [1, 2], [2, 3], [3, 0]], costs: [1, 1, 1, 1] };
    const result = exactCover(problem, NEVER, [0, 1, 2, 3]);
    expect(result.columns.length).toBe(2);
    expect(isCover(problem, result.columns)).toBe(true);
    expect(result.proven).toBe(true);
  });

  it('fewer columns win over lower cost', () => {
    const problem = { rows: [[0, 2], [1, 2]], costs: [1, 1, 5] };
    expect(exactCover(problem, NEVER, [0, 1]).columns).toEqual([2]);
  });

  it('among covers with as many columns, the cheaper wins', () => {
    const problem = { rows: [[0, 1], [2, 3]], costs: [3, 2, 2, 4] };
    expect(exactCover(problem, NEVER, [0, 3]).columns).toEqual([1, 2]);
  });

  it('matches trying every subset of columns', () => {
    fc.assert(
      fc.property(randomProblem, (problem) => {
        const best = bruteForceBest(problem);
        const result = exactCover(problem, NEVER, heuristicCover(problem));
        expect(result.proven).toBe(true);
        expect(isCover(problem, result.columns)).toBe(true);
        expect(compareCovers(problem, result.columns, best)).toBe(0);
      }),
      { numRuns: 300 },
    );
  });

  it('matches trying every subset on problems of up to 14 columns and 24 rows, its bound equal to the cost', () => {
    const larger = fc.integer({ min: 2, max: 14 }).chain((cols) =>
      fc.record({
        rows: fc.array(fc.uniqueArray(fc.integer({ min: 0, max: cols - 1 }), { minLength: 1, maxLength: 5 }), { minLength: 1, maxLength: 24 }),
        costs: fc.array(fc.integer({ min: 1, max: 6 }), { minLength: cols, maxLength: cols }),
      }),
    );
    fc.assert(
      fc.property(larger, (problem) => {
        const best = bruteForceBest(problem);
        const result = exactCover(problem, NEVER, heuristicCover(problem));
        expect(compareCovers(problem, result.columns, best)).toBe(0);
        expect(result.proven).toBe(true);
        expect(result.lowerBound).toEqual({ columns: best.length, cost: coverCost(problem, best) });
      }),
      { numRuns: 200 },
    );
  });

  it('regression: reduced-cost fixing no longer drops the column of the cheapest cover', () => {
    // Found by a seeded search: with exactly as many profitable columns as the cap allows, the
    // fixing took an arbitrary one of them for the dearest and left out a needed column, so a
    // cover of cost 15 was called proven where one of cost 14 exists.
    const problem = seededProblem(2162, 14, 20);
    expect(coverCost(problem, bruteForceBest(problem))).toBe(14);
    const result = exactCover(problem, NEVER, heuristicCover(problem));
    expect(result.columns).toEqual([4, 5, 7, 10, 11]);
    expect(result).toMatchObject({ proven: true, lowerBound: { columns: 5, cost: 14 } });
  });

  it('cut by the deadline at any point, never says proven, and its bound never passes the best cover', () => {
    for (const seed of [2162, 2, 4]) {
      const problem = seededProblem(seed, 14, 24);
      const best = bruteForceBest(problem);
      const start = heuristicCover(problem);
      const full = steppingClock();
      expect(exactCover(problem, deadlineAt(Infinity, full.clock), start).proven).toBe(true);
      for (let k = 0; k <= full.readings() + 1; k++) {
        const stepping = steppingClock();
        const result = exactCover(problem, deadlineAt(k, stepping.clock), start);
        expect(isCover(problem, result.columns)).toBe(true);
        expect(compareCovers(problem, result.columns, best)).toBeGreaterThanOrEqual(0);
        expect(result.lowerBound.columns).toBeLessThanOrEqual(best.length);
        expect(result.lowerBound.cost).toBeLessThanOrEqual(coverCost(problem, best));
        const cut = stepping.readings() > k;
        if (cut) expect(result.proven).toBe(false);
        else expect(result).toMatchObject({ proven: true, lowerBound: { columns: best.length, cost: coverCost(problem, best) } });
      }
    }
  });

  it('out of time, still bounds by the relaxation, above the bound of rows sharing no column', () => {
    // Hand-computed: five rows on a ring of five unit-cost columns, row i covered by columns i
    // and i+1. Two rows at most share no column (bound 2); halves on every column cover each
    // row once, so the relaxation's optimum is 2.5 and every cover has at least 3 columns and
    // costs at least 3 (as {0, 2, 4}, which the prices suggest).
    const problem = { rows: [[0, 1], [1, 2], [2, 3], [3, 4], [4, 0]], costs: [1, 1, 1, 1, 1] };
    const result = exactCover(problem, deadlineAt(-Infinity), [0, 1, 2, 3, 4]);
    expect(result.proven).toBe(false);
    expect(result.lowerBound).toEqual({ columns: 3, cost: 3 });
    expect(result.columns.length).toBe(3);
  });

  it('cut at any reading of the clock, its bounds never pass the best cover, and proven only at the best', () => {
    fc.assert(
      fc.property(randomProblem, fc.nat({ max: 400 }), (problem, k) => {
        const best = bruteForceBest(problem);
        const stepping = steppingClock();
        const result = exactCover(problem, deadlineAt(k, stepping.clock), heuristicCover(problem));
        expect(isCover(problem, result.columns)).toBe(true);
        expect(result.lowerBound.columns).toBeLessThanOrEqual(best.length);
        expect(result.lowerBound.cost).toBeLessThanOrEqual(coverCost(problem, best));
        if (result.proven) expect(compareCovers(problem, result.columns, best)).toBe(0);
      }),
      { numRuns: 300 },
    );
  });

  it('cut at any reading of the clock, returns a cover with no redundant column', () => {
    fc.assert(
      fc.property(randomProblem, fc.nat({ max: 400 }), (problem, k) => {
        const { columns } = exactCover(problem, deadlineAt(k, steppingClock().clock), heuristicCover(problem));
        for (const c of columns) expect(isCover(problem, columns.filter((d) => d !== c))).toBe(false);
      }),
      { numRuns: 300 },
    );
  });

  it('out of time, returns the known cover unproven', () => {
    const problem = { rows: [[0, 1], [1, 2], [2, 3], [3, 0]], costs: [1, 1, 1, 1] };
    const result = exactCover(problem, deadlineAt(-Infinity), [0, 1, 2, 3]);
    expect(result.proven).toBe(false);
    expect(isCover(problem, result.columns)).toBe(true);
  });
});

describe('heuristic covering', () => {
  it('always returns a cover with no redundant column', () => {
    fc.assert(
      fc.property(randomProblem, (problem) => {
        const cols = heuristicCover(problem);
        expect(isCover(problem, cols)).toBe(true);
        for (const c of cols) expect(isCover(problem, cols.filter((x) => x !== c))).toBe(false);
      }),
      { numRuns: 300 },
    );
  });
});
