// Wide tables: the bit-set engine and the symbolic (BDD) engine on the same structured tables
// at 16, 20 and 24 inputs, then the symbolic engine alone at 32-64 inputs. Whole analysis
// in-process (reading the grid included); seeds fixed. Peak memory is the largest RSS sampled
// during the run (the process's, so it includes what earlier runs left behind; the 5 ms timer
// cannot fire inside the synchronous analysis, so in effect it is the RSS at the run's end).
// Beside each symbolic figure: the same table through the baseline commit's engine in the same
// run (its `src` taken from git into a temporary folder; bench/wide-baseline.json names the
// commit and holds its figures from an earlier run, printed instead when git cannot give it).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, symlinkSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { CellValue } from '../src/table/types.js';
import { analyseTable } from '../src/analysis/analyse.js';
import { analysisJson } from '../src/report/analysis-json.js';
import type { TableAnalysis } from '../src/analysis/analysis-types.js';
import { readSpecTables } from '../src/table/read-tables.js';
import { now } from '../src/logic/deadline.js';
import { inputBit, wideDisjoint, type WideCube } from '../src/logic/wide-cube.js';
import { wideRowCube } from '../src/table/read-wide.js';

interface Baseline {
  readonly commit: string;
  /** Where that commit keeps the three modules the bench calls. */
  readonly modules: { readonly readSpecTables: string; readonly analyseTable: string; readonly analysisJson: string };
  readonly source: string;
  /** Per table label: the symbolic engine's figure in an earlier run. */
  readonly symbolic: Record<string, string>;
}

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const baseline = JSON.parse(readFileSync(join(ROOT, 'bench/wide-baseline.json'), 'utf8')) as Baseline;

/** The three calls the bench makes, from one tree of the sources. */
interface Engine {
  readonly readSpecTables: typeof readSpecTables;
  readonly analyseTable: typeof analyseTable;
  readonly analysisJson: typeof analysisJson;
}

const current: Engine = { readSpecTables, analyseTable, analysisJson };

/** The baseline commit's engine, or why there is none. */
async function baselineEngine(): Promise<{ engine: Engine; dispose: () => void } | string> {
  const archive = spawnSync('git', ['archive', baseline.commit, 'src'], { cwd: ROOT, maxBuffer: 1 << 28 });
  if (archive.error || archive.status !== 0) return `git cannot give commit ${baseline.commit} (${(archive.error?.message ?? archive.stderr.toString()).trim()})`;
  const dir = mkdtempSync(join(tmpdir(), 'wide-baseline-'));
  const dispose = (): void => rmSync(dir, { recursive: true, force: true });
  const untar = spawnSync('tar', ['-x', '-C', dir], { input: archive.stdout });
  if (untar.error || untar.status !== 0) {
    dispose();
    return 'tar cannot unpack the baseline sources';
  }
  symlinkSync(join(ROOT, 'node_modules'), join(dir, 'node_modules'));
  const load = async <T>(path: string): Promise<T> => (await import(pathToFileURL(join(dir, path)).href)) as T;
  const engine: Engine = {
    readSpecTables: (await load<Engine>(baseline.modules.readSpecTables)).readSpecTables,
    analyseTable: (await load<Engine>(baseline.modules.analyseTable)).analyseTable,
    analysisJson: (await load<Engine>(baseline.modules.analysisJson)).analysisJson,
  };
  return { engine, dispose };
}

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

/** One row's input cells: 3-10 literals on random inputs at random values, the rest '-'. */
function randomRow(n: number, next: () => number): CellValue[] {
  const row: CellValue[] = Array.from({ length: n }, () => '-');
  const want = 3 + Math.floor(next() * 8);
  for (let literals = 0; literals < want; ) {
    const i = Math.floor(next() * n);
    if (row[i] !== '-') continue;
    row[i] = next() < 0.5 ? 1 : 0;
    literals++;
  }
  return row;
}

/** A stress table: `count` rows of 3-10 random literals, output 1 or 0 evenly, drawn with no regard to each other (most ON rows overlap OFF rows). */
export function randomRowsTable(n: number, count: number, seed: number): CellValue[][] {
  const next = random(seed);
  const names = inputNames(n, 'Sig');
  const rows: CellValue[][] = [];
  for (let k = 0; k < count; k++) rows.push([...randomRow(n, next), next() < 0.5 ? 1 : 0]);
  return sheet(names, rows, 'Enable');
}

/**
 * Robot-cell interlocks as an engineer writes them: `count` rows of 3-10 random literals, output
 * 1 or 0 evenly, and no ON row overlapping an OFF row. Plain rejection of random rows cannot
 * reach 300 (a random row is disjoint from another with chance ~0.4, so from 150 of them almost
 * never); instead each drawn row is repaired: while it overlaps rows of the other value,
 * add the literal (an input the row leaves open, at the value opposite to theirs) that
 * contradicts most of them; a row that would need more than 10 literals is rejected.
 */
export function consistentRowsTable(n: number, count: number, seed: number): CellValue[][] {
  const next = random(seed);
  const names = inputNames(n, 'Sig');
  const rows: CellValue[][] = [];
  const cubes: { cube: WideCube; on: boolean }[] = [];
  while (rows.length < count) {
    const row = randomRow(n, next);
    const on = next() < 0.5;
    for (let literals = row.filter((v) => v !== '-').length; ; literals++) {
      const cube = wideRowCube(row as (0 | 1 | '-')[]);
      const against = cubes.filter((c) => c.on !== on && !wideDisjoint(c.cube, cube)).map((c) => c.cube);
      if (against.length === 0) {
        rows.push([...row, on ? 1 : 0]);
        cubes.push({ cube, on });
        break;
      }
      if (literals === 10) break;
      let best = { i: -1, value: 0 as 0 | 1, hits: 0 };
      names.forEach((_, i) => {
        if (row[i] !== '-') return;
        const bit = inputBit(n, i);
        for (const value of [0, 1] as const) {
          const hits = against.filter((c) => (c.mask & bit) !== 0n && ((c.bits & bit) !== 0n) !== (value === 1)).length;
          if (hits > best.hits) best = { i, value, hits };
        }
      });
      if (best.i < 0) break;
      row[best.i] = best.value;
    }
  }
  return sheet(names, rows, 'Enable');
}

let peak = 0;
const sample = (): void => {
  peak = Math.max(peak, process.memoryUsage.rss());
};

interface Timed {
  readonly ms: number;
  readonly mb: number;
  readonly a: TableAnalysis;
}

function timed(cells: CellValue[][], engine: 'bit-set' | 'symbolic', code: Engine = current): Timed {
  peak = 0;
  const timer = setInterval(sample, 5);
  sample();
  const t0 = now();
  const read = code.readSpecTables({ sheet: 'Bench', origin: 'A1', cells });
  const table = read.tables[0]!;
  const a = code.analyseTable(table, { engine });
  JSON.stringify(code.analysisJson(a));
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

const CONSISTENT = '64 inputs x 300 rows of 3-10 literals, consistent';
/** A stress figure: rows drawn with no regard to each other, most ON/OFF pairs overlapping. */
const CONTRADICTORY = '64 inputs x 300 rows of 3-10 literals, self-contradictory';

export async function run(): Promise<void> {
  console.log('whole analysis in-process (read, forms, proofs, JSON); peak = largest RSS sampled');
  const base = await baselineEngine();
  // Symbolic runs, ours then the baseline's, twice, the faster of each: whichever runs first
  // after a large run pays for collecting it.
  const symbolicRuns = (label: string, cells: CellValue[][]): { ours: Timed; before: string } => {
    if (typeof base === 'string') return { ours: timed(cells, 'symbolic'), before: `; baseline (earlier run) ${baseline.symbolic[label] ?? 'not measured'}` };
    const [a, b, c, d] = [timed(cells, 'symbolic'), timed(cells, 'symbolic', base.engine), timed(cells, 'symbolic'), timed(cells, 'symbolic', base.engine)];
    const theirs = b.ms <= d.ms ? b : d;
    return { ours: a.ms <= c.ms ? a : c, before: `; baseline ${theirs.ms.toFixed(0)} ms (${summary(theirs.a)})` };
  };
  // Both engines' code compiled once before anything is timed.
  timed(permitTable(16, 1), 'symbolic');
  if (typeof base !== 'string') timed(permitTable(16, 1), 'symbolic', base.engine);
  for (const n of [16, 20, 24]) {
    const cells = permitTable(n, 1000 + n);
    const label = `${n} inputs, 8 ON rows of 8 literals + 2 OFF rows`;
    const runs = symbolicRuns(label, cells);
    const symbolic = runs.ours;
    const bitSet = timed(cells, 'bit-set');
    console.log(
      `${label}: bit-set ${bitSet.ms.toFixed(0)} ms (peak ${bitSet.mb.toFixed(0)} MB; ${summary(bitSet.a)}), ` +
        `symbolic ${symbolic.ms.toFixed(0)} ms (peak ${symbolic.mb.toFixed(0)} MB; ${summary(symbolic.a)})${runs.before}`,
    );
  }
  const wide: [string, CellValue[][]][] = [
    ['32 inputs, 8 ON rows of 8 literals + 2 OFF rows', permitTable(32, 1032)],
    ['48 inputs, 8 ON rows of 8 literals + 2 OFF rows', permitTable(48, 1048)],
    ['40-cause OR trip', orTripTable(40)],
    ['40-condition AND permissive', andPermitTable(40)],
    [CONSISTENT, consistentRowsTable(64, 300, 64300)],
    [CONTRADICTORY, randomRowsTable(64, 300, 64300)],
  ];
  for (const [what, cells] of wide) {
    const runs = symbolicRuns(what, cells);
    const r = runs.ours;
    const rows = what === CONTRADICTORY || what === CONSISTENT ? ` (${conflictingPairs(cells)})` : '';
    console.log(`${what}: symbolic ${r.ms.toFixed(0)} ms (peak ${r.mb.toFixed(0)} MB; ${summary(r.a)})${rows}${runs.before}`);
  }
  if (typeof base === 'string') console.log(`baseline: ${baseline.source}; not run now: ${base}`);
  else {
    console.log(`baseline: commit ${baseline.commit}, symbolic engine, in this process: each symbolic figure and its baseline the faster of two alternating runs`);
    base.dispose();
  }
}
