// Where an implementation and its spec disagree, split by what matters on a machine: an
// **unsafe** combination is one where the spec requires the output's safe value and the
// implementation gives the other value (for safe value 0: the program is ON where it must be
// OFF); a **spurious trip** is one where the spec requires the non-safe value and the
// implementation holds the safe value. Each side is counted exactly, listed, and described by
// the minimal AND/OR form of its set ("unsafe exactly when Guard_closed = 0 AND Run = 1").
import { complement, emptySet, intersect, isEmpty, members, minus, symmetricDifference, type BitSet, type Combination } from './bits.js';
import type { BoolFunction, SafeValue } from './boolfn.js';
import { Dd, DdTooLarge, FALSE, type Node } from './bdd.js';
import { cubeToSet, type Cube } from './cube.js';
import { setToCubes } from './primes.js';
import { minimiseSop } from './sop.js';
import type { Signal } from './signals.js';
import { minimiseWide } from './wide-sop.js';
import { toNarrow, toWide, type WideCube } from './wide-cube.js';

export type CounterexampleKind = 'unsafe' | 'spurious-trip';

/** The kind of a disagreement, from the value the spec requires there. */
export function kindOf(expected: 0 | 1, safe: SafeValue): CounterexampleKind {
  return expected === safe ? 'unsafe' : 'spurious-trip';
}

export interface DifferenceSides {
  /** Judged combinations where the spec requires the safe value and the implementation does not give it. */
  readonly unsafe: BitSet;
  /** Judged combinations where the spec requires the non-safe value and the implementation gives the safe one. */
  readonly spuriousTrip: BitSet;
}

/**
 * Both sides over all 2^n combinations. `fn` is the function judged (gaps and conflicts already
 * at the safe value); its don't-cares are never a side. `values` is the implementation.
 */
export function differenceSides(fn: BoolFunction, values: BitSet, safe: SafeValue): DifferenceSides {
  const wrong = minus(symmetricDifference(fn.on, values), fn.dc);
  // Where the implementation gives the non-safe value, a disagreement is unsafe.
  const notSafe = safe === 0 ? values : complement(values, fn.n);
  return { unsafe: intersect(wrong, notSafe), spuriousTrip: minus(wrong, notSafe) };
}

/** The first `limit` combinations of each side, unsafe ones first. */
export function listedSides(sides: DifferenceSides, limit: number): { combination: Combination; kind: CounterexampleKind }[] {
  return [
    ...members(sides.unsafe, limit).map((combination) => ({ combination, kind: 'unsafe' as const })),
    ...members(sides.spuriousTrip, limit).map((combination) => ({ combination, kind: 'spurious-trip' as const })),
  ];
}

/** A side as an AND/OR form over the inputs (wide cubes over 24 inputs). */
export interface SideForm {
  /** Product terms in printed order; none = the side is empty. */
  readonly cubes: readonly (Cube | WideCube)[];
  /** The minimiser proved no form has fewer terms (then literals). */
  readonly proven: boolean;
  /** The form also holds on some combinations that are not judged (don't-cares): it is exact on the judged ones only. */
  readonly coversUnjudged: boolean;
}

export interface SideFormOptions {
  readonly budgetMs?: number;
  /** From this many inputs the symbolic (BDD) minimiser is used, as the analysis does. */
  readonly symbolicFrom?: number;
}

/** How long the sentence of one side may take to minimise (a shorter form is not needed to be exact). */
export const SIDE_FORM_BUDGET_MS = 500;

/**
 * The minimal AND/OR form of one side: its set is the on-set; combinations not judged
 * (`unjudged`: the spec's don't-cares) may be used, since nothing there is a disagreement.
 */
export function sideForm(n: number, side: BitSet, unjudged: BitSet, options: SideFormOptions = {}): SideForm {
  const budgetMs = options.budgetMs ?? SIDE_FORM_BUDGET_MS;
  if (isEmpty(side)) return { cubes: [], proven: true, coversUnjudged: false };
  const dc = minus(unjudged, side);
  const found = n >= (options.symbolicFrom ?? Infinity) ? symbolicForm(n, side, dc, budgetMs) : null;
  const { cubes, proven } = found ?? minimiseSop({ n, on: side, dc }, { budgetMs });
  const covered = emptySet(n);
  for (const c of cubes) cubeToSet(n, c, covered);
  return { cubes, proven, coversUnjudged: !isEmpty(intersect(covered, dc)) };
}

/** The symbolic minimiser over the side's disjoint cubes; null when the diagrams grow too large. */
function symbolicForm(n: number, side: BitSet, dc: BitSet, budgetMs: number): { cubes: Cube[]; proven: boolean } | null {
  try {
    const dd = new Dd(n);
    const of = (set: BitSet) => setToCubes(n, set).reduce((f, c) => dd.or(f, dd.cube(toWide(c))), FALSE);
    const form = minimiseWide({ dd, on: of(side), dc: of(dc) }, { budgetMs });
    return { cubes: form.cubes.map(toNarrow), proven: form.proven };
  } catch (e) {
    if (e instanceof DdTooLarge) return null;
    throw e;
  }
}

/** A form as a condition on the inputs: "Guard_closed = 0 AND Run = 1", terms joined by OR. */
export function conditionText(n: number, cubes: readonly (Cube | WideCube)[], signals: readonly Pick<Signal, 'identifier'>[]): string {
  if (cubes.length === 0) return 'never';
  const terms = cubes.map((narrowOrWide) => {
    const c = typeof narrowOrWide.mask === 'bigint' ? (narrowOrWide as WideCube) : toWide(narrowOrWide as Cube);
    const literals: string[] = [];
    for (let i = 0; i < n; i++) {
      const bit = 1n << BigInt(n - 1 - i);
      if (c.mask & bit) literals.push(`${signals[i]?.identifier ?? `input ${i + 1}`} = ${c.bits & bit ? 1 : 0}`);
    }
    return literals;
  });
  if (terms.some((t) => t.length === 0)) return 'always';
  return terms.map((t) => (t.length > 1 && terms.length > 1 ? `(${t.join(' AND ')})` : t.join(' AND '))).join(' OR ');
}

/** A side of a wide check (BDDs over up to 64 inputs) as its minimal AND/OR form, as `sideForm`. */
export function wideSideForm(dd: Dd, side: Node, unjudged: Node, budgetMs = SIDE_FORM_BUDGET_MS): SideForm {
  if (side === FALSE) return { cubes: [], proven: true, coversUnjudged: false };
  const dc = dd.minus(unjudged, side);
  const form = minimiseWide({ dd, on: side, dc }, { budgetMs });
  const covered = form.cubes.reduce((f, c) => dd.or(f, dd.cube(c)), FALSE);
  return { cubes: form.cubes, proven: form.proven, coversUnjudged: dd.and(covered, dc) !== FALSE };
}

const SIDE_WORD: Readonly<Record<CounterexampleKind, string>> = { unsafe: 'unsafe', 'spurious-trip': 'spurious trip' };

/** One side described for a person: the condition, and the sentence that carries it. */
export interface SideSentence {
  /** "Guard_closed = 0 AND Run = 1" ("always" when every judged combination is on this side). */
  readonly condition: string;
  /** "unsafe exactly when Guard_closed = 0 AND Run = 1", with what the form is not (heuristic, exact only where judged). */
  readonly sentence: string;
  readonly proven: boolean;
  readonly coversUnjudged: boolean;
}

/** The plain sentence of one side, or undefined when the side is empty. */
export function sideSentence(kind: CounterexampleKind, n: number, form: SideForm, signals: readonly Pick<Signal, 'identifier'>[]): SideSentence | undefined {
  if (form.cubes.length === 0) return undefined;
  const word = SIDE_WORD[kind];
  const condition = conditionText(n, form.cubes, signals);
  const head = condition === 'always' ? `${word} on every combination judged` : `${word} exactly when ${condition}`;
  const notes = [...(form.coversUnjudged ? ['on the combinations the spec judges'] : []), ...(form.proven ? [] : ['a short form, not proven minimal'])];
  return { condition, sentence: notes.length > 0 ? `${head} (${notes.join('; ')})` : head, proven: form.proven, coversUnjudged: form.coversUnjudged };
}
