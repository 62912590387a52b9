// Speed of the packed Möbius transform beside baselines measured in the same run: a naive
// butterfly with one value per byte, and memory floors of n plain copies of a buffer as large
// as the packed set. The native copy (`set`) is the true floor; the JS word loop shows what one
// plain pass per level costs in JS. `ours` is the public `mobiusInPlace` (the WebAssembly SIMD
// kernel where available, copies in and out included); `js` is the JS path alone.
import { mobiusInPlace, mobiusInPlaceJs, mobiusKernelAvailable } from '../src/logic/mobius.js';

/**
 * The textbook butterfly, one value (0 or 1) per byte, one level per sweep. Also the reference
 * the packed transform is tested against.
 */
export function naiveMobiusBytes(values: Uint8Array): void {
  const size = values.length;
  for (let h = 1; h < size; h <<= 1) {
    for (let base = 0; base < size; base += 2 * h) {
      for (let t = base; t < base + h; t++) values[t + h] ^= values[t]!;
    }
  }
}

/** One byte per combination (0 or 1), for the naive butterfly. */
export function toBytes(values: Uint32Array, n: number): Uint8Array {
  const bytes = new Uint8Array(1 << n);
  for (let k = 0; k < bytes.length; k++) bytes[k] = (values[k >>> 5]! >>> (k & 31)) & 1;
  return bytes;
}

/** The naive transform of packed values, packed back into words (the tests' reference). */
export function naiveMobius(values: Uint32Array, n: number): Uint32Array {
  const bytes = toBytes(values, n);
  naiveMobiusBytes(bytes);
  const words = new Uint32Array(Math.ceil(bytes.length / 32));
  for (let k = 0; k < bytes.length; k++) words[k >>> 5]! |= bytes[k]! << (k & 31);
  return words;
}

/** Deterministic pseudo-random words (xorshift32), so runs compare. */
function randomWords(count: number, seed: number): Uint32Array {
  const out = new Uint32Array(count);
  let s = seed | 0 || 1;
  for (let i = 0; i < count; i++) {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    out[i] = s;
  }
  return out;
}

/**
 * A JS word-loop copy written as our sweeps are: signed views (uint32 values above 2^31 would go
 * through doubles) and 8 words per iteration (V8 checks each array once per iteration).
 */
function copyWords(dst: Int32Array, src: Int32Array): void {
  for (let i = 0; i < src.length; i += 8) {
    dst[i] = src[i]!;
    dst[i + 1] = src[i + 1]!;
    dst[i + 2] = src[i + 2]!;
    dst[i + 3] = src[i + 3]!;
    dst[i + 4] = src[i + 4]!;
    dst[i + 5] = src[i + 5]!;
    dst[i + 6] = src[i + 6]!;
    dst[i + 7] = src[i + 7]!;
  }
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1]!;
}

interface Task {
  prepare?: () => void;
  work: () => void;
}

/**
 * Median milliseconds of each task over `rounds` rounds. The tasks take turns within a round,
 * so a busy machine slows all of them alike and their ratios hold.
 */
function timeRounds(rounds: number, tasks: Task[]): number[] {
  const times: number[][] = tasks.map(() => []);
  for (let r = 0; r < rounds; r++) {
    tasks.forEach((task, i) => {
      task.prepare?.();
      const t0 = performance.now();
      task.work();
      times[i]!.push(performance.now() - t0);
    });
  }
  return times.map(median);
}

function fmt(ms: number): string {
  return ms < 10 ? ms.toFixed(3) : ms.toFixed(1);
}

export async function run(): Promise<void> {
  // Warm the JIT on every code path before timing.
  for (let n = 1; n <= 18; n++) {
    const w = randomWords(Math.max(1, 1 << (n - 5)), n);
    if (n < 5) w[0] = w[0]! & ((1 << (1 << n)) - 1);
    for (let r = 0; r < 5; r++) {
      mobiusInPlace(w, n);
      mobiusInPlaceJs(w, n);
    }
  }
  naiveMobiusBytes(new Uint8Array(1 << 16));
  const warm = new Int32Array(1 << 12);
  for (let r = 0; r < 200; r++) copyWords(warm, warm);

  const rows: string[][] = [
    ['n', 'words', 'ours ms', 'js ms', 'js/ours', 'loop floor', 'set floor', 'ours/set', 'js/set', 'naive ms', 'naive/ours'],
  ];
  for (const n of [16, 20, 24, 26]) {
    const count = 1 << (n - 5);
    const rounds = n >= 26 ? 7 : n >= 24 ? 9 : 21;
    const source = randomWords(count, n);
    const work = new Uint32Array(count);
    // Memory floors: n full copies of a buffer of 2^n/8 bytes, by a JS word loop and by the
    // engine's native copy (`set`, a SIMD memcpy).
    const dst = new Uint32Array(count);
    const [dstI, workI, sourceI] = [dst, work, source].map((a) => new Int32Array(a.buffer));
    const [ours, js, loopFloor, setFloor] = timeRounds(rounds, [
      { prepare: () => work.set(source), work: () => mobiusInPlace(work, n) },
      { prepare: () => work.set(source), work: () => mobiusInPlaceJs(work, n) },
      { work: () => { for (let pass = 0; pass < n; pass++) copyWords(dstI!, pass & 1 ? workI! : sourceI!); } },
      { work: () => { for (let pass = 0; pass < n; pass++) dst.set(pass & 1 ? work : source); } },
    ]) as [number, number, number, number];

    let bytes: Uint8Array = new Uint8Array(0);
    const [naive] = timeRounds(n >= 26 ? 1 : 3, [
      { prepare: () => (bytes = toBytes(source, n)), work: () => naiveMobiusBytes(bytes) },
    ]) as [number];

    rows.push([
      String(n),
      String(count),
      fmt(ours),
      fmt(js),
      (js / ours).toFixed(2),
      fmt(loopFloor),
      fmt(setFloor),
      (ours / setFloor).toFixed(2),
      (js / setFloor).toFixed(2),
      fmt(naive),
      (naive / ours).toFixed(1),
    ]);
  }
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  for (const r of rows) console.log(r.map((cell, c) => cell.padStart(widths[c]!)).join('  '));
  console.log(`median ms, tasks taking turns; ours ${mobiusKernelAvailable() ? 'through the WebAssembly SIMD kernel' : 'on the JS path (no WebAssembly SIMD)'}`);
  console.log('targets: ours/set <= 1.5 at n = 24 and 26, naive/ours >= 40');
}
