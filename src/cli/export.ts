// `export`: the hand-over pack (Structured Text, PLCopen XML, ladder SVG, test steps) of every
// spec table read, written only when every form is proven and the spec has no error.
import { mkdir } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { sameFile, writeOutputFile } from '../hosts/file-host.js';
import { ladderSvg } from '../report/ladder-svg.js';
import { exportPlcopen } from '../report/plcopen-export.js';
import { exportSt } from '../report/st-export.js';
import { stepsCsv } from '../report/test-steps.js';
import type { TableAnalysis } from '../spec/analysis-types.js';
import { analyseAll, verdictCode, verdictOf, verdictText } from './analyze.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { loadTables } from './load.js';
import type { Progress } from './progress.js';
import { problemLine } from './report-text.js';
import { appendAll } from '../logic/arrays.js';

type ExportCommand = Extract<Command, { name: 'export' }>;

/** One file of the pack: where it goes and what it holds. */
interface PackFile {
  readonly path: string;
  readonly text: string;
}

/** SVG file names from sheet and output identifier, safe on any file system, unique in the folder. */
function ladderFiles(analyses: readonly TableAnalysis[], dir: string): PackFile[] {
  const used = new Set<string>();
  return analyses.flatMap((a) =>
    a.outputs.map((o) => {
      const stem = `${a.table.sheet}-${o.signal.identifier}`.replace(/[^A-Za-z0-9_-]+/g, '_');
      let name = stem;
      for (let i = 2; used.has(name.toLowerCase()); i++) name = `${stem}-${i}`;
      used.add(name.toLowerCase());
      return { path: join(dir, `${name}.svg`), text: ladderSvg(o, a.inputs) };
    }),
  );
}

function packFiles(cmd: ExportCommand, analyses: readonly TableAnalysis[], source: string): PackFile[] {
  const files: PackFile[] = [];
  const from = { workbook: source };
  if (cmd.st !== undefined) files.push({ path: cmd.st, text: exportSt(analyses, { form: cmd.form, source: from }) });
  if (cmd.plcopen !== undefined)
    files.push({ path: cmd.plcopen, text: exportPlcopen(analyses, { form: cmd.form, body: cmd.ladderBody ? 'LD' : 'ST', source: from }) });
  // Several tables: one CSV, their step lists one after another.
  if (cmd.steps !== undefined) files.push({ path: cmd.steps, text: analyses.map((a) => stepsCsv(a)).join('\r\n') });
  if (cmd.svg !== undefined) appendAll(files, ladderFiles(analyses, cmd.svg));
  return files;
}

export async function exportCommand(cmd: ExportCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  const loaded = await loadTables(cmd.file, cmd.spec, progress);
  if (!loaded.ok) {
    io.err(`error: ${loaded.error}\n`);
    return EXIT.usage;
  }
  const { source, tables, otherProblems } = loaded.value;
  const analyses = analyseAll(tables, progress);
  const verdict = verdictOf(analyses, otherProblems);
  if (verdictCode(verdict) !== EXIT.ok) {
    for (const p of [...otherProblems, ...analyses.flatMap((a) => a.problems)]) if (p.severity === 'error') io.err(problemLine(p) + '\n');
    io.err(`${verdictText(verdict)}\nNothing was exported: the hand-over pack is written only from a clean, proven spec.\n`);
    return EXIT.failed;
  }
  const files = packFiles(cmd, analyses, source);
  // Every name is checked before the first file is written: the input is never replaced.
  const clash = files.find((f) => sameFile(cmd.file, f.path));
  if (clash) {
    io.err(`error: ${clash.path} is the input file; choose another name\n`);
    return EXIT.usage;
  }
  for (const file of files) {
    await mkdir(dirname(resolve(file.path)), { recursive: true });
    const written = await writeOutputFile(cmd.file, file.path, file.text);
    if (!written.ok) {
      io.err(`error: ${written.error.message}\n`);
      return EXIT.usage;
    }
    io.out(`wrote ${written.value}\n`);
  }
  return EXIT.ok;
}
