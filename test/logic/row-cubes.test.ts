// The row-cube engine (questions answered on a table's rows' cubes, no decision diagram):
// known answers, and on small random tables against brute force over every combination and
// against the bit-set engine's exact minimum.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { countOutside, pointOutside, UNKNOWN } from '../../src/logic/cube-list.js';
import { deadlineAt, NEVER } from '../../src/logic/deadline.js';
import { proveRowCover, rowCover } from '../../src/logic/row-cover.js';
import { rowUniqueCauseSteps } from '../../src/logic/row-steps.js';
import { rowConflicts } from '../../src/logic/row-table.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { emptySet, add } from '../../src/logic/bits.js';
import { wideContains, wideCube, type WideCube } from '../../src/logic/wide-cube.js';

const signals = (n: number) => Array.from({ length: n }, (_, i) => ({ header: `In ${i + 1}`, identifier: `In_${i + 1}` }));
/** A clock already past every deadline. */
const PASSED = deadlineAt(0, () => 1);
const inAny = (cubes: readonly WideCube[], k: bigint): boolean => cubes.some((c) => wideContains(c, k));
const all = (n: number): bigint[] => Array.from({ length: 2 ** n }, (_, k) => BigInt(k));
/** From '1-0' patterns, leftmost input first. */
const cubeOf = (p: string): WideCube => {
  let mask = 0n;
  let bits = 0n;
  for (const ch of p) {
    mask <<= 1n;
    bits <<= 1n;
    if (ch !== '-') mask |= 1n;
    if (ch === '1') bits |= 1n;
  }
  return wideCube(mask, bits);
};

/** Up to 8 inputs, up to 10 cubes of random literals. */
const cubes = fc.integer({ min: 1, max: 8 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    cubes: fc.array(fc.record({ mask: fc.bigInt({ min: 0n, max: 2n ** BigInt(n) - 1n }), bits: fc.bigInt({ min: 0n, max: 2n ** BigInt(n) - 1n }) }).map((c) => wideCube(c.mask, c.bits)), { maxLength: 10 }),
    within: fc.record({ mask: fc.bigInt({ min: 0n, max: 2n ** BigInt(n) - 1n }), bits: fc.bigInt({ min: 0n, max: 2n ** BigInt(n) - 1n }) }).map((c) => wideCube(c.mask, c.bits)),
  }),
);

describe('a point outside a union of cubes', () => {
  it('is found where one exists: a=1 OR b=1 leaves a=0, b=0', () => {
    expect(pointOutside(2, cubeOf('--'), [cubeOf('1-'), cubeOf('-1')], NEVER)).toBe(0n);
  });

  it('is none where the cubes cover the cube asked about: a=1 and a=0 cover everything', () => {
    expect(pointOutside(3, cubeOf('-1-'), [cubeOf('1--'), cubeOf('0--')], NEVER)).toBeNull();
  });

  it('is unknown when the clock has run out before a search', () => {
    // The only point left is 100100100100, none of the fixed guesses: a search is needed.
    const n = 12;
    const rows = Array.from({ length: n }, (_, i) => wideCube(1n << BigInt(n - 1 - i), i % 3 === 0 ? 0n : 1n << BigInt(n - 1 - i)));
    expect(pointOutside(n, cubeOf('-'.repeat(n)), rows, PASSED)).toBe(UNKNOWN);
  });

  it('lies inside the cube asked about and outside every cube, and is none only when every point of it is covered', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes, within }) => {
        const k = pointOutside(n, within, cubes, NEVER);
        const left = all(n).filter((x) => wideContains(within, x) && !inAny(cubes, x));
        if (k === null) expect(left).toEqual([]);
        else expect(left).toContain(k);
      }),
    );
  });
});

/** The same small problems with their 8 inputs spread over 64 (both 32-bit words inside the search). */
const spread = fc.record({
  problem: cubes,
  places: fc.uniqueArray(fc.integer({ min: 0, max: 63 }), { minLength: 8, maxLength: 8 }),
});
const placed = (places: readonly number[], x: bigint): bigint =>
  places.reduce((k, p, i) => ((x >> BigInt(i)) & 1n ? k | (1n << BigInt(p)) : k), 0n);
const placedCube = (places: readonly number[], c: WideCube): WideCube => wideCube(placed(places, c.mask), placed(places, c.bits));

describe('questions over 64 inputs', () => {
  it('get the answers of the same questions over 8 inputs, wherever the 8 sit among the 64', () => {
    fc.assert(
      fc.property(spread, ({ problem: { n, cubes, within }, places }) => {
        const wide = cubes.map((c) => placedCube(places, c));
        const k = pointOutside(64, placedCube(places, within), wide, NEVER);
        const left = all(n).filter((x) => wideContains(within, x) && !inAny(cubes, x));
        if (k === null) expect(left).toEqual([]);
        else {
          expect(k === UNKNOWN).toBe(false);
          expect(wideContains(placedCube(places, within), k as bigint) && !inAny(wide, k as bigint)).toBe(true);
        }
        const count = countOutside(64, wide, NEVER, 0);
        const truth = BigInt(all(n).filter((x) => !inAny(cubes, x)).length) << BigInt(64 - n);
        expect([count.atLeast, count.atMost]).toEqual([truth, truth]);
      }),
    );
  });
});

describe('counting what a union of cubes leaves out', () => {
  it('is exact when it finishes: a=1 OR b=1 over 3 inputs leaves 2 combinations', () => {
    const left = countOutside(3, [cubeOf('1--'), cubeOf('-1-')], NEVER, 10);
    expect([left.atLeast, left.atMost, left.cubes]).toEqual([2n, 2n, [cubeOf('00-')]]);
  });

  it('matches a count over every combination, its cubes disjoint and outside the union', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes }) => {
        const left = countOutside(n, cubes, NEVER, 1000);
        const truth = BigInt(all(n).filter((x) => !inAny(cubes, x)).length);
        expect([left.atLeast, left.atMost]).toEqual([truth, truth]);
        for (const x of all(n)) expect(left.cubes.filter((c) => wideContains(c, x)).length).toBe(inAny(cubes, x) ? 0 : 1);
      }),
    );
  });

  it('cut short, gives bounds that hold the true count', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes }) => {
        const left = countOutside(n, cubes, PASSED, 10);
        const truth = BigInt(all(n).filter((x) => !inAny(cubes, x)).length);
        expect(left.atLeast <= truth && truth <= left.atMost).toBe(true);
      }),
    );
  });
});

describe('the AND/OR form of a union of rows, on the cubes', () => {
  it('merges a=1 b=1 and a=1 b=0 into a=1, proven (one term of one literal)', () => {
    const cover = rowCover(2, [cubeOf('11'), cubeOf('10')], NEVER);
    expect([cover.cubes, cover.proven, cover.lowerBound]).toEqual([[cubeOf('1-')], true, { terms: 1, literals: 1 }]);
  });

  it('keeps the consensus-free union a.b OR NOT a.c as two terms, bound 2 terms', () => {
    // a.b + a'.c: the consensus b.c is not needed (textbook consensus theorem, common practice).
    const cover = rowCover(3, [cubeOf('11-'), cubeOf('0-1')], NEVER);
    expect(cover.cubes).toEqual([cubeOf('11-'), cubeOf('0-1')]);
    expect(cover.lowerBound.terms).toBe(2);
  });

  it('equals the union on every combination, uses only primes, and its bound never passes the exact minimum', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes: on }) => {
        const cover = rowCover(n, on, NEVER);
        for (const x of all(n)) expect(inAny(cover.cubes, x)).toBe(inAny(on, x));
        for (const t of cover.cubes)
          for (let i = 0; i < n; i++) {
            const bit = 1n << BigInt(i);
            if (!(t.mask & bit)) continue;
            const wider = wideCube(t.mask & ~bit, t.bits);
            expect(all(n).every((x) => !wideContains(wider, x) || inAny(on, x))).toBe(false);
          }
        const f = { n, on: emptySet(n), dc: emptySet(n) };
        for (const x of all(n)) if (inAny(on, x)) add(f.on, Number(x));
        const exact = minimiseSop(f, { budgetMs: 60_000 });
        expect(exact.proven).toBe(true);
        expect(cover.lowerBound.terms).toBeLessThanOrEqual(exact.terms);
        expect(cover.terms).toBeGreaterThanOrEqual(exact.terms);
        if (cover.proven) expect([cover.terms, cover.literals]).toEqual([exact.terms, exact.literals]);
      }),
    );
  });

  it('cut short at once, is still a cover of the rows, its bound no more than the terms of the cover found in full time', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes: on }) => {
        const cover = rowCover(n, on, PASSED);
        for (const x of all(n)) expect(inAny(cover.cubes, x)).toBe(inAny(on, x));
        expect(cover.lowerBound.terms).toBeLessThanOrEqual(rowCover(n, on, NEVER).terms);
      }),
    );
  });
});

describe('the proof of a cover against its rows', () => {
  it('finds where a term reaches past the rows: a=1 against the row a=1 b=1', () => {
    expect(proveRowCover(2, [cubeOf('1-')], [cubeOf('11')], NEVER)).toEqual({ equal: false, at: 0b10n, formOn: true });
  });

  it('finds a row the terms leave out: a=1 b=1 against the rows a=1 b=1 and a=0', () => {
    expect(proveRowCover(2, [cubeOf('11')], [cubeOf('11'), cubeOf('0-')], NEVER)).toEqual({ equal: false, at: 0b00n, formOn: false });
  });

  it('is equal exactly when the cover and the rows agree on every combination', () => {
    fc.assert(
      fc.property(cubes, cubes, ({ n, cubes: a }, { cubes: b }) => {
        const inB = b.map((c) => wideCube(c.mask & (2n ** BigInt(n) - 1n), c.bits));
        const proof = proveRowCover(n, a, inB, NEVER);
        const same = all(n).every((x) => inAny(a, x) === inAny(inB, x));
        expect(proof !== UNKNOWN && proof.equal).toBe(same);
      }),
    );
  });
});

describe('conflicts read on the rows', () => {
  it('names each ON/OFF pair whose cubes meet, with its whole overlap', () => {
    const rows = [
      { cube: cubeOf('1--'), value: 1 as const },
      { cube: cubeOf('-0-'), value: 0 as const },
      { cube: cubeOf('01-'), value: 0 as const },
    ];
    expect(rowConflicts(3, rows)).toEqual([{ rowA: 0, rowB: 1, example: 0b100n, combinations: 2n }]);
  });
});

describe('test steps on the rows', () => {
  it('expect the union of the ON rows at every step, an ON step inside every term', () => {
    fc.assert(
      fc.property(cubes, ({ n, cubes: on }) => {
        const cover = rowCover(n, on, NEVER);
        const steps = rowUniqueCauseSteps(n, cover.cubes, on, signals(n), NEVER);
        for (const s of steps) expect(s.expected).toBe(inAny(on, s.combination) ? 1 : 0);
        for (const t of cover.cubes) expect(steps.some((s) => s.expected === 1 && wideContains(t, s.combination))).toBe(true);
      }),
    );
  });

  it('flip each literal of a=1 AND b=1 to an OFF step', () => {
    const steps = rowUniqueCauseSteps(2, [cubeOf('11')], [cubeOf('11')], signals(2), NEVER);
    expect(steps.map((s) => [s.combination, s.expected])).toEqual([
      [0b11n, 1],
      [0b01n, 0],
      [0b10n, 0],
    ]);
  });
});

