// The fast Boolean Möbius transform over GF(2) on packed combination sets (DESIGN.md section 2).
// Coefficient S = XOR of f(x) over all x whose 1-inputs are a subset of S; applied twice it
// gives back the input. Two implementations of the same levels: a WebAssembly SIMD kernel (its
// bytes made by scripts/make-mobius-wasm.ts) used where the engine allows it, and plain JS.
import { wordCount, type BitSet } from './bits.js';
import { MOBIUS_KERNEL_BASE64 } from './mobius-kernel.wasm.js';

/** Largest n the transform accepts: 2^26 combinations = 8 MiB of words. */
export const MAX_TRANSFORM_INPUTS = 26;

/**
 * Words taken through all their levels while they stay in cache (2^15 words = 128 KiB, inside
 * a 1 MiB L2); only the levels with a larger stride then sweep the whole array. With 3 levels
 * per sweep, 2^15 leaves 12 in-block levels after the first pass: no short sweep inside blocks.
 * Tuned with `npm run bench -- transform`.
 */
const BLOCK_WORDS = 1 << 15;

/** The five levels inside one word: combination bit j has stride 2^j bits. */
function inWord(x: number): number {
  x ^= (x & 0x55555555) << 1;
  x ^= (x & 0x33333333) << 2;
  x ^= (x & 0x0f0f0f0f) << 4;
  x ^= (x & 0x00ff00ff) << 8;
  return x ^ ((x & 0x0000ffff) << 16);
}

/** The first n < 5 levels inside word 0, so bits beyond 2^n stay zero. */
function inWordLow(x: number, n: number): number {
  const masks = [0x55555555, 0x33333333, 0x0f0f0f0f, 0x00ff00ff];
  for (let j = 0; j < n; j++) x ^= (x & masks[j]!) << (1 << j);
  return x;
}

/**
 * In-word levels of every word in [start, start+len) and, when len >= 8, the three smallest
 * cross-word levels (strides 1, 2, 4 words) in registers, so the block is read once for 8 levels.
 * Returns the smallest cross-word stride still to do.
 */
function firstPass(w: Int32Array, start: number, len: number): number {
  const end = start + len;
  if (len < 8) {
    for (let t = start; t < end; t++) w[t] = inWord(w[t]!);
    return 1;
  }
  for (let t = start; t < end; t += 8) {
    const x0 = inWord(w[t]!);
    let x1 = inWord(w[t + 1]!);
    let x2 = inWord(w[t + 2]!);
    let x3 = inWord(w[t + 3]!);
    let x4 = inWord(w[t + 4]!);
    let x5 = inWord(w[t + 5]!);
    let x6 = inWord(w[t + 6]!);
    let x7 = inWord(w[t + 7]!);
    x1 ^= x0; x3 ^= x2; x5 ^= x4; x7 ^= x6;
    x2 ^= x0; x3 ^= x1; x6 ^= x4; x7 ^= x5;
    w[t] = x0;
    w[t + 1] = x1;
    w[t + 2] = x2;
    w[t + 3] = x3;
    w[t + 4] = x4 ^ x0;
    w[t + 5] = x5 ^ x1;
    w[t + 6] = x6 ^ x2;
    w[t + 7] = x7 ^ x3;
  }
  return 8;
}

/** Three levels (strides h, 2h, 4h words) in one sweep over [start, end): radix 8. */
function sweep8(w: Int32Array, start: number, end: number, h: number): void {
  for (let base = start; base < end; base += 8 * h) {
    const stop = base + h;
    for (let t = base; t < stop; t++) {
      const i1 = t + h, i2 = i1 + h, i3 = i2 + h, i4 = i3 + h, i5 = i4 + h, i6 = i5 + h;
      const i7 = i6 + h;
      const x0 = w[t]!;
      let x1 = w[i1]!, x2 = w[i2]!, x3 = w[i3]!, x4 = w[i4]!, x5 = w[i5]!, x6 = w[i6]!;
      let x7 = w[i7]!;
      x1 ^= x0; x3 ^= x2; x5 ^= x4; x7 ^= x6;
      x2 ^= x0; x3 ^= x1; x6 ^= x4; x7 ^= x5;
      w[i1] = x1;
      w[i2] = x2;
      w[i3] = x3;
      w[i4] = x4 ^ x0;
      w[i5] = x5 ^ x1;
      w[i6] = x6 ^ x2;
      w[i7] = x7 ^ x3;
    }
  }
}

/** Two levels (strides h, 2h): of four blocks a, b, c, d the result is a, a^b, a^c, a^b^c^d. */
function sweep4(w: Int32Array, start: number, end: number, h: number): void {
  const h2 = 2 * h;
  const h3 = 3 * h;
  for (let base = start; base < end; base += 4 * h) {
    const stop = base + h;
    for (let t = base; t < stop; t++) {
      const a = w[t]!;
      const b = w[t + h]! ^ a;
      const c = w[t + h2]! ^ a;
      w[t + h] = b;
      w[t + h2] = c;
      w[t + h3] = w[t + h3]! ^ b ^ c ^ a;
    }
  }
}

/** One level (stride h). */
function sweep2(w: Int32Array, start: number, end: number, h: number): void {
  for (let base = start; base < end; base += 2 * h) {
    const stop = base + h;
    for (let t = base; t < stop; t++) w[t + h] = w[t + h]! ^ w[t]!;
  }
}

/** Levels of strides h, 2h, ... (3 for radix 8, 2 for 4, 1 for 2) over [start, end). */
type Sweep = (radix: 2 | 4 | 8, start: number, end: number, h: number) => void;

/**
 * Cross-word levels with strides h, 2h, ... < len on [start, start+len), three per sweep while
 * they last: each sweep reads and writes every word once, so fewer sweeps is less work (three
 * at a time measured faster than two; four spill registers). Units are the sweep's own (words
 * in JS, bytes in the kernel).
 */
function crossLevels(sweep: Sweep, start: number, len: number, h: number): void {
  const end = start + len;
  for (; 8 * h <= len; h *= 8) sweep(8, start, end, h);
  if (4 * h <= len) sweep(4, start, end, h);
  else if (2 * h <= len) sweep(2, start, end, h);
}

function checkArguments(words: Uint32Array, n: number): void {
  if (!Number.isInteger(n) || n < 1 || n > MAX_TRANSFORM_INPUTS || words.length < wordCount(n)) {
    throw new RangeError(`mobiusInPlace: n = ${n} with ${words.length} words`);
  }
}

/**
 * The transform in plain JS: the fallback where WebAssembly SIMD is missing or refused, the
 * path for small n, and the reference the kernel is tested against. Same contract as
 * `mobiusInPlace`.
 */
export function mobiusInPlaceJs(words: Uint32Array, n: number): void {
  checkArguments(words, n);
  if (n < 5) {
    words[0] = inWordLow(words[0]!, n);
    return;
  }
  // Signed view: V8 keeps int32 values in registers, while uint32 loads above 2^31 become doubles.
  const w = new Int32Array(words.buffer, words.byteOffset, wordCount(n));
  const sweep: Sweep = (radix, start, end, h) =>
    (radix === 8 ? sweep8 : radix === 4 ? sweep4 : sweep2)(w, start, end, h);
  const total = w.length;
  const block = Math.min(total, BLOCK_WORDS);
  for (let start = 0; start < total; start += block) {
    crossLevels(sweep, start, block, firstPass(w, start, block));
  }
  crossLevels(sweep, 0, total, block);
}

/** The exports of the WebAssembly kernel (scripts/make-mobius-wasm.ts), pointers in bytes. */
interface Kernel {
  memory: WebAssembly.Memory;
  first(start: number, end: number): void;
  sweep8(start: number, end: number, h: number): void;
  sweep4(start: number, end: number, h: number): void;
  sweep2(start: number, end: number, h: number): void;
}

/**
 * Smallest n given to the kernel: its first pass takes 8 vectors of 128 combinations at once,
 * and from there it already beats the JS path, copies included.
 */
export const KERNEL_MIN_INPUTS = 10;

/** The kernel compiled once; null when WebAssembly SIMD is missing or refused. */
let kernelModule: WebAssembly.Module | null | undefined;

function compileKernel(): WebAssembly.Module | null {
  if (kernelModule !== undefined) return kernelModule;
  kernelModule = null;
  if (typeof WebAssembly !== 'object') return kernelModule;
  const bytes = Uint8Array.from(atob(MOBIUS_KERNEL_BASE64), (c) => c.charCodeAt(0));
  if (!WebAssembly.validate(bytes)) return kernelModule; // an engine without 128-bit SIMD
  try {
    // Synchronous: the module is under 4 KB, which Chromium also compiles this way on a page's
    // main thread. A page whose policy lacks 'wasm-unsafe-eval' refuses it: JS path then.
    kernelModule = new WebAssembly.Module(bytes);
  } catch {
    kernelModule = null;
  }
  return kernelModule;
}

/** Whether `mobiusInPlace` uses the WebAssembly SIMD kernel from KERNEL_MIN_INPUTS inputs on. */
export function mobiusKernelAvailable(): boolean {
  return compileKernel() !== null;
}

/** The instance with the largest memory so far. */
let kernel: Kernel | undefined;

/**
 * An instance whose memory holds `bytes`. A larger need gets a new memory and instance rather
 * than `memory.grow`: growing detaches the old ArrayBuffer, and after the first detach V8's
 * optimised code checks every typed-array access for it (the JS path measured 25% slower).
 */
function kernelWithMemory(module: WebAssembly.Module, bytes: number): Kernel {
  if (kernel && kernel.memory.buffer.byteLength >= bytes) return kernel;
  const memory = new WebAssembly.Memory({ initial: Math.ceil(bytes / 65536) });
  const instance = new WebAssembly.Instance(module, { env: { memory } });
  kernel = { memory, ...(instance.exports as unknown as Omit<Kernel, 'memory'>) };
  return kernel;
}

/**
 * The transform through the kernel, n >= KERNEL_MIN_INPUTS: the words are copied into its
 * memory and back, each copy one native pass (cheap beside the floor of n passes; working in
 * place in the kernel's memory would need callers to allocate there).
 */
function mobiusKernel(module: WebAssembly.Module, words: Uint32Array, n: number): void {
  const total = 1 << (n - 3);
  const k = kernelWithMemory(module, total);
  const inKernel = new Uint32Array(k.memory.buffer, 0, total / 4);
  inKernel.set(words.subarray(0, inKernel.length));
  const sweep: Sweep = (radix, start, end, h) =>
    (radix === 8 ? k.sweep8 : radix === 4 ? k.sweep4 : k.sweep2)(start, end, h);
  // The JS path's block size measured as good as 2^14..2^19 bytes here too.
  const block = Math.min(total, 4 * BLOCK_WORDS);
  for (let start = 0; start < total; start += block) {
    k.first(start, start + block);
    crossLevels(sweep, start, block, 128);
  }
  crossLevels(sweep, 0, total, block);
  words.set(inKernel);
}

/**
 * Transform the set of n inputs (1..26) held in `words` in place. For n < 5 only the low 2^n
 * bits of word 0 take part (the others must be zero and stay zero). Uses the WebAssembly SIMD
 * kernel from KERNEL_MIN_INPUTS inputs where the engine allows it, else `mobiusInPlaceJs`.
 */
export function mobiusInPlace(words: Uint32Array, n: number): void {
  const module = n >= KERNEL_MIN_INPUTS ? compileKernel() : null;
  if (module === null) return mobiusInPlaceJs(words, n);
  checkArguments(words, n);
  mobiusKernel(module, words, n);
}

/** The Möbius transform of a set of n inputs, as a new set. */
export function mobius(set: BitSet, n: number): BitSet {
  const copy = new Uint32Array(wordCount(n));
  copy.set(set.subarray(0, copy.length));
  mobiusInPlace(copy, n);
  return copy;
}
