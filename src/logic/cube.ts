// Product terms and spec rows as cubes over n inputs.
import { add, emptySet, popcount, type BitSet, type Combination } from './bits.js';

/**
 * A cube: the combinations that agree with `bits` on the inputs in `mask`.
 * Input i (0 = leftmost) is bit (n - 1 - i), as in a Combination. `bits` has no bit outside `mask`.
 * As a product term, each masked input is one literal (bit 1: plain, bit 0: negated).
 */
export interface Cube {
  readonly mask: number;
  readonly bits: number;
}

export function cube(mask: number, bits: number): Cube {
  return { mask: mask >>> 0, bits: (bits & mask) >>> 0 };
}

export function cubeContains(c: Cube, k: Combination): boolean {
  return ((k ^ c.bits) & c.mask) === 0;
}

export function cubeLiterals(c: Cube): number {
  return popcount(c.mask);
}

/** Every combination of n inputs in the cube, in increasing order. */
export function cubeMembers(n: number, c: Cube): Combination[] {
  const free = ((1 << n) - 1) & ~c.mask;
  const out: Combination[] = [];
  // Walk the subsets of the free bits (standard sub-mask enumeration).
  let sub = 0;
  do {
    out.push(c.bits | sub);
    sub = (sub - free) & free;
  } while (sub !== 0);
  return out;
}

export function cubeToSet(n: number, c: Cube, into: BitSet = emptySet(n)): BitSet {
  if (n < 5) {
    const free = ((1 << n) - 1) & ~c.mask;
    let sub = 0;
    do {
      add(into, c.bits | sub);
      sub = (sub - free) & free;
    } while (sub !== 0);
    return into;
  }
  // A word at a time: the low 5 inputs give one in-word pattern, the others pick the words
  // (a row with one literal at 24 inputs is 8 M combinations, 256 K words).
  let pattern = 0;
  for (let j = 0; j < 32; j++) if ((j & c.mask & 31) === (c.bits & 31)) pattern |= 1 << j;
  const freeWords = ((1 << (n - 5)) - 1) & ~(c.mask >>> 5);
  const base = c.bits >>> 5;
  let sub = 0;
  do {
    into[base | sub]! |= pattern;
    sub = (sub - freeWords) & freeWords;
  } while (sub !== 0);
  return into;
}

/** '1', '0' or '-' per input, leftmost first: "1-0". */
export function cubeToPattern(n: number, c: Cube): string {
  let s = '';
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    s += c.mask & bit ? (c.bits & bit ? '1' : '0') : '-';
  }
  return s;
}

/** The cube of a pattern such as "1-0" (leftmost character = leftmost input). */
export function cubeFromPattern(pattern: string): Cube {
  const n = pattern.length;
  let mask = 0;
  let bits = 0;
  for (let i = 0; i < n; i++) {
    const ch = pattern[i];
    const bit = 1 << (n - 1 - i);
    if (ch === '1') {
      mask |= bit;
      bits |= bit;
    } else if (ch === '0') mask |= bit;
    else if (ch !== '-') throw new Error(`bug: pattern character ${ch}`);
  }
  return cube(mask, bits);
}
