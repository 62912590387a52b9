// The commissioning test record: numbered steps (the inputs to change and the output values
// to expect) with columns a commissioning engineer fills in and signs, under the caution, the
// source and the revision stamp of the table. By default the unique-cause selection (each step
// shows one input deciding an output); the full table on request. record-read.ts reads it back.
import {
  combinationPattern,
  has,
  wideStepBound,
  type Combination,
  type WideCombination,
} from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { qualifiedAddress } from '../table/index.js';
import { plural } from './text.js';
import { outputSignalsOf } from './output-view.js';
import { minimumWords } from './st-export.js';
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

/** K: the combination, a number up to 24 inputs, BigInt over (the symbolic engine's tables). */
export interface StepRow<K extends Combination | WideCombination = Combination> {
  readonly step: number;
  /** Stable across revisions: the combination's pattern, so a retest can find the same step. */
  readonly testId: string;
  readonly combination: K;
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

export interface StepTable<K extends Combination | WideCombination = Combination> {
  /** Column titles: Step, Test ID, Output, Preconditions, Action, Expected and Actual per output, the fill-in columns, Why. */
  readonly columns: readonly string[];
  readonly rows: readonly StepRow<K>[];
  /** Why the full table was not given, when it was asked for and is too large. */
  readonly note?: string;
}

/** The columns a commissioning engineer fills in, after the Actual values. */
export const FILL_IN_COLUMNS = ['Pass/Fail', 'Punch item', 'Performed by', 'Witnessed by', 'Date'] as const;

/** The title of a record: the record reader finds record sheets by it. */
export const RECORD_TITLE = 'Commissioning test record';

/**
 * The steps of a table analysed by the bit-set engine (combinations as numbers); a table of
 * more than 24 inputs has its steps in `recordSteps` only (none here, as before it had any).
 */
export function stepTable(analysis: TableAnalysis, options: StepOptions = {}): StepTable {
  const all = recordSteps(analysis, options);
  return { ...all, rows: analysis.wide ? [] : (all.rows as StepRow[]) };
}

/** The steps of a table analysed by either engine: what the record, the results sheet and the CSV show. */
export function recordSteps(analysis: TableAnalysis, options: StepOptions = {}): StepTable<Combination | WideCombination> {
  const n = analysis.inputs.length;
  const full = options.full === true && n <= FULL_TABLE_MAX_INPUTS;
  const source = stepSource(analysis);
  const fullNote =
    options.full === true && !full
      ? `Full table left out: ${n} inputs give 2^${n} combinations; unique-cause steps are given instead (the full table is offered up to ${FULL_TABLE_MAX_INPUTS} inputs).`
      : undefined;
  const note = [fullNote, source.note].filter((x) => x !== undefined).join(' ') || undefined;
  const chosen = new Map<Combination | WideCombination, { why: string[]; outputs: string[] }>();
  const everyOutput = source.outputs.map((o) => o.identifier);
  if (full) for (let k = 0; k < 2 ** n; k++) chosen.set(k, { why: [], outputs: everyOutput });
  else {
    source.outputs.forEach((o) => {
      for (const s of o.steps) {
        const entry = chosen.get(s.combination) ?? { why: [], outputs: [] };
        entry.why.push(source.outputs.length > 1 ? `${o.identifier}: ${s.reason}` : s.reason);
        if (!entry.outputs.includes(o.identifier)) entry.outputs.push(o.identifier);
        chosen.set(s.combination, entry);
      }
    });
  }
  const rows: StepRow<Combination | WideCombination>[] = [];
  let previous: readonly (0 | 1)[] = analysis.inputs.map(() => 0);
  for (const [combination, { why, outputs }] of chosen) {
    // The resolved function of each output: what every form does, so what the step expects.
    const facts = source.factsAt(combination);
    const expected = facts.expected;
    const notes: string[] = [];
    if (facts.gap) notes.push('gap: no row covers this combination, each output takes its safe value');
    source.outputs.forEach((o, j) => {
      if (facts.conflicted[j]) notes.push(`conflict: rows ask ${o.identifier} for 1 and 0 here, it takes its safe value ${o.safe}`);
    });
    source.outputs.forEach((o, j) => {
      if (facts.dontCare[j]) notes.push(`don't-care in the table: ${o.identifier} expected ${expected[j]} as resolved (${o.dontCares})`);
    });
    const pattern = combinationPattern(n, BigInt(combination));
    const inputs = analysis.inputs.map((_, i): 0 | 1 => (pattern[i] === '1' ? 1 : 0));
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
    ...source.outputs.map((o) => `Expected ${o.header}`),
    ...source.outputs.map((o) => `Actual ${o.header}`),
    ...FILL_IN_COLUMNS,
    'Why this step',
  ];
  return note === undefined ? { columns, rows } : { columns, rows, note };
}

/** What a combination is in the table, for every output: expected value (resolved), gap, conflicts, don't-cares. */
interface StepFacts {
  readonly expected: readonly (0 | 1)[];
  readonly gap: boolean;
  readonly conflicted: readonly boolean[];
  readonly dontCare: readonly boolean[];
}

/** The outputs' step selections and the facts of their combinations, from either engine. */
interface StepSource {
  readonly outputs: readonly {
    readonly identifier: string;
    readonly header: string;
    readonly safe: 0 | 1;
    readonly dontCares: string;
    readonly steps: readonly { readonly combination: Combination | WideCombination; readonly reason: string }[];
  }[];
  readonly factsAt: (k: Combination | WideCombination) => StepFacts;
  /** Said above the steps: how many there are and the most the plan gives (symbolic engine). */
  readonly note?: string;
}

function stepSource(analysis: TableAnalysis): StepSource {
  const wide = analysis.wide;
  if (wide) {
    const facts = new Map(wide.stepFacts.map((f) => [f.combination, f]));
    const steps = wide.stepFacts.length;
    const bound = wide.outputs.reduce((k, o) => k + wideStepBound(o.andOr.terms, o.andOr.literals), 0);
    const forms = wide.outputs.map((o) => `${o.signal.identifier}: ${plural(o.andOr.terms, 'term')}, ${plural(o.andOr.literals, 'literal')}, ${minimumWords(o.andOr)}`).join('; ');
    return {
      outputs: wide.outputs.map((o) => ({ identifier: o.signal.identifier, header: o.signal.header, safe: o.safe, dontCares: o.dontCares, steps: o.steps })),
      factsAt: (k) => facts.get(BigInt(k))!,
      note:
        `${plural(steps, 'step')} for ${analysis.inputs.length} inputs (2^${analysis.inputs.length} combinations): the unique-cause selection of each AND/OR form ` +
        `(${forms}), at most one ON step per term and two steps per literal, ${bound} at most.`,
    };
  }
  const specs = analysis.table.outputs;
  // A record of a heuristic form says so with its lower bound, as every hand-over file does.
  const heuristic = analysis.outputs.filter((o) => !o.andOr.proven).map((o) => `${o.signal.identifier}: AND/OR form ${minimumWords(o.andOr)}`);
  return {
    ...(heuristic.length > 0 ? { note: `Steps of forms not proven minimal: ${heuristic.join('; ')}.` } : {}),
    outputs: analysis.outputs.map((o) => ({ identifier: o.signal.identifier, header: o.signal.header, safe: o.safe, dontCares: o.dontCares, steps: o.steps })),
    factsAt: (key) => {
      const k = Number(key);
      return {
        expected: analysis.outputs.map((o): 0 | 1 => (has(o.resolved.on, k) ? 1 : 0)),
        gap: specs.some((spec) => has(spec.built.gaps, k)),
        conflicted: specs.map((spec) => has(spec.built.conflicted, k)),
        dontCare: specs.map((spec) => has(spec.built.fn.dc, k)),
      };
    },
  };
}

/** The cells of one step row, in column order, the columns to fill in empty. */
function stepCells(r: StepRow<Combination | WideCombination>, outputs: number): (string | number)[] {
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
  const table = recordSteps(analysis, options);
  const lines: (string | number)[][] = [[CAUTION], [recordTitle(analysis)], ...recordFacts(analysis, options)];
  if (table.note) lines.push([table.note]);
  lines.push([...table.columns]);
  for (const r of table.rows) lines.push(stepCells(r, outputSignalsOf(analysis).length));
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
export const MAX_FROZEN_ROWS = 12;

/**
 * The caution in three rows of two lines each, for sheets whose column titles stay in view
 * (frozen) below it: fewer rows over the steps, the same words as `CAUTION_LINES`.
 */
export function cautionRows(): BlockCell[][] {
  const rows: BlockCell[][] = [];
  for (let i = 0; i < CAUTION_LINES.length; i += 2) rows.push([{ value: CAUTION_LINES.slice(i, i + 2).join(' '), style: 'caution' }]);
  return rows;
}

/**
 * The commissioning test record as a sheet: title, caution, source, revision stamp, settings,
 * tool and date, then the steps to fill in under column titles that stay in view (frozen).
 */
export function testRecordSheet(analysis: TableAnalysis, options: RecordOptions = {}): SheetBlock {
  const table = recordSteps(analysis, options);
  const m = outputSignalsOf(analysis).length;
  const rows: (BlockCell | null)[][] = [
    [{ value: recordTitle(analysis), style: 'title' }],
    ...cautionRows(),
    ...recordFacts(analysis, options).map(([what, value]): BlockCell[] => [{ value: what, style: 'label' }, { value }]),
    ...stepBlockRows(table, m),
  ];
  // The column titles stay in view while scrolling the steps, unless that would fill a screen.
  const above = rows.length - table.rows.length;
  return {
    name: sheetName(analysis.table.sheet, ' record'),
    rows,
    ...(above <= MAX_FROZEN_ROWS ? { freezeRows: above } : {}),
    columnWidths: [15, 14, 18, 40, 30, ...Array.from({ length: 2 * m }, () => 12), 10, 24, 16, 16, 12, 60],
    print: printSetup(`Test record of ${qualifiedAddress(analysis.table.sheet, analysis.table.range)}, ${revisionStamp(analysis.table).slice(0, 19)}`, above),
  };
}

/** Column titles and step rows as sheet rows (also used by the results sheet). */
export function stepBlockRows(table: StepTable<Combination | WideCombination>, outputs: number): (BlockCell | null)[][] {
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
