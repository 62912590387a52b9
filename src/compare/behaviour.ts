// The behaviour of one output before and after an edit, compared on every combination of the
// joint inputs (those of the new table, in its order) with bit sets: what is ON, OFF or
// don't-care in each revision, where the rows leave gaps and where they conflict.
import {
  count,
  cube,
  cubeToSet,
  emptySet,
  equals,
  flipBit,
  intersect,
  minus,
  offSet,
  setToCubes,
  symmetricDifference,
  union,
  type BitSet,
  type BoolFunction,
  type Cube,
} from '../logic/index.js';
import { gapCubes, type OutputSpec } from '../table/index.js';

/**
 * How the old table's inputs sit among the joint inputs: `oldToJoint[i]` is the joint position
 * of old input i, or -1 for an input the new table no longer has (compared as "any": the old
 * function must not depend on it).
 */
export interface JointInputs {
  readonly n: number;
  readonly nOld: number;
  readonly oldToJoint: readonly number[];
}

/** A cube over the old inputs as a cube over the joint inputs (removed inputs left free). */
export function remapCube(joint: JointInputs, c: Cube): Cube {
  let mask = 0;
  let bits = 0;
  joint.oldToJoint.forEach((p, i) => {
    const from = 1 << (joint.nOld - 1 - i);
    if (p < 0 || !(c.mask & from)) return;
    const to = 1 << (joint.n - 1 - p);
    mask |= to;
    if (c.bits & from) bits |= to;
  });
  return cube(mask, bits);
}

function isIdentity(joint: JointInputs): boolean {
  return joint.n === joint.nOld && joint.oldToJoint.every((p, i) => p === i);
}

/** A set over the old inputs as a set over the joint ones, through its disjoint cubes. */
export function remapSet(joint: JointInputs, set: BitSet): BitSet {
  if (isIdentity(joint)) return set.slice();
  const out = emptySet(joint.n);
  for (const c of setToCubes(joint.nOld, set)) cubeToSet(joint.n, remapCube(joint, c), out);
  return out;
}

/** Whether membership in the set changes with old input i somewhere. */
export function dependsOn(nOld: number, set: BitSet, i: number): boolean {
  return !equals(set, flipBit(set, nOld - 1 - i));
}

/** A set of joint combinations: how many, and as disjoint cubes (sorted; `cut` when too many to list). */
export interface ChangeSet {
  readonly count: number;
  readonly cubes: readonly Cube[];
  readonly cut: boolean;
}

export function changeSet(n: number, set: BitSet): ChangeSet {
  const { cubes, cut } = gapCubes(n, set);
  return { count: count(set), cubes, cut };
}

export interface BehaviourChange {
  /** Safe value (old) -> the other value (new): the dangerous direction. */
  readonly nowPermits: ChangeSet;
  /** The other value (old) -> safe value (new). */
  readonly nowTrips: ChangeSet;
  /** Don't-care in one revision, specified in the other. */
  readonly dontCareChanged: ChangeSet;
  /** Covered by a row before, by none now (the safe value applies). */
  readonly gapsOpened: ChangeSet;
  readonly gapsClosed: ChangeSet;
  readonly conflictsNew: ChangeSet;
  readonly conflictsGone: ChangeSet;
  /** Every joint combination whose value changed (permits, trips, don't-care), for the retest. */
  readonly changed: BitSet;
}

/** The sets of one output that may change, over the inputs of its own table. */
interface OutputSets {
  readonly on: BitSet;
  readonly dc: BitSet;
  readonly off: BitSet;
  readonly gaps: BitSet;
  readonly conflicted: BitSet;
}

function setsOf(spec: OutputSpec): OutputSets {
  const fn: BoolFunction = spec.built.fn;
  return { on: fn.on, dc: fn.dc, off: offSet(fn), gaps: spec.built.gaps, conflicted: spec.built.conflicted };
}

/** The old inputs (by index) that the old output's values, gaps or conflicts depend on but the new table lacks. */
export function removedInputsUsed(joint: JointInputs, oldSpec: OutputSpec): number[] {
  const sets = Object.values(setsOf(oldSpec));
  return joint.oldToJoint.flatMap((p, i) => (p < 0 && sets.some((s) => dependsOn(joint.nOld, s, i)) ? [i] : []));
}

/**
 * The change of one output, exact over every joint combination. Gaps and conflicts take the
 * safe value in both revisions (as the functions do), so a gap opened where the old row asked
 * for the safe value changes no behaviour. The direction is judged by the new safe value.
 * Call only when `removedInputsUsed` is empty.
 */
export function behaviourChange(joint: JointInputs, oldSpec: OutputSpec, newSpec: OutputSpec): BehaviourChange {
  const o = setsOf(oldSpec);
  const before: OutputSets = {
    on: remapSet(joint, o.on),
    dc: remapSet(joint, o.dc),
    off: remapSet(joint, o.off),
    gaps: remapSet(joint, o.gaps),
    conflicted: remapSet(joint, o.conflicted),
  };
  const after = setsOf(newSpec);
  const safeSet = (s: OutputSets, safe: 0 | 1): BitSet => (safe === 1 ? s.on : s.off);
  const otherSet = (s: OutputSets, safe: 0 | 1): BitSet => (safe === 1 ? s.off : s.on);
  const n = joint.n;
  const safe = newSpec.safe;
  const permits = intersect(safeSet(before, safe), otherSet(after, safe));
  const trips = intersect(otherSet(before, safe), safeSet(after, safe));
  const dontCare = symmetricDifference(before.dc, after.dc);
  return {
    nowPermits: changeSet(n, permits),
    nowTrips: changeSet(n, trips),
    dontCareChanged: changeSet(n, dontCare),
    gapsOpened: changeSet(n, minus(after.gaps, before.gaps)),
    gapsClosed: changeSet(n, minus(before.gaps, after.gaps)),
    conflictsNew: changeSet(n, minus(after.conflicted, before.conflicted)),
    conflictsGone: changeSet(n, minus(before.conflicted, after.conflicted)),
    changed: union(union(permits, trips), dontCare),
  };
}

/** Whether what the output does changed: it permits, trips or leaves free somewhere else. */
export function behaviourChanged(c: BehaviourChange): boolean {
  return c.nowPermits.count > 0 || c.nowTrips.count > 0 || c.dontCareChanged.count > 0;
}
