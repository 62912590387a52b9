// interlock-algebra: the command line over the file host (DESIGN.md section 4).
// `main(argv, io)` returns the exit status, so that tests run the CLI in-process.
import { pathToFileURL } from 'node:url';
import { analyzeCommand } from './analyze.js';
import { parseArgs, USAGE } from './args.js';
import { exportCommand } from './export.js';
import { EXIT, processIo, type CliIo, type ExitCode } from './io.js';
import { Progress } from './progress.js';
import { recordCommand } from './record.js';
import { verifyCommand } from './verify.js';

export async function main(argv: readonly string[], io: CliIo = processIo): Promise<ExitCode> {
  const parsed = parseArgs(argv);
  if (!parsed.ok) {
    io.err(`error: ${parsed.error}\n\n${USAGE}\n`);
    return EXIT.usage;
  }
  const cmd = parsed.value;
  const progress = new Progress(io);
  switch (cmd.name) {
    case 'help':
      io.out(`${USAGE}\n`);
      return EXIT.ok;
    case 'analyze':
      return analyzeCommand(cmd, io, progress);
    case 'export':
      return exportCommand(cmd, io, progress);
    case 'verify':
      return verifyCommand(cmd, io, progress);
    case 'record':
      return recordCommand(cmd, io, progress);
  }
}

/** Run with the process's arguments and set its exit status (used by the bin and by tsx). */
export async function runCli(): Promise<void> {
  process.exitCode = await main(process.argv.slice(2));
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await runCli();
