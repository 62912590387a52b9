// The public face of the comparison of two revisions of a spec table (hosts import only this).
export { matchSignals, matchTables, type Rename, type SignalMatch, type SignalPair, type TableMatch, type TablePair } from './match.js';
export { behaviourChange, type BehaviourChange, type ChangeSet, type JointInputs } from './behaviour.js';
export { compareAnalyses, compareTables, type CompareOptions, type OutputComparison, type RowChange, type TableComparison } from './compare.js';
export { oldStepsFromRecord, oldStepsOf, recordFor, retestRecordSheet, selectRetest, type NewRecordStep, type OldStep, type Retest, type RetestEntry } from './retest.js';
export { CHANGE_KINDS, comparisonJson, problemJson, type ChangeKind } from './change-json.js';
export { comparisonReport, comparisonText } from './change-text.js';
export { changeRecordSheet, SIGN_FIELDS } from './change-sheet.js';
