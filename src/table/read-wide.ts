// Spec tables of more than 24 inputs (up to 64): the rows' cubes kept for the symbolic engine,
// conflicts and gaps reported from BDDs as read-tables.ts does from bit sets.
import {
  boundsWords,
  buildWide,
  countOutside,
  Dd,
  DdTooLarge,
  deadlineAt,
  DEFAULT_NODE_LIMIT,
  now,
  rowConflicts,
  type LeftOut,
  type WideConflict,
  inputBit,
  overlapCube,
  wideCube,
  widePattern,
  type OutputValue,
  type SafeValue,
  type Signal,
  type WideBuilt,
  type WideCube,
} from '../logic/index.js';
import { describeCube } from './describe.js';
import type { Problem, ProblemCode, Severity, SpecRow, WideSpec } from './types.js';

/** How many gap cubes a gap warning names. */
const GAP_CUBES_SHOWN = 8;

type ProblemAt = (severity: Severity, code: ProblemCode, cell: string, message: string) => Problem;

/** The cube of one row's input values (1, 0, or '-' = not in the mask), leftmost input first. */
export function wideRowCube(values: readonly (OutputValue | undefined)[]): WideCube {
  const n = values.length;
  let mask = 0n;
  let bits = 0n;
  values.forEach((v, i) => {
    if (v === 1 || v === 0) mask |= inputBit(n, i);
    if (v === 1) bits |= inputBit(n, i);
  });
  return wideCube(mask, bits);
}

/** Nodes the rows' diagrams may take before the table goes to the row-cube engine (about 6 MB). */
export const ROWS_DIAGRAM_LIMIT = 250_000;

/** Time to count a table's gaps on its rows' cubes (ms). */
const ROW_GAP_COUNT_MS = 300;

/**
 * Every output's function in one diagram manager. The rows' diagrams must fit in
 * ROWS_DIAGRAM_LIMIT nodes (a union of a few hundred random cubes needs millions in any
 * order: then DdTooLarge, soon); what is made from them afterwards has the whole budget.
 */
export function wideBuilt(n: number, spec: WideSpec, rows: readonly SpecRow[]): { dd: Dd; built: WideBuilt[] } {
  const dd = new Dd(n, ROWS_DIAGRAM_LIMIT);
  const nodes = spec.cubes.map((c) => dd.cube(c));
  const built = spec.outputs.map((o, j) =>
    buildWide(dd, rows.map((r, i) => ({ cube: spec.cubes[i]!, value: r.values[j]! })), nodes, o.safe),
  );
  dd.allowNodes(DEFAULT_NODE_LIMIT);
  return { dd, built };
}

/** Conflicts per output and the gaps: from the diagrams, or on the rows' cubes when they have none. */
interface Facts {
  readonly conflicts: readonly (readonly WideConflict[])[];
  readonly gaps: LeftOut;
  readonly noDiagram?: string;
}

function facts(n: number, spec: WideSpec, rows: readonly SpecRow[]): Facts {
  try {
    const { dd, built } = wideBuilt(n, spec, rows);
    const gaps = built[0]!.gaps;
    const count = dd.satCount(gaps);
    return { conflicts: built.map((b) => b.conflicts), gaps: { atLeast: count, atMost: count, cubes: dd.pathCubes(gaps, GAP_CUBES_LISTED).cubes } };
  } catch (e) {
    if (!(e instanceof DdTooLarge)) throw e;
    const conflicts = spec.outputs.map((_, j) => rowConflicts(n, rows.map((r, i) => ({ cube: spec.cubes[i]!, value: r.values[j]! }))));
    const start = now();
    const gaps = countOutside(n, spec.cubes, deadlineAt(start + ROW_GAP_COUNT_MS), GAP_CUBES_LISTED, deadlineAt(start + ROW_GAP_COUNT_MS / 2));
    return { conflicts, gaps, noDiagram: e.message };
  }
}

/** Gap cubes kept with a table read on its rows' cubes, and listed in an analysis. */
export const GAP_CUBES_LISTED = 1000;

/**
 * The wide part of a table, with its conflicts (one error per row pair at the later row's
 * output cell) and gaps (one warning at the table) pushed onto `problems`.
 */
export function readWide(
  rows: readonly SpecRow[],
  cubes: readonly WideCube[],
  inputs: readonly Signal[],
  outputs: readonly { signal: Signal; safe: SafeValue }[],
  tableRange: string,
  problemAt: ProblemAt,
  problems: Problem[],
): WideSpec {
  const spec: WideSpec = { cubes, outputs };
  if (rows.length === 0) return spec;
  const n = inputs.length;
  const found = facts(n, spec, rows);
  found.conflicts.forEach((conflicts, j) => {
    const { signal, safe } = outputs[j]!;
    for (const c of conflicts) {
      const a = rows[c.rowA]!;
      const r = rows[c.rowB]!;
      const plural = c.combinations === 1n ? 'combination takes' : 'combinations take';
      const message =
        `rows ${a.cells} and ${r.cells} both cover ${describeCube(overlapCube(cubes[c.rowA]!, cubes[c.rowB]!), inputs)} but ask ${signal.header} ` +
        `for ${a.values[j]} and ${r.values[j]}; ${c.combinations} ${plural} the safe value ${safe}`;
      problems.push(problemAt('error', 'conflict', r.outputCells[j]!, message));
    }
  });
  const { gaps } = found;
  if (gaps.atMost > 0n) {
    const shown = gaps.cubes.slice(0, GAP_CUBES_SHOWN);
    const complete = gaps.atLeast === gaps.atMost && gaps.cubes.length <= GAP_CUBES_SHOWN;
    const safes = outputs.map((o) => `${o.signal.header} ${o.safe}`).join(', ');
    problems.push(
      problemAt(
        'warning',
        'gaps',
        tableRange,
        `${boundsWords(gaps, 'input combination')} ${gaps.atMost === 1n ? 'is' : 'are'} covered by no row; there each output takes its safe value (${safes}). ` +
          `Uncovered, as patterns over ${inputs.map((s) => s.header).join(', ')} (- = any): ` +
          shown.map((c) => widePattern(n, c)).join(', ') +
          (complete ? '' : ' and more'),
      ),
    );
  }
  if (found.noDiagram !== undefined) {
    problems.push(
      problemAt(
        'info',
        'row-cube-engine',
        tableRange,
        `${n} inputs: the rows have no decision diagram of workable size (${found.noDiagram}), ` +
          'so the table is analysed on its rows\' cubes: its AND/OR form is a heuristic with a proven lower bound, proven equal to the rows on every combination; ' +
          'no XOR forms and no verify of programs against it (both need the diagram); outputs with don\'t-care rows or safe value 1 get no form',
      ),
    );
    return { ...spec, noDiagram: { why: found.noDiagram, gaps } };
  }
  problems.push(
    problemAt(
      'info',
      'symbolic-engine',
      tableRange,
      `${n} inputs: analysed by the symbolic engine (up to 64 inputs); its forms, proofs and unique-cause test steps go to the report, ` +
        `the JSON document, the results sheet and test record (no live check: that takes at most 12 inputs), the hand-over files and verify, and the pane's result cards and typed expression checks`,
    ),
  );
  return spec;
}

/** Why a table could not be checked: the symbolic engine's limit, with what to do. */
export function tooLarge(n: number, e: DdTooLarge): string {
  return (
    `${n} inputs: this table is too large for the symbolic engine (${e.message}, inputs in column order), ` +
    'so nothing about it was checked or proven; split the table, or order its columns so that inputs used together stand together'
  );
}
