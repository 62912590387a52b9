// Implementation checks under the workbook's verdicts: an output of a table that was not
// analysed (it has errors) is UNCHECKED, whatever the program does, with the reason.
import { fail, parseExpression, type Result } from '../logic/index.js';
import {
  NO_DIFFERENCE,
  verifyExpression,
  verifyImplementation,
  type ImplProgram,
  type NameMapping,
  type OutputVerdict,
  type VerifyReport,
} from '../impl/index.js';
import { qualifiedAddress } from '../table/index.js';
import { outputSignals, type TableResult, type Workbook } from './examine.js';
import { verdictWords } from './verdict.js';

/** The words of an implementation check's verdict, in every host. */
export type ImplementationWord = 'EQUAL' | 'DIFFERS' | 'UNCHECKED';

export function implementationWord(o: Pick<OutputVerdict, 'status'>): ImplementationWord {
  return o.status === 'equal' ? 'EQUAL' : o.status === 'differs' ? 'DIFFERS' : 'UNCHECKED';
}

/** A program checked against every table read; outputs of not-analysed tables come back unchecked. */
export function verifyProgram(wb: Workbook, program: ImplProgram, mapping?: NameMapping, options: { gapsFree?: boolean } = {}): VerifyReport {
  const report = verifyImplementation(wb.tables.map((t) => t.table), program, mapping, options);
  const stopped = new Map(wb.tables.filter((t) => !t.analysis).map((t) => [qualifiedAddress(t.table.sheet, t.table.range), t]));
  if (stopped.size === 0) return report;
  return { ...report, outputs: report.outputs.map((o) => unchecked(o, stopped.get(o.table))) };
}

function unchecked(o: OutputVerdict, t: TableResult | undefined): OutputVerdict {
  if (!t || (o.status !== 'equal' && o.status !== 'differs')) return o;
  const { unsafeWhen: _u, spuriousTripWhen: _s, ...rest } = o;
  return {
    ...rest,
    status: 'unchecked',
    ...NO_DIFFERENCE,
    reasons: [`the spec table is ${verdictWords(t.verdict)}`, ...o.reasons],
  };
}

/** Every output EQUAL and every table cleared: exit status 0 of `verify`. */
export function programCleared(wb: Workbook, report: VerifyReport): boolean {
  return wb.handOver.allowed && report.outputs.length > 0 && report.outputs.every((o) => implementationWord(o) === 'EQUAL');
}

/**
 * A typed or pasted expression checked against one output, as a program's output is checked
 * (up to 64 inputs: symbolically over 24); refused for a table that was not analysed.
 */
export function checkExpression(wb: Workbook, tableId: number, output: number, text: string): Result<OutputVerdict> {
  const t = wb.tables[tableId];
  if (!t || !outputSignals(t.table)[output]) return fail({ message: `no table ${tableId} output ${output} in what was read` });
  if (!t.analysis) return fail({ message: `not checked: the spec table is ${verdictWords(t.verdict)}` });
  const parsed = parseExpression(text, t.table.inputs);
  if (!parsed.ok) return parsed;
  return { ok: true, value: verifyExpression(t.table, output, parsed.value) };
}
