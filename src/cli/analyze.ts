// `analyze`: spec tables -> forms, proofs and findings, as a readable report or the JSON
// document of DESIGN.md section 4; with -o, a results workbook beside the untouched input.
// The verdicts and the sheets written are the workflow's; this file brings the file I/O.
import { mkdir } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { sameFile } from '../hosts/node.js';
import { qualifiedAddress } from '../table/index.js';
import { allCleared, sheetsToWrite, verdictWords, workbookJson, workbookVerdictText, writeSheets, type TableResult, type Workbook } from '../workflow/index.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { examineLoaded, loadTables } from './load.js';
import type { Progress } from './progress.js';
import { analysisReport, problemLine, tableReport } from '../report/index.js';

type AnalyzeCommand = Extract<Command, { name: 'analyze' }>;

/** Exit status of a run: 0 only when every table is cleared. */
export function exitOf(wb: Workbook): ExitCode {
  return allCleared(wb) ? EXIT.ok : EXIT.failed;
}

/** A table that was not analysed: where it is, why, and its problems; no form and no proof. */
function notAnalysedLines(t: TableResult): string[] {
  const title = `Table ${qualifiedAddress(t.table.sheet, t.table.range)}: ${verdictWords(t.verdict)}`;
  return [
    title,
    '='.repeat(Math.min(title.length, 100)),
    'No form was derived or proven, and nothing of this table is handed over. Fix the cells below and run again.',
    ...(t.table.xReading === 'dont-care' ? ["X cells read as '-' (any / don't-care)."] : []),
    '',
    'Problems:',
    ...t.problems.map(problemLine),
  ];
}

export function workbookReport(wb: Workbook): string {
  const tables = wb.tables.flatMap((t) => [...(t.analysis ? tableReport(t.analysis) : notAnalysedLines(t)), '']);
  return (tables.length > 0 ? tables.join('\n') + '\n' : '') + analysisReport([], wb.problems, workbookVerdictText(wb));
}

export async function analyzeCommand(cmd: AnalyzeCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  // Refused before any work, so that a mistyped -o costs nothing and touches nothing.
  if (cmd.out !== undefined && sameFile(cmd.file, cmd.out)) {
    io.err(`error: ${cmd.out} is the input file; results go to a new file (choose another -o name)\n`);
    return EXIT.usage;
  }
  const loaded = await loadTables(cmd.file, cmd.spec, progress);
  if (!loaded.ok) {
    io.err(`error: ${loaded.error}\n`);
    return EXIT.usage;
  }
  const wb = examineLoaded(loaded.value, progress);
  if (cmd.json) io.out(JSON.stringify(workbookJson(wb), null, 2) + '\n');
  else io.out(workbookReport(wb));

  if (cmd.out !== undefined) {
    if (!wb.resultsWrite.allowed) {
      io.err(`error: no results workbook written: ${wb.resultsWrite.reason}\n`);
      return EXIT.failed;
    }
    const { host } = loaded.value;
    await writeSheets(host, sheetsToWrite(wb));
    // A fresh checkout has no out/ folder (it is git-ignored): make the folder asked for.
    await mkdir(dirname(resolve(cmd.out)), { recursive: true });
    const saved = await progress.during(`writing ${cmd.out}`, host.save(cmd.out));
    if (!saved.ok) {
      io.err(`error: ${saved.error.message}\n`);
      return EXIT.usage;
    }
    // With --json, stdout carries the document only.
    const line = `Results workbook written: ${saved.value}\n`;
    if (cmd.json) io.err(line);
    else io.out(line);
  }
  return exitOf(wb);
}
