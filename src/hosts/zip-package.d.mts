// Types of zip-package.mjs (plain JavaScript, so that the parsing worker runs without a build).
import type { Result } from '../logic/index.js';

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

/** How far a package may unpack: per part, in all, and a part's ratio to its packed size. */
export interface ZipBudget {
  readonly maxEntryBytes: number;
  readonly maxTotalBytes: number;
  readonly maxRatio: number;
}

/** An entry inflated and checked: its bytes, or why they cannot be used. */
export interface CheckedEntry {
  readonly name: string;
  readonly data?: Uint8Array;
  readonly damaged?: string;
}

/** CRC-32 as zip and PNG use it (ISO 3309 / ITU-T V.42 polynomial). */
export function crc32(bytes: Uint8Array): number;
export function readZip(bytes: Uint8Array): Result<ZipEntry[]>;
export function checkZip(bytes: Uint8Array, budget: ZipBudget): Promise<Result<CheckedEntry[]>>;
export function storedEntry(name: string, content: Uint8Array, like?: ZipEntry): ZipEntry;
export function writeZip(entries: readonly ZipEntry[]): Uint8Array;
export function inflateRawWeb(data: Uint8Array, maxBytes: number): Promise<Uint8Array>;
