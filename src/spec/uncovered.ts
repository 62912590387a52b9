// The input combinations no row of a table covers, as a short list of disjoint cubes, for
// the gap warning and the analysis. No search: fast for any table the engine takes.
import { members, type BitSet } from '../logic/bits.js';
import { cube, type Cube } from '../logic/cube.js';

/** Cubes of a ∖ b, disjoint from each other (the disjoint sharp product). */
function sharp(a: Cube, b: Cube): Cube[] {
  if (((a.bits ^ b.bits) & a.mask & b.mask) !== 0) return [a];
  const out: Cube[] = [];
  let mask = a.mask;
  let bits = a.bits;
  let free = b.mask & ~a.mask;
  while (free !== 0) {
    const bit = free & -free;
    free ^= bit;
    out.push(cube(mask | bit, bits | (~b.bits & bit)));
    mask |= bit;
    bits |= b.bits & bit;
  }
  return out;
}

/**
 * Disjoint cubes whose union is every combination of n inputs that none of `rows` covers.
 * Undefined when the list would grow past `limit` cubes on the way (then only a count and
 * examples are worth showing).
 */
export function uncoveredCubes(n: number, rows: readonly Cube[], limit = 4096): Cube[] | undefined {
  let left: Cube[] = [cube(0, 0)];
  for (const row of rows) {
    if (row.mask >>> n !== 0) throw new Error('bug: a row cube uses inputs beyond n');
    left = left.flatMap((c) => sharp(c, row));
    if (left.length > limit) return undefined;
    if (left.length === 0) break;
  }
  return left;
}

/** Beyond this many cubes a gap list is cut short (the count of gaps stays complete). */
export const GAP_CUBE_LIMIT = 65536;

/**
 * The gaps of a table as cubes, sorted (by the values of their fixed inputs, wider first):
 * the disjoint cubes of `uncoveredCubes`; or, when there would be more than `limit`, the
 * first `limit` gap combinations as cubes of one combination each, and `cut` says so.
 */
export function gapCubes(n: number, rows: readonly Cube[], gaps: BitSet, limit = GAP_CUBE_LIMIT): { cubes: Cube[]; cut: boolean } {
  const disjoint = uncoveredCubes(n, rows, limit);
  const cubes = disjoint ?? members(gaps, limit).map((k) => cube((1 << n) - 1, k));
  return { cubes: cubes.sort((x, y) => x.bits - y.bits || y.mask - x.mask), cut: disjoint === undefined };
}
