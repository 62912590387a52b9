// A Boolean function of n inputs as on-set and don't-care set, built from table rows.
import {
  MAX_INPUTS,
  count,
  emptySet,
  fullSet,
  intersect,
  isEmpty,
  members,
  minus,
  union,
  type BitSet,
  type Combination,
} from './bits.js';
import { cube, cubeContains, cubeToSet, type Cube } from './cube.js';
import { fail, ok, type Result } from './result.js';

/** The value an output must take: 1, 0, or '-' (don't-care). */
export type OutputValue = 0 | 1 | '-';

/** An output's value when nothing is specified: 0 = de-energised / not permitted. */
export type SafeValue = 0 | 1;

/**
 * A Boolean function of n inputs (1..24). Combinations in neither set are OFF.
 * `on` and `dc` never overlap.
 */
export interface BoolFunction {
  readonly n: number;
  readonly on: BitSet;
  readonly dc: BitSet;
}

/** One table row for one output: the input cube it covers and the value it asks for. */
export interface TableRow {
  readonly cube: Cube;
  readonly value: OutputValue;
}

/** Two rows that both cover a combination but ask for different values (1 against 0). */
export interface RowConflict {
  /** Indices into the rows given to buildFunction. */
  readonly rowA: number;
  readonly rowB: number;
  /** The first combination both cover. */
  readonly example: Combination;
  /** How many combinations both cover. */
  readonly combinations: number;
}

export interface BuiltFunction {
  /** Gap and conflict combinations take the safe value. */
  readonly fn: BoolFunction;
  /** Combinations that no row covers. */
  readonly gaps: BitSet;
  /** Combinations asked to be both 1 and 0. */
  readonly conflicted: BitSet;
  /** Pairs of rows in conflict, at most `conflictLimit` of them. */
  readonly conflicts: RowConflict[];
}

export function offSet(fn: BoolFunction): BitSet {
  return minus(minus(fullSet(fn.n), fn.on), fn.dc);
}

/** The care set: combinations whose value is specified (not don't-care). */
export function careSet(fn: BoolFunction): BitSet {
  return minus(fullSet(fn.n), fn.dc);
}

export function checkInputCount(n: number): Result<number> {
  if (!Number.isInteger(n) || n < 1) return fail({ message: `a function needs at least 1 input, got ${n}` });
  if (n > MAX_INPUTS) return fail({ message: `${n} inputs is more than the ${MAX_INPUTS} the engine handles` });
  return ok(n);
}

/**
 * Paint the rows into on/off/don't-care sets. A definite 1 or 0 wins over a don't-care row
 * that overlaps it; 1 against 0 is a conflict. Uncovered and conflicted combinations take
 * the safe value (fail-safe), and are returned so that they can be reported.
 */
export function buildFunction(
  n: number,
  rows: readonly TableRow[],
  safe: SafeValue = 0,
  conflictLimit = 50,
): Result<BuiltFunction> {
  const counted = checkInputCount(n);
  if (!counted.ok) return counted;
  const on = emptySet(n);
  const off = emptySet(n);
  const dc = emptySet(n);
  for (const row of rows) {
    if (row.cube.mask >>> n !== 0) return fail({ message: `a row's cube uses inputs beyond the ${n} given` });
    cubeToSet(n, row.cube, row.value === 1 ? on : row.value === 0 ? off : dc);
  }
  const conflicted = intersect(on, off);
  const covered = union(union(on, off), dc);
  const gaps = minus(fullSet(n), covered);
  let onSet = minus(on, conflicted);
  let dcSet = minus(minus(dc, on), off);
  if (safe === 1) onSet = union(union(onSet, gaps), conflicted);
  dcSet = minus(dcSet, onSet);
  return ok({
    fn: { n, on: onSet, dc: dcSet },
    gaps,
    conflicted,
    conflicts: isEmpty(conflicted) ? [] : findConflicts(n, rows, conflicted, conflictLimit),
  });
}

/**
 * Name the row pairs behind conflicted combinations, each pair once. Each pair found takes
 * the whole overlap of its two rows out of the search, so the work is per pair, not per
 * combination.
 */
function findConflicts(n: number, rows: readonly TableRow[], conflicted: BitSet, limit: number): RowConflict[] {
  const out: RowConflict[] = [];
  let remaining = conflicted;
  while (out.length < limit) {
    const [k] = members(remaining, 1);
    if (k === undefined) break;
    const a = rows.findIndex((r) => r.value === 1 && cubeContains(r.cube, k));
    const b = rows.findIndex((r) => r.value === 0 && cubeContains(r.cube, k));
    const ca = rows[a]!.cube;
    const cb = rows[b]!.cube;
    const overlap = cubeToSet(n, cube(ca.mask | cb.mask, ca.bits | cb.bits));
    out.push({ rowA: Math.min(a, b), rowB: Math.max(a, b), example: k, combinations: count(intersect(overlap, conflicted)) });
    remaining = minus(remaining, overlap);
  }
  return out;
}

/** A completely specified function from its on-set (no don't-cares). */
export function fromOnSet(n: number, on: BitSet): BoolFunction {
  return { n, on, dc: emptySet(n) };
}
