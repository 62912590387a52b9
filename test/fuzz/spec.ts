// Random spec tables, their meaning computed here from the rows (not by the product), and the
// sheet grid the product reads them from.
import type { CellValue, Grid } from '../../src/table/types.js';
import type { Prng } from './prng.js';

export type Cell = '0' | '1' | '-';

export interface GenRow {
  /** Leftmost input first. */
  readonly inputs: readonly Cell[];
  readonly outputs: readonly Cell[];
}

export interface GenSpec {
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** Per output: the value of combinations no row covers. */
  readonly safe: readonly (0 | 1)[];
  readonly rows: readonly GenRow[];
  /** How 1/0 are written in the sheet. */
  readonly cells: 'numbers' | 'booleans';
}

const INPUT_NAMES = [
  'Guard_closed', 'Estop_ok', 'Air_ok', 'Mode_auto', 'Jog', 'Door_locked', 'Curtain_clear',
  'Two_hand', 'Part_present', 'Clamp_closed', 'Pressure_ok', 'Reset_pb', 'Oil_level', 'Key_run',
];
const OUTPUT_NAMES = ['Motor_permit', 'Valve_open', 'Lamp_ready', 'Clamp_cmd', 'Alarm', 'Feed_enable'];

/** Every input combination, leftmost input the most significant bit. */
export function inputValues(n: number, k: number): boolean[] {
  return Array.from({ length: n }, (_, i) => ((k >>> (n - 1 - i)) & 1) === 1);
}

export function combinationOf(values: readonly (0 | 1 | boolean)[]): number {
  return values.reduce<number>((k, v) => (k << 1) | (v ? 1 : 0), 0);
}

function covers(row: GenRow, values: readonly boolean[]): boolean {
  return row.inputs.every((c, i) => c === '-' || (c === '1') === values[i]);
}

/** What the spec asks of output `o` on combination `k`: 0/1 (gaps at the safe value) or '-' (don't-care). */
export function specValue(spec: GenSpec, o: number, k: number): 0 | 1 | '-' {
  const values = inputValues(spec.inputs.length, k);
  let one = false;
  let zero = false;
  let any = false;
  for (const row of spec.rows) {
    if (!covers(row, values)) continue;
    any = true;
    if (row.outputs[o] === '1') one = true;
    else if (row.outputs[o] === '0') zero = true;
  }
  if (one && zero) throw new Error('generated spec has a conflict');
  if (one) return 1;
  if (zero) return 0;
  return any ? '-' : spec.safe[o]!;
}

/** Whether any combination of the table is covered by no row. */
export function hasGaps(spec: GenSpec): boolean {
  const n = spec.inputs.length;
  for (let k = 0; k < 2 ** n; k++) if (!spec.rows.some((r) => covers(r, inputValues(n, k)))) return true;
  return false;
}

function overlap(a: readonly Cell[], b: readonly Cell[]): boolean {
  return a.every((c, i) => c === '-' || b[i] === '-' || c === b[i]);
}

/**
 * A table of 2-6 inputs and 1-3 outputs: either every combination once (some merged by '-'),
 * or rows of random cubes that leave gaps. No two overlapping rows ask one output for 1 and 0.
 */
export function generateSpec(rng: Prng): GenSpec {
  const n = rng.int(2, 6);
  const m = rng.int(1, 3);
  const inputs = rng.sample(INPUT_NAMES, n);
  const outputs = rng.sample(OUTPUT_NAMES, m);
  const safe = outputs.map(() => (rng.chance(0.2) ? 1 : 0) as 0 | 1);
  const dcOut = rng.pick([0, 0.1, 0.25]);
  const rows: GenRow[] = [];
  const outCell = (): Cell => (rng.chance(dcOut) ? '-' : rng.chance(0.5) ? '1' : '0');
  const add = (cube: Cell[]): void => {
    const out = outputs.map((_, o) => {
      let want = outCell();
      const clashing = rows.filter((r) => overlap(r.inputs, cube) && r.outputs[o] !== '-').map((r) => r.outputs[o]);
      if (want !== '-' && clashing.some((c) => c !== want)) want = clashing.every((c) => c === clashing[0]) ? clashing[0]! : '-';
      return want;
    });
    rows.push({ inputs: cube, outputs: out });
  };
  if (rng.chance(0.4)) {
    // Complete: each combination once, with one input left as '-' where a pair is merged.
    const merge = rng.int(0, n - 1);
    for (let k = 0; k < 2 ** n; k++) {
      const v = inputValues(n, k);
      const cube = v.map((b) => (b ? '1' : '0') as Cell);
      if (v[merge] && rng.chance(0.3)) continue;
      if (!v[merge] && rng.chance(0.3)) cube[merge] = '-';
      if (rng.chance(0.1) && rows.length > 0) continue; // a gap
      add(cube);
    }
    // the 1-halves skipped above are covered by their merged twin or are gaps
  } else {
    const count = rng.int(1, Math.min(2 ** n, 3 + 2 * n));
    const dash = rng.pick([0.15, 0.3, 0.5]);
    for (let r = 0; r < count; r++) add(inputs.map(() => (rng.chance(dash) ? '-' : rng.chance(0.5) ? '1' : '0')));
  }
  if (rows.length === 0) add(inputs.map(() => '-'));
  return { inputs, outputs, safe, rows, cells: rng.chance(0.2) ? 'booleans' : 'numbers' };
}

/** The sheet: a role row, the header row, then the rows, from A1. */
export function specGrid(spec: GenSpec): Grid {
  const cell = (c: Cell): CellValue => (c === '-' ? '-' : spec.cells === 'booleans' ? c === '1' : c === '1' ? 1 : 0);
  return {
    sheet: 'Fuzz',
    origin: 'A1',
    cells: [
      [...spec.inputs.map(() => 'input'), ...spec.outputs.map(() => 'output')],
      [...spec.inputs, ...spec.outputs],
      ...spec.rows.map((r) => [...r.inputs.map(cell), ...r.outputs.map(cell)]),
    ],
  };
}

/** Safe values as the product takes them: by header, only the outputs whose safe value is 1. */
export function safeValues(spec: GenSpec): Record<string, 0 | 1> {
  return Object.fromEntries(spec.outputs.flatMap((o, i) => (spec.safe[i] === 1 ? [[o, 1 as const]] : [])));
}

/** The table as text: headers, then one line per row ("1 0 - | 1 -"), and the safe values. */
export function specText(spec: GenSpec): string {
  const lines = [
    `inputs: ${spec.inputs.join(', ')}`,
    `outputs: ${spec.outputs.map((o, i) => `${o} (safe value ${spec.safe[i]})`).join(', ')}`,
    ...spec.rows.map((r) => `  ${r.inputs.join(' ')} | ${r.outputs.join(' ')}`),
  ];
  if (hasGaps(spec)) lines.push('  (combinations no row covers take the safe value)');
  return lines.join('\n');
}
