// Every output format: sheets, hand-over files, the test record, the JSON and readable text of
// an analysis, the check report. The other layers import src/report only through this module.
export { analysisJson, problemJson, type ProblemJson } from './analysis-json.js';
export { analysisReport, problemLine, tableReport } from './analysis-text.js';
export { CAUTION, CAUTION_LINES } from './caution.js';
export { checkSheet } from './check-sheet.js';
export { ladderSvg } from './ladder-svg.js';
export { notAnalysedSheet } from './not-analysed-sheet.js';
export { exportPlcopen } from './plcopen-export.js';
export { judgeRecord, readTestRecord, type FilledRecord, type RecordVerdict, type StepResult } from './record-read.js';
export { liveCheckSheet, resultsSheet, resultsSheets } from './results-sheet.js';
export { revisionStamp } from './revision.js';
export { quotedSheet, renameSheetRefs, type BlockCell, type CellStyle, type SheetBlock } from './sheet-block.js';
export { footerText, LOOKS, PAGE_FOOTER, printSetup, STATUS_LOOKS, type Look } from './sheet-looks.js';
export { exportSt, minimumWords, type FormChoice } from './st-export.js';
export { sheetName, stepsCsv, stepTable, testRecordSheet, type RecordOptions } from './test-steps.js';
export { NO_XOR, plural } from './text.js';
export { verifyReportJson, verifyReportText } from './verify-report.js';
export { TOOL_NAME, TOOL_VERSION } from './version.js';
export { outputViews, type AndOrView, type FormView, type OutputView, type StepView, type XorView } from './output-view.js';
