// `compare OLD NEW`: two revisions of the spec tables compared by behaviour, with the steps of
// the old test record to repeat; with -o, the change record and the new record beside the new
// workbook. The verdict and the sheets are the workflow's (compareWorkbooks); this is the printing.
import { mkdir } from 'node:fs/promises';
import { basename, dirname, resolve } from 'node:path';
import { comparisonJson, comparisonReport, problemJson } from '../compare/index.js';
import { openFile, sameFile } from '../hosts/node.js';
import { problemLine, readTestRecord, type FilledRecord } from '../report/index.js';
import { fail, ok, type Result } from '../logic/index.js';
import type { Problem } from '../table/index.js';
import { compareWorkbooks, writeSheets, type TableCompared } from '../workflow/index.js';
import type { CompareCommand } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { loadTables } from './load.js';
import type { Progress } from './progress.js';

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

function report(cmd: CompareCommand, io: CliIo, compared: readonly TableCompared[], problems: readonly Problem[], specProblems: readonly Problem[]): void {
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
  const result = compareWorkbooks(old.value.read, next.value.read, {
    renames: cmd.renames,
    ...(records?.ok ? { records: records.value } : {}),
    oldSource: basename(cmd.old),
    newSource: basename(cmd.new),
    onProgress: (what, done, total) => (done === undefined || total === undefined ? progress.note(what) : progress.tick(what, done, total)),
  });
  report(cmd, io, result.compared, result.problems, result.specProblems);

  if (cmd.out !== undefined) {
    const host = next.value.host;
    await writeSheets(host, result.sheets);
    await mkdir(dirname(resolve(cmd.out)), { recursive: true });
    const saved = await progress.during(`writing ${cmd.out}`, host.save(cmd.out));
    if (!saved.ok) {
      io.err(`error: ${saved.error.message}\n`);
      return EXIT.usage;
    }
    (cmd.json ? io.err : io.out)(`Change record written: ${saved.value}\n`);
  }
  return result.cleared ? EXIT.ok : EXIT.failed;
}
