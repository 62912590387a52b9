// Two revisions of a spec table compared by behaviour: signals matched (renamed, added,
// removed), per output the exact change over every joint combination, the rows that differ as
// context, and the AND/OR forms before and after.
import { cubeToPattern, signalIndex, type Cube, type Signal } from '../logic/index.js';
import { revisionStamp } from '../report/index.js';
import { analyseTable, type AnalyseOptions, type TableAnalysis } from '../analysis/index.js';
import type { Problem, SpecTable } from '../table/index.js';
import { behaviourChange, behaviourChanged, remapCube, removedInputsUsed, type BehaviourChange, type JointInputs } from './behaviour.js';
import { matchSignals, type Rename, type SignalMatch } from './match.js';

export interface FormChange {
  /** Structured Text of the AND/OR form. */
  readonly text: string;
  /** Its product terms over the joint inputs. */
  readonly terms: readonly Cube[];
}

export interface OutputComparison {
  /** The output's header (the new one where it has one). */
  readonly name: string;
  readonly identifier: string;
  /** compared: in both; added/removed: in one revision only; not-compared: see the table's problems. */
  readonly status: 'compared' | 'added' | 'removed' | 'not-compared';
  readonly renamedFrom?: string;
  readonly safe: { readonly old?: 0 | 1; readonly new?: 0 | 1 };
  readonly change?: BehaviourChange;
  readonly before?: FormChange;
  readonly after?: FormChange;
  /** Whether the output behaves otherwise (also true for an output added, removed or not compared). */
  readonly changed: boolean;
}

export interface RowChange {
  readonly kind: 'added' | 'removed' | 'changed';
  /** Input pattern over the joint inputs. */
  readonly pattern: string;
  readonly oldCells?: string;
  readonly newCells?: string;
  /** Values of the outputs both revisions have, in the new order: "1-0". */
  readonly oldValues?: string;
  readonly newValues?: string;
}

export interface TableComparison {
  readonly old: TableAnalysis;
  readonly new: TableAnalysis;
  readonly oldStamp: string;
  readonly newStamp: string;
  /** The inputs every change is stated over: the new table's, in its order. */
  readonly inputs: readonly Signal[];
  readonly joint: JointInputs;
  readonly inputMatch: SignalMatch;
  readonly outputMatch: SignalMatch;
  readonly outputs: readonly OutputComparison[];
  readonly rows: readonly RowChange[];
  /** What kept the comparison from being complete (errors), with what to give. */
  readonly problems: readonly Problem[];
  readonly changed: boolean;
}

export interface CompareOptions {
  /** Old signal -> new signal, where neither identifier nor header pairs them. */
  readonly renames?: readonly Rename[];
}

export function compareTables(oldTable: SpecTable, newTable: SpecTable, options: AnalyseOptions & CompareOptions = {}): TableComparison {
  return compareAnalyses(analyseTable(oldTable, options), analyseTable(newTable, options), options);
}

export function compareAnalyses(oldA: TableAnalysis, newA: TableAnalysis, options: CompareOptions = {}): TableComparison {
  const oldT = oldA.table;
  const newT = newA.table;
  const renames = options.renames ?? [];
  const oldOutputs = oldT.outputs.map((o) => o.signal);
  const newOutputs = newT.outputs.map((o) => o.signal);
  const inputMatch = matchSignals(oldT.inputs, newT.inputs, renames);
  const outputMatch = matchSignals(oldOutputs, newOutputs, renames);
  const oldToJoint = oldT.inputs.map((_, i) => inputMatch.pairs.find((p) => p.oldIndex === i)?.newIndex ?? -1);
  const joint: JointInputs = { n: newT.inputs.length, nOld: oldT.inputs.length, oldToJoint };
  const problems: Problem[] = [];
  if (inputMatch.pairs.length === 0 && outputMatch.pairs.length === 0)
    problems.push({
      severity: 'error',
      code: 'tables-unrelated',
      sheet: newT.sheet,
      cell: newT.range,
      message: `the old table (${oldT.sheet}!${oldT.range}) and the new one share no signal by identifier or header: choose the pair with --old-sheet/--old-range and --new-sheet/--new-range`,
    });

  for (const [from, to] of renames) {
    const pairs = [...inputMatch.pairs, ...outputMatch.pairs];
    if (!pairs.some((p) => signalIndex([p.old], from) === 0 && signalIndex([p.new], to) === 0))
      problems.push({
        severity: 'error',
        code: 'rename-unknown',
        sheet: newT.sheet,
        cell: newT.range,
        message: `--rename ${from}=${to}: the old table has no free signal "${from}" or the new one no free signal "${to}" of the same role`,
      });
  }

  // Per removed input: which old outputs depend on it (the comparison of those is undefined).
  const usedBy = new Map<number, string[]>();
  const notCompared = new Set<number>();
  outputMatch.pairs.forEach((p) => {
    for (const i of removedInputsUsed(joint, oldT.outputs[p.oldIndex]!)) {
      usedBy.set(i, [...(usedBy.get(i) ?? []), p.old.header]);
      notCompared.add(p.newIndex);
    }
  });
  for (const [i, outs] of usedBy) {
    const header = oldT.inputs[i]!.header;
    problems.push({
      severity: 'error',
      code: 'removed-input-used',
      sheet: oldT.sheet,
      cell: oldT.headerCells[i]!,
      message:
        `input "${header}" is not in the new table, but in the old one ${outs.join(', ')} differ between ${header} = 0 and ${header} = 1, ` +
        `so the two cannot be compared: map it to a signal of the new table (--rename "${header}=NEW NAME"), give the new table a column with the same header or identifier, or choose the old table with --old-sheet/--old-range`,
    });
  }

  const outputs: OutputComparison[] = [];
  const formOf = (a: TableAnalysis, j: number, remap: boolean): FormChange => {
    const form = a.outputs[j]!.andOr;
    return { text: form.text, terms: remap ? form.cubes.map((c) => remapCube(joint, c)) : form.cubes };
  };
  for (const p of outputMatch.pairs) {
    const oldSpec = oldT.outputs[p.oldIndex]!;
    const newSpec = newT.outputs[p.newIndex]!;
    const base = {
      name: p.new.header,
      identifier: p.new.identifier,
      ...(p.renamed ? { renamedFrom: p.old.header } : {}),
      safe: { old: oldSpec.safe, new: newSpec.safe },
      before: formOf(oldA, p.oldIndex, true),
      after: formOf(newA, p.newIndex, false),
    };
    if (notCompared.has(p.newIndex)) {
      outputs.push({ ...base, status: 'not-compared', changed: true });
      continue;
    }
    const change = behaviourChange(joint, oldSpec, newSpec);
    outputs.push({ ...base, status: 'compared', change, changed: behaviourChanged(change) || oldSpec.safe !== newSpec.safe });
  }
  for (const r of outputMatch.removed)
    outputs.push({ name: r.signal.header, identifier: r.signal.identifier, status: 'removed', safe: { old: oldT.outputs[r.index]!.safe }, before: formOf(oldA, r.index, true), changed: true });
  for (const a of outputMatch.added)
    outputs.push({ name: a.signal.header, identifier: a.signal.identifier, status: 'added', safe: { new: newT.outputs[a.index]!.safe }, after: formOf(newA, a.index, false), changed: true });

  return {
    old: oldA,
    new: newA,
    oldStamp: revisionStamp(oldT),
    newStamp: revisionStamp(newT),
    inputs: newT.inputs,
    joint,
    inputMatch,
    outputMatch,
    outputs,
    rows: rowChanges(oldT, newT, joint, outputMatch),
    problems,
    changed: problems.length > 0 || outputs.some((o) => o.changed),
  };
}

/**
 * The rows that differ, as context for a reviewer: rows are keyed by their input pattern (over
 * the joint inputs) and the values of the outputs both revisions have, so a reordered row is
 * no change; a pattern kept with other values is a changed row.
 */
function rowChanges(oldT: SpecTable, newT: SpecTable, joint: JointInputs, outputs: SignalMatch): RowChange[] {
  const described = (t: SpecTable, isOld: boolean) =>
    t.rows.map((r) => ({
      pattern: cubeToPattern(joint.n, isOld ? remapCube(joint, r.cube) : r.cube),
      values: outputs.pairs.map((p) => String(r.values[isOld ? p.oldIndex : p.newIndex])).join(''),
      cells: r.cells,
    }));
  const olds = described(oldT, true);
  const news = described(newT, false);
  type Described = (typeof olds)[number];
  // Rows the same in both are taken out as a multiset, then a pattern left on both sides is a changed row.
  const bucket = (rows: Described[], by: (r: Described) => string): Map<string, Described[]> => {
    const m = new Map<string, Described[]>();
    for (const r of rows) m.set(by(r), [...(m.get(by(r)) ?? []), r]);
    return m;
  };
  const whole = (r: Described): string => `${r.pattern}|${r.values}`;
  const newWhole = bucket(news, whole);
  const leftOld = olds.filter((o) => newWhole.get(whole(o))?.shift() === undefined);
  const leftNew = [...newWhole.values()].flat();
  const newByPattern = bucket(leftNew, (r) => r.pattern);
  const paired = new Set<Described>();
  const out: RowChange[] = [];
  for (const o of leftOld) {
    const n = newByPattern.get(o.pattern)?.shift();
    if (n === undefined) out.push({ kind: 'removed', pattern: o.pattern, oldCells: o.cells, oldValues: o.values });
    else {
      paired.add(n);
      out.push({ kind: 'changed', pattern: o.pattern, oldCells: o.cells, newCells: n.cells, oldValues: o.values, newValues: n.values });
    }
  }
  const unpaired = new Set(leftNew.filter((n) => !paired.has(n)));
  for (const n of news) if (unpaired.has(n)) out.push({ kind: 'added', pattern: n.pattern, newCells: n.cells, newValues: n.values });
  return out;
}
