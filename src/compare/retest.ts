// Which steps of the old commissioning test record still hold after an edit, which must be
// repeated (a value they expect changed, or a product term they test is not in the new form),
// and which steps of the new record are new. The new record marks each step.
import {
  cube,
  cubeContains,
  cubeMeetsSet,
  has,
  popcount,
  printSt,
  sopToExpr,
  type Combination,
  type Cube,
} from '../logic/index.js';
import {
  stepTable,
  testRecordSheet,
  type BlockCell,
  type FilledRecord,
  type RecordOptions,
  type SheetBlock,
  type StepResult,
} from '../report/index.js';
import { qualifiedAddress, type Problem } from '../table/index.js';
import { remapCube } from './behaviour.js';
import type { TableComparison } from './compare.js';

/** One step of the old record: its test ID, its combination of the old inputs, the outputs it tests. */
export interface OldStep {
  readonly step: number;
  readonly testId: string;
  readonly combination: Combination;
  readonly outputs: readonly string[];
  /** What the filled-in record says of it, when read from one. */
  readonly result?: StepResult;
}

export interface RetestEntry {
  readonly step: number;
  readonly testId: string;
  /** Why it must be repeated or no longer applies; empty for a step still valid. */
  readonly reasons: readonly string[];
  /** Headers of the outputs whose change makes it a repeat. */
  readonly outputs: readonly string[];
}

export type NewStepStatus = 'repeat' | 'new' | 'still valid';

export interface NewRecordStep {
  readonly step: number;
  readonly testId: string;
  /** Identifiers of the outputs the new step tests. */
  readonly outputs: readonly string[];
  readonly status: NewStepStatus;
  /** Test IDs of the old steps at this combination. */
  readonly old: readonly string[];
}

export interface Retest {
  /** Where the old steps came from: a filled-in record, or the old table's own selection. */
  readonly source: 'record' | 'old table';
  readonly stillValid: readonly RetestEntry[];
  readonly repeat: readonly RetestEntry[];
  /** Steps that test only outputs the new table no longer has. */
  readonly dropped: readonly RetestEntry[];
  /** Each step of the new record, and whether it repeats an old step, is new, or still holds. */
  readonly newRecord: readonly NewRecordStep[];
  readonly problems: readonly Problem[];
}

/** The old table's own steps (the unique-cause selection), when no filled-in record is given. */
export function oldStepsOf(c: TableComparison): OldStep[] {
  return stepTable(c.old).rows.map((r) => ({ step: r.step, testId: r.testId, combination: r.combination, outputs: r.outputs }));
}

/**
 * The steps of a filled-in record (read by record-read.ts), checked against the old table: the
 * test IDs must be patterns of its inputs. A record of another revision is a warning (its steps
 * are still read). The outputs a step tests are those the old table's selection gives it (all
 * outputs for a step that selection does not have).
 */
export function oldStepsFromRecord(c: TableComparison, record: FilledRecord): { steps: OldStep[]; problems: Problem[] } {
  const n = c.old.inputs.length;
  const problems: Problem[] = [...record.problems];
  const selected = new Map(stepTable(c.old).rows.map((r) => [r.testId, r.outputs]));
  const every = c.old.outputs.map((o) => o.signal.identifier);
  const at = (severity: Problem['severity'], code: string, message: string): Problem => ({ severity, code, sheet: record.sheet, cell: 'A1', message });
  if (record.stamp !== c.oldStamp)
    problems.push(at('warning', 'record-other-revision', `the record's revision stamp ${record.stamp || '(none)'} is not the old table's (${c.oldStamp}): it was made from another revision`));
  const steps: OldStep[] = [];
  for (const s of record.steps) {
    const bits = s.testId.slice(2);
    if (bits.length !== n) {
      problems.push(at('error', 'record-mismatch', `step ${s.step} (${s.testId}) sets ${bits.length} inputs, the old table has ${n}: give the record of this table (--old-record)`));
      continue;
    }
    steps.push({ step: s.step, testId: s.testId, combination: parseInt(bits, 2), outputs: selected.get(s.testId) ?? every, result: s.result });
  }
  return { steps, problems };
}

/**
 * The terms a step tests, as the unique-cause steps are chosen: a step where the output is ON
 * tests the terms it lies in; a step where it is OFF, the terms one literal away (the flip).
 */
function testedTerms(terms: readonly Cube[], k: Combination, on: boolean): Cube[] {
  return terms.filter((t) => popcount((k ^ t.bits) & t.mask) === (on ? 0 : 1));
}

export function selectRetest(c: TableComparison, old: readonly OldStep[], source: Retest['source'], problems: readonly Problem[] = []): Retest {
  const { joint } = c;
  const full = (1 << joint.nOld) - 1;
  const stillValid: RetestEntry[] = [];
  const repeat: RetestEntry[] = [];
  const dropped: RetestEntry[] = [];
  const oldInputs = c.old.inputs;
  const verdict = new Map<OldStep, boolean>(); // true = must be repeated
  for (const s of old) {
    const reasons: string[] = [];
    const concerned = new Set<string>();
    const because = (output: string, why: string): void => {
      concerned.add(output);
      reasons.push(`${output}: ${why}`);
    };
    const at = remapCube(joint, cube(full, s.combination));
    if (s.result !== undefined && s.result !== 'passed') reasons.push(`the old record shows it ${s.result}`);
    for (const o of c.outputs) {
      if (o.status === 'compared' && cubeMeetsSet(joint.n, at, o.change!.changed)) because(o.name, 'the expected value changed');
      if (o.status === 'not-compared') because(o.name, 'not compared (see the problems)');
    }
    const tested = s.outputs.map((id) => c.outputMatch.pairs.find((p) => p.old.identifier.toLowerCase() === id.toLowerCase()));
    tested.forEach((p) => {
      if (!p) return;
      const after = c.outputs.find((o) => o.identifier === p.new.identifier)!.after!.terms;
      const isOn = has(c.old.table.outputs[p.oldIndex]!.built.fn.on, s.combination);
      for (const term of testedTerms(c.old.outputs[p.oldIndex]!.andOr.cubes, s.combination, isOn)) {
        const mapped = remapCube(joint, term);
        if (!after.some((t) => t.mask === mapped.mask && t.bits === mapped.bits))
          because(p.new.header, `the term ${printSt(sopToExpr([term], oldInputs))} it tests is not in the new AND/OR form`);
      }
    });
    const entry = { step: s.step, testId: s.testId, reasons, outputs: [...concerned] };
    if (s.outputs.length > 0 && tested.every((p) => p === undefined)) {
      dropped.push({ ...entry, reasons: [`tests only outputs the new table no longer has (${s.outputs.join(', ')})`] });
      continue;
    }
    verdict.set(s, reasons.length > 0);
    (reasons.length > 0 ? repeat : stillValid).push(entry);
  }
  const newRecord = stepTable(c.new).rows.map((r) => {
    const same = [...verdict].filter(([s]) => cubeContains(remapCube(joint, cube(full, s.combination)), r.combination));
    const status: NewStepStatus = same.some(([, again]) => again) ? 'repeat' : same.length > 0 ? 'still valid' : 'new';
    return { step: r.step, testId: r.testId, outputs: r.outputs, status, old: same.map(([s]) => s.testId) };
  });
  return { source, stillValid, repeat, dropped, newRecord, problems };
}

/** What the Retest column of the new record says of a step. */
function statusText(s: NewRecordStep): string {
  if (s.status === 'new') return 'new step';
  const of = s.old.join(', ');
  return s.status === 'repeat' ? `repeat (old ${of})` : `still valid (old ${of}): need not be repeated`;
}

/** The new commissioning test record, with a Retest column saying of each step whether it repeats an old one. */
export function retestRecordSheet(c: TableComparison, retest: Retest, options: RecordOptions = {}): SheetBlock {
  const sheet = testRecordSheet(c.new, options);
  const head = sheet.rows.findIndex((r) => r[0]?.value === 'Step' && r[1]?.value === 'Test ID');
  const width = sheet.rows[head]!.length;
  const byId = new Map(retest.newRecord.map((s) => [s.testId, s]));
  const rows = sheet.rows.map((r, i): readonly (BlockCell | null)[] => {
    if (i === head) return [...r, { value: 'Retest', style: 'heading' }];
    const step = i > head ? byId.get(String(r[1]?.value)) : undefined;
    if (!step) return r;
    const padded = [...r, ...Array.from({ length: width - r.length }, () => null)];
    return [...padded, { value: statusText(step) }];
  });
  const note = `Retest after the change of ${qualifiedAddress(c.old.table.sheet, c.old.table.range)}: the last column says which steps repeat the old record's`;
  return {
    ...sheet,
    name: sheet.name.replace(/ record$/, ' retest').slice(0, 31),
    rows: [...rows.slice(0, head), [{ value: note, style: 'label' }], ...rows.slice(head)],
    // The note row goes above the column titles, which stay frozen and print on every page.
    ...(sheet.freezeRows !== undefined ? { freezeRows: sheet.freezeRows + 1 } : {}),
    ...(sheet.print ? { print: { ...sheet.print, titleRows: { first: sheet.print.titleRows.first + 1, last: sheet.print.titleRows.last + 1 } } } : {}),
    columnWidths: [...(sheet.columnWidths ?? []), 44],
  };
}

/** The record of the old table among those read: by revision stamp, else by the table it names. */
export function recordFor(c: TableComparison, records: readonly FilledRecord[]): FilledRecord | undefined {
  const { sheet, range } = c.old.table;
  return records.find((r) => r.stamp === c.oldStamp) ?? records.find((r) => r.table.sheet === sheet && r.table.range === range);
}
