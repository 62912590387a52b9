// Conflicts of a spec table read on its rows' cubes (no decision diagram): each conflict is one
// pair of rows, ON against OFF, whose cubes meet, with its whole overlap (the gaps are counted
// by cube-list.ts `countOutside`).
import { wideDisjoint, wideLiterals } from './wide-cube.js';
import { overlapCube, type WideConflict, type WideRow } from './wide-fn.js';

/** The first `limit` row pairs that ask for 1 and 0 on common combinations, in row order. */
export function rowConflicts(n: number, rows: readonly WideRow[], limit = 50): WideConflict[] {
  const out: WideConflict[] = [];
  for (let b = 0; b < rows.length && out.length < limit; b++)
    for (let a = 0; a < b && out.length < limit; a++) {
      const [x, y] = [rows[a]!, rows[b]!];
      if (x.value === '-' || y.value === '-' || x.value === y.value || wideDisjoint(x.cube, y.cube)) continue;
      const overlap = overlapCube(x.cube, y.cube);
      out.push({ rowA: a, rowB: b, example: overlap.bits, combinations: 1n << BigInt(n - wideLiterals(overlap)) });
    }
  return out;
}
