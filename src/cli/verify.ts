// `verify`: an implementation (Structured Text or PLCopen XML) checked against the spec tables,
// every input combination, with counterexamples where it differs.
import { readFile, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import type { Result } from '../logic/index.js';
import { readImplementation } from '../impl/index.js';
import { problemLine, verifyReportJson, verifyReportText } from '../report/index.js';
import { errorsOf, programCleared, readMappings, verifyProgram } from '../workflow/index.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { examineLoaded, loadTables } from './load.js';
import type { Progress } from './progress.js';
import { fileSystemReason } from '../hosts/node.js';

type VerifyCommand = Extract<Command, { name: 'verify' }>;

/** Implementation and mapping files are text we parse ourselves; this bounds what we read. */
const MAX_TEXT_BYTES = 20 * 1024 * 1024;

async function readText(path: string, what: string): Promise<Result<string, string>> {
  try {
    const info = await stat(path);
    if (!info.isFile()) return { ok: false, error: `${path}: the ${what} file ${info.isDirectory() ? 'is a folder (EISDIR)' : 'is not a regular file'}` };
    if (info.size > MAX_TEXT_BYTES) return { ok: false, error: `${path}: the ${what} is larger than ${MAX_TEXT_BYTES} bytes` };
    return { ok: true, value: await readFile(path, 'utf8') };
  } catch (e) {
    return { ok: false, error: `${path}: the ${what} file cannot be read: ${fileSystemReason(e)}` };
  }
}

export async function verifyCommand(cmd: VerifyCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  const implText = await readText(cmd.impl, 'implementation');
  if (!implText.ok) {
    io.err(`error: ${implText.error}\n`);
    return EXIT.usage;
  }
  const mapText = cmd.map === undefined ? undefined : await readText(cmd.map, 'mapping');
  if (mapText && !mapText.ok) {
    io.err(`error: ${mapText.error}\n`);
    return EXIT.usage;
  }
  const loaded = await loadTables(cmd.file, cmd.spec, progress);
  if (!loaded.ok) {
    io.err(`error: ${loaded.error}\n`);
    return EXIT.usage;
  }
  const wb = examineLoaded(loaded.value, progress);
  // A program that cannot be read, or a mapping that cannot, is a finding about the user's
  // files (exit 1), reported with file and line.
  const program = readImplementation(basename(cmd.impl), implText.value);
  if (!program.ok) {
    io.err(`error: ${program.error.message}\n`);
    return EXIT.failed;
  }
  const mapping = readMappings(mapText?.ok ? [{ kind: 'file', fileName: basename(cmd.map!), text: mapText.value }] : []);
  if (!mapping.ok) {
    io.err(`error: ${mapping.error.message}\n`);
    return EXIT.failed;
  }
  progress.note(`checking ${cmd.impl} against ${wb.tables.length} spec table(s)`);
  // Outputs of a table with errors come back UNCHECKED: the workflow's rule, as in every host.
  const report = verifyProgram(wb, program.value, mapping.value, { gapsFree: cmd.gapsFree });
  if (cmd.json) io.out(JSON.stringify(verifyReportJson(report), null, 2) + '\n');
  else io.out(verifyReportText(report));
  for (const p of errorsOf([...wb.problems, ...wb.tables.flatMap((t) => t.problems)])) io.err(problemLine(p) + '\n');
  return programCleared(wb, report) ? EXIT.ok : EXIT.failed;
}
