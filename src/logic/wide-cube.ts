// Cubes and combinations over up to 64 inputs, for the symbolic (BDD) engine.
import { cube as narrowCube, type Cube } from './cube.js';

/** Inputs the symbolic engine takes (a cube's mask stays within one 64-bit word). */
export const WIDE_MAX_INPUTS = 64;

/** From this many inputs (up to 24) analysis and verify take the symbolic engine: measured by the wide bench. */
export const SYMBOLIC_FROM_INPUTS = 20;

/**
 * A cube over n <= 64 inputs: the combinations that agree with `bits` on the inputs in `mask`.
 * The same positions as a Cube (input i of n is bit n-1-i) in BigInt, so the cube algebra of
 * the bit-set engine carries over one to one: masks past 32 bits need BigInt, and a pattern
 * string would cost a loop per character for every containment or disjointness test.
 */
export interface WideCube {
  readonly mask: bigint;
  readonly bits: bigint;
}

/** An input combination over up to 64 inputs, leftmost input = most significant bit. */
export type WideCombination = bigint;

export function wideCube(mask: bigint, bits: bigint): WideCube {
  return { mask, bits: bits & mask };
}

export const ANY: WideCube = { mask: 0n, bits: 0n };

export function inputBit(n: number, input: number): bigint {
  return 1n << BigInt(n - 1 - input);
}

export function wideLiterals(c: WideCube): number {
  let k = 0;
  for (let m = c.mask; m !== 0n; m &= m - 1n) k++;
  return k;
}

export function wideDisjoint(a: WideCube, b: WideCube): boolean {
  return ((a.bits ^ b.bits) & a.mask & b.mask) !== 0n;
}

/** a lies inside b. */
export function wideWithin(a: WideCube, b: WideCube): boolean {
  return (b.mask & ~a.mask) === 0n && ((a.bits ^ b.bits) & b.mask) === 0n;
}

export function wideContains(c: WideCube, k: WideCombination): boolean {
  return ((k ^ c.bits) & c.mask) === 0n;
}

/** '1', '0' or '-' per input, leftmost first. */
export function widePattern(n: number, c: WideCube): string {
  let s = '';
  for (let i = 0; i < n; i++) {
    const bit = inputBit(n, i);
    s += c.mask & bit ? (c.bits & bit ? '1' : '0') : '-';
  }
  return s;
}

/** A combination as a pattern of n characters '1'/'0', leftmost input first. */
export function combinationPattern(n: number, k: WideCombination): string {
  return k.toString(2).padStart(n, '0');
}

export function toWide(c: Cube): WideCube {
  return { mask: BigInt(c.mask), bits: BigInt(c.bits) };
}

/** Back to a Cube (n <= 32: a bug otherwise). */
export function toNarrow(c: WideCube): Cube {
  if (c.mask >> 32n !== 0n) throw new Error('bug: a cube of more than 32 inputs has no narrow form');
  return narrowCube(Number(c.mask), Number(c.bits));
}

/** Printed order as `comparePrinted`: per input from the leftmost, plain, then negated, then absent. */
export function compareWidePrinted(n: number): (a: WideCube, b: WideCube) => number {
  const rank = (c: WideCube, bit: bigint): number => (c.mask & bit ? (c.bits & bit ? 0 : 1) : 2);
  return (a, b) => {
    for (let i = 0; i < n; i++) {
      const bit = inputBit(n, i);
      const d = rank(a, bit) - rank(b, bit);
      if (d !== 0) return d;
    }
    return 0;
  };
}

/** A count for JSON: a number while exact (<= 2^53), else its decimal digits. */
export function countJson(k: bigint): number | string {
  return k <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(k) : k.toString();
}

/** Plain data with every BigInt inside it (arrays and plain objects, any depth) made `countJson`. */
export function jsonCounts<T>(value: T): unknown {
  if (typeof value === 'bigint') return countJson(value);
  if (Array.isArray(value)) return value.map(jsonCounts);
  if (value !== null && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, jsonCounts(v)]));
  return value;
}
