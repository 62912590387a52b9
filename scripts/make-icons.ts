// Writes the add-in's icons (assets/icon-SIZE.png) with a plain PNG encoder over node:zlib.
// The picture is our own: an IEC 61131-3 normally-open contact (—| |—) on a blue tile.
// Run with `npm run icons`; the PNGs are committed, this script is how they were made.
import { writeFileSync, mkdirSync } from 'node:fs';
import { deflateSync } from 'node:zlib';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';
import { crc32 } from '../src/hosts/zip-package.js';

export const ICON_SIZES = [16, 32, 64, 80] as const;

type Rgba = readonly [number, number, number, number];
const TILE: Rgba = [0x1d, 0x5a, 0x86, 255];
const INK: Rgba = [255, 255, 255, 255];
const CLEAR: Rgba = [0, 0, 0, 0];

/** Colour at a point of the unit square (0..1 both ways, y downwards). */
function paint(x: number, y: number): Rgba {
  // Rounded tile: corner radius 0.18.
  const r = 0.18;
  const cx = Math.min(Math.max(x, r), 1 - r);
  const cy = Math.min(Math.max(y, r), 1 - r);
  if ((x - cx) ** 2 + (y - cy) ** 2 > r * r) return CLEAR;
  const line = 0.09; // stroke width
  const inBar = (x0: number) => x >= x0 && x <= x0 + line * 1.4 && y >= 0.26 && y <= 0.74;
  // Contact plates.
  if (inBar(0.33) || inBar(0.67 - line * 1.4)) return INK;
  // Wires to the left and right of the contact.
  if (Math.abs(y - 0.5) <= line / 2 && ((x >= 0.1 && x <= 0.34) || (x >= 0.66 && x <= 0.9))) return INK;
  return TILE;
}

/** RGBA pixels of a size x size icon, 4x4 supersampled for smooth edges. */
export function renderIcon(size: number): Uint8Array {
  const px = new Uint8Array(size * size * 4);
  const s = 4;
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let v = 0; v < s; v++) {
        for (let u = 0; u < s; u++) {
          const c = paint((i + (u + 0.5) / s) / size, (j + (v + 0.5) / s) / size);
          r += c[0] * c[3]; g += c[1] * c[3]; b += c[2] * c[3]; a += c[3];
        }
      }
      const o = (j * size + i) * 4;
      px[o] = a ? Math.round(r / a) : 0;
      px[o + 1] = a ? Math.round(g / a) : 0;
      px[o + 2] = a ? Math.round(b / a) : 0;
      px[o + 3] = Math.round(a / (s * s));
    }
  }
  return px;
}

function chunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 'ascii');
  Buffer.from(data).copy(out, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)), 8 + data.length);
  return out;
}

/** A PNG file (8-bit RGBA, no interlace, filter 0 on every row) — PNG spec, W3C 2nd edition. */
export function encodePng(width: number, height: number, rgba: Uint8Array): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  const raw = Buffer.alloc(height * (width * 4 + 1));
  for (let y = 0; y < height; y++) {
    raw[y * (width * 4 + 1)] = 0;
    Buffer.from(rgba.buffer, rgba.byteOffset + y * width * 4, width * 4).copy(raw, y * (width * 4 + 1) + 1);
  }
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([signature, chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw, { level: 9 })), chunk('IEND', new Uint8Array(0))]);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  const dir = join(dirname(fileURLToPath(import.meta.url)), '..', 'assets');
  mkdirSync(dir, { recursive: true });
  for (const size of ICON_SIZES) {
    writeFileSync(join(dir, `icon-${size}.png`), encodePng(size, size, renderIcon(size)));
    console.log(`assets/icon-${size}.png`);
  }
}
