// The AND/OR form of a union of row cubes without a decision diagram (cube-list.ts): each row
// expanded to a prime of the union, rows another term already covers skipped, terms the
// others cover dropped. Never claimed minimal unless its lower bound meets it: the bound is a
// set of ON combinations no two of which one implicant holds (each needs a term of its own).
// The proof is separate and exact: every term lies inside the union and every row inside the
// terms, so the form equals the union on every one of the 2^n combinations.
import { coveredBy, pointOutside, UNKNOWN, type Unknown } from './cube-list.js';
import type { Deadline } from './deadline.js';
import type { FormBound } from './sop.js';
import { ANY, compareWidePrinted, inputBit, wideContains, wideLiterals, wideWithin, type WideCombination, type WideCube } from './wide-cube.js';

export interface RowCover {
  readonly cubes: WideCube[];
  readonly terms: number;
  readonly literals: number;
  readonly proven: boolean;
  readonly lowerBound: FormBound;
}

/** Drop literals, leftmost input first, while the cube stays inside the union (UNKNOWN keeps the literal). */
function expand(n: number, c: WideCube, on: readonly WideCube[], deadline: Deadline): WideCube {
  let out = c;
  for (let i = 0; i < n; i++) {
    const bit = inputBit(n, i);
    if (!(out.mask & bit)) continue;
    // The wider cube is inside the union when its other half is.
    const otherHalf = { mask: out.mask, bits: out.bits ^ bit };
    if (coveredBy(n, otherHalf, on, deadline) === true) out = { mask: out.mask & ~bit, bits: out.bits & ~bit };
  }
  return out;
}

/**
 * A cover of the union of `on` (rows' cubes) by primes of it. Past the deadline a question
 * left open keeps what is there (a literal, a row, a term): still a cover of the rows, less
 * small, its bound what was shown by then.
 */
export function rowCover(n: number, on: readonly WideCube[], deadline: Deadline): RowCover {
  if (on.length === 0) return result(n, [], { terms: 0, literals: 0 });
  if (on.some((c) => c.mask === 0n)) return result(n, [ANY], { terms: 1, literals: 0 });
  const rows = [...on].sort((a, b) => wideLiterals(a) - wideLiterals(b));
  const taken: WideCube[] = [];
  for (const r of rows) {
    if (taken.some((t) => wideWithin(r, t))) continue;
    if (coveredBy(n, r, taken, deadline) === true) continue;
    const prime = expand(n, r, on, deadline);
    if (!taken.some((t) => wideWithin(prime, t))) taken.push(prime);
  }
  const kept = irredundant(n, taken, on, deadline);
  const bound = independentWitnesses(n, kept.witnesses, on, deadline);
  return result(n, kept.terms, { terms: bound, literals: bound });
}

function result(n: number, cubes: WideCube[], lowerBound: FormBound): RowCover {
  const sorted = [...cubes].sort(compareWidePrinted(n));
  const literals = sorted.reduce((k, c) => k + wideLiterals(c), 0);
  return { cubes: sorted, terms: sorted.length, literals, lowerBound, proven: lowerBound.terms === sorted.length && lowerBound.literals === literals };
}

/**
 * Drop, dearest first, each term whose rows the other terms cover; for each term kept, an ON
 * combination only it holds (the witnesses the bound is built from; none where the clock ran out).
 */
function irredundant(n: number, terms: readonly WideCube[], on: readonly WideCube[], deadline: Deadline): { terms: WideCube[]; witnesses: WideCombination[] } {
  const order = terms.map((_, i) => i).sort((a, b) => wideLiterals(terms[b]!) - wideLiterals(terms[a]!));
  const kept = new Set(terms.map((_, i) => i));
  const witness = new Map<number, WideCombination>();
  for (const i of order) {
    kept.delete(i);
    const others = [...kept].map((j) => terms[j]!);
    let alone: WideCombination | Unknown | null = null;
    for (const r of on) {
      if (((r.bits ^ terms[i]!.bits) & r.mask & terms[i]!.mask) !== 0n) continue;
      alone = pointOutside(n, r, others, deadline);
      if (alone !== null) break;
    }
    if (alone === null) continue;
    kept.add(i);
    if (alone !== UNKNOWN) witness.set(i, alone);
  }
  const ids = [...kept].sort((a, b) => a - b);
  return { terms: ids.map((i) => terms[i]!), witnesses: ids.flatMap((i) => (witness.has(i) ? [witness.get(i)!] : [])) };
}

/**
 * How many of the witnesses pairwise share no implicant of the union (their smallest common
 * cube leaves it): greedily, in order. Past the deadline the set so far (still a bound).
 */
function independentWitnesses(n: number, witnesses: readonly WideCombination[], on: readonly WideCube[], deadline: Deadline): number {
  const chosen: WideCombination[] = [];
  for (const w of witnesses) {
    if (deadline.passed()) break;
    if (chosen.every((c) => apart(n, c, w, on, deadline) === true)) chosen.push(w);
  }
  return chosen.length;
}

/** Time to decide whether two witnesses share an implicant (ms). */
const APART_MS = 3;

/** No implicant of the union holds both a and b. */
function apart(n: number, a: WideCombination, b: WideCombination, on: readonly WideCube[], deadline: Deadline): boolean | Unknown {
  const same = ~(a ^ b) & ((1n << BigInt(n)) - 1n);
  const between: WideCube = { mask: same, bits: a & same };
  // Cheap first: the combination halfway between them often lies outside.
  const halfway = a ^ ((a ^ b) & 0x5555555555555555n);
  if (!on.some((c) => wideContains(c, halfway))) return true;
  // A few milliseconds each: a pair left undecided counts as sharing one (the bound stays true).
  const covered = coveredBy(n, between, on, deadline.at(deadline.clock() + APART_MS));
  return covered === UNKNOWN ? UNKNOWN : !covered;
}

/** What the proof of a cover against the union of its rows found. */
export type RowProof =
  | { readonly equal: true }
  /** A combination the form and the rows disagree on: ON in the form only, or in the rows only. */
  | { readonly equal: false; readonly at: WideCombination; readonly formOn: boolean }
  | Unknown;

/**
 * The form's terms against the union of `on`, on every combination: each term lies inside the
 * union, and each row inside the terms, or the first combination where not.
 */
export function proveRowCover(n: number, cubes: readonly WideCube[], on: readonly WideCube[], deadline: Deadline): RowProof {
  for (const [from, into, formOn] of [
    [cubes, on, true],
    [on, cubes, false],
  ] as const)
    for (const c of from) {
      const k = pointOutside(n, c, into, deadline);
      if (k === UNKNOWN) return UNKNOWN;
      if (k !== null) return { equal: false, at: k, formOn };
    }
  return { equal: true };
}
