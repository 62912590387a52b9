// Read -> analyse -> verdicts -> what may be written and handed over: the one path every host
// takes. Tables with errors are not analysed; their verdict says so, with the first error.
import type { Signal } from '../logic/index.js';
import { analyseTable, type TableAnalysis } from '../analysis/index.js';
import { qualifiedAddress, type Problem, type SpecTable } from '../table/index.js';
import { plural } from '../report/index.js';
import type { TablesRead } from './read.js';
import { cleared, errorsOf, notAnalysed, outputVerdict, verdictWords, weakest, type Verdict } from './verdict.js';

/** May it be done, and if not, why not (in words every host shows as they are). */
export type Permission = { readonly allowed: true } | { readonly allowed: false; readonly reason: string };

export interface TableResult {
  /** The table's place in the workbook read: hosts and the pane's worker refer to tables by it. */
  readonly id: number;
  readonly table: SpecTable;
  readonly verdict: Verdict;
  /** Per output, in the table's order. */
  readonly outputs: readonly Verdict[];
  /** Present only when the table has no error. */
  readonly analysis?: TableAnalysis;
  /** The table's problems, and those its analysis found. */
  readonly problems: readonly Problem[];
}

export interface Workbook {
  /** The workbook as results and hand-over files name it. */
  readonly source: string;
  readonly tables: readonly TableResult[];
  /** Problems that belong to no table. */
  readonly problems: readonly Problem[];
  /** The hand-over pack (Structured Text, PLCopen XML, ladder pictures, test steps). */
  readonly handOver: Permission;
  /** Results sheets (and the test records of the cleared tables). */
  readonly resultsWrite: Permission;
}

export interface ExamineOptions {
  readonly source: string;
  /** Time for each output's AND/OR form. */
  readonly budgetMs?: number;
  /** Before a table is analysed (done 0) and after each step of it. */
  readonly onProgress?: (step: { table: SpecTable; index: number; count: number; done: number; total: number; what: string }) => void;
}

/** The output signals of a table, in order, whichever engine takes it. */
export function outputSignals(table: SpecTable): readonly Signal[] {
  return (table.wide?.outputs ?? table.outputs).map((o) => o.signal);
}

export function examineTable(table: SpecTable, id: number, analyse: (t: SpecTable) => TableAnalysis): TableResult {
  const stopped = notAnalysed(table.problems);
  if (stopped) return { id, table, verdict: stopped, outputs: outputSignals(table).map(() => stopped), problems: table.problems };
  const analysis = analyse(table);
  const wide = analysis.wide;
  // An output the symbolic engine could not take (too large) has an error and no forms.
  const outputs = wide
    ? outputSignals(table).map((s) => {
        const o = wide.outputs.find((w) => w.signal.header === s.header);
        return o ? outputVerdict(o) : notAnalysed(analysis.problems)!;
      })
    : analysis.outputs.map(outputVerdict);
  return { id, table, verdict: outputs.length > 0 ? weakest(outputs) : notAnalysed(analysis.problems)!, outputs, analysis, problems: analysis.problems };
}

export function examine(read: TablesRead, options: ExamineOptions): Workbook {
  const count = read.tables.length;
  const tables = read.tables.map((table, index) =>
    examineTable(table, index, (t) => {
      const say = (done: number, total: number, what: string) => options.onProgress?.({ table: t, index, count, done, total, what });
      say(0, 1, 'starting');
      return analyseTable(t, { ...(options.budgetMs !== undefined ? { budgetMs: options.budgetMs } : {}), onProgress: say });
    }),
  );
  return { source: options.source, tables, problems: read.problems, ...permissions(tables, read.problems) };
}

function permissions(tables: readonly TableResult[], problems: readonly Problem[]): Pick<Workbook, 'handOver' | 'resultsWrite'> {
  if (tables.length === 0) {
    const reason = 'no spec table was found';
    return { handOver: { allowed: false, reason }, resultsWrite: { allowed: false, reason } };
  }
  const why: string[] = [];
  for (const t of tables) if (!cleared(t.verdict)) why.push(`${qualifiedAddress(t.table.sheet, t.table.range)} ${t.verdict.kind === 'not-analysed' ? 'is ' : ''}${verdictWords(t.verdict)}`);
  const outside = errorsOf(problems);
  if (outside.length > 0) why.push(`${plural(outside.length, 'error')} outside the tables, the first at ${qualifiedAddress(outside[0]!.sheet, outside[0]!.cell)}`);
  const handOver: Permission = why.length > 0 ? { allowed: false, reason: `nothing is handed over until every table is cleared: ${why.join('; ')}` } : { allowed: true };
  return { handOver, resultsWrite: { allowed: true } };
}

/** Every table cleared, none left out, no error outside them: what exit status 0 of the command line means. */
export function allCleared(wb: Workbook): boolean {
  return wb.tables.length > 0 && wb.tables.every((t) => cleared(t.verdict)) && errorsOf(wb.problems).length === 0;
}

/** The verdict line of a whole run. */
export function workbookVerdictText(wb: Workbook): string {
  if (wb.tables.length === 0) return 'No spec table was found: nothing was proven.';
  const outputs = wb.tables.flatMap((t) => [...(t.analysis?.outputs ?? []), ...(t.analysis?.wide?.outputs ?? [])]);
  const forms = outputs.reduce((n, o) => n + [o.andOr, o.xor, o.bestXor].filter((f) => f !== null).length, 0);
  const withoutXor = outputs.filter((o) => o.xor === null).length;
  const missing = withoutXor === 0 ? '' : `; no XOR forms for ${plural(withoutXor, 'output')} analysed on its rows' cubes (no decision diagram)`;
  if (allCleared(wb)) return `Every form derived (${forms}) was proven against its spec table, every input combination checked${missing}.`;
  const errors = errorsOf([...wb.problems, ...wb.tables.flatMap((t) => t.problems)]).length;
  const differing = wb.tables
    .flatMap((t) => [...(t.analysis?.outputs ?? []), ...(t.analysis?.wide?.outputs ?? [])])
    .flatMap((o) => [o.andOr, o.xor, o.bestXor])
    .filter((f) => f !== null && Number(f.proof.mismatchCount) > 0).length;
  const why: string[] = [];
  if (errors > 0) why.push(`${plural(errors, 'error')} in the spec`);
  if (differing > 0) why.push(`${plural(differing, 'form')} differ from the spec`);
  return `Not cleared: ${why.join(', ')}. Fix the cells named above and run again.`;
}
