// Where the pane runs: inside Excel (Office.onReady reports the Excel host) or in a plain
// browser tab (office.js loaded, no host). The only other place besides excel-host.ts that
// touches the Office namespace.

export interface OfficeTheme {
  readonly background: string;
  readonly foreground: string;
}

export interface OfficeStart {
  readonly inExcel: boolean;
  /** The Office theme's body colours, when the host reports them. */
  readonly theme?: OfficeTheme;
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
  return theme?.bodyBackgroundColor
    ? { inExcel, theme: { background: theme.bodyBackgroundColor, foreground: theme.bodyForegroundColor } }
    : { inExcel };
}
