import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { wordCount, type BitSet } from '../../src/logic/bits.js';
import {
  KERNEL_MIN_INPUTS,
  mobiusInPlace,
  mobiusInPlaceJs,
  mobiusKernelAvailable,
} from '../../src/logic/mobius.js';
import { naiveMobius } from '../../bench/transform.bench.js';
import { KERNEL_MODULE_PATH, kernelSource, mobiusKernelBytes } from '../../scripts/make-mobius-wasm.js';

/** Random words for n inputs (n >= 5: every bit of every word is a combination). */
const functionArb = (minN: number, maxN: number): fc.Arbitrary<{ n: number; values: BitSet }> =>
  fc.integer({ min: minN, max: maxN }).chain((n) =>
    fc
      .integer()
      .map((seed) => ({ n, values: new Uint32Array(wordCount(n)).map((_, i) => Math.imul(i + seed, 0x9e3779b1) ^ (seed >>> (i & 15))) })),
  );

function transformed(values: BitSet, n: number, transform: (words: Uint32Array, n: number) => void): BitSet {
  const copy = values.slice();
  transform(copy, n);
  return copy;
}

/** Index of the first word in which two sets differ, -1 when equal (cheap for large sets). */
function firstDifference(a: BitSet, b: BitSet): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return i;
  return a.length === b.length ? -1 : a.length;
}

describe('WebAssembly SIMD kernel of the Möbius transform', () => {
  it('is committed exactly as scripts/make-mobius-wasm.ts writes it', () => {
    expect(readFileSync(KERNEL_MODULE_PATH, 'utf8')).toBe(kernelSource());
  });

  it('stays under the 4 KB Chromium compiles synchronously on a page main thread', () => {
    expect(mobiusKernelBytes().length).toBeLessThan(4096);
  });

  it('runs in Node, so the tests below exercise it rather than the JS path', () => {
    expect(mobiusKernelAvailable()).toBe(true);
    expect(KERNEL_MIN_INPUTS).toBeLessThanOrEqual(10);
  });

  it('agrees with the JS path and the naive butterfly for random functions of 10 to 16 inputs', () => {
    fc.assert(
      fc.property(functionArb(10, 16), ({ n, values }) => {
        const ours = transformed(values, n, mobiusInPlace);
        expect(ours).toEqual(transformed(values, n, mobiusInPlaceJs));
        expect(ours).toEqual(naiveMobius(values, n));
      }),
      { numRuns: 40 },
    );
  });

  it('agrees with the JS path and the naive butterfly past one 128 KiB block (17 to 22 inputs)', () => {
    fc.assert(
      fc.property(functionArb(17, 22), ({ n, values }) => {
        const ours = transformed(values, n, mobiusInPlace);
        expect(firstDifference(ours, transformed(values, n, mobiusInPlaceJs))).toBe(-1);
        expect(firstDifference(ours, naiveMobius(values, n))).toBe(-1);
      }),
      { numRuns: 5 },
    );
  });

  it('is its own inverse', () => {
    fc.assert(
      fc.property(functionArb(10, 20), ({ n, values }) => {
        const twice = transformed(transformed(values, n, mobiusInPlace), n, mobiusInPlace);
        expect(firstDifference(twice, values)).toBe(-1);
      }),
      { numRuns: 12 },
    );
  });

  it('answers a small transform right after a large one and the other way round (memory sized for the largest so far)', () => {
    for (const n of [12, 21, 11, 18]) {
      const values = new Uint32Array(wordCount(n)).map((_, i) => Math.imul(i + n, 0x85ebca6b));
      expect(firstDifference(transformed(values, n, mobiusInPlace), transformed(values, n, mobiusInPlaceJs))).toBe(-1);
    }
  });

  it('leaves the words beyond 2^n combinations alone', () => {
    const n = 12;
    const words = new Uint32Array(wordCount(n) + 3).map((_, i) => Math.imul(i + 7, 0x27d4eb2f));
    const tail = words.slice(wordCount(n));
    mobiusInPlace(words, n);
    expect(words.slice(wordCount(n))).toEqual(tail);
  });
});
