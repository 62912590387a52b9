// The zip container of an Office Open XML package, read and written at the level of entries:
// an entry we do not change is copied with its compressed bytes as they are, so every part of
// the user's workbook that we do not touch stays byte-identical. Browser-safe (no node:).
import { fail, ok, type Result } from '../logic/result.js';

export interface ZipEntry {
  readonly name: string;
  /** 0 = stored, 8 = deflated. */
  readonly method: number;
  readonly crc: number;
  readonly size: number;
  /** The entry's bytes as stored in the zip (compressed when method is 8). */
  readonly data: Uint8Array;
  /** MS-DOS time and date fields, kept as they were. */
  readonly time: number;
  readonly date: number;
}

const LOCAL = 0x04034b50;
const CENTRAL = 0x02014b50;
const END = 0x06054b50;

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

/** CRC-32 as zip and PNG use it (ISO 3309 / ITU-T V.42 polynomial). */
export function crc32(bytes: Uint8Array): number {
  let c = 0xffffffff;
  for (let i = 0; i < bytes.length; i++) c = CRC_TABLE[(c ^ bytes[i]!) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

/** The entries of a zip, in central-directory order, with their stored bytes (not inflated). */
export function readZip(bytes: Uint8Array): Result<ZipEntry[]> {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let end = -1;
  for (let i = bytes.length - 22; i >= Math.max(0, bytes.length - 22 - 0xffff); i--)
    if (view.getUint32(i, true) === END) {
      end = i;
      break;
    }
  if (end < 0) return fail({ message: 'not a zip package (no end of central directory)' });
  const count = view.getUint16(end + 10, true);
  let at = view.getUint32(end + 16, true);
  if (count === 0xffff || at === 0xffffffff) return fail({ message: 'zip64 packages are not supported' });
  const decoder = new TextDecoder();
  const entries: ZipEntry[] = [];
  for (let i = 0; i < count; i++) {
    if (at + 46 > bytes.length || view.getUint32(at, true) !== CENTRAL) return fail({ message: 'the zip central directory is damaged' });
    const method = view.getUint16(at + 10, true);
    const time = view.getUint16(at + 12, true);
    const date = view.getUint16(at + 14, true);
    const crc = view.getUint32(at + 16, true);
    const compressed = view.getUint32(at + 20, true);
    const size = view.getUint32(at + 24, true);
    const nameLength = view.getUint16(at + 28, true);
    const extra = view.getUint16(at + 30, true);
    const comment = view.getUint16(at + 32, true);
    const offset = view.getUint32(at + 42, true);
    const name = decoder.decode(bytes.subarray(at + 46, at + 46 + nameLength));
    if (compressed === 0xffffffff || size === 0xffffffff || offset === 0xffffffff) return fail({ message: `zip64 entry ${name} is not supported` });
    if (offset + 30 > bytes.length || view.getUint32(offset, true) !== LOCAL) return fail({ message: `the zip entry ${name} is damaged` });
    const start = offset + 30 + view.getUint16(offset + 26, true) + view.getUint16(offset + 28, true);
    if (start + compressed > bytes.length) return fail({ message: `the zip entry ${name} is cut short` });
    entries.push({ name, method, crc, size, data: bytes.subarray(start, start + compressed), time, date });
    at += 46 + nameLength + extra + comment;
  }
  return ok(entries);
}

/** A new stored (uncompressed) entry: our own parts are small, and no deflate is needed. */
export function storedEntry(name: string, content: Uint8Array, like?: ZipEntry): ZipEntry {
  return { name, method: 0, crc: crc32(content), size: content.length, data: content, time: like?.time ?? 0, date: like?.date ?? 0x21 };
}

/** The zip of these entries, in this order. */
export function writeZip(entries: readonly ZipEntry[]): Uint8Array {
  const encoder = new TextEncoder();
  const names = entries.map((e) => encoder.encode(e.name));
  const localSize = entries.reduce((s, e, i) => s + 30 + names[i]!.length + e.data.length, 0);
  const centralSize = entries.reduce((s, _, i) => s + 46 + names[i]!.length, 0);
  const out = new Uint8Array(localSize + centralSize + 22);
  const view = new DataView(out.buffer);
  // The fields local and central headers share, from "version needed" to the name length.
  const common = (p: number, e: ZipEntry, name: Uint8Array): void => {
    view.setUint16(p, 20, true);
    view.setUint16(p + 2, /[^\x20-\x7e]/.test(e.name) ? 0x0800 : 0, true); // bit 11: the name is UTF-8
    view.setUint16(p + 4, e.method, true);
    view.setUint16(p + 6, e.time, true);
    view.setUint16(p + 8, e.date, true);
    view.setUint32(p + 10, e.crc, true);
    view.setUint32(p + 14, e.data.length, true);
    view.setUint32(p + 18, e.size, true);
    view.setUint16(p + 22, name.length, true);
  };
  const offsets: number[] = [];
  let at = 0;
  entries.forEach((e, i) => {
    offsets.push(at);
    view.setUint32(at, LOCAL, true);
    common(at + 4, e, names[i]!);
    out.set(names[i]!, at + 30);
    out.set(e.data, at + 30 + names[i]!.length);
    at += 30 + names[i]!.length + e.data.length;
  });
  const centralStart = at;
  entries.forEach((e, i) => {
    view.setUint32(at, CENTRAL, true);
    view.setUint16(at + 4, 20, true);
    common(at + 6, e, names[i]!);
    view.setUint32(at + 42, offsets[i]!, true);
    out.set(names[i]!, at + 46);
    at += 46 + names[i]!.length;
  });
  view.setUint32(at, END, true);
  view.setUint16(at + 8, entries.length, true);
  view.setUint16(at + 10, entries.length, true);
  view.setUint32(at + 12, at - centralStart, true);
  view.setUint32(at + 16, centralStart, true);
  return out;
}
