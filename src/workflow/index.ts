// The workflow every host shares (DESIGN.md sections 8 and 9): read the tables of a workbook
// through a WorkbookHost with the user's settings -> analyse -> verdicts -> what may be
// written and handed over -> the sheets to write. Hosts take every decision from here and use
// the lower layers only to print and show.
export { readGrids, readTables, type GridsRead, type ReadFailure, type TablesRead, type WorkbookChoice } from './read.js';
export { allCleared, examine, examineTable, workbookVerdictText, type ExamineOptions, type Permission, type TableResult, type Workbook } from './examine.js';
export { errorsOf, verdictWords, type Verdict } from './verdict.js';
export { sheetsToWrite, writeSheets } from './sheets.js';
export { handOverFiles, type HandOverFile, type HandOverKind, type HandOverRequest } from './hand-over.js';
export { checkExpression, implementationWord, programCleared, verifyProgram, type ImplementationWord } from './implementation.js';
export { readMappings, readMappingSheet, type MappingSource } from './mapping.js';
export { workbookJson } from './json.js';
export { workbookView, type TableView, type WorkbookView } from './view.js';
export { checkRecords, judgeRecords, readRecordGrids, recordsCleared, type RecordGrids, type RecordVerdict } from './records.js';
export { compareView, compareWorkbooks, type CompareView, type CompareWorkbooksOptions, type TableCompared, type WorkbooksCompared } from './compare.js';
