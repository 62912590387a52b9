// A revision stamp: a hash of what a spec table says and of the settings it was read with, so
// a test record can tell whether the table in the workbook is still the one it was made from.
// Only what the table means is hashed (signals, roles, rows as patterns and values, safe values,
// the X reading, the don't-care policy): a cell re-typed with the same meaning (TRUE for 1) keeps the stamp.
import { cubeToPattern } from '../logic/index.js';
import type { SpecOptions, SpecTable } from '../table/index.js';
import { sha256Hex } from './sha256.js';

/** "sha256:" and 64 hex digits. */
export function revisionStamp(table: SpecTable): string {
  const n = table.inputs.length;
  const canonical = JSON.stringify({
    stamp: 1,
    sheet: table.sheet,
    range: table.range,
    roleRule: table.roleRule,
    xReading: table.xReading,
    dontCares: table.dontCares ?? 'minimal',
    inputs: table.inputs.map((s) => [s.header, s.identifier]),
    outputs: table.outputs.map((o) => [o.signal.header, o.signal.identifier, o.safe]),
    rows: table.rows.map((r) => [r.cells, cubeToPattern(n, r.cube), r.values.join('')]),
  });
  return `sha256:${sha256Hex(canonical)}`;
}

/**
 * The settings that read this table again the same way, as one line a person can read and the
 * record reader can parse: "range=A3:J12; x=dont-care; dont-cares=minimal; inputs=5; safe=Spindle_run_permit:0".
 */
export function settingsLine(table: SpecTable): string {
  const parts = [`range=${table.range}`, `x=${table.xReading}`, `dont-cares=${table.dontCares ?? 'minimal'}`];
  if (table.roleRule === 'user-choice') parts.push(`inputs=${table.inputs.length}`);
  parts.push(`safe=${table.outputs.map((o) => `${o.signal.identifier}:${o.safe}`).join(',')}`);
  return parts.join('; ');
}

/** The spec options a settings line stands for; undefined when it is not one of ours. */
export function parseSettingsLine(line: string): SpecOptions | undefined {
  const fields = new Map<string, string>();
  for (const part of line.split(';')) {
    const m = /^\s*([a-z-]+)=(.*?)\s*$/.exec(part);
    if (!m) return undefined;
    fields.set(m[1]!, m[2]!);
  }
  const range = fields.get('range');
  const x = fields.get('x');
  if (!range || (x !== 'none' && x !== 'dont-care')) return undefined;
  const safeValues: Record<string, 0 | 1> = {};
  for (const pair of (fields.get('safe') ?? '').split(',').filter(Boolean)) {
    const m = /^(.+):([01])$/.exec(pair);
    if (!m) return undefined;
    safeValues[m[1]!] = m[2] === '1' ? 1 : 0;
  }
  const inputs = fields.get('inputs');
  const dontCares = fields.get('dont-cares') ?? 'minimal';
  if (dontCares !== 'minimal' && dontCares !== 'safe') return undefined;
  return { range, xReading: x, safeValues, dontCares, ...(inputs !== undefined ? { inputCount: Number(inputs) } : {}) };
}
