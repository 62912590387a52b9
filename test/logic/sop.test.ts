import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { add, complement, emptySet, equals, has, popcount, union } from '../../src/logic/bits.js';
import { cubeContains, cubeFromPattern, cubeMembers, cubeToPattern, cubeToSet, cube, type Cube } from '../../src/logic/cube.js';
import type { BoolFunction } from '../../src/logic/boolfn.js';
import { coverCost, exactCover } from '../../src/logic/cover.js';
import { deadlineAt, NEVER } from '../../src/logic/deadline.js';
import { heuristicCover, separatedCombinations } from '../../src/logic/heuristic.js';
import { setToCubes } from '../../src/logic/primes.js';
import { coverProblem, minimiseSop, primeImplicants } from '../../src/logic/sop.js';

function fn(n: number, on: number[], dc: number[] = []): BoolFunction {
  const f = { n, on: emptySet(n), dc: emptySet(n) };
  on.forEach((k) => add(f.on, k));
  dc.forEach((k) => add(f.dc, k));
  return f;
}

/** A random function of 1..maxInputs inputs with 0-20 % don't-cares. */
const randomFunction = (maxInputs: number) =>
  fc.record({ n: fc.integer({ min: 1, max: maxInputs }), dcShare: fc.double({ min: 0, max: 0.2, noNaN: true }) }).chain(({ n, dcShare }) =>
    fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1 << n, maxLength: 1 << n }).map((draws) => {
      const on: number[] = [];
      const dc: number[] = [];
      draws.forEach((d, k) => (d < dcShare ? dc.push(k) : d < dcShare + (1 - dcShare) / 2 ? on.push(k) : undefined));
      return fn(n, on, dc);
    }),
  );

const patterns = (n: number, cubes: Cube[]): string[] => cubes.map((c) => cubeToPattern(n, c));
const literals = (cubes: Cube[]): number => cubes.reduce((k, c) => k + popcount(c.mask), 0);

/**
 * The smallest (terms, literals) over every cover by primes, by dynamic programming over the
 * set of on-set combinations covered so far (n <= 5: one 32-bit mask): the lowest uncovered
 * combination must be covered by one of the primes holding it, each tried in turn.
 */
function bruteForceMinimum(f: BoolFunction): [number, number] {
  const primes = primeImplicants(f);
  const masks = primes.map((p) => cubeMembers(f.n, p).reduce((m, k) => (has(f.on, k) ? m | (1 << k) : m), 0) >>> 0);
  const all = cubeMembers(f.n, cube(0, 0)).reduce((m, k) => (has(f.on, k) ? m | (1 << k) : m), 0) >>> 0;
  const memo = new Map<number, [number, number]>();
  const best = (covered: number): [number, number] => {
    if (covered === all) return [0, 0];
    const known = memo.get(covered);
    if (known) return known;
    const open = 31 - Math.clz32((all & ~covered) & -(all & ~covered));
    let out: [number, number] = [Infinity, Infinity];
    primes.forEach((p, i) => {
      if (!cubeContains(p, open)) return;
      const [t, l] = best((covered | masks[i]!) >>> 0);
      const here: [number, number] = [t + 1, l + popcount(p.mask)];
      if (here[0] < out[0] || (here[0] === out[0] && here[1] < out[1])) out = here;
    });
    memo.set(covered, out);
    return out;
  };
  return best(0);
}

describe('minimal AND/OR forms: known answers', () => {
  it('a function that is never on is FALSE: no product terms', () => {
    expect(minimiseSop(fn(3, []))).toEqual({ cubes: [], proven: true, terms: 0, literals: 0, lowerBound: { terms: 0, literals: 0 } });
  });

  it('a function that is always on is TRUE: one term with no literals', () => {
    expect(minimiseSop(fn(2, [0, 1, 2, 3]))).toEqual({ cubes: [cube(0, 0)], proven: true, terms: 1, literals: 0, lowerBound: { terms: 1, literals: 0 } });
  });

  it('a function on or don\'t-care everywhere is TRUE', () => {
    expect(patterns(2, minimiseSop(fn(2, [1], [0, 2, 3])).cubes)).toEqual(['--']);
  });

  it('a single combination is one term naming every input', () => {
    const form = minimiseSop(fn(4, [0b1010]));
    expect(patterns(4, form.cubes)).toEqual(['1010']);
    expect([form.terms, form.literals]).toEqual([1, 4]);
  });

  it('XOR of n inputs needs all 2^(n-1) odd combinations as terms', () => {
    for (let n = 1; n <= 6; n++) {
      const odd = cubeMembers(n, cube(0, 0)).filter((k) => popcount(k) % 2 === 1);
      const form = minimiseSop(fn(n, odd));
      expect([form.terms, form.literals, form.proven]).toEqual([2 ** (n - 1), n * 2 ** (n - 1), true]);
    }
  });

  it('majority of three is AB + AC + BC', () => {
    expect(patterns(3, minimiseSop(fn(3, [3, 5, 6, 7])).cubes)).toEqual(['11-', '1-1', '-11']);
  });

  it('terms come in printed order: by the leftmost input, plain before negated before absent', () => {
    expect(patterns(3, minimiseSop(fn(3, [0, 1, 6, 7])).cubes)).toEqual(['11-', '00-']);
    expect(patterns(3, minimiseSop(fn(3, [1, 3, 4, 6])).cubes)).toEqual(['1-0', '0-1']);
  });

  it('a 20-input interlock table given by a few rows is minimised and proven', () => {
    const n = 20;
    const f = fn(n, []);
    const rows = ['11------------------', '1-1-----------------', '-11-----------------', '---1--------------11'];
    for (const p of rows) for (const k of cubeMembers(n, cubeFromPattern(p))) add(f.on, k);
    const form = minimiseSop(f);
    expect(patterns(n, form.cubes)).toEqual(rows);
    expect(form.proven).toBe(true);
  });

  it('with no time at all, still returns a correct cover, marked unproven', () => {
    const f = fn(4, [0, 2, 5, 7, 8, 10, 13, 15, 3], [1]);
    const form = minimiseSop(f, { budgetMs: -1 });
    expect(form.proven).toBe(false);
    const allowed = union(f.on, f.dc);
    for (const k of cubeMembers(4, cube(0, 0))) {
      const covered = form.cubes.some((c) => cubeContains(c, k));
      if (has(f.on, k)) expect(covered).toBe(true);
      if (!has(allowed, k)) expect(covered).toBe(false);
    }
  });
});

/**
 * The gaps of a sparse 16-input table: every combination that none of 60 rows of 8 fixed inputs
 * (drawn from a seeded generator) names. Its on-set falls into thousands of disjoint cubes.
 */
function sparseTableGaps(): BoolFunction {
  const n = 16;
  let state = 12345;
  const next = (): number => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const named = emptySet(n);
  for (let row = 0; row < 60; row++) {
    let mask = 0;
    let bits = 0;
    while (popcount(mask) < 8) {
      const bit = 1 << Math.floor(next() * n);
      mask |= bit;
      if (next() < 0.5) bits |= bit;
    }
    cubeToSet(n, cube(mask, bits), named);
  }
  return { n, on: complement(named, n), dc: emptySet(n) };
}

describe('cubes as bit sets', () => {
  it('paint exactly the combinations of the cube, word by word from 5 inputs on (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 12 }).chain((n) => fc.tuple(fc.constant(n), fc.nat(2 ** n - 1), fc.nat(2 ** n - 1))),
        ([n, mask, bits]) => {
          const c = cube(mask, bits);
          const expected = emptySet(n);
          for (const k of cubeMembers(n, c)) add(expected, k);
          expect(equals(cubeToSet(n, c), expected)).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('minimal AND/OR forms: out of time', () => {
  const f = sparseTableGaps();
  for (const budgetMs of [0, 50]) {
    it(`a big sparse function with a budget of ${budgetMs} ms still gets a correct cover, marked unproven`, () => {
      const form = minimiseSop(f, { budgetMs });
      expect(form.proven).toBe(false);
      const covered = emptySet(f.n);
      for (const c of form.cubes) cubeToSet(f.n, c, covered);
      expect(equals(union(covered, f.on), covered)).toBe(true);
      expect(equals(union(covered, f.on), f.on)).toBe(true);
      expect(form.terms).toBe(form.cubes.length);
      expect(form.literals).toBe(literals(form.cubes));
    });
  }
});

/** Seeded random function: each combination on with probability `on`, else don't-care with `dc`. */
function seededFunction(n: number, seed: number, on: number, dc: number): BoolFunction {
  let state = seed >>> 0;
  const next = (): number => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const f = fn(n, []);
  for (let k = 0; k < 1 << n; k++) {
    const r = next();
    if (r < on) add(f.on, k);
    else if (r < on + dc) add(f.dc, k);
  }
  return f;
}

describe('minimal AND/OR forms: the proven claim', () => {
  // A clock that moves one step per reading, so that each budget stops the same phase of the
  // work (primes, matrix, heuristic, reductions, bound, branch and bound) on any machine.
  const f = seededFunction(7, 3, 0.63, 0.17);
  const full = minimiseSop(f, { budgetMs: Infinity });

  it('the unlimited search proves its form: the lower bound is the cost', () => {
    expect(full.proven).toBe(true);
    expect(full.lowerBound).toEqual({ terms: full.terms, literals: full.literals });
  });

  it('stopped at any point by the deadline, never says proven; its bound never passes the minimum', () => {
    let readings = 0;
    minimiseSop(f, { budgetMs: Infinity, clock: () => ++readings });
    const budgets = [0, 1, 2, 3];
    for (let b = 4; b <= 2 * readings + 4; b += Math.ceil(readings / 30)) budgets.push(b);
    for (const budget of budgets) {
      let t = 0;
      const form = minimiseSop(f, { budgetMs: budget, clock: () => ++t });
      expect(form.lowerBound.terms).toBeLessThanOrEqual(full.terms);
      expect(form.lowerBound.literals).toBeLessThanOrEqual(full.literals);
      expect(form.terms > full.terms || (form.terms === full.terms && form.literals >= full.literals)).toBe(true);
      // The first reading sets the deadline at 1 + budget; a later reading past it cut the work.
      if (t > 1 + budget) expect(form.proven).toBe(false);
      if (form.proven) expect([form.terms, form.literals]).toEqual([full.terms, full.literals]);
      else expect(form.lowerBound.terms < form.terms || form.lowerBound.literals < form.literals || t > 1 + budget).toBe(true);
    }
  });

  it('regression: from any start cover, a seeded 8-input function gets 34 terms / 165 literals, proven', () => {
    // Found by a seeded search at the density of the reported case (63 % on, 17 % don't-care):
    // started from a poor cover (as when the clock cuts the heuristic short), the search once
    // said 34 / 166 was proven, through the reduced-cost fixing fixed in cover.ts.
    const g = seededFunction(8, 173, 0.63, 0.17);
    const problem = coverProblem(setToCubes(8, g.on), primeImplicants(g))!;
    const starts = [heuristicCover(problem), heuristicCover(problem, deadlineAt(-Infinity)), problem.costs.map((_, c) => c)];
    for (const start of starts) {
      const result = exactCover(problem, NEVER, start);
      expect([result.columns.length, coverCost(problem, result.columns), result.proven]).toEqual([34, 165, true]);
      expect(result.lowerBound).toEqual({ columns: 34, cost: 165 });
    }
    expect(minimiseSop(g, { budgetMs: Infinity })).toMatchObject({ terms: 34, literals: 165, proven: true });
  });

  it('with a budget of 0 or 1 ms on the real clock, a 10-input function is not proven', () => {
    const big = seededFunction(10, 1, 0.63, 0.17);
    for (const budgetMs of [0, 1]) {
      const form = minimiseSop(big, { budgetMs });
      expect(form.proven).toBe(false);
      expect(form.lowerBound.terms <= form.terms && form.lowerBound.literals <= form.literals).toBe(true);
    }
  });
});

describe('minimal AND/OR forms: properties', () => {
  it('cover the on-set, touch no off-set combination, use only primes, and are proven (n <= 8)', () => {
    fc.assert(
      fc.property(randomFunction(8), (f) => {
        const form = minimiseSop(f, { budgetMs: Infinity });
        expect(form.proven).toBe(true);
        const allowed = union(f.on, f.dc);
        for (const k of cubeMembers(f.n, cube(0, 0))) {
          const covered = form.cubes.some((c) => cubeContains(c, k));
          if (has(f.on, k)) expect(covered).toBe(true);
          if (!has(allowed, k)) expect(covered).toBe(false);
        }
        const primes = new Set(patterns(f.n, primeImplicants(f)));
        for (const p of patterns(f.n, form.cubes)) expect(primes.has(p)).toBe(true);
        expect(form.terms).toBe(form.cubes.length);
        expect(form.literals).toBe(literals(form.cubes));
      }),
      { numRuns: 200 },
    );
  });

  it('have as few terms, then literals, as the best of every cover by primes (n <= 5)', () => {
    fc.assert(
      fc.property(randomFunction(5), (f) => {
        const form = minimiseSop(f);
        expect([form.terms, form.literals]).toEqual(bruteForceMinimum(f));
      }),
      { numRuns: 150 },
    );
  });

  it('combinations no implicant joins are never more than the fewest terms (n <= 5)', () => {
    fc.assert(
      fc.property(randomFunction(5), (f) => {
        const separated = separatedCombinations(f.n, setToCubes(f.n, f.on), union(f.on, f.dc), NEVER);
        expect(separated).toBeLessThanOrEqual(bruteForceMinimum(f)[0]);
      }),
      { numRuns: 150 },
    );
  });
});

describe('the bound without primes', () => {
  it('XOR of 4 inputs: its 8 odd combinations are pairwise apart, as many as its terms', () => {
    const odd = Array.from({ length: 16 }, (_, k) => k).filter((k) => popcount(k) % 2 === 1);
    const f = fn(4, odd);
    expect(separatedCombinations(4, setToCubes(4, f.on), f.on, NEVER)).toBe(8);
  });
});
