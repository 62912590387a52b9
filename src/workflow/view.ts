// What a host shows of a workbook read, without the truth tables behind it: small enough to
// cross from the pane's worker on every read (a 24-input table's bit sets are 16.8 MB).
import type { Signal } from '../logic/index.js';
import type { OutputAnalysis } from '../analysis/index.js';
import type { Problem, RoleRule, XReading } from '../table/index.js';
import { wideLimit, type TableResult, type Workbook } from './examine.js';
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
  /** The outputs' forms and findings, only for a table of at most 24 inputs that was analysed. */
  readonly analysed?: readonly OutputAnalysis[];
  /** Over 24 inputs: what the host cannot show or check of the table, and where its forms are. */
  readonly limit?: string;
}

/** The workbook's verdicts and permissions as they are, its tables as views. */
export interface WorkbookView extends Omit<Workbook, 'tables'> {
  readonly tables: readonly TableView[];
}

function tableView(t: TableResult): TableView {
  const { table } = t;
  const limit = wideLimit(table);
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
    ...(t.analysis && !limit ? { analysed: t.analysis.outputs } : {}),
    ...(limit ? { limit } : {}),
  };
}

export function workbookView(wb: Workbook): WorkbookView {
  return { source: wb.source, tables: wb.tables.map(tableView), problems: wb.problems, handOver: wb.handOver, resultsWrite: wb.resultsWrite };
}
