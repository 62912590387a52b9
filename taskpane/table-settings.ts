// The settings of a reading as plain data: what the settings card (settings.tsx) edits, how it
// becomes the reader's options, and how it is read back from where it was remembered (the
// workbook's document settings may hold anything).
import type { RememberedValues } from '../src/hosts/index.js';
import type { DontCarePolicy, HostKind, SpecOptions } from '../src/table/index.js';

export interface TableSettings {
  /** Leftmost columns that are inputs; absent = the table decides (role row, separator column). */
  readonly inputCount?: number;
  /** Safe value per output identifier; absent = 0. */
  readonly safeValues: Readonly<Record<string, 0 | 1>>;
  readonly xMeansDontCare: boolean;
  readonly dontCares: DontCarePolicy;
}

export const DEFAULT_SETTINGS: TableSettings = { safeValues: {}, xMeansDontCare: false, dontCares: 'minimal' };

/** The reading options of the settings, worded for `host`. */
export function specOptions(s: TableSettings, host: HostKind): SpecOptions {
  return {
    host,
    xReading: s.xMeansDontCare ? 'dont-care' : 'none',
    dontCares: s.dontCares,
    ...(s.inputCount !== undefined ? { inputCount: s.inputCount } : {}),
    ...(Object.keys(s.safeValues).length > 0 ? { safeValues: s.safeValues } : {}),
  };
}

/** Settings as remembered; anything the store holds that is not ours reads as the defaults. */
export function settingsFrom(v: unknown): TableSettings {
  if (typeof v !== 'object' || v === null) return DEFAULT_SETTINGS;
  const o = v as Record<string, unknown>;
  const safe = typeof o.safeValues === 'object' && o.safeValues !== null ? Object.entries(o.safeValues) : [];
  const count = o.inputCount;
  return {
    ...(typeof count === 'number' && Number.isInteger(count) && count >= 1 ? { inputCount: count } : {}),
    safeValues: Object.fromEntries(safe.filter((e): e is [string, 0 | 1] => e[1] === 0 || e[1] === 1)),
    xMeansDontCare: o.xMeansDontCare === true,
    dontCares: o.dontCares === 'safe' ? 'safe' : 'minimal',
  };
}

/** Values kept while the page stays open (the standalone page). */
export function pageValues(): RememberedValues {
  const kept = new Map<string, unknown>();
  return {
    get: (key) => kept.get(key),
    set: async (key, value) => void kept.set(key, value),
  };
}
