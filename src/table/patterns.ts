// Combinations and cubes as a small table with one column per signal, for problems and reports.
import { cube, cubeToPattern, type Combination, type Cube, type Signal } from '../logic/index.js';
import type { PatternTable } from './types.js';

/** One row per cube, one column per input header; cells '1', '0' or '-' (any). */
export function patternTable(inputs: readonly Signal[], cubes: readonly Cube[]): PatternTable {
  const n = inputs.length;
  return { headers: inputs.map((s) => s.header), rows: cubes.map((c) => [...cubeToPattern(n, c)]) };
}

/** A combination as the cube of that one combination. */
export function combinationCube(n: number, k: Combination): Cube {
  return cube((1 << n) - 1, k);
}
