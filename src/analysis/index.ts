// Analysing a spec table: per output its AND/OR and XOR forms, proofs, gaps and test steps.
// The other layers import src/analysis only through this module.
export { analyseTable, type AnalyseOptions } from './analyse.js';
export { type AndOrForm, type FormProof, type OutputAnalysis, type TableAnalysis, type XorForm } from './analysis-types.js';
export { type WideOutputAnalysis, type WideTableAnalysis } from './wide-types.js';
