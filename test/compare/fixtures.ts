// Invented revisions of small spec tables for the comparison tests.
import { members } from '../../src/logic/bits.js';
import { cubeFromPattern, cubeToSet } from '../../src/logic/cube.js';
import { emptySet } from '../../src/logic/bits.js';
import type { ChangeSet } from '../../src/compare/index.js';
import { tinyTable, type TinySpec } from '../report/fixtures.js';

export { tinyTable, type TinySpec };

/** A guard table of three inputs and one output, as first issued. */
export const ISSUED: TinySpec = {
  sheet: 'Press',
  inputs: ['Guard closed', 'Two-hand OK', 'Setup mode'],
  outputs: ['Stroke permit'],
  rows: ['1 1 - | 1', '0 - - | 0', '1 0 - | 0'],
};

export function revised(rows: readonly string[], changes: Partial<TinySpec> = {}): TinySpec {
  return { ...ISSUED, ...changes, rows };
}

/** Every combination a change set holds, from its cubes. */
export function combinationsOf(n: number, set: ChangeSet): number[] {
  const s = emptySet(n);
  for (const c of set.cubes) cubeToSet(n, c, s);
  return members(s);
}

export function patternsOf(n: number, patterns: readonly string[]): number[] {
  const s = emptySet(n);
  for (const p of patterns) cubeToSet(n, cubeFromPattern(p), s);
  return members(s);
}
