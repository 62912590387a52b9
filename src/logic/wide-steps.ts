// Commissioning test steps of steps.ts from BDDs: the same steps (each set's first combination
// is its smallest on both engines), without the 2^n-bit sets that cost ~1 s per output at 24
// inputs.
import { FALSE, type Dd, type Node } from './bdd.js';
import { printSt } from './expr/print-st.js';
import type { Signal } from './signals.js';
import { causeSteps, type StepSets, type StepTerm } from './steps.js';
import { wideSopToExpr } from './wide-analysis.js';
import { inputBit, type WideCombination, type WideCube } from './wide-cube.js';

/** A wide test step: as `TestStep`, the combination in BigInt. */
export interface WideTestStep {
  readonly combination: WideCombination;
  readonly expected: 0 | 1;
  readonly reason: string;
}

/**
 * `uniqueCauseSteps` of a function with no don't-cares left (`on`, everything else OFF, the
 * resolved function of an output) and its AND/OR form's terms, over the BDDs of `dd`.
 */
export function wideUniqueCauseSteps(dd: Dd, cubes: readonly WideCube[], on: Node, signals: readonly Signal[]): WideTestStep[] {
  const { n } = dd;
  const sets: StepSets<Node, WideCombination> = {
    on,
    off: dd.not(on),
    none: FALSE,
    term: (j) => dd.cube(cubes[j]!),
    or: (a, b) => dd.or(a, b),
    and: (a, b) => dd.and(a, b),
    minus: (a, b) => dd.minus(a, b),
    isEmpty: (f) => f === FALSE,
    first: (f) => dd.minterms(f, 1)[0],
    has: (f, k) => dd.evaluate(f, k),
    flipInput: (f, input) => dd.flip(f, inputBit(n, input)),
    flip: (k, input) => k ^ inputBit(n, input),
  };
  const terms = cubes.map((c): StepTerm => {
    const inputs: number[] = [];
    for (let i = 0; i < n; i++) if (c.mask & inputBit(n, i)) inputs.push(i);
    return { inputs, flippedTo: (i) => (c.bits & inputBit(n, i) ? 0 : 1), text: printSt(wideSopToExpr([c], signals)) };
  });
  return causeSteps(sets, terms, signals);
}
