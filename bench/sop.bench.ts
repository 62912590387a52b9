// Minimal AND/OR forms: time and share proven within the default budget on random functions
// with 10 % don't-cares and on tables of cube rows, beside sympy's SOPform on the same 6- and
// 8-input functions (run once in python3 through scripts/sympy_reference.py --time, timed
// inside Python). For every form not proven: its lower bound beside its cost, and per group the
// median gap between them. Baseline for the share proven and the gap: the heuristic cover with
// the bound of rows sharing no prime (a maximal independent set of rows: each needs a term of
// its own, at its cheapest prime's literals).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { add, emptySet, members, popcount } from '../src/logic/bits.js';
import type { BoolFunction } from '../src/logic/boolfn.js';
import { cube, cubeToSet, type Cube } from '../src/logic/cube.js';
import { coverCost, type CoverProblem } from '../src/logic/cover.js';
import { heuristicCover } from '../src/logic/heuristic.js';
import { primeImplicants, setToCubes } from '../src/logic/primes.js';
import { now } from '../src/logic/deadline.js';
import { coverProblem, DEFAULT_BUDGET_MS, minimiseSop, type SopForm } from '../src/logic/sop.js';

/** Seeded random functions: each combination don't-care 10 %, else on or off evenly. */
export function randomFunctions(n: number, count: number, seed: number): BoolFunction[] {
  let state = seed >>> 0;
  const next = (): number => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
  return Array.from({ length: count }, () => {
    const f = { n, on: emptySet(n), dc: emptySet(n) };
    for (let k = 0; k < 1 << n; k++) {
      const r = next();
      if (r < 0.1) add(f.dc, k);
      else if (r < 0.55) add(f.on, k);
    }
    return f;
  });
}

/**
 * A table of cube rows as an interlock spec has: `rows` rows of 3-7 fixed inputs, each on or
 * off (a row meeting an on row is made off only where it does not: off rows are painted
 * first, on rows take the rest), 10 % of rows don't-care; combinations no row names are off.
 */
export function cubeTables(n: number, count: number, rows: number, seed: number): BoolFunction[] {
  let state = seed >>> 0;
  const next = (): number => (state = (Math.imul(state, 1664525) + 1013904223) >>> 0) / 2 ** 32;
  const rowCube = (): Cube => {
    let mask = 0;
    let bits = 0;
    const fixed = 3 + Math.floor(next() * 5);
    while (popcount(mask) < fixed) {
      const bit = 1 << Math.floor(next() * n);
      mask |= bit;
      if (next() < 0.5) bits |= bit;
    }
    return cube(mask, bits);
  };
  return Array.from({ length: count }, () => {
    const f = { n, on: emptySet(n), dc: emptySet(n) };
    const off = emptySet(n);
    const kinds = Array.from({ length: rows }, () => next());
    const cubes = kinds.map(() => rowCube());
    cubes.forEach((c, i) => kinds[i]! >= 0.55 && cubeToSet(n, c, off));
    const on = emptySet(n);
    const dc = emptySet(n);
    cubes.forEach((c, i) => (kinds[i]! < 0.1 ? cubeToSet(n, c, dc) : kinds[i]! < 0.55 && cubeToSet(n, c, on)));
    for (let w = 0; w < on.length; w++) {
      f.on[w] = on[w]! & ~off[w]!;
      f.dc[w] = dc[w]! & ~off[w]! & ~f.on[w]!;
    }
    return f;
  });
}

/** The baseline: heuristic cover and independent-row bound (proven when they meet), and the gap. */
function baseline(f: BoolFunction): { proven: boolean; gap: Gap } {
  const primes = primeImplicants(f);
  const problem = coverProblem(setToCubes(f.n, f.on), primes)!;
  const cover = heuristicCover(problem);
  const bound = independentRowBound(problem);
  const gap = { terms: cover.length - bound.terms, literals: coverCost(problem, cover) - bound.literals };
  return { proven: gap.terms === 0 && gap.literals === 0, gap };
}

/** Cost less lower bound: what is left to prove. */
interface Gap {
  terms: number;
  literals: number;
}

const medianGap = (gaps: Gap[]): string => `${median(gaps.map((g) => g.terms))}/${median(gaps.map((g) => g.literals))}`;

function independentRowBound(problem: CoverProblem): { terms: number; literals: number } {
  const used = new Uint8Array(problem.costs.length);
  let terms = 0;
  let literals = 0;
  for (const row of [...problem.rows].sort((a, b) => a.length - b.length)) {
    if (row.some((c) => used[c])) continue;
    row.forEach((c) => (used[c] = 1));
    terms++;
    literals += Math.min(...row.map((c) => problem.costs[c]!));
  }
  return { terms, literals };
}

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[xs.length >> 1]!;

interface SympyRun {
  source: string;
  results: { ms: number; terms: number; literals: number }[];
}

function sympyTimes(fns: BoolFunction[]): SympyRun | string {
  const input = JSON.stringify(fns.map((f) => ({ n: f.n, on: members(f.on), dc: members(f.dc) })));
  const run = spawnSync(existsSync('/usr/bin/python3') ? '/usr/bin/python3' : 'python3', ['scripts/sympy_reference.py', '--time'], { input, encoding: 'utf8', maxBuffer: 1 << 26 });
  if (run.error || run.status !== 0) return `sympy not available: python3 cannot run SOPform (${(run.error?.message ?? run.stderr).trim().split('\n').pop()})`;
  return JSON.parse(run.stdout) as SympyRun;
}

export async function run(): Promise<void> {
  const plan: [string, number, BoolFunction[]][] = [
    ...([[6, 20], [8, 20], [10, 20], [12, 8]] as const).map(([n, count]) => [`${n} inputs random`, n, randomFunctions(n, count, 1000 + n)] as [string, number, BoolFunction[]]),
    ...([[12, 8, 40], [14, 8, 40], [16, 8, 40]] as const).map(([n, count, rows]) => [`${n} inputs, ${rows} cube rows`, n, cubeTables(n, count, rows, 2000 + n)] as [string, number, BoolFunction[]]),
  ];
  console.log(`budget ${DEFAULT_BUDGET_MS} ms per function; random functions: 10 % don't-cares, the rest on or off evenly; cube rows: see cubeTables`);
  for (const [label, n, fns] of plan) {
    const count = fns.length;
    const times: number[] = [];
    const forms: SopForm[] = [];
    for (const f of fns) {
      const t0 = now();
      forms.push(minimiseSop(f));
      times.push(now() - t0);
    }
    const proven = forms.filter((f) => f.proven).length;
    const share = (k: number): string => `${k}/${count} (${Math.round((100 * k) / count)} %)`;
    let line = `${label}: ${count} functions, median ${median(times).toFixed(1)} ms, proven ${share(proven)}, median terms ${median(forms.map((f) => f.terms))}`;
    const gaps = forms.map((f) => ({ terms: f.terms - f.lowerBound.terms, literals: f.literals - f.lowerBound.literals }));
    line += `\n   median gap cost - lower bound (terms/literals): ${medianGap(gaps)}`;
    // The baseline needs every prime and the whole matrix: only where they come quickly.
    if (n <= 12 || label.includes('rows')) {
      const base = fns.map(baseline);
      line += `; baseline (heuristic + independent rows): ${medianGap(base.map((b) => b.gap))}, proven ${share(base.filter((b) => b.proven).length)}`;
    }
    const open = forms.filter((f) => !f.proven).map((f) => `${f.terms}/${f.literals} >= ${f.lowerBound.terms}/${f.lowerBound.literals}`);
    if (open.length > 0) line += `\n   not proven, cost >= lower bound (terms/literals): ${open.join(', ')}`;
    if (n <= 8) {
      const sympy = sympyTimes(fns);
      if (typeof sympy === 'string') line += `\n   ${sympy}`;
      else {
        const worse = forms.filter((f, i) => {
          const s = sympy.results[i]!;
          return f.terms > s.terms || (f.terms === s.terms && f.literals > s.literals);
        }).length;
        const better = forms.filter((f, i) => {
          const s = sympy.results[i]!;
          return f.terms < s.terms || (f.terms === s.terms && f.literals < s.literals);
        }).length;
        const theirs = median(sympy.results.map((r) => r.ms));
        // Also once the engine's code is compiled (four more passes over the same functions),
        // as it is from the second output of a table on.
        const warm: number[] = [];
        for (let pass = 0; pass < 4; pass++)
          for (const f of fns) {
            const t0 = now();
            minimiseSop(f);
            warm.push(now() - t0);
          }
        line += `\n   ${sympy.source} SOPform: median ${theirs.toFixed(1)} ms, ratio sympy/ours ${(theirs / median(times)).toFixed(0)} (first pass), ${(theirs / median(warm)).toFixed(0)} (later passes, median ${median(warm).toFixed(2)} ms); ours worse in ${worse}, better in ${better} of ${count}`;
      }
    }
    console.log(line);
  }
}
