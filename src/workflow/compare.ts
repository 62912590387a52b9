// Two revisions of a workbook's spec tables compared, the same in every host: tables paired,
// analysed and compared by behaviour, the retest chosen from a filled-in record or the old
// table's own steps, whether the comparison clears, and the sheets that write it down.
import {
  changeRecordSheet,
  compareAnalyses,
  matchTables,
  oldStepsFromRecord,
  oldStepsOf,
  recordFor,
  retestRecordSheet,
  selectRetest,
  type Rename,
  type Retest,
  comparisonJson,
  problemJson,
  type TableComparison,
} from '../compare/index.js';
import type { FilledRecord, SheetBlock } from '../report/index.js';
import { analyseTable, type TableAnalysis } from '../analysis/index.js';
import { qualifiedAddress, type Problem, type SpecTable } from '../table/index.js';
import type { TablesRead } from './read.js';

export interface CompareWorkbooksOptions {
  readonly renames?: readonly Rename[];
  /** A filled-in record of the old revision; without it the old table's own steps are used. */
  readonly records?: readonly FilledRecord[];
  /** File names as the change record and the new record name their sources. */
  readonly oldSource: string;
  readonly newSource: string;
  readonly onProgress?: (what: string, done?: number, total?: number) => void;
}

export interface TableCompared {
  readonly comparison: TableComparison;
  readonly retest: Retest;
}

export interface WorkbooksCompared {
  readonly compared: readonly TableCompared[];
  /** Pairing and record problems. */
  readonly problems: readonly Problem[];
  /** Errors read in either revision: they keep the comparison from clearing. */
  readonly specProblems: readonly Problem[];
  /** Exit 0 / "no change": a pair compared, nothing changed, nothing in the way. */
  readonly cleared: boolean;
  /** Per pair the change record and the new test record with its Retest column (new sheets). */
  readonly sheets: readonly SheetBlock[];
}

function analyseAll(tables: readonly SpecTable[], onProgress: CompareWorkbooksOptions['onProgress']): TableAnalysis[] {
  return tables.map((table) => {
    const label = `analysing ${qualifiedAddress(table.sheet, table.range)}`;
    onProgress?.(label);
    return analyseTable(table, { onProgress: (done, total) => onProgress?.(label, done, total) });
  });
}

const hasError = (ps: readonly Problem[]) => ps.some((p) => p.severity === 'error');

export function compareWorkbooks(oldRead: TablesRead, newRead: TablesRead, options: CompareWorkbooksOptions): WorkbooksCompared {
  const { records, onProgress } = options;
  const match = matchTables(oldRead.tables, newRead.tables);
  const problems: Problem[] = match.unmatched.map((message) => ({ severity: 'error', code: 'tables-unmatched', sheet: newRead.tables[0]?.sheet ?? '', cell: 'A1', message }));
  const olds = analyseAll(match.pairs.map((p) => p.old), onProgress);
  const news = analyseAll(match.pairs.map((p) => p.new), onProgress);
  const compared = olds.map((a, i) => {
    const comparison = compareAnalyses(a, news[i]!, { renames: options.renames ?? [] });
    const record = records && recordFor(comparison, records);
    if (records && !record)
      problems.push({ severity: 'warning', code: 'record-not-found', sheet: a.table.sheet, cell: a.table.range, message: "no sheet of the record is of this table: the old table's own steps are used" });
    const fromRecord = record ? oldStepsFromRecord(comparison, record) : undefined;
    const retest = fromRecord ? selectRetest(comparison, fromRecord.steps, 'record', fromRecord.problems) : selectRetest(comparison, oldStepsOf(comparison), 'old table');
    return { comparison, retest };
  });
  const specProblems = [oldRead, newRead].flatMap((r) => [...r.problems, ...r.tables.flatMap((t) => t.problems)]).filter((p) => p.severity === 'error');
  const cleared = compared.length > 0 && !hasError(problems) && specProblems.length === 0 && compared.every((c) => !c.comparison.changed && !hasError(c.retest.problems));
  const sheets = compared.flatMap(({ comparison, retest }) => [
    changeRecordSheet(comparison, retest, { oldSource: options.oldSource, newSource: options.newSource }),
    retestRecordSheet(comparison, retest, { source: options.newSource }),
  ]);
  return { compared, problems, specProblems, cleared, sheets };
}

/** What a pane shows and writes: per pair the comparison as JSON data (patterns over the joint inputs), as plain data. */
export interface CompareView {
  readonly tables: readonly ReturnType<typeof comparisonJson>[];
  readonly problems: readonly ReturnType<typeof problemJson>[];
  readonly cleared: boolean;
  readonly sheets: readonly SheetBlock[];
}

export function compareView(c: WorkbooksCompared): CompareView {
  return {
    tables: c.compared.map((t) => comparisonJson(t.comparison, t.retest)),
    problems: [...c.problems, ...c.specProblems].map(problemJson),
    cleared: c.cleared,
    sheets: c.sheets,
  };
}
