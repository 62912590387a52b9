// Rectangular blocks of filled cells, separated by fully empty rows or columns.
import type { RangeRef } from './grid.js';

/**
 * Cut the filled area into blocks: split at fully empty rows, then at fully empty columns,
 * and again inside each piece until no piece holds an empty row or column (a recursive
 * X-Y cut). Blocks come in reading order (top to bottom, then left to right).
 * `filled[r][c]` is in grid coordinates; blocks are too.
 */
export function findBlocks(filled: readonly (readonly boolean[])[], width: number): RangeRef[] {
  const out: RangeRef[] = [];
  const height = filled.length;
  if (height > 0 && width > 0) cut({ top: 0, left: 0, bottom: height - 1, right: width - 1 }, filled, out);
  return out.sort((a, b) => a.top - b.top || a.left - b.left);
}

/** Pieces wait on a list, not on the call stack: a sheet laid out as a spiral nests deep. */
function cut(whole: RangeRef, filled: readonly (readonly boolean[])[], out: RangeRef[]): void {
  const todo = [whole];
  while (todo.length > 0) {
    const region = todo.pop()!;
    const rowRuns = runs(region.top, region.bottom, (r) => anyFilled(filled, r, r, region.left, region.right));
    for (const [top, bottom] of rowRuns) {
      const colRuns = runs(region.left, region.right, (c) => anyFilled(filled, top, bottom, c, c));
      for (const [left, right] of colRuns) {
        const piece = { top, left, bottom, right };
        // A piece that neither cut made smaller has no empty row or column left: a block.
        if (rowRuns.length === 1 && colRuns.length === 1 && sameRange(piece, region)) out.push(piece);
        else todo.push(piece);
      }
    }
  }
}

/** Maximal runs of indices lo..hi where `keep` holds. */
function runs(lo: number, hi: number, keep: (i: number) => boolean): [number, number][] {
  const out: [number, number][] = [];
  let start = -1;
  for (let i = lo; i <= hi + 1; i++) {
    const k = i <= hi && keep(i);
    if (k && start < 0) start = i;
    if (!k && start >= 0) {
      out.push([start, i - 1]);
      start = -1;
    }
  }
  return out;
}

export function anyFilled(
  filled: readonly (readonly boolean[])[],
  top: number,
  bottom: number,
  left: number,
  right: number,
): boolean {
  for (let r = top; r <= bottom; r++) {
    const row = filled[r]!;
    for (let c = left; c <= right; c++) if (row[c]) return true;
  }
  return false;
}

function sameRange(a: RangeRef, b: RangeRef): boolean {
  return a.top === b.top && a.left === b.left && a.bottom === b.bottom && a.right === b.right;
}
