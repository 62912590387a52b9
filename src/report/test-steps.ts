// The commissioning test record: numbered steps (the inputs to change and the output values
// to expect) with columns a commissioning engineer fills in and signs, under the caution, the
// source and the revision stamp of the table. By default the unique-cause selection (each step
// shows one input deciding an output); the full table on request. record-read.ts reads it back.
import { has, inputValue, type Combination } from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { qualifiedAddress } from '../table/index.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import type { BlockCell, SheetBlock } from './sheet-block.js';
import { revisionStamp, settingsLine } from './revision.js';
import { printSetup } from './sheet-looks.js';
import { TOOL_NAME, TOOL_VERSION } from './version.js';

/** The full table is offered up to this many inputs (65,536 steps); beyond, unique-cause steps. */
export const FULL_TABLE_MAX_INPUTS = 16;

export interface StepOptions {
  /** Every input combination instead of the unique-cause selection. */
  readonly full?: boolean;
}

export interface RecordOptions extends StepOptions {
  /** The workbook the table is in, as the record names it. */
  readonly source?: string;
  /** The day the record was made (YYYY-MM-DD); today when not given. */
  readonly date?: string;
}

export type Expected = 0 | 1 | '-';

export interface StepRow {
  readonly step: number;
  /** Stable across revisions: the combination's pattern, so a retest can find the same step. */
  readonly testId: string;
  readonly combination: Combination;
  readonly inputs: readonly (0 | 1)[];
  /** Identifiers of the outputs this step was chosen to test (all of them for the full table). */
  readonly outputs: readonly string[];
  /** The inputs this step leaves as the previous step had them (the first step: as at rest, all 0). */
  readonly preconditions: string;
  /** The inputs to change from the previous step, and to what. */
  readonly action: string;
  /** Per output: the value the spec asks for; '-' where either value meets it (don't-care). */
  readonly expected: readonly Expected[];
  readonly why: string;
}

export interface StepTable {
  /** Column titles: Step, Test ID, Output, Preconditions, Action, Expected and Actual per output, the fill-in columns, Why. */
  readonly columns: readonly string[];
  readonly rows: readonly StepRow[];
  /** Why the full table was not given, when it was asked for and is too large. */
  readonly note?: string;
}

/** The columns a commissioning engineer fills in, after the Actual values. */
export const FILL_IN_COLUMNS = ['Pass/Fail', 'Punch item', 'Performed by', 'Witnessed by', 'Date'] as const;

/** The title of a record: the record reader finds record sheets by it. */
export const RECORD_TITLE = 'Commissioning test record';

export function stepTable(analysis: TableAnalysis, options: StepOptions = {}): StepTable {
  const n = analysis.inputs.length;
  const full = options.full === true && n <= FULL_TABLE_MAX_INPUTS;
  const note =
    options.full === true && !full
      ? `Full table left out: ${n} inputs give 2^${n} combinations; unique-cause steps are given instead (the full table is offered up to ${FULL_TABLE_MAX_INPUTS} inputs).`
      : undefined;
  const chosen = new Map<Combination, { why: string[]; outputs: string[] }>();
  const everyOutput = analysis.outputs.map((o) => o.signal.identifier);
  if (full) for (let k = 0; k < 2 ** n; k++) chosen.set(k, { why: [], outputs: everyOutput });
  else {
    for (const o of analysis.outputs) {
      for (const s of o.steps) {
        const entry = chosen.get(s.combination) ?? { why: [], outputs: [] };
        entry.why.push(analysis.outputs.length > 1 ? `${o.signal.identifier}: ${s.reason}` : s.reason);
        if (!entry.outputs.includes(o.signal.identifier)) entry.outputs.push(o.signal.identifier);
        chosen.set(s.combination, entry);
      }
    }
  }
  const specs = analysis.table.outputs;
  const rows: StepRow[] = [];
  let previous: readonly (0 | 1)[] = analysis.inputs.map(() => 0);
  for (const [combination, { why, outputs }] of chosen) {
    // The resolved function of each output: what every form does, so what the step expects.
    const expected = analysis.outputs.map((o): Expected => (has(o.resolved.on, combination) ? 1 : 0));
    const notes: string[] = [];
    if (specs.some((spec) => has(spec.built.gaps, combination))) notes.push('gap: no row covers this combination, each output takes its safe value');
    specs.forEach((spec, j) => {
      if (has(spec.built.conflicted, combination)) notes.push(`conflict: rows ask ${analysis.outputs[j]!.signal.identifier} for 1 and 0 here, it takes its safe value ${spec.safe}`);
    });
    specs.forEach((spec, j) => {
      if (has(spec.built.fn.dc, combination))
        notes.push(`don't-care in the table: ${analysis.outputs[j]!.signal.identifier} expected ${expected[j]} as resolved (${analysis.outputs[j]!.dontCares})`);
    });
    const inputs = analysis.inputs.map((_, i) => inputValue(n, combination, i));
    const changed = analysis.inputs.flatMap((s, i) => (inputs[i] !== previous[i] ? [`set ${s.header} to ${inputs[i]}`] : []));
    const kept = analysis.inputs.flatMap((s, i) => (inputs[i] === previous[i] ? [`${s.header} = ${inputs[i]}`] : []));
    rows.push({
      step: rows.length + 1,
      testId: `T-${inputs.join('')}`,
      combination,
      inputs,
      outputs,
      preconditions: kept.length > 0 ? kept.join(', ') : 'none: every input changes',
      action: changed.length > 0 ? changed.join('; ') : 'none: leave every input as it is',
      expected,
      why: [...why, ...notes].join('. '),
    });
    previous = inputs;
  }
  const columns = [
    'Step',
    'Test ID',
    'Output',
    'Preconditions',
    'Action',
    ...analysis.outputs.map((o) => `Expected ${o.signal.header}`),
    ...analysis.outputs.map((o) => `Actual ${o.signal.header}`),
    ...FILL_IN_COLUMNS,
    'Why this step',
  ];
  return note === undefined ? { columns, rows } : { columns, rows, note };
}

/** The cells of one step row, in column order, the columns to fill in empty. */
function stepCells(r: StepRow, outputs: number): (string | number)[] {
  const empty = (k: number): string[] => Array.from({ length: k }, () => '');
  return [r.step, r.testId, r.outputs.join(', '), r.preconditions, r.action, ...r.expected, ...empty(outputs), ...empty(FILL_IN_COLUMNS.length), r.why];
}

/** What stands above the steps: what the record was made from and with. */
function recordFacts(analysis: TableAnalysis, options: RecordOptions): [string, string][] {
  const where = qualifiedAddress(analysis.table.sheet, analysis.table.range);
  return [
    ['Source', options.source ? `${options.source}, ${where}` : where],
    ['Revision stamp', revisionStamp(analysis.table)],
    ['Settings', settingsLine(analysis.table)],
    ['Tool', `${TOOL_NAME} ${TOOL_VERSION}`],
    ['Made', options.date ?? new Date().toISOString().slice(0, 10)],
  ];
}

function recordTitle(analysis: TableAnalysis): string {
  return `${RECORD_TITLE}: ${qualifiedAddress(analysis.table.sheet, analysis.table.range)}`;
}

/** The record as CSV (RFC 4180: CRLF, fields quoted when needed); the caution is the first line. */
export function stepsCsv(analysis: TableAnalysis, options: RecordOptions = {}): string {
  const table = stepTable(analysis, options);
  const lines: (string | number)[][] = [[CAUTION], [recordTitle(analysis)], ...recordFacts(analysis, options)];
  if (table.note) lines.push([table.note]);
  lines.push([...table.columns]);
  for (const r of table.rows) lines.push(stepCells(r, analysis.outputs.length));
  return lines.map((fields) => fields.map(csvField).join(',')).join('\r\n') + '\r\n';
}

/**
 * One CSV field. Quoted when it holds a comma, quote, line break or edge blank. Text that a
 * spreadsheet would take for a formula (=, +, @, or '-' followed by more) gets a leading
 * apostrophe, the usual guard against formula injection (OWASP, "CSV Injection"; from memory).
 */
export function csvField(value: string | number): string {
  if (typeof value === 'number') return String(value);
  const guarded = /^[=+@\t\r]/.test(value) || /^-./.test(value) ? `'${value}` : value;
  return /[",\r\n]|^\s|\s$/.test(guarded) ? `"${guarded.replace(/"/g, '""')}"` : guarded;
}

/** At most this many rows are frozen above the steps, so the steps keep most of the window. */
const MAX_FROZEN_ROWS = 12;

/** The commissioning test record as a sheet: title, caution, source and revision stamp, then the steps to fill in. */
export function testRecordSheet(analysis: TableAnalysis, options: RecordOptions = {}): SheetBlock {
  const table = stepTable(analysis, options);
  const m = analysis.outputs.length;
  const rows: (BlockCell | null)[][] = [
    [{ value: recordTitle(analysis), style: 'title' }],
    ...CAUTION_LINES.map((line) => [{ value: line, style: 'caution' as const }]),
    ...recordFacts(analysis, options).map(([what, value]): BlockCell[] => [{ value: what, style: 'label' }, { value }]),
    [],
    ...stepBlockRows(table, m),
  ];
  // Everything above the first step stays in view while scrolling, unless it would fill a screen.
  const above = rows.length - table.rows.length;
  return {
    name: sheetName(analysis.table.sheet, ' record'),
    rows,
    ...(above <= MAX_FROZEN_ROWS ? { freezeRows: above } : {}),
    columnWidths: [6, 14, 18, 40, 30, ...Array.from({ length: 2 * m }, () => 12), 10, 24, 16, 16, 12, 60],
    print: printSetup(`Test record of ${qualifiedAddress(analysis.table.sheet, analysis.table.range)}, ${revisionStamp(analysis.table).slice(0, 19)}`),
  };
}

/** Column titles and step rows as sheet rows (also used by the results sheet). */
export function stepBlockRows(table: StepTable, outputs: number): (BlockCell | null)[][] {
  const rows: (BlockCell | null)[][] = [];
  if (table.note) rows.push([{ value: table.note, style: 'label' }]);
  rows.push(table.columns.map((c) => ({ value: c, style: 'heading' as const })));
  const styleOf = (c: number): BlockCell['style'] => (c === 0 ? 'number' : c === 1 ? 'code' : c >= 5 && c < 5 + outputs ? 'input' : undefined);
  for (const r of table.rows) rows.push(stepCells(r, outputs).map((v, c) => (v === '' ? null : withStyle(v, styleOf(c)))));
  return rows;
}

function withStyle(value: string | number, style: BlockCell['style']): BlockCell {
  return style === undefined ? { value } : { value, style };
}

/** A sheet name of at most 31 characters: the source sheet's name cut to leave room for the suffix. */
export function sheetName(sheet: string, suffix: string): string {
  return `${sheet.slice(0, 31 - suffix.length)}${suffix}`;
}
