// What the pane remembers with the workbook in Excel: one document setting holding a record of
// values by key (Office.Settings, see excel-api.ts). A save that Office refuses is an error
// the pane shows; what the document holds is read back as unknown and checked by the caller.
import type { XlDocumentSettings } from './excel-api.js';

export interface RememberedValues {
  /** What was stored under `key` (unknown: the document may hold anything). */
  get(key: string): unknown;
  /** Every key something is stored under. */
  keys(): string[];
  /** Store `value` under `key` and save it into the document. */
  set(key: string, value: unknown): Promise<void>;
}

/** The document's setting `name` as a record of values by key; `failed` = `Office.AsyncResultStatus.Failed`. */
export function documentValues(settings: XlDocumentSettings, name: string, failed: unknown): RememberedValues {
  const all = (): Record<string, unknown> => {
    const v = settings.get(name);
    return typeof v === 'object' && v !== null && !Array.isArray(v) ? (v as Record<string, unknown>) : {};
  };
  return {
    get: (key) => (Object.hasOwn(all(), key) ? all()[key] : undefined),
    keys: () => Object.keys(all()),
    set: (key, value) =>
      new Promise((done, refuse) => {
        settings.set(name, { ...all(), [key]: value });
        settings.saveAsync((result) => (result.status === failed ? refuse(new Error(`Excel did not save the settings: ${result.error?.message ?? 'no reason given'}`)) : done()));
      }),
  };
}
