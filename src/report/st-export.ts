// Structured Text hand-over: one FUNCTION_BLOCK (or PROGRAM) per spec table, BOOL inputs and
// outputs named by the header -> identifier map, one assignment per output, and a header of
// (* *) comments that says where the logic came from, how it was proven, and the caution.
import { appendAll, boundsWords, toIdentifiers } from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { outputSignalsOf, outputViews, type FormView, type OutputView } from './output-view.js';
import { CAUTION_LINES } from './caution.js';
import { plural, stCommentText, wrap } from './text.js';

export type FormChoice = 'andOr' | 'xor' | 'bestXor';
export type PouKind = 'FUNCTION_BLOCK' | 'PROGRAM';

export interface HandOverSource {
  /** The workbook the spec tables were read from (a file name, or the workbook's title). */
  readonly workbook: string;
}

export interface StExportOptions {
  readonly kind?: PouKind;
  readonly form?: FormChoice;
  readonly source: HandOverSource;
  /** Date written in the header (default: today, YYYY-MM-DD). */
  readonly date?: string;
}

export const PRODUCT_NAME = 'Interlock Algebra';

/** ST lines are broken at blanks beyond this many characters (ST ignores line breaks). */
const LINE_CHARS = 96;

export function exportSt(analyses: readonly TableAnalysis[], options: StExportOptions): string {
  const kind = options.kind ?? 'FUNCTION_BLOCK';
  const form = options.form ?? 'andOr';
  const names = pouNames(analyses);
  const out: string[] = [];
  out.push(comment(`${PRODUCT_NAME}: Structured Text hand-over, ${analyses.length} spec table(s)`));
  out.push(...CAUTION_LINES.map(comment), '');
  analyses.forEach((analysis, t) => {
    appendAll(out, headerLines(analysis, form, { source: options.source, date: options.date ?? today() }).map(comment));
    out.push(`${kind} ${names[t]}`);
    out.push('VAR_INPUT');
    for (const s of analysis.inputs) out.push(`    ${s.identifier} : BOOL;`);
    out.push('END_VAR');
    out.push('VAR_OUTPUT');
    for (const o of outputSignalsOf(analysis)) out.push(`    ${o.identifier} : BOOL;`);
    out.push('END_VAR');
    for (const line of assignmentLines(analysis, form)) out.push(`    ${line}`);
    out.push(`END_${kind}`, '');
  });
  return out.join('\n');
}

/**
 * POU names from the sheet names: valid, unique across the tables, and different from every
 * signal identifier (a block named like one of its variables confuses readers and compilers).
 */
export function pouNames(analyses: readonly TableAnalysis[]): string[] {
  const taken = analyses.flatMap((a) => [...a.inputs, ...outputSignalsOf(a)].map((s) => s.identifier));
  const all = toIdentifiers([...taken, ...analyses.map((a) => a.table.sheet)]);
  return all.slice(taken.length);
}

export function chosenForm<O extends { andOr: unknown; xor: unknown; bestXor: unknown }>(output: O, form: FormChoice): O['andOr'] | O['xor'] | O['bestXor'] {
  return form === 'andOr' ? output.andOr : form === 'xor' ? output.xor : output.bestXor;
}

/** The form written for an output: the one chosen, or the AND/OR form when the chosen one is too long to print. */
export function writtenForm(output: OutputView, form: FormChoice): { form: FormChoice; view: FormView } {
  const chosen = chosenForm(output, form);
  return chosen?.expr ? { form, view: chosen } : { form: 'andOr', view: output.andOr };
}

/** "proven minimum", or "heuristic" with the lower bound that was proven. */
export function minimumWords(andOr: Pick<OutputView['andOr'], 'proven' | 'lowerBound'>): string {
  if (andOr.proven) return 'proven minimum';
  const b = andOr.lowerBound;
  return `heuristic (minimum not proven; proven lower bound ${plural(b.terms, 'term')}, and ${plural(b.literals, 'literal')} with that many terms)`;
}

export const FORM_LABEL: Readonly<Record<FormChoice, string>> = {
  andOr: 'AND/OR form',
  xor: 'XOR form',
  bestXor: 'best-polarity XOR form',
};

/** What was proven of a form, in one line. */
export function proofText(output: OutputView, chosen: FormChoice): string {
  const { form, view: f } = writtenForm(output, chosen);
  const cost = form === 'andOr' ? `${plural(output.andOr.terms, 'term')}, ${plural(output.andOr.literals, 'literal')}, ${minimumWords(output.andOr)}` : plural(f.terms, 'term');
  const checked =
    f.mismatchCount === 0n ? `equal to the spec on all ${f.combinations} combinations` : `DIFFERS from the spec on ${f.mismatchCount} of ${f.combinations} combinations`;
  const permits = f.permitsAlsoCount > 0n ? `; turns on ${plural(f.permitsAlsoCount, "don't-care combination")}` : '';
  const alternative = chosenForm(output, chosen);
  const instead =
    form === chosen
      ? ''
      : alternative
        ? ` (the ${FORM_LABEL[chosen]} has ${plural(alternative.terms, 'term')}, too many to print)`
        : ` (the ${FORM_LABEL[chosen]} was not derived: the table was analysed on its rows' cubes)`;
  return `${FORM_LABEL[form]}${instead} (${cost}): ${checked}${permits}`;
}

/** The header of one table's block, as plain lines (the caller makes them comments). */
export function headerLines(analysis: TableAnalysis, form: FormChoice, options: { source: HandOverSource; date: string }): string[] {
  const outputs = outputViews(analysis);
  const lines = [
    `Source workbook: ${options.source.workbook}`,
    `Spec table: sheet '${analysis.table.sheet}', range ${analysis.table.range}`,
    `Written: ${options.date}`,
    'Signals (header -> identifier):',
    ...analysis.inputs.map((s) => `  input  ${s.header} -> ${s.identifier}`),
    ...outputs.map((o) => `  output ${o.signal.header} -> ${o.signal.identifier} (safe value ${o.safe})`),
    'Proof:',
    ...outputs.map((o) => `  ${o.signal.identifier}: ${proofText(o, form)}`),
  ];
  for (const o of outputs.filter((x) => x.gapCount.atMost > 0n || x.conflicts.length > 0)) {
    const what = [o.gapCount.atMost > 0n ? boundsWords(o.gapCount, 'unspecified combination') : '', o.conflicts.length > 0 ? plural(o.conflicts.length, 'conflicting row pair') : ''];
    lines.push(`  ${o.signal.identifier}: ${what.filter((w) => w !== '').join(' and ')} take the safe value ${o.safe}`);
  }
  const errors = analysis.problems.filter((p) => p.severity === 'error').length;
  if (errors > 0) lines.push(`The spec table has ${errors} error(s): see the results sheet before using this logic.`);
  return lines;
}

/** `Output := expression;` per output, broken into lines of at most about 96 characters. */
export function assignmentLines(analysis: TableAnalysis, form: FormChoice): string[] {
  const out: string[] = [];
  for (const o of outputViews(analysis)) {
    const lines = wrap(`${o.signal.identifier} := ${writtenForm(o, form).view.text};`, LINE_CHARS);
    out.push(lines[0]!, ...lines.slice(1).map((l) => `    ${l}`));
  }
  return out;
}

export function comment(text: string): string {
  return text === '' ? '' : `(* ${stCommentText(text)} *)`;
}

export function today(): string {
  return new Date().toISOString().slice(0, 10);
}
