// Workbook hosts that run anywhere: the WorkbookHost interface, the Excel host over Office.js and
// the page's file host. The file host on Node has its own entry, node.ts.
export { BrowserFileHost, openBrowserFile } from './browser-file-host.js';
export { officeExcelHost, type ExcelHost, type NamedTable } from './excel-host.js';
export { officeStart, type OfficeTheme } from './excel-office.js';
export { type RememberedValues } from './excel-settings.js';
export { csvAnswer } from './parsed-workbook.js';
export { type WorkbookHost, type WriteReport } from './workbook-host.js';
