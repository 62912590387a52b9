// Spec tables of more than 24 inputs (up to 64): the rows' cubes kept for the symbolic engine,
// conflicts and gaps reported from BDDs as read-tables.ts does from bit sets.
import {
  buildWide,
  Dd,
  DdTooLarge,
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

/** Every output's function in one diagram manager. */
export function wideBuilt(n: number, spec: WideSpec, rows: readonly SpecRow[]): { dd: Dd; built: WideBuilt[] } {
  const dd = new Dd(n);
  const nodes = spec.cubes.map((c) => dd.cube(c));
  const built = spec.outputs.map((o, j) =>
    buildWide(dd, rows.map((r, i) => ({ cube: spec.cubes[i]!, value: r.values[j]! })), nodes, o.safe),
  );
  return { dd, built };
}

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
  let made: ReturnType<typeof wideBuilt>;
  try {
    made = wideBuilt(n, spec, rows);
  } catch (e) {
    if (!(e instanceof DdTooLarge)) throw e;
    problems.push(problemAt('error', 'too-large', tableRange, tooLarge(n, e)));
    return { ...spec, tooLarge: e.message };
  }
  const { dd, built } = made;
  built.forEach((b, j) => {
    const { signal, safe } = outputs[j]!;
    for (const c of b.conflicts) {
      const a = rows[c.rowA]!;
      const r = rows[c.rowB]!;
      const plural = c.combinations === 1n ? 'combination takes' : 'combinations take';
      const message =
        `rows ${a.cells} and ${r.cells} both cover ${describeCube(overlapCube(cubes[c.rowA]!, cubes[c.rowB]!), inputs)} but ask ${signal.header} ` +
        `for ${a.values[j]} and ${r.values[j]}; ${c.combinations} ${plural} the safe value ${safe}`;
      problems.push(problemAt('error', 'conflict', r.outputCells[j]!, message));
    }
  });
  const gaps = built[0]!.gaps;
  const gapCount = dd.satCount(gaps);
  if (gapCount > 0n) {
    const { cubes: shown, complete } = dd.pathCubes(gaps, GAP_CUBES_SHOWN);
    const safes = outputs.map((o) => `${o.signal.header} ${o.safe}`).join(', ');
    const plural = gapCount === 1n ? 'combination is' : 'combinations are';
    problems.push(
      problemAt(
        'warning',
        'gaps',
        tableRange,
        `${gapCount} input ${plural} covered by no row; there each output takes its safe value (${safes}). ` +
          `Uncovered, as patterns over ${inputs.map((s) => s.header).join(', ')} (- = any): ` +
          shown.map((c) => widePattern(n, c)).join(', ') +
          (complete ? '' : ' and more'),
      ),
    );
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
