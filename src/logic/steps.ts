// Commissioning test steps: which input combinations to try, and what the output must do.
import {
  emptySet,
  has,
  flipBit,
  intersect,
  isEmpty,
  members,
  minus,
  union,
  type BitSet,
  type Combination,
} from './bits.js';
import { careSet, offSet, type BoolFunction } from './boolfn.js';
import type { Cube } from './cube.js';
import { truthTable } from './expr/evaluate.js';
import { sopToExpr } from './expr/forms.js';
import { printSt } from './expr/print-st.js';
import type { Signal } from './signals.js';

export interface TestStep {
  readonly combination: Combination;
  /** What the spec asks of the output: steps never rest on a don't-care. */
  readonly expected: 0 | 1;
  /** Why this step is there, in plain words. */
  readonly reason: string;
}

/**
 * A small set of steps for an AND/OR form (its product terms `cubes`) of the spec fn:
 * - per term, a specified ON combination where that term alone is true (when there is none,
 *   the reason says the other terms are true there too);
 * - per literal of a term, the combination with that one literal flipped, where the spec asks
 *   for OFF: so each contact is shown to matter on its own (unique cause).
 * Every expected value is the spec's value on a specified combination. Steps are unique by
 * combination (reasons merged). A literal that no specified pair can show alone is named in
 * the reason of its term's ON step. `signals` name the literals (default I1, I2, ...).
 */
export function uniqueCauseSteps(cubes: readonly Cube[], fn: BoolFunction, signals?: readonly Signal[]): TestStep[] {
  const n = fn.n;
  const names = signals ?? Array.from({ length: n }, (_, i) => ({ header: `input ${i + 1}`, identifier: `I${i + 1}` }));
  const off = offSet(fn);
  const steps = new StepList();
  if (cubes.length === 0) {
    const [k] = members(off, 1);
    if (k !== undefined) steps.add(k, 0, 'no product term: the output is never on');
    return steps.list();
  }
  const termSets = cubes.map((c) => truthTable(sopToExpr([c], names), n));
  const others = unionOfOthers(termSets, n);
  const offFlipped = new Map<number, BitSet>();
  const offIfFlipped = (input: number): BitSet => {
    let set = offFlipped.get(input);
    if (!set) offFlipped.set(input, (set = flipInput(off, n, input)));
    return set;
  };

  cubes.forEach((c, j) => {
    const term = `term ${j + 1}`;
    const text = printSt(sopToExpr([c], names));
    const onInTerm = intersect(termSets[j]!, fn.on);
    const alone = minus(onInTerm, others[j]!);
    const literals = inputsOf(c, n);
    // Prefer an ON combination from which every single-literal flip lands on a specified OFF.
    let best = alone;
    for (const i of literals) {
      const narrower = intersect(best, offIfFlipped(i));
      if (!isEmpty(narrower)) best = narrower;
    }
    const [k] = members(isEmpty(best) ? onInTerm : best, 1);
    if (k === undefined) return; // the term covers only don't-cares: nothing to test
    const isAlone = has(alone, k);
    const onReason = isAlone ? `${term} alone: ${text}` : `${term} (other terms are true with it on every specified combination): ${text}`;
    const untestable: string[] = [];
    const pairs: [Combination, 0 | 1, string][] = [];
    for (const i of literals) {
      const bit = 1 << (n - 1 - i);
      const flippedTo = c.bits & bit ? 0 : 1;
      const offReason = `${term} with ${names[i]!.identifier} = ${flippedTo}: output off`;
      if (has(offIfFlipped(i), k)) {
        pairs.push([k ^ bit, 0, offReason]);
        continue;
      }
      const [other] = members(intersect(alone, offIfFlipped(i)), 1);
      const [any] = other === undefined ? members(intersect(onInTerm, offIfFlipped(i)), 1) : [other];
      if (any === undefined) {
        untestable.push(names[i]!.identifier);
        continue;
      }
      pairs.push([any, 1, has(alone, any) ? `${term} alone: ${text}` : `${term} with other terms: ${text}`]);
      pairs.push([any ^ bit, 0, offReason]);
    }
    const note = untestable.length
      ? `; flipping ${untestable.join(', ')} alone never turns the output off on a specified combination`
      : '';
    steps.add(k, 1, onReason + note);
    for (const [combination, expected, reason] of pairs) steps.add(combination, expected, reason);
  });
  return steps.list();
}

/** One step per specified combination, in increasing order. */
export function fullTableSteps(fn: BoolFunction): TestStep[] {
  return members(careSet(fn)).map((k) =>
    has(fn.on, k)
      ? { combination: k, expected: 1 as const, reason: 'specified combination: output on' }
      : { combination: k, expected: 0 as const, reason: 'specified combination: output off' },
  );
}

/** Steps unique by combination, reasons merged, in the order first added (BigInt combinations in wide-steps.ts). */
export class StepList<K = Combination> {
  private readonly byCombination = new Map<K, { expected: 0 | 1; reasons: string[] }>();

  add(combination: K, expected: 0 | 1, reason: string): void {
    const step = this.byCombination.get(combination);
    if (!step) this.byCombination.set(combination, { expected, reasons: [reason] });
    else if (!step.reasons.includes(reason)) step.reasons.push(reason);
  }

  list(): { combination: K; expected: 0 | 1; reason: string }[] {
    return [...this.byCombination].map(([combination, s]) => ({ combination, expected: s.expected, reason: s.reasons.join('; ') }));
  }
}

/** Inputs a cube has a literal for, leftmost first. */
function inputsOf(c: Cube, n: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < n; i++) if (c.mask & (1 << (n - 1 - i))) out.push(i);
  return out;
}

/** For each set, the union of all the others (prefix and suffix unions: linear in the count). */
function unionOfOthers(sets: readonly BitSet[], n: number): BitSet[] {
  const before: BitSet[] = [];
  let acc = emptySet(n);
  for (const s of sets) {
    before.push(acc);
    acc = union(acc, s);
  }
  const out: BitSet[] = new Array(sets.length);
  acc = emptySet(n);
  for (let j = sets.length - 1; j >= 0; j--) {
    out[j] = union(before[j]!, acc);
    acc = union(acc, sets[j]!);
  }
  return out;
}

/** Within-word swap masks for bit positions 0..4 of a combination. */
/** The combinations k for which k with input i flipped is in the set. */
function flipInput(set: BitSet, n: number, input: number): BitSet {
  return flipBit(set, n - 1 - input);
}
