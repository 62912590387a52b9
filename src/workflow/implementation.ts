// Implementation checks under the workbook's verdicts: an output of a table that was not
// analysed (it has errors) is UNCHECKED, whatever the program does, with the reason.
import { checkImplementation, fail, parseExpression, type ImplCheck, type Result } from '../logic/index.js';
import {
  verifyImplementation,
  type ImplProgram,
  type NameMapping,
  type OutputVerdict,
  type VerifyReport,
} from '../impl/index.js';
import { qualifiedAddress } from '../table/index.js';
import { outputSignals, wideLimit, type TableResult, type Workbook } from './examine.js';
import { verdictWords } from './verdict.js';

/** The words of an implementation check's verdict, in every host. */
export type ImplementationWord = 'EQUAL' | 'DIFFERS' | 'UNCHECKED';

export function implementationWord(o: Pick<OutputVerdict, 'status'>): ImplementationWord {
  return o.status === 'equal' ? 'EQUAL' : o.status === 'differs' ? 'DIFFERS' : 'UNCHECKED';
}

/** A program checked against every table read; outputs of not-analysed tables come back unchecked. */
export function verifyProgram(wb: Workbook, program: ImplProgram, mapping?: NameMapping, options: { gapsFree?: boolean } = {}): VerifyReport {
  const report = withWideUnchecked(wb, verifyImplementation(wb.tables.flatMap((t) => (wideLimit(t.table) ? [] : [t.table])), program, mapping, options));
  const stopped = new Map(wb.tables.filter((t) => !t.analysis).map((t) => [qualifiedAddress(t.table.sheet, t.table.range), t]));
  if (stopped.size === 0) return report;
  return { ...report, outputs: report.outputs.map((o) => unchecked(o, stopped.get(o.table))) };
}

function unchecked(o: OutputVerdict, t: TableResult | undefined): OutputVerdict {
  if (!t || (o.status !== 'equal' && o.status !== 'differs')) return o;
  return {
    ...o,
    status: 'unchecked',
    mismatchCount: 0,
    counterexamples: [],
    differenceMonomials: [],
    differenceMonomialCount: 0,
    reasons: [`the spec table is ${verdictWords(t.verdict)}`, ...o.reasons],
  };
}

/** Each output of a table of more than 24 inputs: UNCHECKED with the reason (verify takes at most 24). */
function withWideUnchecked(wb: Workbook, report: VerifyReport): VerifyReport {
  const wide = wb.tables.flatMap((t) => {
    const limit = wideLimit(t.table);
    if (!limit) return [];
    const table = qualifiedAddress(t.table.sheet, t.table.range);
    const n = t.table.inputs.length;
    return outputSignals(t.table).map((output, j): OutputVerdict => ({
      table,
      output,
      cell: qualifiedAddress(t.table.sheet, t.table.headerCells[n + j]!),
      status: 'unchecked',
      combinations: 0,
      mismatchCount: 0,
      counterexamples: [],
      differenceMonomials: [],
      differenceMonomialCount: 0,
      dontCare: { count: 0, implementationOn: 0 },
      gaps: { count: 0, implementationOn: 0, safe: t.table.wide!.outputs[j]!.safe, unsafe: 0, unsafeExamples: [], judged: false },
      conflicted: 0,
      reasons: [limit],
      cannotJudge: [],
    }));
  });
  return wide.length === 0 ? report : { ...report, outputs: [...report.outputs, ...wide] };
}

/** Every output EQUAL and every table cleared: exit status 0 of `verify`. */
export function programCleared(wb: Workbook, report: VerifyReport): boolean {
  return wb.handOver.allowed && report.outputs.length > 0 && report.outputs.every((o) => implementationWord(o) === 'EQUAL');
}

/** A typed or pasted expression checked against one output; refused for a table that was not analysed. */
export function checkExpression(wb: Workbook, tableId: number, output: number, text: string): Result<ImplCheck> {
  const t = wb.tables[tableId];
  const limit = t && wideLimit(t.table);
  if (limit) return fail({ message: `not checked: ${limit}` });
  if (!t || !t.table.outputs[output]) return fail({ message: `no table ${tableId} output ${output} in what was read` });
  if (!t.analysis) return fail({ message: `not checked: the spec table is ${verdictWords(t.verdict)}` });
  const parsed = parseExpression(text, t.table.inputs);
  if (!parsed.ok) return parsed;
  return { ok: true, value: checkImplementation(parsed.value, t.table.outputs[output].built.fn) };
}
