// Reading spec tables: a grid of cells (or CSV text) -> spec tables, and problems at their
// cells. The other layers import src/table only through this module.
export { csvRecords, parseCsv } from './csv.js';
export { cellAddress, columnLetters, gridCell, gridOrigin, gridWidth, intersectRanges, parseA1, parseRange, qualifiedAddress, rangeAddress, restrictGrid } from './grid.js';
export { combinationCube, patternTable } from './patterns.js';
export { describeCube, describePattern } from './describe.js';
export { readSpecTables } from './read-tables.js';
export { GAP_CUBES_LISTED, tooLarge, wideBuilt } from './read-wide.js';
export { settingName } from './settings.js';
export { type AnnotationColumn, type CellValue, type DontCarePolicy, type Grid, type HostKind, type OutputSpec, type PatternTable, type Problem, type ProblemCode, type RoleRule, type Setting, type Severity, type SpecOptions, type SpecTable, type ValueReading, type WideSpec, type XReading } from './types.js';
export { gapCubes } from './uncovered.js';
