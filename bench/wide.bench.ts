// Wide tables: the bit-set engine and the symbolic (BDD) engine on the same structured tables
// at 16, 20 and 24 inputs, then the symbolic engine alone at 32-64 inputs. Whole analysis
// in-process (reading the grid included); seeds fixed. Peak memory is the largest RSS sampled
// during the run (the process's, so it includes what earlier runs left behind). Beside each
// symbolic figure: the same table on the baseline commit (bench/wide-baseline.json: that
// commit's bench, run on this machine, with its load average).
import { readFileSync } from 'node:fs';
import type { CellValue } from '../src/spec/types.js';
import { analyseTable } from '../src/spec/analyse.js';
import { analysisJson } from '../src/spec/analysis-json.js';
import type { TableAnalysis } from '../src/spec/analysis-types.js';
import { readSpecTables } from '../src/spec/read-tables.js';
import { now } from '../src/logic/deadline.js';
import { wideDisjoint } from '../src/logic/wide-cube.js';
import { wideRowCube } from '../src/spec/read-wide.js';

interface Baseline {
  readonly source: string;
  /** Per table label: the symbolic engine's ms and what it gave. */
  readonly symbolic: Record<string, string>;
}

const baseline = JSON.parse(readFileSync(new URL('./wide-baseline.json', import.meta.url), 'utf8')) as Baseline;
const before = (label: string): string => `; baseline ${baseline.symbolic[label] ?? 'not measured'}`;

function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

function sheet(names: string[], rows: CellValue[][], output: string): CellValue[][] {
  return [[...names.map(() => 'input'), 'output'], [...names, output], ...rows];
}

const inputNames = (n: number, stem: string): string[] => Array.from({ length: n }, (_, i) => `${stem} ${i + 1}`);

/** A start permissive: 8 ON rows of 8 literals that all need the first 2 inputs at 1; OFF rows: each of those at 0. */
export function permitTable(n: number, seed: number): CellValue[][] {
  const next = random(seed);
  const names = inputNames(n, 'Cond');
  const rows: CellValue[][] = [];
  for (let k = 0; k < 8; k++) {
    const row: CellValue[] = names.map((_, i) => (i < 2 ? 1 : '-'));
    for (let literals = 2; literals < 8; ) {
      const i = 2 + Math.floor(next() * (n - 2));
      if (row[i] !== '-') continue;
      row[i] = next() < 0.5 ? 1 : 0;
      literals++;
    }
    rows.push([...row, 1]);
  }
  for (let s = 0; s < 2; s++) rows.push([...names.map((_, i) => (i === s ? 0 : '-')), 0]);
  return sheet(names, rows, 'Permit');
}

/** A trip: ON when any of n causes is 1; all causes at 0 is OFF. */
export function orTripTable(n: number): CellValue[][] {
  const names = inputNames(n, 'Cause');
  const rows: CellValue[][] = names.map((_, i) => [...names.map((_, j) => (j === i ? 1 : '-')), 1]);
  rows.push([...names.map(() => 0), 0]);
  return sheet(names, rows, 'Trip');
}

/** A permissive: ON when all n conditions are 1, OFF when any is 0. */
export function andPermitTable(n: number): CellValue[][] {
  const names = inputNames(n, 'Cond');
  const rows: CellValue[][] = [[...names.map(() => 1), 1]];
  names.forEach((_, i) => rows.push([...names.map((_, j) => (j === i ? 0 : '-')), 0]));
  return sheet(names, rows, 'Permit');
}

/** Robot-cell interlocks: `count` rows of 3-10 random literals, output 1 or 0 evenly. */
export function randomRowsTable(n: number, count: number, seed: number): CellValue[][] {
  const next = random(seed);
  const names = inputNames(n, 'Sig');
  const rows: CellValue[][] = [];
  for (let k = 0; k < count; k++) {
    const row: CellValue[] = names.map(() => '-');
    const want = 3 + Math.floor(next() * 8);
    for (let literals = 0; literals < want; ) {
      const i = Math.floor(next() * n);
      if (row[i] !== '-') continue;
      row[i] = next() < 0.5 ? 1 : 0;
      literals++;
    }
    rows.push([...row, next() < 0.5 ? 1 : 0]);
  }
  return sheet(names, rows, 'Enable');
}

let peak = 0;
const sample = (): void => {
  peak = Math.max(peak, process.memoryUsage.rss());
};

function timed(cells: CellValue[][], engine: 'bit-set' | 'symbolic'): { ms: number; mb: number; a: TableAnalysis } {
  peak = 0;
  const timer = setInterval(sample, 5);
  sample();
  const t0 = now();
  const read = readSpecTables({ sheet: 'Bench', origin: 'A1', cells });
  const table = read.tables[0]!;
  const a = analyseTable(table, { engine });
  JSON.stringify(analysisJson(a));
  const ms = now() - t0;
  sample();
  clearInterval(timer);
  return { ms, mb: peak / 2 ** 20, a };
}

function summary(a: TableAnalysis): string {
  const o = a.outputs[0];
  const w = a.wide?.outputs[0];
  if (o) return `${o.andOr.terms} terms${o.andOr.proven ? ' proven' : ''}, XOR ${o.xor.terms} terms, gaps ${o.gapCount}`;
  if (w) return `${w.andOr.terms} terms${w.andOr.proven ? ' proven' : ' heuristic'}, XOR ${w.xor.terms} terms, best ${w.bestXor.terms}, gaps ${a.wide!.gapCount}`;
  const error = a.problems.find((p) => p.severity === 'error');
  return error ? `${error.code}: ${error.message.split(', so ')[0]}` : 'no output';
}

/** ON rows and OFF rows sharing a combination: where a table's rows contradict each other. */
function conflictingPairs(cells: CellValue[][]): string {
  const rows = cells.slice(2);
  const n = cells[0]!.length - 1;
  const cubes = rows.map((r) => wideRowCube(r.slice(0, n) as (0 | 1 | '-')[]));
  let pairs = 0;
  let all = 0;
  rows.forEach((a, i) =>
    rows.forEach((b, j) => {
      if (a[n] !== 1 || b[n] !== 0) return;
      all++;
      if (!wideDisjoint(cubes[i]!, cubes[j]!)) pairs++;
    }),
  );
  return `${pairs} of ${all} ON/OFF row pairs overlap`;
}

export async function run(): Promise<void> {
  console.log('whole analysis in-process (read, forms, proofs, JSON); peak = largest RSS sampled');
  for (const n of [16, 20, 24]) {
    const cells = permitTable(n, 1000 + n);
    const symbolic = timed(cells, 'symbolic');
    const bitSet = timed(cells, 'bit-set');
    const label = `${n} inputs, 8 ON rows of 8 literals + 2 OFF rows`;
    console.log(
      `${label}: bit-set ${bitSet.ms.toFixed(0)} ms (peak ${bitSet.mb.toFixed(0)} MB; ${summary(bitSet.a)}), ` +
        `symbolic ${symbolic.ms.toFixed(0)} ms (peak ${symbolic.mb.toFixed(0)} MB; ${summary(symbolic.a)})${before(label)}`,
    );
  }
  const wide: [string, CellValue[][]][] = [
    ['32 inputs, 8 ON rows of 8 literals + 2 OFF rows', permitTable(32, 1032)],
    ['48 inputs, 8 ON rows of 8 literals + 2 OFF rows', permitTable(48, 1048)],
    ['40-cause OR trip', orTripTable(40)],
    ['40-condition AND permissive', andPermitTable(40)],
    ['64 inputs x 300 rows of 3-10 literals', randomRowsTable(64, 300, 64300)],
  ];
  for (const [what, cells] of wide) {
    const r = timed(cells, 'symbolic');
    const rows = what.includes(' x 300 ') ? ` (${conflictingPairs(cells)})` : '';
    console.log(`${what}: symbolic ${r.ms.toFixed(0)} ms (peak ${r.mb.toFixed(0)} MB; ${summary(r.a)})${rows}${before(what)}`);
  }
  console.log(`baseline: ${baseline.source}`);
}
