import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { compareCovers, exactCover, isCover, type CoverProblem } from '../../src/logic/cover.js';
import { heuristicCover } from '../../src/logic/heuristic.js';

/** The best cover by trying every subset of columns (fewest columns, then lowest cost). */
function bruteForceBest(problem: CoverProblem): number[] {
  let best: number[] | undefined;
  for (let subset = 0; subset < 1 << problem.costs.length; subset++) {
    const cols = problem.costs.map((_, c) => c).filter((c) => subset & (1 << c));
    if (isCover(problem, cols) && (!best || compareCovers(problem, cols, best) < 0)) best = cols;
  }
  return best!;
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
    expect(exactCover(problem, Infinity, [0, 1, 2])).toEqual({ columns: [0, 1], proven: true });
  });

  it('a cyclic problem with no essential column finds its two-column cover', () => {
    // Rows on a ring of four columns, each row covered by two neighbours; columns 0 and 2 cover all.
    const problem = { rows: [[0, 1], [1, 2], [2, 3], [3, 0]], costs: [1, 1, 1, 1] };
    const result = exactCover(problem, Infinity, [0, 1, 2, 3]);
    expect(result.columns.length).toBe(2);
    expect(isCover(problem, result.columns)).toBe(true);
    expect(result.proven).toBe(true);
  });

  it('fewer columns win over lower cost', () => {
    const problem = { rows: [[0, 2], [1, 2]], costs: [1, 1, 5] };
    expect(exactCover(problem, Infinity, [0, 1]).columns).toEqual([2]);
  });

  it('among covers with as many columns, the cheaper wins', () => {
    const problem = { rows: [[0, 1], [2, 3]], costs: [3, 2, 2, 4] };
    expect(exactCover(problem, Infinity, [0, 3]).columns).toEqual([1, 2]);
  });

  it('matches trying every subset of columns', () => {
    fc.assert(
      fc.property(randomProblem, (problem) => {
        const best = bruteForceBest(problem);
        const result = exactCover(problem, Infinity, heuristicCover(problem));
        expect(result.proven).toBe(true);
        expect(isCover(problem, result.columns)).toBe(true);
        expect(compareCovers(problem, result.columns, best)).toBe(0);
      }),
      { numRuns: 300 },
    );
  });

  it('out of time, returns the known cover unproven', () => {
    const problem = { rows: [[0, 1], [1, 2], [2, 3], [3, 0]], costs: [1, 1, 1, 1] };
    const result = exactCover(problem, -Infinity, [0, 1, 2, 3]);
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
