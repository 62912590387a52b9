// Where, inside a block of cells, a spec table's role row, header row and data rows are;
// and which side-by-side blocks are one table split by an empty separator column.
import { isBlank, isTagWord, isText, looksLikeData, roleWord } from './cell-values.js';
import { anyFilled } from './find-blocks.js';
import type { RangeRef } from './grid.js';
import type { CellValue } from './types.js';

/** Cell lookup in grid coordinates (null outside the grid). */
export type CellAt = (row: number, col: number) => CellValue;

/** The merged area (grid coordinates) whose top-left cell is this one, if the host reported it. */
export type MergeAt = (row: number, col: number) => RangeRef | undefined;

export interface BlockLayout {
  /** The block in grid coordinates; note rows above the table are inside it. */
  readonly block: RangeRef;
  /** Grid column of an empty column between inputs (left) and outputs (right). */
  readonly separator?: number;
  /** First row of the table: the role row when there is one, else the header row. */
  readonly top: number;
  readonly roleRow?: number;
  /** A row reading `tag` beside the role row or the headers: each signal's program name. */
  readonly tagRow?: number;
  /** Rows of group titles above the signal names (a merged "Guards" over two columns), skipped. */
  readonly groupRows: readonly number[];
  readonly headerRow: number;
  /** First data row. */
  readonly dataTop: number;
  /** Title rows above the table were skipped. */
  readonly titled: boolean;
  /** No cell reads as data and there is no role row: a note or title, not a spec table. */
  readonly isNote: boolean;
}

/** The grid columns of the block that may hold signals (all but the separator). */
export function signalColumns(layout: Pick<BlockLayout, 'block' | 'separator'>): number[] {
  const cols: number[] = [];
  for (let c = layout.block.left; c <= layout.block.right; c++) if (c !== layout.separator) cols.push(c);
  return cols;
}

/**
 * Read the rows of a block from the top:
 * - title rows: a single text cell above a row with more cells that names signals, skipped;
 * - then, in any order, at most one role row (some cells read input/output, in/out, I/Q; all
 *   text), at most one tag row (a cell reads `tag`; all text) and group rows (text only, fewer
 *   cells than the row below, which names signals: group titles over the signal names);
 * - the header row: the next row; a tag row may also follow it directly.
 * A row "names signals" when it holds at least as much text that is not a value as values
 * (a header may be Y or N, which are also values).
 */
export function layoutBlock(cellAt: CellAt, block: RangeRef, separator?: number): BlockLayout {
  const cols = signalColumns({ block, separator });
  const allCols: number[] = [];
  for (let c = block.left; c <= block.right; c++) allCols.push(c);
  const rowCells = (r: number, which: readonly number[] = cols): CellValue[] => which.map((c) => cellAt(r, c));
  const filledCount = (r: number): number => rowCells(r).filter((v) => !isBlank(v)).length;
  const namesSignals = (r: number): boolean => {
    const cells = rowCells(r);
    const words = cells.filter((v) => isText(v) && !looksLikeData(v)).length;
    return words > 0 && words >= cells.filter(looksLikeData).length;
  };
  const allText = (r: number): boolean => rowCells(r, allCols).every((v) => isBlank(v) || isText(v));

  let r = block.top;
  while (r < block.bottom && cols.length > 1 && isNoteRow(rowCells(r)) && filledCount(r + 1) > 1 && namesSignals(r + 1)) r++;
  const top = r;
  let roleRow: number | undefined;
  let tagRow: number | undefined;
  const groupRows: number[] = [];
  while (r < block.bottom && allText(r) && namesSignals(r + 1)) {
    const cells = rowCells(r, allCols);
    if (roleRow === undefined && cells.some((v) => roleWord(v))) roleRow = r;
    else if (tagRow === undefined && cells.some(isTagWord)) tagRow = r;
    else if (
      filledCount(r) < filledCount(r + 1) &&
      !cells.some((v) => looksLikeData(v) || roleWord(v) || isTagWord(v)) &&
      !rowCells(r + 1, allCols).some(isTagWord)
    )
      groupRows.push(r);
    else break;
    r++;
  }
  const headerRow = r;
  if (tagRow === undefined && headerRow < block.bottom && allText(headerRow + 1) && rowCells(headerRow + 1, allCols).some(isTagWord)) tagRow = headerRow + 1;
  let anyData = false;
  for (let row = block.top; row <= block.bottom && !anyData; row++) anyData = rowCells(row).some(looksLikeData);
  return {
    block,
    ...(separator === undefined ? {} : { separator }),
    top,
    ...(roleRow === undefined ? {} : { roleRow }),
    ...(tagRow === undefined ? {} : { tagRow }),
    groupRows,
    headerRow,
    dataTop: Math.max(headerRow, tagRow ?? headerRow) + 1,
    titled: top > block.top,
    isNote: !anyData && roleRow === undefined,
  };
}

function isNoteRow(cells: readonly CellValue[]): boolean {
  const filled = cells.filter((v) => !isBlank(v));
  return filled.length === 1 && isText(filled[0]!) && !looksLikeData(filled[0]!) && !roleWord(filled[0]!) && !isTagWord(filled[0]!);
}

/** The role row gives every signal column a role by itself (it holds both words). */
function rolesComplete(cellAt: CellAt, layout: BlockLayout): boolean {
  if (layout.roleRow === undefined) return false;
  const words = signalColumns(layout).map((c) => roleWord(cellAt(layout.roleRow!, c)));
  return words.includes('input') && words.includes('output');
}

/**
 * Join blocks that are one table with an empty separator column: two blocks, side by side,
 * exactly one empty column apart, whose header rows are the same sheet row, with nothing
 * else in the rectangle around both; unless both already tell inputs from outputs with a
 * role row of their own (then they are two tables). A joined table is never joined again:
 * a table has at most one separator column.
 */
export function joinSeparated(
  cellAt: CellAt,
  filled: readonly (readonly boolean[])[],
  blocks: readonly RangeRef[],
): BlockLayout[] {
  const layouts = blocks.map((b) => layoutBlock(cellAt, b));
  const used = new Set<number>();
  const out: BlockLayout[] = [];
  for (let i = 0; i < layouts.length; i++) {
    if (used.has(i)) continue;
    const left = layouts[i]!;
    const j = layouts.findIndex((right, k) => !used.has(k) && k !== i && joinable(cellAt, filled, left, right));
    if (j < 0) {
      out.push(left);
      continue;
    }
    const right = layouts[j]!;
    used.add(j);
    const box = {
      top: Math.min(left.block.top, right.block.top),
      left: left.block.left,
      bottom: Math.max(left.block.bottom, right.block.bottom),
      right: right.block.right,
    };
    out.push(layoutBlock(cellAt, box, left.block.right + 1));
  }
  return out.sort((a, b) => a.block.top - b.block.top || a.block.left - b.block.left);
}

function joinable(
  cellAt: CellAt,
  filled: readonly (readonly boolean[])[],
  left: BlockLayout,
  right: BlockLayout,
): boolean {
  if (right.block.left !== left.block.right + 2 || left.isNote || right.isNote) return false;
  if (left.headerRow !== right.headerRow) return false;
  if (rolesComplete(cellAt, left) && rolesComplete(cellAt, right)) return false;
  // Each with a title of its own: two tables side by side.
  if (left.titled && right.titled) return false;
  // Every filled cell of the surrounding rectangle must belong to one of the two blocks.
  const top = Math.min(left.block.top, right.block.top);
  const bottom = Math.max(left.block.bottom, right.block.bottom);
  const outside = (b: RangeRef, from: number, to: number): boolean =>
    (from < b.top && anyFilled(filled, from, Math.min(to, b.top - 1), b.left, b.right)) ||
    (to > b.bottom && anyFilled(filled, Math.max(from, b.bottom + 1), to, b.left, b.right));
  const sep = left.block.right + 1;
  return (
    !anyFilled(filled, top, bottom, sep, sep) &&
    !outside(left.block, top, bottom) &&
    !outside(right.block, top, bottom)
  );
}
