// `record`: filled-in commissioning test records read back. Each record names its table and
// the settings it was read with; the table is read again the same way, and the record is
// current only when its revision stamp still matches. The workbook is only read, never written.
import { openFile } from '../hosts/file-host.js';
import { judgeRecord, readTestRecord, type RecordVerdict } from '../report/record-read.js';
import { CAUTION_LINES } from '../report/caution.js';
import { analyseTable } from '../spec/analyse.js';
import { qualifiedAddress } from '../spec/grid.js';
import { readSpecTables } from '../spec/read-tables.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import type { Progress } from './progress.js';
import { problemLine } from './report-text.js';

type RecordCommand = Extract<Command, { name: 'record' }>;

export async function recordCommand(cmd: RecordCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  const opened = await progress.during(`reading ${cmd.file}`, openFile(cmd.file, cmd.timeLimitMs !== undefined ? { timeLimitMs: cmd.timeLimitMs } : {}));
  if (!opened.ok) {
    io.err(`error: ${opened.error.message}\n`);
    return EXIT.usage;
  }
  const host = opened.value;
  const sheets = await host.listSheets();
  const verdicts: RecordVerdict[] = [];
  for (const sheet of sheets) {
    if (host.sheetProblem(sheet)) continue;
    const record = readTestRecord(await host.readGrid(sheet));
    if (!record) continue;
    const there = sheets.includes(record.table.sheet) && !host.sheetProblem(record.table.sheet);
    const table = there ? readSpecTables(await host.readGrid(record.table.sheet), record.settings).tables.find((t) => t.range === record.table.range) : undefined;
    verdicts.push(judgeRecord(record, table && { table, analysis: analyseTable(table) }));
  }
  if (cmd.json) io.out(JSON.stringify({ caution: CAUTION_LINES.join(' '), records: verdicts.map(recordJson) }, null, 2) + '\n');
  else io.out(recordText(cmd.file, verdicts));
  return verdicts.length > 0 && verdicts.every((v) => v.ok) ? EXIT.ok : EXIT.failed;
}

function recordJson(v: RecordVerdict) {
  return {
    sheet: v.record.sheet,
    table: qualifiedAddress(v.record.table.sheet, v.record.table.range),
    stamp: v.record.stamp,
    current: v.current,
    ...(v.stale !== undefined ? { stale: v.stale } : {}),
    passed: v.passed,
    failed: v.failed,
    notRun: v.notRun,
    steps: v.record.steps.map((s) => ({ step: s.step, testId: s.testId, result: s.result, cell: s.cell })),
    problems: v.problems.map((p) => ({ severity: p.severity, code: p.code, sheet: p.sheet, cell: p.cell, message: p.message })),
    ok: v.ok,
  };
}

function recordText(file: string, verdicts: readonly RecordVerdict[]): string {
  const lines: string[] = [...CAUTION_LINES, ''];
  if (verdicts.length === 0) lines.push(`${file}: no commissioning test record found (a sheet whose first cell reads "Commissioning test record: ...")`);
  for (const v of verdicts) {
    lines.push(`Test record "${v.record.sheet}" of ${qualifiedAddress(v.record.table.sheet, v.record.table.range)}`);
    lines.push(v.current ? `  current: the table still has revision stamp ${v.record.stamp.slice(0, 19)}...` : `  STALE: ${v.stale}`);
    lines.push(`  ${v.passed} passed, ${v.failed} failed, ${v.notRun} not run, of ${v.record.steps.length} steps`);
    for (const s of v.record.steps) if (s.result !== 'passed') lines.push(`    step ${s.step} (${s.testId}) ${s.result === 'failed' ? 'FAILED' : 'not run'} at ${qualifiedAddress(v.record.sheet, s.cell)}`);
    for (const p of v.problems) lines.push(problemLine(p));
    lines.push(v.ok ? '  Every step passed on the current revision.' : '  Not complete: see above.', '');
  }
  return lines.join('\n') + '\n';
}
