// `record`: filled-in commissioning test records read back. Each record names its table and
// the settings it was read with; the table is read again the same way, and the record is
// current only when its revision stamp still matches (src/workflow/records.ts, shared with the
// pane and the page). The workbook is only read, never written.
import { openFile } from '../hosts/node.js';
import { CAUTION_LINES, problemLine } from '../report/index.js';
import { qualifiedAddress } from '../table/index.js';
import { checkRecords, recordsCleared, type RecordVerdict } from '../workflow/index.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import type { Progress } from './progress.js';

type RecordCommand = Extract<Command, { name: 'record' }>;

export async function recordCommand(cmd: RecordCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  const opened = await progress.during(`reading ${cmd.file}`, openFile(cmd.file, cmd.timeLimitMs !== undefined ? { timeLimitMs: cmd.timeLimitMs } : {}));
  if (!opened.ok) {
    io.err(`error: ${opened.error.message}\n`);
    return EXIT.usage;
  }
  const verdicts = await checkRecords(opened.value);
  if (cmd.json) io.out(JSON.stringify({ caution: CAUTION_LINES.join(' '), records: verdicts.map(recordJson) }, null, 2) + '\n');
  else io.out(recordText(cmd.file, verdicts));
  return recordsCleared(verdicts) ? EXIT.ok : EXIT.failed;
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
