// Combinations and cubes printed as a small table with one column per signal header, for
// the readable report: a reader sees which input is which without counting characters.
import { cubeToPattern, type Combination, type Cube, type Signal } from '../logic/index.js';
import { combinationCube } from '../table/index.js';

/** Rows printed before "... (N in all)"; the counts are always complete. */
export const TABLE_ROWS_SHOWN = 8;

/**
 * The lines of the table: a header line of the signal headers, then one line per row with
 * '1', '0' or '-' (any) under each header; `total` (when more than shown) closes it with a count.
 */
export function patternTableLines(headers: readonly string[], rows: readonly (readonly string[])[], indent: string, total = rows.length): string[] {
  const widths = headers.map((h) => Math.max(1, h.length));
  const line = (cells: readonly string[]): string => indent + cells.map((c, i) => c.padEnd(widths[i]!)).join('  ').trimEnd();
  const shown = rows.slice(0, TABLE_ROWS_SHOWN);
  const out = [line(headers), ...shown.map(line)];
  if (total > shown.length) out.push(`${indent}... (${total} in all)`);
  return out;
}

export function cubeTableLines(inputs: readonly Signal[], cubes: readonly Cube[], indent: string, total = cubes.length): string[] {
  const n = inputs.length;
  return patternTableLines(inputs.map((s) => s.header), cubes.map((c) => [...cubeToPattern(n, c)]), indent, total);
}

export function combinationTableLines(inputs: readonly Signal[], combinations: readonly Combination[], indent: string, total = combinations.length): string[] {
  return cubeTableLines(inputs, combinations.map((k) => combinationCube(inputs.length, k)), indent, total);
}
