// Wide tables: the bit-set engine and the symbolic (BDD) engine on the same structured tables
// at 16, 20 and 24 inputs, then the symbolic engine alone at 32-64 inputs. Whole analysis
// (reading the grid included); seeds fixed. Each case runs alone in a fresh process
// (bench/wide-case.ts): an earlier case's heap would otherwise stay in the RSS, and a timer
// cannot sample inside the synchronous analysis; the child reads its own high-water mark instead.
// Beside each symbolic figure: the same table through the baseline commit's engine in the same
// run (its `src` taken from git into a temporary folder; bench/wide-baseline.json names the
// commit and holds its figures from an earlier run, printed instead when git cannot give it).
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { CellValue } from '../src/table/types.js';
import { maxOf, minOf } from '../src/logic/arrays.js';
import { inputBit, wideDisjoint, type WideCube } from '../src/logic/wide-cube.js';
import { wideRowCube } from '../src/table/read-wide.js';
import type { CaseFigure, CaseRequest, Modules } from './wide-case.js';

interface Baseline {
  readonly commit: string;
  /** Where that commit keeps the three modules the bench calls. */
  readonly modules: Modules;
  readonly source: string;
  /** Per table label: the symbolic engine's figure in an earlier run. */
  readonly symbolic: Record<string, string>;
}

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const baseline = JSON.parse(readFileSync(join(ROOT, 'bench/wide-baseline.json'), 'utf8')) as Baseline;

/** A source tree of the engine: where it is and where it keeps the modules the bench calls. */
interface Tree {
  readonly root: string;
  readonly modules: Modules;
}

const current: Tree = {
  root: ROOT,
  modules: { readSpecTables: 'src/table/read-tables.ts', analyseTable: 'src/analysis/analyse.ts', analysisJson: 'src/report/analysis-json.ts' },
};

/** The baseline commit's sources in a temporary folder, or why there are none. */
function baselineEngine(): { tree: Tree; dispose: () => void } | string {
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
  return { tree: { root: dir, modules: baseline.modules }, dispose };
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

/** One case in a fresh process: its figure, or why the process gave none. */
function measured(request: CaseRequest): CaseFigure | string {
  const child = spawnSync(process.execPath, ['--expose-gc', '--import', 'tsx', join(ROOT, 'bench/wide-case.ts'), JSON.stringify(request)], {
    cwd: ROOT,
    encoding: 'utf8',
    maxBuffer: 1 << 24,
  });
  const last = (text: string): string => text.trim().split('\n').at(-1) ?? '';
  if (child.status === 0) return JSON.parse(last(child.stdout)) as CaseFigure;
  return `process failed (${child.error?.message ?? (child.signal ?? `exit ${child.status}`)}: ${last(child.stderr)})`;
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

/** The symbolic engine's targets (issue 11): whole analysis of a table, and peak memory of every case. */
const TARGET_MS: Record<string, number> = {
  [permitLabel(24)]: 1000,
  [CONSISTENT]: 2000,
  [CONTRADICTORY]: 2000,
};
const TARGET_PEAK_MB = 300;

function permitLabel(n: number): string {
  return `${n} inputs, 8 ON rows of 8 literals + 2 OFF rows`;
}

const target = (value: number, limit: number | undefined, unit: string): string =>
  limit === undefined ? '' : ` [<= ${limit} ${unit}${value <= limit ? '' : ', over'}]`;

function figure(f: CaseFigure | string, limitMs?: number, limitMb?: number): string {
  if (typeof f === 'string') return f;
  const peak = `peak ${f.peakMb.toFixed(0)} MB${target(f.peakMb, limitMb, 'MB')}${f.ownPeak ? '' : ' with the warm-up'}`;
  return `${f.ms.toFixed(0)} ms${target(f.ms, limitMs, 'ms')} (${peak}; ${f.summary})`;
}

/** Of two runs of one case: the faster time, and the larger peak (a peak is not lowered by choosing a run). */
function better(a: CaseFigure | string, b: CaseFigure | string): CaseFigure | string {
  if (typeof a === 'string') return a;
  if (typeof b === 'string') return b;
  return { ...(a.ms <= b.ms ? a : b), peakMb: Math.max(a.peakMb, b.peakMb), ownPeak: a.ownPeak && b.ownPeak };
}

export async function run(): Promise<void> {
  console.log(`whole analysis (read, forms, proofs, JSON), each case alone in a fresh process; peak = that process's largest RSS during the case; [targets]`);
  const base = baselineEngine();
  const dir = mkdtempSync(join(tmpdir(), 'wide-bench-'));
  let files = 0;
  const tableFile = (cells: CellValue[][]): string => {
    const path = join(dir, `table-${files++}.json`);
    writeFileSync(path, JSON.stringify(cells));
    return path;
  };
  const warm = tableFile(permitTable(16, 1));
  const floors: number[] = [];
  const one = (cells: string, engine: CaseRequest['engine'], tree: Tree = current): CaseFigure | string => {
    const f = measured({ ...tree, engine, cells, warm });
    if (typeof f !== 'string') floors.push(f.floorMb);
    return f;
  };
  // Symbolic runs, ours then the baseline's, twice, the faster of each: the shared machine's
  // load changes from one second to the next.
  const symbolicRuns = (label: string, cells: string): { ours: string; before: string } => {
    if (typeof base === 'string') {
      return { ours: figure(one(cells, 'symbolic'), TARGET_MS[label], TARGET_PEAK_MB), before: `; baseline (earlier run) ${baseline.symbolic[label] ?? 'not measured'}` };
    }
    const [a, b, c, d] = [one(cells, 'symbolic'), one(cells, 'symbolic', base.tree), one(cells, 'symbolic'), one(cells, 'symbolic', base.tree)];
    return { ours: figure(better(a, c), TARGET_MS[label], TARGET_PEAK_MB), before: `; baseline ${figure(better(b, d))}` };
  };
  try {
    for (const n of [16, 20, 24]) {
      const cells = tableFile(permitTable(n, 1000 + n));
      const label = permitLabel(n);
      const runs = symbolicRuns(label, cells);
      console.log(`${label}: bit-set ${figure(one(cells, 'bit-set'))}, symbolic ${runs.ours}${runs.before}`);
    }
    const wide: [string, CellValue[][]][] = [
      [permitLabel(32), permitTable(32, 1032)],
      [permitLabel(48), permitTable(48, 1048)],
      ['40-cause OR trip', orTripTable(40)],
      ['40-condition AND permissive', andPermitTable(40)],
      [CONSISTENT, consistentRowsTable(64, 300, 64300)],
      [CONTRADICTORY, randomRowsTable(64, 300, 64300)],
    ];
    for (const [what, cells] of wide) {
      const runs = symbolicRuns(what, tableFile(cells));
      const rows = what === CONTRADICTORY || what === CONSISTENT ? ` (${conflictingPairs(cells)})` : '';
      console.log(`${what}: symbolic ${runs.ours}${rows}${runs.before}`);
    }
    if (typeof base === 'string') console.log(`baseline: ${baseline.source}; not run now: ${base}`);
    else console.log(`baseline: commit ${baseline.commit}, symbolic engine, each run in its own process too; each symbolic figure and its baseline the faster of two alternating runs, with the larger peak of the two`);
    if (floors.length > 0) console.log(`a fresh process held ${minOf(floors).toFixed(0)}-${maxOf(floors).toFixed(0)} MB before its case (node, tsx, the engine's modules, the table, after a warm-up run at 16 inputs)`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
    if (typeof base !== 'string') base.dispose();
  }
}
