// A spec function over up to 64 inputs as BDDs: on-set, don't-cares, gaps and conflicts from
// the rows' cubes, as `buildFunction` does with bit sets.
import { Dd, type Node } from './bdd.js';
import type { OutputValue, SafeValue } from './boolfn.js';
import { wideCube, wideContains, type WideCombination, type WideCube } from './wide-cube.js';

/** One table row for one output, over up to 64 inputs. */
export interface WideRow {
  readonly cube: WideCube;
  readonly value: OutputValue;
}

/** Everything else is OFF; `on` and `dc` never overlap. */
export interface WideFunction {
  readonly dd: Dd;
  readonly on: Node;
  readonly dc: Node;
}

export interface WideConflict {
  readonly rowA: number;
  readonly rowB: number;
  readonly example: WideCombination;
  readonly combinations: bigint;
}

export interface WideBuilt {
  /** Gap and conflict combinations take the safe value. */
  readonly fn: WideFunction;
  readonly gaps: Node;
  readonly conflicted: Node;
  readonly conflicts: WideConflict[];
}

/** off = not on and not dc. */
export function wideOff(fn: WideFunction): Node {
  return fn.dd.not(fn.dd.or(fn.on, fn.dc));
}

/**
 * Paint the rows as `buildFunction` does: a 1 or 0 wins over an overlapping don't-care row,
 * 1 against 0 is a conflict, uncovered and conflicted combinations take the safe value.
 * `rowNodes` are the rows' cubes in `dd` (shared by every output of a table).
 */
export function buildWide(
  dd: Dd,
  rows: readonly WideRow[],
  rowNodes: readonly Node[],
  safe: SafeValue = 0,
  conflictLimit = 50,
): WideBuilt {
  const pick = (value: OutputValue): Node => dd.orAll(rowNodes.filter((_, r) => rows[r]!.value === value));
  const on = pick(1);
  const off = pick(0);
  const dc = pick('-');
  const conflicted = dd.and(on, off);
  const gaps = dd.not(dd.or(dd.or(on, off), dc));
  let onSet = dd.minus(on, conflicted);
  if (safe === 1) onSet = dd.or(dd.or(onSet, gaps), conflicted);
  const dcSet = dd.minus(dd.minus(dd.minus(dc, on), off), onSet);
  return {
    fn: { dd, on: onSet, dc: dcSet },
    gaps,
    conflicted,
    conflicts: conflicted === 0 ? [] : findWideConflicts(dd, rows, rowNodes, conflicted, conflictLimit),
  };
}

/** The row pairs behind conflicted combinations, each pair's whole overlap taken out at once. */
function findWideConflicts(dd: Dd, rows: readonly WideRow[], rowNodes: readonly Node[], conflicted: Node, limit: number): WideConflict[] {
  const out: WideConflict[] = [];
  let remaining = conflicted;
  while (out.length < limit && remaining !== 0) {
    const k = dd.minterms(remaining, 1)[0]!;
    const a = rows.findIndex((r) => r.value === 1 && wideContains(r.cube, k));
    const b = rows.findIndex((r) => r.value === 0 && wideContains(r.cube, k));
    const overlap = dd.and(rowNodes[a]!, rowNodes[b]!);
    out.push({ rowA: Math.min(a, b), rowB: Math.max(a, b), example: k, combinations: dd.satCount(dd.and(overlap, conflicted)) });
    remaining = dd.minus(remaining, overlap);
  }
  return out;
}

/** The cube both rows cover. */
export function overlapCube(a: WideCube, b: WideCube): WideCube {
  return wideCube(a.mask | b.mask, a.bits | b.bits);
}
