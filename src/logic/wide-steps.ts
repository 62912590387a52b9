// Commissioning test steps over up to 64 inputs: the unique-cause plan of steps.ts (one
// algorithm, `causeSteps`) worked on BDDs instead of bit sets, so that a table of 40 or 64
// inputs gets one step per test that matters, never 2^n, and 24 inputs no 2^24-bit sets (~1 s
// an output). Each set's first combination is its smallest on both engines: the same steps.
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

/** The most steps the plan gives a form: one ON step per term, and per literal an ON and an OFF step. */
export function wideStepBound(terms: number, literals: number): number {
  return Math.max(1, terms + 2 * literals);
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
  return causeSteps(sets, wideStepTerms(n, cubes, signals), signals);
}

/** The AND/OR form's terms as the steps see them. */
export function wideStepTerms(n: number, cubes: readonly WideCube[], signals: readonly Signal[]): StepTerm[] {
  return cubes.map((c): StepTerm => {
    const inputs: number[] = [];
    for (let i = 0; i < n; i++) if (c.mask & inputBit(n, i)) inputs.push(i);
    return { inputs, flippedTo: (i) => (c.bits & inputBit(n, i) ? 0 : 1), text: printSt(wideSopToExpr([c], signals)) };
  });
}
