// Implementations read back (Structured Text, PLCopen XML) and verified against the spec
// tables. The other layers import src/impl only through this module.
export { kindWord } from './constructs.js';
export { readMappingCsv, type NameMapping } from './mapping.js';
export { readImplementation } from './read.js';
export { type ImplProgram } from './types.js';
export { printMonomial, specRowOf, verifyExitCode, verifyImplementation, type OutputVerdict, type VerifyReport } from './verify.js';
