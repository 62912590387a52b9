// Writes src/logic/mobius-kernel.wasm.ts: the WebAssembly SIMD kernel of the Möbius transform,
// as base64 so bundlers and Node load it without file access. A tiny emitter of the binary
// format (WebAssembly Core Specification 2.0, chapter 5, with the 128-bit SIMD opcodes) for the
// few instructions used: no compiler needed. Run with `npm run wasm`; the output is committed and
// test/logic/mobius-kernel.test.ts checks it matches this script.
//
// The kernel works on packed combination bits in its imported memory ("env" "memory"), pointers
// and strides in bytes, all multiples of 16 (one vector = 128 combinations):
// - first(p, end): every vector in [p, end) through the 7 levels inside it, then groups of 8
//   neighbouring vectors through the 3 levels between them (strides 16, 32, 64 bytes);
// - sweep8 / sweep4 / sweep2(p, end, h): 3 / 2 / 1 levels of strides h, 2h, 4h over [p, end).
import { writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

type Bytes = number[];

function uleb(value: number): Bytes {
  const out: Bytes = [];
  do {
    let byte = value & 0x7f;
    value >>>= 7;
    if (value !== 0) byte |= 0x80;
    out.push(byte);
  } while (value !== 0);
  return out;
}

function sleb(value: number): Bytes {
  const out: Bytes = [];
  for (;;) {
    const byte = value & 0x7f;
    value >>= 7;
    const done = (value === 0 && (byte & 0x40) === 0) || (value === -1 && (byte & 0x40) !== 0);
    out.push(done ? byte : byte | 0x80);
    if (done) return out;
  }
}

const utf8 = (text: string): Bytes => [...uleb(text.length), ...new TextEncoder().encode(text)];
const vec = (items: Bytes[]): Bytes => [...uleb(items.length), ...items.flat()];
const section = (id: number, body: Bytes): Bytes => [id, ...uleb(body.length), ...body];

const I32 = 0x7f;
const V128 = 0x7b;
const VOID_BLOCK = 0x40;

// Instructions (opcodes from the specification's binary format, SIMD ones after prefix 0xfd).
const get = (local: number): Bytes => [0x20, ...uleb(local)];
const set = (local: number): Bytes => [0x21, ...uleb(local)];
const tee = (local: number): Bytes => [0x22, ...uleb(local)];
const i32 = (value: number): Bytes => [0x41, ...sleb(value)];
const I32_ADD = [0x6a];
const I32_MUL = [0x6c];
const I32_NE = [0x47];
const loop = (body: Bytes[]): Bytes => [0x03, VOID_BLOCK, ...body.flat(), 0x0b];
const BR_IF_LOOP = [0x0d, 0]; // back to the start of the innermost loop
const simd = (opcode: number, ...immediates: number[]): Bytes => [0xfd, ...uleb(opcode), ...immediates];
/** v128.load / v128.store with 16-byte alignment (log2 = 4) and a constant offset. */
const load = (offset: number): Bytes => simd(0x00, 4, ...uleb(offset));
const store = (offset: number): Bytes => simd(0x0b, 4, ...uleb(offset));
const v128Const = (lanes32: number[]): Bytes =>
  simd(0x0c, ...lanes32.flatMap((x) => [x & 0xff, (x >>> 8) & 0xff, (x >>> 16) & 0xff, x >>> 24]));
const shuffle = (lanes: number[]): Bytes => simd(0x0d, ...lanes);
const V128_AND = simd(0x4e);
const V128_XOR = simd(0x51);
const I32X4_SHL = simd(0xab);
const I64X2_SHL = simd(0xcb);

/** x_to ^= x_from, both v128 locals. */
const xorInto = (to: number, from: number): Bytes => [...get(to), ...get(from), ...V128_XOR, ...set(to)];

/**
 * The levels between `radix` vectors held in locals x[0..radix): for stride s = 1, 2, 4 ...,
 * x[j] ^= x[j - s] where bit s of j is set.
 */
function butterfly(x: number[]): Bytes {
  const out: Bytes = [];
  for (let s = 1; s < x.length; s *= 2) {
    for (let j = 0; j < x.length; j++) if (j & s) out.push(...xorInto(x[j]!, x[j - s]!));
  }
  return out;
}

/** Combination bit j of a 32-bit lane has stride 2^j: x ^= (x & mask) << 2^j. */
const IN_WORD_MASKS = [0x55555555, 0x33333333, 0x0f0f0f0f, 0x00ff00ff, 0x0000ffff];

/**
 * The 7 levels inside vector local x: 5 in each 32-bit lane, then lane 0 into 1 and 2 into 3
 * (a 64-bit shift by 32), then lanes 0-1 into 2-3 (a shuffle with the zero vector).
 */
function inVector(x: number, masks: number[], zero: number): Bytes {
  const out: Bytes = [];
  masks.forEach((mask, j) => out.push(...get(x), ...get(x), ...get(mask), ...V128_AND, ...i32(1 << j), ...I32X4_SHL, ...V128_XOR, ...set(x)));
  out.push(...get(x), ...get(x), ...i32(32), ...I64X2_SHL, ...V128_XOR, ...set(x));
  const lowHalfUp = [16, 17, 18, 19, 20, 21, 22, 23, 0, 1, 2, 3, 4, 5, 6, 7];
  out.push(...get(x), ...get(x), ...get(zero), ...shuffle(lowHalfUp), ...V128_XOR, ...set(x));
  return out;
}

const range = (from: number, count: number): number[] => Array.from({ length: count }, (_, i) => from + i);

/** A function body: locals as runs of one type, then the code. */
function body(locals: [count: number, type: number][], code: Bytes[]): Bytes {
  const bytes = [...vec(locals.map(([count, type]) => [...uleb(count), type])), ...code.flat(), 0x0b];
  return [...uleb(bytes.length), ...bytes];
}

/** first(p, end): params 0-1; vectors x 2-9, masks 10-14, zero 15 (never set). */
function firstBody(): Bytes {
  const [p, end] = [0, 1];
  const x = range(2, 8);
  const masks = range(10, 5);
  const zero = 15;
  const code: Bytes[] = masks.map((m, j) => [...v128Const(Array(4).fill(IN_WORD_MASKS[j]!)), ...set(m)]);
  code.push(
    loop([
      ...x.map((xj, j) => [...get(p), ...load(16 * j), ...set(xj)]),
      ...x.map((xj) => inVector(xj, masks, zero)),
      butterfly(x),
      ...x.map((xj, j) => [...get(p), ...get(xj), ...store(16 * j)]),
      [...get(p), ...i32(8 * 16), ...I32_ADD, ...tee(p), ...get(end), ...I32_NE, ...BR_IF_LOOP],
    ]),
  );
  return body([[8 + 5 + 1, V128]], code);
}

/**
 * sweepR(p, end, h): params 0-2; stop 3, skip 4, addresses a[1..R) 5.., vectors x after.
 * For each group of R blocks of h bytes, the words at p, p+h, ... p+(R-1)h go through the
 * levels between them; x[0] is only read.
 */
function sweepBody(radix: number): Bytes {
  const [p, end, h, stop, skip] = [0, 1, 2, 3, 4];
  const a = [p, ...range(5, radix - 1)];
  const x = range(5 + radix - 1, radix);
  const loads = x.map((xj, j) =>
    j === 0
      ? [...get(p), ...load(0), ...set(xj)]
      : [...get(a[j - 1]!), ...get(h), ...I32_ADD, ...tee(a[j]!), ...load(0), ...set(xj)],
  );
  const stores = x.slice(1).map((xj, i) => [...get(a[i + 1]!), ...get(xj), ...store(0)]);
  return body(
    [
      [2 + radix - 1, I32],
      [radix, V128],
    ],
    [
      [...get(h), ...i32(radix - 1), ...I32_MUL, ...set(skip)],
      loop([
        [...get(p), ...get(h), ...I32_ADD, ...set(stop)],
        loop([
          ...loads,
          butterfly(x),
          ...stores,
          [...get(p), ...i32(16), ...I32_ADD, ...tee(p), ...get(stop), ...I32_NE, ...BR_IF_LOOP],
        ]),
        [...get(p), ...get(skip), ...I32_ADD, ...tee(p), ...get(end), ...I32_NE, ...BR_IF_LOOP],
      ]),
    ],
  );
}

/** The whole module. */
export function mobiusKernelBytes(): Uint8Array {
  const twoParams = [0x60, ...vec([[I32], [I32]]), ...vec([])];
  const threeParams = [0x60, ...vec([[I32], [I32], [I32]]), ...vec([])];
  const exports: [string, Bytes][] = [
    ['first', firstBody()],
    ['sweep8', sweepBody(8)],
    ['sweep4', sweepBody(4)],
    ['sweep2', sweepBody(2)],
  ];
  const memoryImport = [...utf8('env'), ...utf8('memory'), 0x02, 0x00, ...uleb(1)];
  return new Uint8Array([
    ...[0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00],
    ...section(1, vec([twoParams, threeParams])),
    ...section(2, vec([memoryImport])),
    ...section(3, vec(exports.map((_, i) => uleb(i === 0 ? 0 : 1)))),
    ...section(7, vec(exports.map(([name], i) => [...utf8(name), 0x00, ...uleb(i)]))),
    ...section(10, vec(exports.map(([, code]) => code))),
  ]);
}

/** The generated TypeScript module, base64 in lines of 100 characters. */
export function kernelSource(): string {
  const base64 = Buffer.from(mobiusKernelBytes()).toString('base64');
  const lines = base64.match(/.{1,100}/g)!.map((line) => `  '${line}'`);
  return [
    '// Generated by scripts/make-mobius-wasm.ts (`npm run wasm`): do not edit. The WebAssembly',
    '// SIMD kernel of the Möbius transform; what its functions do is described in the script.',
    `export const MOBIUS_KERNEL_BASE64 =\n${lines.join(' +\n')};`,
    '',
  ].join('\n');
}

export const KERNEL_MODULE_PATH = join(dirname(fileURLToPath(import.meta.url)), '..', 'src', 'logic', 'mobius-kernel.wasm.ts');

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  writeFileSync(KERNEL_MODULE_PATH, kernelSource());
  console.log(`wrote ${KERNEL_MODULE_PATH} (${mobiusKernelBytes().length} bytes of WebAssembly)`);
}
