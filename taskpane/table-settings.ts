// The settings of a reading or of one table as plain data: what the settings card
// (settings.tsx) edits, how it becomes the reader's options, and how it is read back from where
// it was remembered (the workbook's document settings may hold anything). A table's own
// settings are remembered under its sheet and top-left cell (or its name, for an Excel table),
// so two tables side by side on one sheet keep theirs apart.
import type { RememberedValues } from '../src/hosts/index.js';
import { qualifiedAddress, type DontCarePolicy, type HostKind, type SpecOptions } from '../src/table/index.js';
import { tableCell, type TableChoice } from '../src/workflow/index.js';

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

/** A table as the pane shows it: where it is, and the name of the Excel table it is, if any. */
export interface TablePlace {
  readonly sheet: string;
  readonly range: string;
  readonly excelTable?: string;
}

const TABLE_KEY = 'table@';

/** What one table's own settings are remembered under: `table@Sheet!B3` (its top-left cell), or `table@Name` for an Excel table. */
export function tableKey(t: TablePlace): string {
  return TABLE_KEY + (t.excelTable ?? qualifiedAddress(t.sheet, tableCell(t.range)));
}

/** A table's own settings, remembered with where the table starts (so the reader finds it again). */
export function rememberTable(store: RememberedValues, t: TablePlace, settings: TableSettings): Promise<void> {
  return store.set(tableKey(t), { sheet: t.sheet, cell: tableCell(t.range), settings });
}

/** The table's own settings, or undefined when it has none (it is read with those of the reading). */
export function tableSettings(store: RememberedValues, t: TablePlace): TableSettings | undefined {
  const v = store.get(tableKey(t));
  return isRememberedTable(v) ? settingsFrom(v.settings) : undefined;
}

/**
 * Every table with settings of its own on `sheet` (every sheet when undefined), as the reader
 * takes them. An Excel table being read (`named`) is found where it is now, wherever it was.
 */
export function tableChoices(store: RememberedValues, sheet: string | undefined, host: HostKind, named?: TablePlace): TableChoice[] {
  return store.keys().flatMap((key) => {
    const v = key.startsWith(TABLE_KEY) ? store.get(key) : undefined;
    if (!isRememberedTable(v)) return [];
    const at = named && key === tableKey(named) ? { sheet: named.sheet, cell: tableCell(named.range) } : { sheet: v.sheet, cell: v.cell };
    if (sheet !== undefined && at.sheet !== sheet) return [];
    const { host: _host, ...options } = specOptions(settingsFrom(v.settings), host);
    return [{ ...at, options }];
  });
}

function isRememberedTable(v: unknown): v is { sheet: string; cell: string; settings: unknown } {
  if (typeof v !== 'object' || v === null) return false;
  const o = v as Record<string, unknown>;
  return typeof o.sheet === 'string' && typeof o.cell === 'string' && /^[A-Z]{1,3}[1-9]\d*$/.test(o.cell);
}

/** Values kept while the page stays open (the standalone page). */
export function pageValues(): RememberedValues {
  const kept = new Map<string, unknown>();
  return {
    get: (key) => kept.get(key),
    keys: () => [...kept.keys()],
    set: async (key, value) => void kept.set(key, value),
  };
}
