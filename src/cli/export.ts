// `export`: the hand-over pack (Structured Text, PLCopen XML, ladder SVG, test steps) of every
// spec table read, written only when the workflow allows it (every table cleared).
import { mkdir } from 'node:fs/promises';
import { dirname, join, resolve } from 'node:path';
import { sameFile, writeOutputFile } from '../hosts/node.js';
import { errorsOf, handOverFiles, workbookVerdictText, type HandOverKind } from '../workflow/index.js';
import type { Command } from './args.js';
import { EXIT, type CliIo, type ExitCode } from './io.js';
import { examineLoaded, loadTables } from './load.js';
import type { Progress } from './progress.js';
import { problemLine } from '../report/index.js';

type ExportCommand = Extract<Command, { name: 'export' }>;

export async function exportCommand(cmd: ExportCommand, io: CliIo, progress: Progress): Promise<ExitCode> {
  const loaded = await loadTables(cmd.file, cmd.spec, progress);
  if (!loaded.ok) {
    io.err(`error: ${loaded.error}\n`);
    return EXIT.usage;
  }
  const wb = examineLoaded(loaded.value, progress);
  // Where each kind of file goes: a path given on the command line, or the folder for pictures.
  const paths: Partial<Record<HandOverKind, string>> = { st: cmd.st, plcopen: cmd.plcopen, steps: cmd.steps, ladder: cmd.svg };
  const kinds = (['st', 'plcopen', 'steps', 'ladder'] as const).filter((k) => paths[k] !== undefined);
  const pack = handOverFiles(wb, { kinds, form: cmd.form, body: cmd.ladderBody ? 'LD' : 'ST' });
  if (!pack.ok) {
    for (const p of errorsOf([...wb.problems, ...wb.tables.flatMap((t) => t.problems)])) io.err(problemLine(p) + '\n');
    io.err(`${workbookVerdictText(wb)}\nNothing was exported: ${pack.error}.\n`);
    return EXIT.failed;
  }
  const files = pack.value.map((f) => ({ path: f.kind === 'ladder' ? join(paths.ladder!, f.name) : paths[f.kind]!, text: f.text }));
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
