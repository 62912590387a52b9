// Commissioning test steps: numbered rows of input values to set and the output values to
// expect, with empty columns for the result and who checked it. By default the unique-cause
// selection (each step shows one input deciding an output); the full table on request.
import { has, inputValue, type Combination } from '../logic/bits.js';
import type { TableAnalysis } from '../spec/analysis-types.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import type { BlockCell, SheetBlock } from './sheet-block.js';

/** The full table is offered up to this many inputs (65,536 steps); beyond, unique-cause steps. */
export const FULL_TABLE_MAX_INPUTS = 16;

export interface StepOptions {
  /** Every input combination instead of the unique-cause selection. */
  readonly full?: boolean;
}

export type Expected = 0 | 1 | '-';

export interface StepRow {
  readonly step: number;
  readonly combination: Combination;
  readonly inputs: readonly (0 | 1)[];
  /** Per output: the value the spec asks for; '-' where either value meets it (don't-care). */
  readonly expected: readonly Expected[];
  readonly why: string;
}

export interface StepTable {
  /** Column titles: Step, one per input, one per output, Why, Result, Checked by. */
  readonly columns: readonly string[];
  readonly rows: readonly StepRow[];
  /** Why the full table was not given, when it was asked for and is too large. */
  readonly note?: string;
}

export function stepTable(analysis: TableAnalysis, options: StepOptions = {}): StepTable {
  const n = analysis.inputs.length;
  const full = options.full === true && n <= FULL_TABLE_MAX_INPUTS;
  const note =
    options.full === true && !full
      ? `Full table left out: ${n} inputs give 2^${n} combinations; unique-cause steps are given instead (the full table is offered up to ${FULL_TABLE_MAX_INPUTS} inputs).`
      : undefined;
  const reasons = new Map<Combination, string[]>();
  if (full) for (let k = 0; k < 2 ** n; k++) reasons.set(k, []);
  else {
    for (const o of analysis.outputs) {
      for (const s of o.steps) {
        const list = reasons.get(s.combination) ?? [];
        list.push(analysis.outputs.length > 1 ? `${o.signal.identifier}: ${s.reason}` : s.reason);
        reasons.set(s.combination, list);
      }
    }
  }
  const specs = analysis.table.outputs;
  const rows: StepRow[] = [];
  for (const [combination, why] of reasons) {
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
    rows.push({
      step: rows.length + 1,
      combination,
      inputs: analysis.inputs.map((_, i) => inputValue(n, combination, i)),
      expected,
      why: [...why, ...notes].join('. '),
    });
  }
  const columns = [
    'Step',
    ...analysis.inputs.map((s) => s.header),
    ...analysis.outputs.map((o) => `Expect ${o.signal.header}`),
    'Why this step',
    'Result',
    'Checked by',
  ];
  return note === undefined ? { columns, rows } : { columns, rows, note };
}

/** The steps as CSV (RFC 4180: CRLF, fields quoted when needed); the caution is the first line. */
export function stepsCsv(analysis: TableAnalysis, options: StepOptions = {}): string {
  const table = stepTable(analysis, options);
  const lines: (string | number)[][] = [
    [CAUTION],
    [`Interlock Algebra test steps for sheet '${analysis.table.sheet}', range ${analysis.table.range}`],
  ];
  if (table.note) lines.push([table.note]);
  lines.push([...table.columns]);
  for (const r of table.rows) lines.push([r.step, ...r.inputs, ...r.expected, r.why, '', '']);
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

/** The steps as a sheet to write into the workbook. */
export function stepsSheet(analysis: TableAnalysis, options: StepOptions = {}): SheetBlock {
  const table = stepTable(analysis, options);
  const rows: (BlockCell | null)[][] = [
    [{ value: `Test steps: sheet '${analysis.table.sheet}', range ${analysis.table.range}`, style: 'title' }],
    ...CAUTION_LINES.map((line) => [{ value: line, style: 'caution' as const }]),
    [],
    ...stepBlockRows(table),
  ];
  return {
    name: sheetName(analysis.table.sheet, ' steps'),
    rows,
    columnWidths: [6, ...analysis.inputs.map(() => 12), ...analysis.outputs.map(() => 14), 60, 12, 14],
  };
}

/** Column titles and step rows as sheet rows (also used by the results sheet). */
export function stepBlockRows(table: StepTable): (BlockCell | null)[][] {
  const rows: (BlockCell | null)[][] = [];
  if (table.note) rows.push([{ value: table.note, style: 'label' }]);
  rows.push(table.columns.map((c) => ({ value: c, style: 'heading' as const })));
  for (const r of table.rows) {
    rows.push([
      { value: r.step, style: 'number' },
      ...r.inputs.map((v) => ({ value: v, style: 'input' as const })),
      ...r.expected.map((v) => ({ value: v, style: 'number' as const })),
      { value: r.why },
      null,
      null,
    ]);
  }
  return rows;
}

/** A sheet name of at most 31 characters: the source sheet's name cut to leave room for the suffix. */
export function sheetName(sheet: string, suffix: string): string {
  return `${sheet.slice(0, 31 - suffix.length)}${suffix}`;
}
