import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { add, emptySet, has, union, type BitSet } from '../../src/logic/bits.js';
import { cube, cubeFromPattern, cubeMembers, cubeToPattern, type Cube } from '../../src/logic/cube.js';
import type { BoolFunction } from '../../src/logic/boolfn.js';
import { completeSum, cubeInsideSet, cubeMeetsSet, primeImplicants, setToCubes } from '../../src/logic/primes.js';
import { NEVER } from '../../src/logic/deadline.js';

/** A random function: each combination on, off or (with probability dcShare) don't-care. */
const randomFunction = (maxInputs: number, dcShare: number) =>
  fc.integer({ min: 1, max: maxInputs }).chain((n) =>
    fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1 << n, maxLength: 1 << n }).map((draws) => {
      const on = emptySet(n);
      const dc = emptySet(n);
      draws.forEach((d, k) => (d < dcShare ? add(dc, k) : d < dcShare + (1 - dcShare) / 2 ? add(on, k) : undefined));
      return { n, on, dc } as BoolFunction;
    }),
  );

const patterns = (n: number, cubes: Cube[]): string[] => cubes.map((c) => cubeToPattern(n, c));
const inside = (n: number, c: Cube, set: BitSet): boolean => cubeMembers(n, c).every((k) => has(set, k));

/** Every cube of n inputs (3^n of them), by brute force. */
function allCubes(n: number): Cube[] {
  const out: Cube[] = [];
  for (let mask = 0; mask < 1 << n; mask++) for (let bits = mask; ; bits = (bits - 1) & mask) {
    out.push(cube(mask, bits));
    if (bits === 0) break;
  }
  return out;
}

describe('prime implicants', () => {
  it('majority of three has the primes AB, AC, BC', () => {
    const on = emptySet(3);
    [3, 5, 6, 7].forEach((k) => add(on, k));
    expect(patterns(3, primeImplicants({ n: 3, on, dc: emptySet(3) }))).toEqual(['11-', '1-1', '-11']);
  });

  it('leaves out primes made only of don\'t-cares', () => {
    const on = emptySet(2);
    const dc = emptySet(2);
    add(on, 3);
    add(dc, 0);
    expect(patterns(2, primeImplicants({ n: 2, on, dc }))).toEqual(['11']);
  });

  it('are exactly the maximal cubes inside on ∪ dc that touch the on-set (brute force over all cubes, n <= 6)', () => {
    fc.assert(
      fc.property(randomFunction(6, 0.2), (fn) => {
        const allowed = union(fn.on, fn.dc);
        const implicants = allCubes(fn.n).filter((c) => inside(fn.n, c, allowed));
        const maximal = implicants.filter(
          (c) => !implicants.some((d) => d.mask !== c.mask && (d.mask & ~c.mask) === 0 && ((d.bits ^ c.bits) & d.mask) === 0),
        );
        const expected = maximal.filter((c) => cubeMembers(fn.n, c).some((k) => has(fn.on, k)));
        expect(patterns(fn.n, primeImplicants(fn)).sort()).toEqual(patterns(fn.n, expected).sort());
      }),
      { numRuns: 100 },
    );
  });

  it('from cubes (the method for many inputs) agree with the bit-set lattice', () => {
    fc.assert(
      fc.property(randomFunction(9, 0.2), (fn) => {
        const viaCubes = completeSum(setToCubes(fn.n, union(fn.on, fn.dc)), NEVER)!.filter((p) =>
          cubeMeetsSet(fn.n, p, fn.on),
        );
        expect(patterns(fn.n, viaCubes).sort()).toEqual(patterns(fn.n, primeImplicants(fn)).sort());
      }),
      { numRuns: 100 },
    );
  });

  it('of a 24-input table given by a few rows come out without enumerating combinations', () => {
    const n = 24;
    const on = emptySet(n);
    const rows = ['1-----------------------', '-1---------------------1', '--11-------------------0'];
    for (const p of rows) for (const k of cubeMembers(n, cubeFromPattern(p))) add(on, k);
    const primes = patterns(n, primeImplicants({ n, on, dc: emptySet(n) }));
    expect(primes.sort()).toEqual(['--11-------------------0', '-1---------------------1', '-111--------------------', '1-----------------------'].sort());
  });
});

describe('cubes against sets of combinations', () => {
  it('a cube lies inside a set exactly when all its combinations are members', () => {
    fc.assert(
      fc.property(randomFunction(8, 0), fc.nat(), (fn, pick) => {
        const cubes = allCubes(Math.min(fn.n, 4));
        const c = cubes[pick % cubes.length]!;
        expect(cubeInsideSet(fn.n, c, fn.on)).toBe(inside(fn.n, c, fn.on));
        expect(cubeMeetsSet(fn.n, c, fn.on)).toBe(cubeMembers(fn.n, c).some((k) => has(fn.on, k)));
      }),
    );
  });

  it('a set splits into disjoint cubes holding exactly its members', () => {
    fc.assert(
      fc.property(randomFunction(10, 0), (fn) => {
        const seen = emptySet(fn.n);
        for (const c of setToCubes(fn.n, fn.on))
          for (const k of cubeMembers(fn.n, c)) {
            expect(has(seen, k)).toBe(false);
            add(seen, k);
          }
        expect([...seen]).toEqual([...fn.on]);
      }),
      { numRuns: 50 },
    );
  });

  it('a row with only its last input fixed stays one cube', () => {
    const n = 16;
    const set = emptySet(n);
    for (const k of cubeMembers(n, cubeFromPattern('---------------1'))) add(set, k);
    expect(patterns(n, setToCubes(n, set))).toEqual(['---------------1']);
  });
});
