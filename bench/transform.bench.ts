// Speed of the packed Möbius transform beside two baselines measured in the same run:
// a naive butterfly with one value per byte, and a memory floor of n plain copies of a buffer
// as large as the packed set (the transform cannot beat touching its data n times by much).
import { mobiusInPlace } from '../src/logic/mobius.js';

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

/** Signed views, as in the transform: uint32 values above 2^31 would go through doubles. */
function copyWords(dst: Int32Array, src: Int32Array): void {
  for (let i = 0; i < src.length; i++) dst[i] = src[i]!;
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[s.length >> 1]!;
}

/** Median milliseconds of `reps` calls of `work`, each after `prepare`. */
function timeMs(reps: number, prepare: () => void, work: () => void): number {
  const times: number[] = [];
  for (let r = 0; r < reps; r++) {
    prepare();
    const t0 = performance.now();
    work();
    times.push(performance.now() - t0);
  }
  return median(times);
}

function fmt(ms: number): string {
  return ms < 10 ? ms.toFixed(3) : ms.toFixed(1);
}

export async function run(): Promise<void> {
  // Warm the JIT on every code path before timing.
  for (let n = 1; n <= 18; n++) {
    const w = randomWords(Math.max(1, 1 << (n - 5)), n);
    if (n < 5) w[0] = w[0]! & ((1 << (1 << n)) - 1);
    for (let r = 0; r < 5; r++) mobiusInPlace(w, n);
  }
  naiveMobiusBytes(new Uint8Array(1 << 16));

  const rows: string[][] = [
    ['n', 'words', 'ours ms', 'loop floor', 'ours/loop', 'set floor', 'ours/set', 'naive ms', 'naive/ours'],
  ];
  for (const n of [16, 20, 24, 26]) {
    const count = 1 << (n - 5);
    const reps = n >= 26 ? 5 : n >= 24 ? 7 : 21;
    const source = randomWords(count, n);
    const work = new Uint32Array(count);
    const ours = timeMs(reps, () => work.set(source), () => mobiusInPlace(work, n));

    // Memory floors: n full copies of a buffer of 2^n/8 bytes, by a JS word loop (what any JS
    // transform must at least do) and by the engine's native copy (`set`, SIMD memcpy).
    const dst = new Uint32Array(count);
    const [dstI, workI, sourceI] = [dst, work, source].map((a) => new Int32Array(a.buffer));
    const loopFloor = timeMs(reps, () => undefined, () => {
      for (let pass = 0; pass < n; pass++) copyWords(dstI!, pass & 1 ? workI! : sourceI!);
    });
    const setFloor = timeMs(reps, () => undefined, () => {
      for (let pass = 0; pass < n; pass++) dst.set(pass & 1 ? work : source);
    });

    const bytes = new Uint8Array(1 << n);
    const fillBytes = (): void => {
      for (let k = 0; k < bytes.length; k++) bytes[k] = (source[k >>> 5]! >>> (k & 31)) & 1;
    };
    const naive = timeMs(n >= 26 ? 1 : 3, fillBytes, () => naiveMobiusBytes(bytes));

    rows.push([
      String(n),
      String(count),
      fmt(ours),
      fmt(loopFloor),
      (ours / loopFloor).toFixed(2),
      fmt(setFloor),
      (ours / setFloor).toFixed(2),
      fmt(naive),
      (naive / ours).toFixed(1),
    ]);
  }
  const widths = rows[0]!.map((_, c) => Math.max(...rows.map((r) => r[c]!.length)));
  for (const r of rows) console.log(r.map((cell, c) => cell.padStart(widths[c]!)).join('  '));
  console.log('times: median ms; targets: ours/floor <= 1.5 at n = 24 and 26, naive/ours >= 40');
}
