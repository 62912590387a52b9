import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { emptySet, has, union } from '../../src/logic/bits.js';
import { buildFunction, type TableRow } from '../../src/logic/boolfn.js';
import { cubeFromPattern } from '../../src/logic/cube.js';
import { inputValues, prove } from '../../src/logic/proof.js';
import { specArb } from './expr/arbitraries.js';

const row = (pattern: string, value: 0 | 1 | '-'): TableRow => ({ cube: cubeFromPattern(pattern), value });

function spec(rows: TableRow[], n = 3) {
  const built = buildFunction(n, rows);
  if (!built.ok) throw new Error(built.error.message);
  return built.value.fn;
}

describe('proof of a form against its spec', () => {
  // Spec: on at 7, don't-care at 6, off elsewhere.
  const fn = spec([row('111', 1), row('110', '-'), row('0--', 0), row('10-', 0)]);

  it('checks all 2^n combinations and finds none wrong for a correct form', () => {
    const values = emptySet(3);
    values[0] = 0b1000_0000;
    const proof = prove(fn, values);
    expect(proof.combinations).toBe(8);
    expect(proof.mismatchCount).toBe(0);
    expect(proof.mismatches).toEqual([]);
    expect(proof.permitsAlso).toEqual([]);
  });

  it("lists the don't-care combinations a form turns on as permitted also, not as mismatches", () => {
    const values = emptySet(3);
    values[0] = 0b1100_0000;
    const proof = prove(fn, values);
    expect(proof.mismatchCount).toBe(0);
    expect(proof.permitsAlso).toEqual([6]);
    expect(proof.permitsAlsoCount).toBe(1);
  });

  it('lists the specified combinations where the form differs, both ways', () => {
    const values = emptySet(3);
    values[0] = 0b0000_0011;
    const proof = prove(fn, values);
    expect(proof.mismatches).toEqual([0, 1, 7]);
    expect(proof.mismatchCount).toBe(3);
  });

  it('lists at most 50 mismatches but counts them all', () => {
    const big = spec([row('--------', 0)], 8);
    const proof = prove(big, union(big.on, new Uint32Array(8).fill(0xffffffff)));
    expect(proof.mismatchCount).toBe(256);
    expect(proof.mismatches).toHaveLength(50);
    expect(proof.mismatches[49]).toBe(49);
  });

  it('counts exactly the specified combinations where values and spec differ (fast-check)', () => {
    fc.assert(
      fc.property(specArb(1, 9), fc.nat(), (s, seed) => {
        const values = s.fn.on.map((w, i) => w ^ Math.imul(seed + i, 2654435761));
        values[0] = values[0]! & (s.n >= 5 ? 0xffffffff : (1 << (1 << s.n)) - 1);
        const proof = prove(s.fn, values);
        let wrong = 0;
        for (let k = 0; k < 1 << s.n; k++) if (!has(s.fn.dc, k) && has(values, k) !== has(s.fn.on, k)) wrong++;
        expect(proof.mismatchCount).toBe(wrong);
      }),
    );
  });
});

describe('counterexamples as rows of input values', () => {
  it('gives the inputs leftmost first: combination 6 of A, B, C is 1, 1, 0', () => {
    expect(inputValues(3, 6)).toEqual([1, 1, 0]);
    expect(inputValues(4, 1)).toEqual([0, 0, 0, 1]);
  });
});
