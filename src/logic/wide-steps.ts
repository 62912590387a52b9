// Commissioning test steps over up to 64 inputs: the unique-cause plan of steps.ts, worked on
// BDDs instead of bit sets, so that a table of 40 or 64 inputs gets one step per test that
// matters, never 2^n. The same choices as `uniqueCauseSteps` (lowest combination first), so
// both engines give the same steps for the same function.
import { FALSE, type Dd, type Node } from './bdd.js';
import { printSt } from './expr/print-st.js';
import type { Signal } from './signals.js';
import { wideSopToExpr } from './wide-analysis.js';
import { inputBit, type WideCombination, type WideCube } from './wide-cube.js';

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
 * Steps for an AND/OR form (product terms `cubes`) of the function `on` (no don't-cares left):
 * - per term, a combination where that term alone is true (else one where it is true with others);
 * - per literal, the neighbour with that literal flipped, where the output is OFF: each contact
 *   shown to decide the output on its own (unique cause), from the term's step when it can be,
 *   else from another combination of the term (one more ON step).
 * Unique by combination, reasons merged; at most `wideStepBound(terms, literals)` steps.
 */
export function wideUniqueCauseSteps(dd: Dd, cubes: readonly WideCube[], on: Node, signals: readonly Signal[]): WideTestStep[] {
  const n = dd.n;
  const off = dd.not(on);
  const steps = new Map<WideCombination, { expected: 0 | 1; reasons: string[] }>();
  const add = (k: WideCombination, expected: 0 | 1, reason: string): void => {
    const s = steps.get(k);
    if (!s) steps.set(k, { expected, reasons: [reason] });
    else if (!s.reasons.includes(reason)) s.reasons.push(reason);
  };
  const first = (f: Node): WideCombination | undefined => (f === FALSE ? undefined : dd.minterms(f, 1)[0]);
  if (cubes.length === 0) {
    const k = first(off);
    if (k !== undefined) add(k, 0, 'no product term: the output is never on');
    return list(steps);
  }
  const termNodes = cubes.map((c) => dd.cube(c));
  const others = othersOf(dd, termNodes);
  const flipped = new Map<number, Node>();
  const offIfFlipped = (i: number): Node => {
    let f = flipped.get(i);
    if (f === undefined) flipped.set(i, (f = dd.flip(off, inputBit(n, i))));
    return f;
  };
  cubes.forEach((c, j) => {
    const term = `term ${j + 1}`;
    const text = printSt(wideSopToExpr([c], signals));
    const onInTerm = dd.and(termNodes[j]!, on);
    const alone = dd.minus(onInTerm, others[j]!);
    const literals = signals.flatMap((_, i) => (c.mask & inputBit(n, i) ? [i] : []));
    let best = alone;
    for (const i of literals) {
      const narrower = dd.and(best, offIfFlipped(i));
      if (narrower !== FALSE) best = narrower;
    }
    const k = first(best === FALSE ? onInTerm : best);
    if (k === undefined) return;
    const isAlone = dd.evaluate(alone, k);
    const onReason = isAlone ? `${term} alone: ${text}` : `${term} (other terms are true with it on every specified combination): ${text}`;
    const untestable: string[] = [];
    const pairs: [WideCombination, 0 | 1, string][] = [];
    for (const i of literals) {
      const bit = inputBit(n, i);
      const offReason = `${term} with ${signals[i]!.identifier} = ${c.bits & bit ? 0 : 1}: output off`;
      if (dd.evaluate(offIfFlipped(i), k)) {
        pairs.push([k ^ bit, 0, offReason]);
        continue;
      }
      const any = first(dd.and(alone, offIfFlipped(i))) ?? first(dd.and(onInTerm, offIfFlipped(i)));
      if (any === undefined) {
        untestable.push(signals[i]!.identifier);
        continue;
      }
      pairs.push([any, 1, dd.evaluate(alone, any) ? `${term} alone: ${text}` : `${term} with other terms: ${text}`]);
      pairs.push([any ^ bit, 0, offReason]);
    }
    const note = untestable.length ? `; flipping ${untestable.join(', ')} alone never turns the output off on a specified combination` : '';
    add(k, 1, onReason + note);
    for (const [combination, expected, reason] of pairs) add(combination, expected, reason);
  });
  return list(steps);
}

function list(steps: Map<WideCombination, { expected: 0 | 1; reasons: string[] }>): WideTestStep[] {
  return [...steps].map(([combination, s]) => ({ combination, expected: s.expected, reason: s.reasons.join('; ') }));
}

/** For each term, the OR of all the others (prefix and suffix ORs: linear in the count). */
function othersOf(dd: Dd, terms: readonly Node[]): Node[] {
  const before: Node[] = [];
  let acc: Node = FALSE;
  for (const t of terms) {
    before.push(acc);
    acc = dd.or(acc, t);
  }
  const out: Node[] = new Array(terms.length);
  acc = FALSE;
  for (let j = terms.length - 1; j >= 0; j--) {
    out[j] = dd.or(before[j]!, acc);
    acc = dd.or(acc, terms[j]!);
  }
  return out;
}
