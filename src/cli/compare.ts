// `compare OLD NEW`: two revisions of the spec tables compared by behaviour, with the steps of
// the old test record to repeat; with -o, the change record and the new record beside the new
// workbook. Each stage is a small function so the flow can move into a shared workflow layer.
import { mkdir } from 'node:fs/promises';
import { basename, dirname, resolve } from 'node:path';
import {
  changeRecordSheet,
  compareAnalyses,
  comparisonJson,
  comparisonReport,
  matchTables,
  oldStepsFromRecord,
  oldStepsOf,
  problemJson,
  recordFor,
  retestRecordSheet,
  selectRetest,
  type Retest,
  type TableComparison,
} from '../compare/index.js';
import { openFile, sameFile } from '../hosts/file-host.js';
import { readTestRecord, type FilledRecord } from '../report/record-read.js';
import { fail, ok, type Result } from '../logic/result.js';
import { analyseTable } from '../spec/analyse.js';
import type { TableAnalysis } from '../spec/analysis-types.js';
import { qualifiedAddress } from '../spec/grid.js';
import type { Problem, SpecTable } from '../spec/types.js';
import type { CompareCommand } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { loadTables, type Loaded } from './load.js';
import type { Progress } from './progress.js';
import { problemLine } from './report-text.js';

interface Compared {
  readonly comparison: TableComparison;
  readonly retest: Retest;
}

/** Every record sheet of a filled-in record workbook. */
async function readRecords(file: string, progress: Progress): Promise<Result<FilledRecord[], string>> {
  const opened = await progress.during(`reading ${file}`, openFile(file));
  if (!opened.ok) return fail(opened.error.message);
  const records: FilledRecord[] = [];
  for (const sheet of await opened.value.listSheets()) {
    if (opened.value.sheetProblem(sheet)) continue;
    const record = readTestRecord(await opened.value.readGrid(sheet));
    if (record) records.push(record);
  }
  if (records.length === 0) return fail(`${file}: no commissioning test record sheet in it (a sheet titled "Commissioning test record: ...")`);
  return ok(records);
}

function analyseAll(tables: readonly SpecTable[], progress: Progress): TableAnalysis[] {
  return tables.map((table) => {
    const label = `analysing ${qualifiedAddress(table.sheet, table.range)}`;
    progress.note(label);
    return analyseTable(table, { onProgress: (done, total) => progress.tick(label, done, total) });
  });
}

/** The tables paired, compared, and their retest chosen from the record or the old table. */
function compareLoaded(cmd: CompareCommand, old: Loaded, next: Loaded, records: readonly FilledRecord[] | undefined, progress: Progress): { compared: Compared[]; problems: Problem[] } {
  const match = matchTables(old.read.tables, next.read.tables);
  const problems: Problem[] = match.unmatched.map((message) => ({ severity: 'error', code: 'tables-unmatched', sheet: next.read.tables[0]?.sheet ?? '', cell: 'A1', message }));
  const olds = analyseAll(match.pairs.map((p) => p.old), progress);
  const news = analyseAll(match.pairs.map((p) => p.new), progress);
  const compared = olds.map((a, i) => {
    const comparison = compareAnalyses(a, news[i]!, { renames: cmd.renames });
    const record = records && recordFor(comparison, records);
    if (records && !record)
      problems.push({ severity: 'warning', code: 'record-not-found', sheet: a.table.sheet, cell: a.table.range, message: "no sheet of the record is of this table: the old table's own steps are used" });
    const fromRecord = record ? oldStepsFromRecord(comparison, record) : undefined;
    const retest = fromRecord ? selectRetest(comparison, fromRecord.steps, 'record', fromRecord.problems) : selectRetest(comparison, oldStepsOf(comparison), 'old table');
    return { comparison, retest };
  });
  return { compared, problems };
}

function report(cmd: CompareCommand, io: CliIo, compared: readonly Compared[], problems: readonly Problem[], specProblems: readonly Problem[]): void {
  if (cmd.json) {
    const doc = { tables: compared.map((c) => comparisonJson(c.comparison, c.retest)), problems: [...problems, ...specProblems].map(problemJson) };
    io.out(JSON.stringify(doc, null, 2) + '\n');
    return;
  }
  io.out(comparisonReport(compared));
  if (compared.length === 0) io.err('No pair of tables to compare: nothing was judged.\n');
  for (const p of [...problems, ...specProblems]) io.err(problemLine(p) + '\n');
}

export async function compareCommand(cmd: CompareCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  if (cmd.out !== undefined && (sameFile(cmd.old, cmd.out) || sameFile(cmd.new, cmd.out))) {
    io.err(`error: ${cmd.out} is an input file; the change record goes to a new file (choose another -o name)\n`);
    return EXIT.usage;
  }
  const old = await loadTables(cmd.old, cmd.oldSpec, progress);
  const next = old.ok ? await loadTables(cmd.new, cmd.newSpec, progress) : old;
  const records = cmd.oldRecord === undefined ? undefined : await readRecords(cmd.oldRecord, progress);
  for (const failed of [old, next, records]) {
    if (failed && !failed.ok) {
      io.err(`error: ${failed.error}\n`);
      return EXIT.usage;
    }
  }
  if (!old.ok || !next.ok) return EXIT.usage;
  const { compared, problems } = compareLoaded(cmd, old.value, next.value, records?.ok ? records.value : undefined, progress);
  // A comparison is only as good as what was read: errors in either revision keep it from clearing.
  const specProblems = [old.value, next.value].flatMap((l) => [...l.read.problems, ...l.read.tables.flatMap((t) => t.problems)]).filter((p) => p.severity === 'error');
  report(cmd, io, compared, problems, specProblems);

  if (cmd.out !== undefined) {
    const host = next.value.host;
    for (const { comparison, retest } of compared) {
      await host.writeSheet(changeRecordSheet(comparison, retest, { oldSource: basename(cmd.old), newSource: basename(cmd.new) }));
      await host.writeSheet(retestRecordSheet(comparison, retest, { source: basename(cmd.new) }));
    }
    await mkdir(dirname(resolve(cmd.out)), { recursive: true });
    const saved = await progress.during(`writing ${cmd.out}`, host.save(cmd.out));
    if (!saved.ok) {
      io.err(`error: ${saved.error.message}\n`);
      return EXIT.usage;
    }
    (cmd.json ? io.err : io.out)(`Change record written: ${saved.value}\n`);
  }
  const cleared =
    compared.length > 0 &&
    problems.every((p) => p.severity !== 'error') &&
    specProblems.length === 0 &&
    compared.every((c) => !c.comparison.changed && c.retest.problems.every((p) => p.severity !== 'error'));
  return cleared ? EXIT.ok : EXIT.failed;
}
