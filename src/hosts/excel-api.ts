// The few parts of the Excel JavaScript API (Office.js) that the Excel host uses, as plain
// structural types. The real `Excel.RequestContext` satisfies them (checked where the host is
// wired to `Excel.run`), and so does the strict test double in test/hosts/excel-double.ts.
// Requirement set of each member in brackets (Excel JavaScript API reference, learn.microsoft.com).

/** Cell values as Office.js hands them over (numbers, text, booleans; '' for empty). */
export type XlValue = string | number | boolean;

export interface XlLoadable {
  load(propertyNames: string): unknown;
}

export interface XlFont {
  bold: boolean; // [1.1]
  italic: boolean; // [1.1]
  color: string; // [1.1]
  name: string; // [1.1]
  size: number; // [1.1]
}

export interface XlFill {
  color: string; // [1.1]
}

export interface XlRangeFormat {
  readonly fill: XlFill;
  readonly font: XlFont;
  columnWidth: number; // points [1.2]
  wrapText: boolean; // [1.1]
  horizontalAlignment: string; // [1.1]
}

export interface XlTextConditionalFormat {
  readonly format: { readonly fill: XlFill; readonly font: { color: string; bold: boolean } };
  rule: { operator: string; text: string };
}

export interface XlConditionalFormat {
  readonly textComparison: XlTextConditionalFormat; // [1.6]
}

export interface XlRange extends XlLoadable {
  readonly address: string; // "Sheet1!B3:D9" [1.1]
  readonly rowCount: number; // [1.1]
  readonly columnCount: number; // [1.1]
  readonly isNullObject: boolean; // [1.4]
  values: XlValue[][]; // [1.1]
  formulas: XlValue[][]; // [1.1]
  numberFormat: string[][]; // [1.1]
  readonly valueTypes: string[][]; // "Empty" | "String" | "Double" | "Boolean" | "Error" ... [1.1]
  readonly format: XlRangeFormat;
  readonly conditionalFormats: { add(type: 'ContainsText'): XlConditionalFormat }; // [1.6]
  readonly worksheet: XlWorksheet; // [1.1]
  getCell(row: number, column: number): XlRange; // [1.1]
  getResizedRange(deltaRows: number, deltaColumns: number): XlRange; // [1.2]
  getOffsetRange(rowOffset: number, columnOffset: number): XlRange; // [1.1]
  getUsedRangeOrNullObject(valuesOnly?: boolean): XlRange; // [1.4]
  /** Merged areas whose top-left cell is in this range; fails over 512 areas. */
  getMergedAreasOrNullObject(): XlRangeAreas; // [1.13]
  select(): void; // [1.1]
}

/** Rectangular ranges of one sheet (here: merged areas). */
export interface XlRangeAreas extends XlLoadable {
  readonly isNullObject: boolean; // [1.9]
  /** "Sheet1!A1:B4,Sheet1!D1:D4": each area with its sheet, quoted as a formula quotes it. */
  readonly address: string; // [1.9]
}

/** Header/footer text with Excel's codes (&P page, &N pages, && a literal &). */
export interface XlHeaderFooter {
  leftFooter: string; // [1.9]
  rightFooter: string; // [1.9]
}

export interface XlPageLayout {
  orientation: 'Portrait' | 'Landscape'; // [1.9]
  zoom: { horizontalFitToPages?: number; verticalFitToPages?: number; scale?: number }; // set as a whole [1.9]
  readonly headersFooters: { readonly defaultForAllPages: XlHeaderFooter }; // [1.9]
  setPrintTitleRows(printTitleRows: string): void; // whole rows, "$1:$3" [1.9]
}

export interface XlWorksheet extends XlLoadable {
  readonly name: string; // [1.1]
  readonly pageLayout: XlPageLayout; // [1.9]
  readonly freezePanes: { freezeRows(count?: number): void }; // [1.7]
  getRange(address?: string): XlRange; // [1.1]
  getUsedRangeOrNullObject(valuesOnly?: boolean): XlRange; // [1.4]
  activate(): void; // [1.1]
}

export interface XlCollection<T> extends XlLoadable {
  readonly items: T[];
}

export interface XlWorksheets extends XlCollection<XlWorksheet> {
  getItem(name: string): XlWorksheet; // [1.1]
  add(name?: string): XlWorksheet; // [1.1]
}

export interface XlTable extends XlLoadable {
  readonly name: string; // [1.1]
  readonly worksheet: XlWorksheet; // [1.2]
  getRange(): XlRange; // [1.1]
}

export interface XlWorkbook {
  readonly worksheets: XlWorksheets;
  readonly tables: XlCollection<XlTable>; // [1.1]
  getSelectedRange(): XlRange; // [1.1]
}

export interface XlContext {
  readonly workbook: XlWorkbook;
  sync(): Promise<unknown>;
}

/** `Office.context.requirements.isSetSupported('ExcelApi', version)`: does this Excel have the requirement set? */
export type XlSupports = (excelApiVersion: string) => boolean;

/** `Excel.run` narrowed to what the host does: one batch function, one result. */
export type XlRun = <T>(batch: (context: XlContext) => Promise<T>) => Promise<T>;

/** Error codes of Office.js that the host reacts to (as named in office-js dist, excel-web-16.00.js). */
export const XL_ERROR = {
  propertyNotLoaded: 'PropertyNotLoaded',
  requestTooLarge: 'RequestPayloadSizeLimitExceeded',
  responseTooLarge: 'ResponsePayloadSizeLimitExceeded',
  itemNotFound: 'ItemNotFound',
  invalidArgument: 'InvalidArgument',
} as const;

/** The `code` of an Office.js error (OfficeExtension.Error), if it has one. */
export function xlErrorCode(error: unknown): string | undefined {
  if (typeof error === 'object' && error !== null && 'code' in error && typeof error.code === 'string') return error.code;
  return undefined;
}

/**
 * `Office.context.document.settings` (Office.Settings, common API requirement set Settings 1.1):
 * name/value pairs stored in the document per add-in. `set` changes the in-memory copy only;
 * `saveAsync` writes it into the document and reports `status` = `Office.AsyncResultStatus`.
 * Values are JSON (string, number, boolean, null, object, array).
 */
export interface XlDocumentSettings {
  get(name: string): unknown;
  set(name: string, value: unknown): void;
  saveAsync(callback?: (result: { readonly status: unknown; readonly error: { readonly message: string } | null }) => void): void;
}
