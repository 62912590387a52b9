// What a host shows of a workbook read, without the truth tables behind it: small enough to
// cross from the pane's worker on every read (a 24-input table's bit sets are 16.8 MB). Either
// engine's outputs come as the same views (src/report output-view.ts), up to 64 inputs.
import type { Signal } from '../logic/index.js';
import { outputViews, type OutputView } from '../report/index.js';
import type { Problem, RoleRule, XReading } from '../table/index.js';
import type { TableResult, Workbook } from './examine.js';
import type { Verdict } from './verdict.js';

export interface TableView {
  readonly id: number;
  readonly sheet: string;
  readonly range: string;
  readonly inputs: readonly Signal[];
  readonly outputs: readonly { readonly signal: Signal; readonly safe: 0 | 1; readonly verdict: Verdict }[];
  readonly rows: number;
  readonly roleRule: RoleRule;
  readonly xReading: XReading;
  readonly verdict: Verdict;
  readonly problems: readonly Problem[];
  /**
   * The outputs' forms and findings, only for a table that was analysed; in the order of
   * `outputs`, less any output the symbolic engine found too large (its error says so).
   */
  readonly analysed?: readonly OutputView[];
}

/** The workbook's verdicts and permissions as they are, its tables as views. */
export interface WorkbookView extends Omit<Workbook, 'tables'> {
  readonly tables: readonly TableView[];
}

function tableView(t: TableResult): TableView {
  const { table } = t;
  return {
    id: t.id,
    sheet: table.sheet,
    range: table.range,
    inputs: table.inputs,
    outputs: (table.wide?.outputs ?? table.outputs).map((o, j) => ({ signal: o.signal, safe: o.safe, verdict: t.outputs[j]! })),
    rows: table.rows.length,
    roleRule: table.roleRule,
    xReading: table.xReading,
    verdict: t.verdict,
    problems: t.problems,
    ...(t.analysis ? { analysed: outputViews(t.analysis) } : {}),
  };
}

export function workbookView(wb: Workbook): WorkbookView {
  return { source: wb.source, tables: wb.tables.map(tableView), problems: wb.problems, handOver: wb.handOver, resultsWrite: wb.resultsWrite };
}
