// Minimal AND/OR forms: time and share proven within the default budget on random functions
// with 10 % don't-cares, beside sympy's SOPform on the same 6- and 8-input functions (run once
// in python3 through scripts/sympy_reference.py --time, timed inside Python).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { add, emptySet, members } from '../src/logic/bits.js';
import type { BoolFunction } from '../src/logic/boolfn.js';
import { now } from '../src/logic/deadline.js';
import { DEFAULT_BUDGET_MS, minimiseSop, type SopForm } from '../src/logic/sop.js';

/** Seeded random functions: each combination don't-care 10 %, else on or off evenly. */
function randomFunctions(n: number, count: number, seed: number): BoolFunction[] {
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
  const plan: [number, number][] = [[6, 20], [8, 20], [10, 20], [12, 8]];
  console.log(`budget ${DEFAULT_BUDGET_MS} ms per function; random functions, 10 % don't-cares, the rest on or off evenly`);
  for (const [n, count] of plan) {
    const fns = randomFunctions(n, count, 1000 + n);
    const times: number[] = [];
    const forms: SopForm[] = [];
    for (const f of fns) {
      const t0 = now();
      forms.push(minimiseSop(f));
      times.push(now() - t0);
    }
    const proven = forms.filter((f) => f.proven).length;
    let line = `${n} inputs: ${count} functions, median ${median(times).toFixed(1)} ms, proven ${proven}/${count} (${Math.round((100 * proven) / count)} %), median terms ${median(forms.map((f) => f.terms))}`;
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
