// `analyze`: spec tables -> forms, proofs and findings, as a readable report or the JSON
// document of DESIGN.md section 4; with -o, a results workbook beside the untouched input.
import { mkdir } from 'node:fs/promises';
import { dirname, resolve } from 'node:path';
import { sameFile } from '../hosts/file-host.js';
import { resultsSheet } from '../report/results-sheet.js';
import { stepsSheet } from '../report/test-steps.js';
import { analyseTable } from '../spec/analyse.js';
import { analysisJson } from '../spec/analysis-json.js';
import type { TableAnalysis } from '../spec/analysis-types.js';
import { qualifiedAddress } from '../spec/grid.js';
import type { Problem, SpecTable } from '../spec/types.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { loadTables } from './load.js';
import type { Progress } from './progress.js';
import { analysisReport } from './report-text.js';

type AnalyzeCommand = Extract<Command, { name: 'analyze' }>;

export function analyseAll(tables: readonly SpecTable[], progress: Progress): TableAnalysis[] {
  return tables.map((table) => {
    const label = `analysing ${qualifiedAddress(table.sheet, table.range)}`;
    progress.note(`${label} (${table.inputs.length} inputs, ${table.outputs.length} output${table.outputs.length === 1 ? "" : "s"})`);
    return analyseTable(table, { onProgress: (done, total) => progress.tick(label, done, total) });
  });
}

/** What keeps a run from exit status 0: spec errors, forms that differ from the spec, no table. */
export interface Verdict {
  readonly errors: number;
  readonly failedForms: number;
  readonly forms: number;
  readonly tables: number;
}

export function verdictOf(analyses: readonly TableAnalysis[], otherProblems: readonly Problem[]): Verdict {
  const problems = [...otherProblems, ...analyses.flatMap((a) => a.problems)];
  const forms = analyses.flatMap((a) => [...a.outputs, ...(a.wide?.outputs ?? [])].flatMap((o) => [o.andOr.proof, o.xor.proof, o.bestXor.proof]));
  return {
    errors: problems.filter((p) => p.severity === 'error').length,
    failedForms: forms.filter((p) => p.mismatchCount > 0).length,
    forms: forms.length,
    tables: analyses.length,
  };
}

export function verdictCode(v: Verdict): ExitCode {
  return v.tables > 0 && v.errors === 0 && v.failedForms === 0 ? EXIT.ok : EXIT.failed;
}

export function verdictText(v: Verdict): string {
  if (v.tables === 0) return 'No spec table was found: nothing was proven.';
  if (verdictCode(v) === EXIT.ok)
    return `Every form (${v.forms}) was proven against its spec table, every input combination checked.`;
  const why: string[] = [];
  if (v.errors > 0) why.push(`${v.errors} error${v.errors === 1 ? '' : 's'} in the spec`);
  if (v.failedForms > 0) why.push(`${v.failedForms} form${v.failedForms === 1 ? '' : 's'} differ from the spec`);
  return `Not cleared: ${why.join(', ')}. Fix the cells named above and run again.`;
}

/** A problem outside any table: as in a table's `problems`, with its sheet beside the cell. */
export function problemJson(p: Problem): { severity: string; sheet: string; cell: string; message: string } {
  return { severity: p.severity, sheet: p.sheet, cell: p.cell, message: p.message };
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
  const { host, source, tables, otherProblems } = loaded.value;
  const analyses = analyseAll(tables, progress);
  const verdict = verdictOf(analyses, otherProblems);
  if (cmd.json) {
    const doc = { tables: analyses.map(analysisJson), problems: otherProblems.map(problemJson) };
    io.out(JSON.stringify(doc, null, 2) + '\n');
  } else io.out(analysisReport(analyses, otherProblems, verdictText(verdict)));

  if (cmd.out !== undefined) {
    for (const analysis of analyses) {
      await host.writeSheet(resultsSheet(analysis, { source }));
      await host.writeSheet(stepsSheet(analysis));
    }
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
  return verdictCode(verdict);
}
