// The engine as the other layers use it: pure functions, no DOM, Office or files; src/logic
// imports nothing from the rest. Modules of the engine import each other directly.
export { anfDegree, anfOf, anfSupport, type Monomial } from './anf.js';
export { appendAll, maxOf, minOf } from './arrays.js';
export { Dd, DdTooLarge, type Node } from './bdd.js';
export { count, emptySet, equals, flipBit, has, inputValue, intersect, MAX_INPUTS, members, minus, popcount, symmetricDifference, union, type BitSet, type Combination } from './bits.js';
export { buildFunction, offSet, type BoolFunction, type BuiltFunction, type OutputValue, type SafeValue, type TableRow } from './boolfn.js';
export { cube, cubeContains, cubeToPattern, cubeToSet, type Cube } from './cube.js';
export { and, FALSE, not, or, TRUE, variable, xor, type Expr } from './expr/ast.js';
export { truthTable } from './expr/evaluate.js';
export { anfToExpr, sopToExpr } from './expr/forms.js';
export { parseExpression } from './expr/parse.js';
export { printExcel } from './expr/print-excel.js';
export { printSt } from './expr/print-st.js';
export { fullIdentifier, isReserved, toIdentifiers } from './identifiers.js';
export { checkImplementation, postOrder, type ImplCheck } from './implcheck.js';
export { bestPolarity } from './polarity.js';
export { cubeMeetsSet, setToCubes } from './primes.js';
export { inputValues, LISTED, prove } from './proof.js';
export { fail, ok, type EngineError, type Result } from './result.js';
export { signalIndex, type Signal } from './signals.js';
export { minimiseSop, type FormBound } from './sop.js';
export { uniqueCauseSteps, type TestStep } from './steps.js';
export { analyseWideOutput, wideResolved, type WideOutputForms, type WideXor } from './wide-analysis.js';
export { XOR_PRINT_LIMIT } from './wide-anf.js';
export { combinationPattern, countJson, inputBit, toNarrow, toWide, WIDE_MAX_INPUTS, wideCube, widePattern, type WideCombination, type WideCube } from './wide-cube.js';
export { buildWide, overlapCube, type WideBuilt, type WideFunction } from './wide-fn.js';
export { exprToBdd, proveWide, type WideProof } from './wide-proof.js';
export { wideUniqueCauseSteps, type WideTestStep } from './wide-steps.js';
