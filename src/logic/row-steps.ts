// The unique-cause test steps (steps.ts, one algorithm) over sets written as cube lists: the
// combinations inside some cube of `inside` and inside none of `outside`. For a table whose
// rows have no decision diagram: every question the plan asks is then one search for a point
// (cube-list.ts). The function has no don't-cares: ON is the union of the ON rows' cubes.
import { pointOutside, UNKNOWN } from './cube-list.js';
import type { Deadline } from './deadline.js';
import type { Signal } from './signals.js';
import { causeSteps, type StepSets } from './steps.js';
import { ANY, inputBit, wideContains, wideDisjoint, type WideCombination, type WideCube } from './wide-cube.js';
import { wideStepTerms, type WideTestStep } from './wide-steps.js';

interface CubeSet {
  readonly inside: readonly WideCube[];
  readonly outside: readonly WideCube[];
  /** A product term of the form: inside ON (its proof showed it). */
  readonly term?: true;
}

/** The steps' searches ran past their time: no plan is given rather than a partial one. */
export class StepsTimedOut extends Error {}

/**
 * `uniqueCauseSteps` of the function ON = union of `on` (everything else OFF) and its AND/OR
 * form `cubes`, each proven inside ON. Throws StepsTimedOut past the deadline.
 */
export function rowUniqueCauseSteps(n: number, cubes: readonly WideCube[], on: readonly WideCube[], signals: readonly Signal[], deadline: Deadline): WideTestStep[] {
  // The plan asks whether a set is empty, then for its first point: one search each.
  const known = new WeakMap<CubeSet, WideCombination | undefined>();
  const point = (s: CubeSet): WideCombination | undefined => {
    if (known.has(s)) return known.get(s);
    let found: WideCombination | undefined;
    for (const c of s.inside) {
      const k = pointOutside(n, c, s.outside, deadline);
      if (k === UNKNOWN) throw new StepsTimedOut();
      if (k !== null) {
        found = k;
        break;
      }
    }
    known.set(s, found);
    return found;
  };
  const flipCube = (c: WideCube, bit: bigint): WideCube => (c.mask & bit ? { mask: c.mask, bits: c.bits ^ bit } : c);
  const onSet: CubeSet = { inside: on, outside: [] };
  const sets: StepSets<CubeSet, WideCombination> = {
    on: onSet,
    off: { inside: [ANY], outside: on },
    none: { inside: [], outside: [] },
    term: (j) => ({ inside: [cubes[j]!], outside: [], term: true }),
    or: (a, b) => {
      if (a.outside.length > 0 || b.outside.length > 0) throw new Error('bug: a union of cube sets with exclusions');
      return { inside: [...a.inside, ...b.inside], outside: [] };
    },
    and: (a, b) => {
      if (b === onSet && a.term) return a;
      if (a === onSet && b.term) return b;
      const inside = a.inside.flatMap((x) => b.inside.filter((y) => !wideDisjoint(x, y)).map((y) => ({ mask: x.mask | y.mask, bits: x.bits | y.bits })));
      return { inside, outside: [...a.outside, ...b.outside] };
    },
    minus: (a, b) => {
      if (b.outside.length > 0) throw new Error('bug: taking away a cube set with exclusions');
      return { inside: a.inside, outside: [...a.outside, ...b.inside] };
    },
    isEmpty: (s) => point(s) === undefined,
    first: point,
    has: (s, k) => s.inside.some((c) => wideContains(c, k)) && !s.outside.some((c) => wideContains(c, k)),
    flipInput: (s, input) => {
      const bit = inputBit(n, input);
      return { inside: s.inside.map((c) => flipCube(c, bit)), outside: s.outside.map((c) => flipCube(c, bit)) };
    },
    flip: (k, input) => k ^ inputBit(n, input),
  };
  return causeSteps(sets, wideStepTerms(n, cubes, signals), signals);
}
