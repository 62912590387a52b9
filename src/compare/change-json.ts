// The comparison as plain JSON data: combinations as patterns over the joint inputs, leftmost
// first ('-' = any), as the analysis JSON writes them.
import { cubeToPattern } from '../logic/index.js';
import { CAUTION } from '../report/index.js';
import type { Problem } from '../table/index.js';
import type { ChangeSet } from './behaviour.js';
import type { TableComparison } from './compare.js';
import type { Retest } from './retest.js';

/** The change kinds in the order they are reported: the dangerous direction first. */
export const CHANGE_KINDS = ['nowPermits', 'nowTrips', 'dontCareChanged', 'gapsOpened', 'gapsClosed', 'conflictsNew', 'conflictsGone'] as const;
export type ChangeKind = (typeof CHANGE_KINDS)[number];

/** A problem as the JSON documents write it. */
export const problemJson = (p: Problem) => ({ severity: p.severity, code: p.code, sheet: p.sheet, cell: p.cell, message: p.message });

export function comparisonJson(c: TableComparison, retest?: Retest) {
  const n = c.joint.n;
  const setJson = (s: ChangeSet | undefined) =>
    s === undefined ? null : { count: s.count, cubes: s.cubes.map((x) => cubeToPattern(n, x)), ...(s.cut ? { cut: true } : {}) };
  const signals = (role: 'input' | 'output', m: TableComparison['inputMatch']) => ({
    renamed: m.pairs.filter((p) => p.renamed).map((p) => ({ role, identifier: p.new.identifier, old: p.old.header, new: p.new.header })),
    added: m.added.map((a) => ({ role, header: a.signal.header, identifier: a.signal.identifier })),
    removed: m.removed.map((r) => ({ role, header: r.signal.header, identifier: r.signal.identifier })),
  });
  const ins = signals('input', c.inputMatch);
  const outs = signals('output', c.outputMatch);
  return {
    caution: CAUTION,
    old: { sheet: c.old.table.sheet, range: c.old.table.range, revision: c.oldStamp },
    new: { sheet: c.new.table.sheet, range: c.new.table.range, revision: c.newStamp },
    inputs: c.inputs.map((s) => s.header),
    changed: c.changed,
    signals: { renamed: [...ins.renamed, ...outs.renamed], added: [...ins.added, ...outs.added], removed: [...ins.removed, ...outs.removed] },
    outputs: c.outputs.map((o) => ({
      name: o.name,
      identifier: o.identifier,
      status: o.status,
      changed: o.changed,
      ...(o.renamedFrom !== undefined ? { renamedFrom: o.renamedFrom } : {}),
      safe: o.safe,
      ...Object.fromEntries(CHANGE_KINDS.map((k) => [k, setJson(o.change?.[k])])),
      andOrBefore: o.before?.text ?? null,
      andOrAfter: o.after?.text ?? null,
      ...(retest
        ? {
            retest: {
              repeat: retest.repeat.filter((e) => e.outputs.includes(o.name)).map((e) => e.testId),
              newSteps: retest.newRecord.filter((s) => s.status === 'new' && s.outputs.includes(o.identifier)).map((s) => s.testId),
            },
          }
        : {}),
    })),
    rows: c.rows,
    ...(retest
      ? {
          retest: {
            source: retest.source,
            stillValid: retest.stillValid.map((e) => e.testId),
            repeat: retest.repeat.map((e) => ({ testId: e.testId, step: e.step, reasons: e.reasons })),
            dropped: retest.dropped.map((e) => ({ testId: e.testId, step: e.step, reasons: e.reasons })),
            newSteps: retest.newRecord.filter((s) => s.status === 'new').map((s) => s.testId),
            newRecord: retest.newRecord.map((s) => ({ step: s.step, testId: s.testId, status: s.status, old: s.old })),
          },
        }
      : {}),
    problems: [...c.problems, ...(retest?.problems ?? [])].map(problemJson),
  };
}
