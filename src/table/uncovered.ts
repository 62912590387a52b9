// The input combinations no row of a table covers, as a short list of disjoint cubes, for
// the gap warning and the analysis. Cut from the gap set itself (work in proportion to 2^n
// words, whatever the number of rows), with no search for a minimal cover.
import { cube, members, setToCubes, type BitSet, type Cube } from '../logic/index.js';

/** Beyond this many cubes a gap list is cut short (the count of gaps stays complete). */
export const GAP_CUBE_LIMIT = 65536;

/**
 * The gaps of a table as disjoint cubes, sorted (by the values of their fixed inputs, wider
 * first); when there would be more than `limit`, the first `limit` gap combinations as cubes
 * of one combination each, and `cut` says so.
 */
export function gapCubes(n: number, gaps: BitSet, limit = GAP_CUBE_LIMIT): { cubes: Cube[]; cut: boolean } {
  const disjoint = setToCubes(n, gaps);
  const cut = disjoint.length > limit;
  const cubes = cut ? members(gaps, limit).map((k) => cube((1 << n) - 1, k)) : disjoint;
  return { cubes: cubes.sort((x, y) => x.bits - y.bits || y.mask - x.mask), cut };
}
