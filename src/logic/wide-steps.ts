// Commissioning test steps of steps.ts from BDDs: the same steps (each set's first combination
// is its smallest on both engines), without the 2^n-bit sets that cost ~1 s per output at 24
// inputs.
import { FALSE, type Dd, type Node } from './bdd.js';
import { printSt } from './expr/print-st.js';
import type { Signal } from './signals.js';
import { StepList } from './steps.js';
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
  const off = dd.not(on);
  const first = (f: Node): WideCombination | undefined => dd.minterms(f, 1)[0];
  const steps = new StepList<WideCombination>();
  if (cubes.length === 0) {
    const k = first(off);
    if (k !== undefined) steps.add(k, 0, 'no product term: the output is never on');
    return steps.list();
  }
  const termSets = cubes.map((c) => dd.cube(c));
  const others = unionOfOthers(dd, termSets);
  const offFlipped = new Map<number, Node>();
  const offIfFlipped = (input: number): Node => {
    let set = offFlipped.get(input);
    if (set === undefined) offFlipped.set(input, (set = dd.flip(off, inputBit(n, input))));
    return set;
  };
  cubes.forEach((c, j) => {
    const term = `term ${j + 1}`;
    const text = printSt(wideSopToExpr([c], signals));
    const onInTerm = dd.and(termSets[j]!, on);
    const alone = dd.minus(onInTerm, others[j]!);
    const literals = inputsOf(c, n);
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
      const flippedTo = c.bits & bit ? 0 : 1;
      const offReason = `${term} with ${signals[i]!.identifier} = ${flippedTo}: output off`;
      if (dd.evaluate(offIfFlipped(i), k)) {
        pairs.push([k ^ bit, 0, offReason]);
        continue;
      }
      const other = first(dd.and(alone, offIfFlipped(i)));
      const any = other === undefined ? first(dd.and(onInTerm, offIfFlipped(i))) : other;
      if (any === undefined) {
        untestable.push(signals[i]!.identifier);
        continue;
      }
      pairs.push([any, 1, dd.evaluate(alone, any) ? `${term} alone: ${text}` : `${term} with other terms: ${text}`]);
      pairs.push([any ^ bit, 0, offReason]);
    }
    const note = untestable.length ? `; flipping ${untestable.join(', ')} alone never turns the output off on a specified combination` : '';
    steps.add(k, 1, onReason + note);
    for (const [combination, expected, reason] of pairs) steps.add(combination, expected, reason);
  });
  return steps.list();
}

function inputsOf(c: WideCube, n: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < n; i++) if (c.mask & inputBit(n, i)) out.push(i);
  return out;
}

/** For each term, the OR of all the others (prefix and suffix unions). */
function unionOfOthers(dd: Dd, sets: readonly Node[]): Node[] {
  const before: Node[] = [];
  let acc: Node = FALSE;
  for (const s of sets) {
    before.push(acc);
    acc = dd.or(acc, s);
  }
  const out: Node[] = new Array<Node>(sets.length);
  acc = FALSE;
  for (let j = sets.length - 1; j >= 0; j--) {
    out[j] = dd.or(before[j]!, acc);
    acc = dd.or(acc, sets[j]!);
  }
  return out;
}
