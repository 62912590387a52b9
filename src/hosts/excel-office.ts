// Where the pane runs: inside Excel (Office.onReady reports the Excel host) or in a plain
// browser tab (office.js loaded, no host). The only other place besides excel-host.ts that
// touches the Office namespace.
import type { XlDocumentSettings } from './excel-api.js';
import { documentValues, type RememberedValues } from './excel-settings.js';

/** The one document setting the pane keeps its values in. */
const SETTING = 'interlock-algebra';

export interface OfficeTheme {
  readonly background: string;
  readonly foreground: string;
}

export interface OfficeStart {
  readonly inExcel: boolean;
  /** The Office theme's body colours, when the host reports them. */
  readonly theme?: OfficeTheme;
  /** What the pane remembers with the workbook (its document settings), in Excel only. */
  readonly remembered?: RememberedValues;
}

/** Wait for office.js; outside Office (or without office.js) the answer is "not in Excel". */
export async function officeStart(timeoutMs = 10_000): Promise<OfficeStart> {
  if (typeof Office === 'undefined' || typeof Office.onReady !== 'function') return { inExcel: false };
  const info = await Promise.race([
    Office.onReady(),
    new Promise<undefined>((done) => setTimeout(() => done(undefined), timeoutMs)),
  ]);
  const inExcel = info?.host === Office.HostType.Excel;
  if (!inExcel) return { inExcel };
  const theme = Office.context?.officeTheme;
  const settings: XlDocumentSettings | undefined = Office.context?.document?.settings;
  return {
    inExcel,
    ...(theme?.bodyBackgroundColor ? { theme: { background: theme.bodyBackgroundColor, foreground: theme.bodyForegroundColor } } : {}),
    ...(settings ? { remembered: documentValues(settings, SETTING, Office.AsyncResultStatus.Failed) } : {}),
  };
}
