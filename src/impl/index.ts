// Implementations read back (Structured Text, PLCopen XML) and verified against the spec
// tables. The other layers import src/impl only through this module.
export { kindWord } from './constructs.js';
export { readMappingCsv, readMappingGrid, type NameMapping, type NamePair } from './mapping.js';
export { readImplementation } from './read.js';
export { type ImplProgram } from './types.js';
export { NO_DIFFERENCE, printMonomial, specRowOf, verifyExitCode, verifyExpression, verifyImplementation, type Count, type OutputVerdict, type VerifyReport } from './verify.js';
