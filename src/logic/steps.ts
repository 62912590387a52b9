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
  const sets: StepSets<BitSet, Combination> = {
    on: fn.on,
    off: offSet(fn),
    none: emptySet(n),
    term: (j) => truthTable(sopToExpr([cubes[j]!], names), n),
    or: union,
    and: intersect,
    minus,
    isEmpty,
    first: (set) => members(set, 1)[0],
    has,
    flipInput: (set, input) => flipBit(set, n - 1 - input),
    flip: (k, input) => k ^ (1 << (n - 1 - input)),
  };
  const terms = cubes.map((c): StepTerm => {
    const inputs: number[] = [];
    for (let i = 0; i < n; i++) if (c.mask & (1 << (n - 1 - i))) inputs.push(i);
    return { inputs, flippedTo: (i) => (c.bits & (1 << (n - 1 - i)) ? 0 : 1), text: printSt(sopToExpr([c], names)) };
  });
  return causeSteps(sets, terms, names);
}

/** The set operations the steps need, over bit sets (here) or BDDs (wide-steps.ts); K a combination. */
export interface StepSets<S, K> {
  /** The function's ON and OFF combinations (don't-cares are neither). */
  readonly on: S;
  readonly off: S;
  readonly none: S;
  /** The combinations of term j. */
  term(j: number): S;
  or(a: S, b: S): S;
  and(a: S, b: S): S;
  minus(a: S, b: S): S;
  isEmpty(set: S): boolean;
  /** The smallest combination of the set. */
  first(set: S): K | undefined;
  has(set: S, k: K): boolean;
  /** The combinations k for which k with the input flipped is in the set. */
  flipInput(set: S, input: number): S;
  /** k with the input flipped. */
  flip(k: K, input: number): K;
}

/** A product term as the steps see it: its inputs (leftmost first), the value each flips to, its text. */
export interface StepTerm {
  readonly inputs: readonly number[];
  flippedTo(input: number): 0 | 1;
  readonly text: string;
}

/** `uniqueCauseSteps` over any set representation: the same operations give the same steps. */
export function causeSteps<S, K>(sets: StepSets<S, K>, terms: readonly StepTerm[], names: readonly Signal[]): { combination: K; expected: 0 | 1; reason: string }[] {
  const steps = new StepList<K>();
  if (terms.length === 0) {
    const k = sets.first(sets.off);
    if (k !== undefined) steps.add(k, 0, 'no product term: the output is never on');
    return steps.list();
  }
  const termSets = terms.map((_, j) => sets.term(j));
  const others = unionOfOthers(sets, termSets);
  const offFlipped = new Map<number, S>();
  const offIfFlipped = (input: number): S => {
    let set = offFlipped.get(input);
    if (set === undefined) offFlipped.set(input, (set = sets.flipInput(sets.off, input)));
    return set;
  };

  terms.forEach((t, j) => {
    const term = `term ${j + 1}`;
    const onInTerm = sets.and(termSets[j]!, sets.on);
    const alone = sets.minus(onInTerm, others[j]!);
    // Prefer an ON combination from which every single-literal flip lands on a specified OFF.
    let best = alone;
    for (const i of t.inputs) {
      const narrower = sets.and(best, offIfFlipped(i));
      if (!sets.isEmpty(narrower)) best = narrower;
    }
    const k = sets.first(sets.isEmpty(best) ? onInTerm : best);
    if (k === undefined) return; // the term covers only don't-cares: nothing to test
    const isAlone = sets.has(alone, k);
    const onReason = isAlone ? `${term} alone: ${t.text}` : `${term} (other terms are true with it on every specified combination): ${t.text}`;
    const untestable: string[] = [];
    const pairs: [K, 0 | 1, string][] = [];
    for (const i of t.inputs) {
      const offReason = `${term} with ${names[i]!.identifier} = ${t.flippedTo(i)}: output off`;
      if (sets.has(offIfFlipped(i), k)) {
        pairs.push([sets.flip(k, i), 0, offReason]);
        continue;
      }
      const other = sets.first(sets.and(alone, offIfFlipped(i)));
      const any = other === undefined ? sets.first(sets.and(onInTerm, offIfFlipped(i))) : other;
      if (any === undefined) {
        untestable.push(names[i]!.identifier);
        continue;
      }
      pairs.push([any, 1, sets.has(alone, any) ? `${term} alone: ${t.text}` : `${term} with other terms: ${t.text}`]);
      pairs.push([sets.flip(any, i), 0, offReason]);
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

/** Steps unique by combination, reasons merged, in the order first added. */
class StepList<K> {
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

/** For each set, the union of all the others (prefix and suffix unions: linear in the count). */
function unionOfOthers<S, K>(sets: StepSets<S, K>, terms: readonly S[]): S[] {
  const before: S[] = [];
  let acc = sets.none;
  for (const t of terms) {
    before.push(acc);
    acc = sets.or(acc, t);
  }
  const out: S[] = new Array<S>(terms.length);
  acc = sets.none;
  for (let j = terms.length - 1; j >= 0; j--) {
    out[j] = sets.or(before[j]!, acc);
    acc = sets.or(acc, terms[j]!);
  }
  return out;
}
