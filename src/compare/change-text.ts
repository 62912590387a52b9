// The comparison as a readable report: the caution, both revisions, the signals matched, per
// output the combinations that now permit (the dangerous direction, first and marked), now trip,
// changed don't-care, opened or closed gaps, as small tables with one column per input; the
// rows that differ, the AND/OR forms before and after, and the retest.
import { cubeToPattern, type Cube, type Signal } from '../logic/index.js';
import { CAUTION_LINES, plural } from '../report/index.js';
import { qualifiedAddress, type Problem } from '../table/index.js';
import type { ChangeSet } from './behaviour.js';
import { CHANGE_KINDS, type ChangeKind } from './change-json.js';
import type { OutputComparison, TableComparison } from './compare.js';
import type { Retest } from './retest.js';

/** Cubes shown per change; the count is always complete. */
const SHOWN = 16;

/** What each change kind means, given the output's safe value. */
export function kindTitle(kind: ChangeKind, safe: 0 | 1): string {
  const other = safe === 1 ? 0 : 1;
  const titles: Record<ChangeKind, string> = {
    nowPermits: `NOW PERMITS (safe value ${safe} -> ${other})`,
    nowTrips: `Now trips (${other} -> safe value ${safe})`,
    dontCareChanged: "Don't-care changed (don't-care in one revision, specified in the other)",
    gapsOpened: `Gaps opened (no row covers them now; they take the safe value ${safe})`,
    gapsClosed: 'Gaps closed (a row covers them now)',
    conflictsNew: 'Conflicts new (rows ask for 1 and 0)',
    conflictsGone: 'Conflicts gone',
  };
  return titles[kind];
}

/** A small table: one column per input (its header), one row per cube, '-' = any. */
export function cubeTable(inputs: readonly Signal[], set: ChangeSet, indent = '      '): string[] {
  const n = inputs.length;
  const widths = inputs.map((s) => Math.max(1, s.header.length));
  const line = (cells: readonly string[]): string => indent + cells.map((c, i) => c.padEnd(widths[i]!)).join(' | ');
  const rows = set.cubes.slice(0, SHOWN).map((c: Cube) => line([...cubeToPattern(n, c)]));
  const more = set.cubes.length > SHOWN ? [`${indent}... ${set.cubes.length - SHOWN} more cubes (all in --json)`] : [];
  return [line(inputs.map((s) => s.header)), ...rows, ...more];
}

function outputLines(o: OutputComparison, inputs: readonly Signal[]): string[] {
  const renamed = o.renamedFrom !== undefined ? ` (was "${o.renamedFrom}")` : '';
  const head = `  ${o.name}${renamed}`;
  if (o.status === 'added') return [`${head}: ADDED in the new revision`, `    AND/OR form: ${o.after!.text}`];
  if (o.status === 'removed') return [`${head}: REMOVED in the new revision`, `    AND/OR form before: ${o.before!.text}`];
  if (o.status === 'not-compared') return [`${head}: NOT COMPARED (see the problems below)`];
  const change = o.change!;
  const lines = [`${head}: ${o.changed ? 'behaviour CHANGED' : 'behaviour identical on every combination'}`];
  if (o.safe.old !== o.safe.new) lines.push(`    safe value changed: ${o.safe.old} -> ${o.safe.new}`);
  const safe = o.safe.new!;
  for (const kind of CHANGE_KINDS) {
    const set = change[kind];
    if (set.count === 0) continue;
    const mark = kind === 'nowPermits' ? '  !! ' : '    ';
    lines.push(`${mark}${kindTitle(kind, safe)}: ${plural(set.count, 'combination')}`, ...cubeTable(inputs, set));
  }
  if (o.before!.text !== o.after!.text) lines.push(`    AND/OR form before: ${o.before!.text}`, `    AND/OR form after:  ${o.after!.text}`);
  else lines.push(`    AND/OR form (unchanged): ${o.after!.text}`);
  return lines;
}

function signalLines(c: TableComparison): string[] {
  const lines: string[] = [];
  for (const [role, m] of [
    ['input', c.inputMatch],
    ['output', c.outputMatch],
  ] as const) {
    for (const p of m.pairs.filter((p) => p.renamed)) lines.push(`  ${role} renamed: "${p.old.header}" -> "${p.new.header}" (identifier ${p.new.identifier})`);
    for (const a of m.added) lines.push(`  ${role} added: ${a.signal.header}`);
    for (const r of m.removed) lines.push(`  ${role} removed: ${r.signal.header}${role === 'input' ? ' (compared as any)' : ''}`);
  }
  return lines;
}

function retestLines(r: Retest): string[] {
  const lines = [`Retest (old steps from ${r.source === 'record' ? 'the filled-in record' : "the old table's own selection"}):`];
  lines.push(`  repeat: ${r.repeat.length === 0 ? 'none' : ''}`);
  for (const e of r.repeat) lines.push(`    step ${e.step} ${e.testId}: ${e.reasons.join('; ')}`);
  lines.push(`  still valid: ${r.stillValid.length === 0 ? 'none' : r.stillValid.map((e) => e.testId).join(', ')}`);
  for (const e of r.dropped) lines.push(`  no longer applies: step ${e.step} ${e.testId}: ${e.reasons.join('; ')}`);
  const fresh = r.newRecord.filter((s) => s.status === 'new');
  lines.push(`  new steps: ${fresh.length === 0 ? 'none' : fresh.map((s) => s.testId).join(', ')}`);
  return lines;
}

export function problemLines(problems: readonly Problem[]): string[] {
  return problems.map((p) => `  ${p.severity.padEnd(7)} ${qualifiedAddress(p.sheet, p.cell)}  ${p.message}`);
}

export function comparisonText(c: TableComparison, retest?: Retest): string {
  const lines = [
    `Compare ${qualifiedAddress(c.old.table.sheet, c.old.table.range)} (old) with ${qualifiedAddress(c.new.table.sheet, c.new.table.range)} (new)`,
    `  old revision: ${c.oldStamp}`,
    `  new revision: ${c.newStamp}`,
    ...signalLines(c),
    ...c.outputs.flatMap((o) => outputLines(o, c.inputs)),
  ];
  if (c.rows.length > 0) {
    lines.push('  Rows that differ (context; behaviour is judged above):');
    for (const r of c.rows) {
      const oldPart = r.oldCells ? `${r.oldCells} ${r.pattern} | ${r.oldValues}` : '';
      const newPart = r.newCells ? `${r.newCells} ${r.pattern} | ${r.newValues}` : '';
      lines.push(`    ${r.kind.padEnd(7)} ${r.kind === 'changed' ? `${oldPart}  ->  ${newPart}` : oldPart || newPart}`);
    }
  }
  if (retest) lines.push(...retestLines(retest));
  const problems = [...c.problems, ...(retest?.problems ?? [])];
  if (problems.length > 0) lines.push('Problems:', ...problemLines(problems));
  lines.push(c.changed ? 'Behaviour CHANGED: review the changes above and repeat the steps listed.' : 'Behaviour identical on every combination of every output (cells may differ).');
  return lines.join('\n') + '\n';
}

/** The whole report: the caution first, then each table compared. */
export function comparisonReport(tables: readonly { readonly comparison: TableComparison; readonly retest?: Retest }[]): string {
  return [...CAUTION_LINES, '', ...tables.map((t) => comparisonText(t.comparison, t.retest))].join('\n');
}
