// Types of zip-package.mjs (plain JavaScript, so that the parsing worker runs without a build).
export interface ZipBudget {
  readonly maxEntryBytes: number;
  readonly maxTotalBytes: number;
  readonly maxRatio: number;
}

export interface ZipEntry {
  readonly name: string;
  readonly data?: Uint8Array;
  readonly damaged?: string;
}

export function crc32(bytes: Uint8Array): number;
export function readZip(bytes: Uint8Array, budget: ZipBudget): Promise<{ ok: true; entries: ZipEntry[] } | { ok: false; reason: string }>;
export function zipOf(entries: readonly { name: string; data: Uint8Array; deflated?: Uint8Array }[]): Uint8Array;
