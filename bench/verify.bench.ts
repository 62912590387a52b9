// Speed of the implementation check on a 16-input output: reading an ST program that holds a
// random AND/OR form and verifying it on all 65,536 combinations, beside the baseline of
// only building the spec's function from its rows (measured in the same run).
import { buildFunction, type TableRow } from '../src/logic/boolfn.js';
import { cube, cubeContains, type Cube } from '../src/logic/cube.js';
import { readImplementation } from '../src/impl/read.js';
import { verifyImplementation } from '../src/impl/verify.js';
import type { SpecRow, SpecTable } from '../src/table/types.js';

const N = 16;
const TERMS = 24;

/** Deterministic pseudo-random numbers (xorshift32), so runs compare. */
function random(seed: number): () => number {
  let s = seed | 0 || 1;
  return () => {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    return (s >>> 0) / 2 ** 32;
  };
}

function randomForm(next: () => number): Cube[] {
  return Array.from({ length: TERMS }, () => {
    let mask = 0;
    while (mask === 0 || mask.toString(2).replace(/0/g, '').length < 4) mask |= 1 << Math.floor(next() * N);
    return cube(mask, Math.floor(next() * 2 ** N));
  });
}

const names = Array.from({ length: N }, (_, i) => `In_${i + 1}`);

function stProgram(terms: readonly Cube[]): string {
  const literal = (c: Cube, i: number): string => ((c.bits >>> (N - 1 - i)) & 1 ? names[i]! : `NOT ${names[i]}`);
  const products = terms.map((c) => `(${names.map((_, i) => i).filter((i) => (c.mask >>> (N - 1 - i)) & 1).map((i) => literal(c, i)).join(' AND ')})`);
  return `PROGRAM Bench\nVAR_INPUT ${names.join(', ')} : BOOL; END_VAR\nVAR_OUTPUT Q : BOOL; END_VAR\nQ := ${products.join('\n  OR ')};\nEND_PROGRAM\n`;
}

/** One spec row per combination, as a fully written 16-input table would have. */
function specRows(terms: readonly Cube[]): TableRow[] {
  const full = (1 << N) - 1;
  return Array.from({ length: 1 << N }, (_, k) => ({ cube: cube(full, k), value: terms.some((c) => cubeContains(c, k)) ? 1 : 0 }));
}

function specTable(rows: readonly TableRow[]): SpecTable {
  const built = buildFunction(N, rows, 0);
  if (!built.ok) throw new Error(built.error.message);
  const specRows: SpecRow[] = rows.map((r, k) => ({ cells: `A${k + 3}:Q${k + 3}`, inputCells: [], outputCells: [`Q${k + 3}`], cube: r.cube, values: [r.value] }));
  return {
    sheet: 'Bench',
    range: `A1:Q${rows.length + 2}`,
    inputs: names.map((n) => ({ header: n, identifier: n })),
    outputs: [{ signal: { header: 'Q', identifier: 'Q' }, safe: 0, built: built.value }],
    rows: specRows,
    roleRule: 'role-row',
    xReading: 'none',
    headerCells: [],
    problems: [],
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1]!;
}

function time(runs: number, f: () => void): number {
  const ms: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    ms.push(performance.now() - t0);
  }
  return median(ms);
}

export async function run(): Promise<void> {
  const terms = randomForm(random(2026));
  const rows = specRows(terms);
  const table = specTable(rows);
  const right = stProgram(terms);
  const wrong = stProgram(terms.slice(1));
  const verify = (text: string): string => {
    const impl = readImplementation('bench.st', text);
    if (!impl.ok) throw new Error(impl.error.message);
    return verifyImplementation([table], impl.value).outputs[0]!.status;
  };
  if (verify(right) !== 'equal' || verify(wrong) !== 'differs') throw new Error('bench: unexpected verdicts');
  const runs = 7;
  const baseline = time(runs, () => buildFunction(N, rows, 0));
  const readOnly = time(runs, () => readImplementation('bench.st', right));
  const equal = time(runs, () => verify(right));
  const differs = time(runs, () => verify(wrong));
  console.log(`16 inputs, ${TERMS} product terms, ${rows.length} spec rows; median of ${runs} runs`);
  console.log(`  baseline: build the spec function from its rows   ${baseline.toFixed(1)} ms`);
  console.log(`  read the ST program only                          ${readOnly.toFixed(1)} ms`);
  console.log(`  read + verify, equal                              ${equal.toFixed(1)} ms  (${(equal / baseline).toFixed(2)}x baseline)`);
  console.log(`  read + verify, differs (counterexamples, ANF)     ${differs.toFixed(1)} ms  (${(differs / baseline).toFixed(2)}x baseline)`);
}
