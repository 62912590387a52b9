// interlock-algebra: the command line over the file host (DESIGN.md section 4).
// `main(argv, io)` returns the exit status, so that tests run the CLI in-process.
import { pathToFileURL } from 'node:url';
import { fileSystemErrorText, isFileSystemError } from '../hosts/node.js';
import { parseArgs, USAGE, type Command } from './args.js';
import { EXIT, processIo, type CliIo, type ExitCode } from './io.js';
import { Progress } from './progress.js';
import { jsonSafe, terminalSafe } from './terminal-text.js';

/** Set (to anything) to see the stack trace of an internal error, for developers. */
export const DEBUG_VARIABLE = 'IA_DEBUG';

/**
 * What the commands print, made safe for a terminal: stderr and the readable report shown
 * with control and bidirectional characters escaped visibly; a JSON document kept exact JSON.
 */
function safeIo(io: CliIo, json: boolean): CliIo {
  return { out: (text) => io.out(json ? jsonSafe(text) : terminalSafe(text)), err: (text) => io.err(terminalSafe(text)) };
}

/** Each command's modules are loaded when it runs, so that `--help` starts at once. */
async function run(cmd: Command, io: CliIo): Promise<ExitCode> {
  const progress = new Progress(io);
  switch (cmd.name) {
    case 'help':
      io.out(`${USAGE}\n`);
      return EXIT.ok;
    case 'analyze':
      return (await import('./analyze.js')).analyzeCommand(cmd, io, progress);
    case 'export':
      return (await import('./export.js')).exportCommand(cmd, io, progress);
    case 'verify':
      return (await import('./verify.js')).verifyCommand(cmd, io, progress);
    case 'record':
      return (await import('./record.js')).recordCommand(cmd, io, progress);
    case 'compare':
      return (await import('./compare.js')).compareCommand(cmd, io, progress);
  }
}

/**
 * The one line for what escaped a command: a file-system failure is the user's situation
 * (exit 2, path and reason in words); anything else is a bug of ours (exit 2, asked to report).
 */
export function escapedError(e: unknown, io: CliIo, env: NodeJS.ProcessEnv = process.env): ExitCode {
  if (isFileSystemError(e)) {
    io.err(`error: ${fileSystemErrorText(e)}\n`);
    return EXIT.usage;
  }
  const what = e instanceof Error ? `${e.name === 'Error' ? '' : `${e.name}: `}${e.message}` : String(e);
  io.err(`internal error: ${what.split('\n')[0]} (please report)\n`);
  if (env[DEBUG_VARIABLE] && e instanceof Error && e.stack) io.err(`${e.stack}\n`);
  return EXIT.usage;
}

export async function main(argv: readonly string[], io: CliIo = processIo): Promise<ExitCode> {
  const parsed = parseArgs(argv);
  const json = parsed.ok && 'json' in parsed.value && parsed.value.json;
  const safe = safeIo(io, json);
  if (!parsed.ok) {
    safe.err(`error: ${parsed.error}\n\n${USAGE}\n`);
    return EXIT.usage;
  }
  try {
    return await run(parsed.value, safe);
  } catch (e) {
    return escapedError(e, safe);
  }
}

/** Run with the process's arguments and set its exit status (used by the bin). */
export async function runCli(): Promise<void> {
  const io = safeIo(processIo, false);
  // What fails outside the awaited work (a stream, a worker's event) still ends in one line.
  const fatal = (e: unknown): void => {
    process.exitCode = escapedError(e, io);
    process.exit();
  };
  process.on('uncaughtException', fatal);
  process.on('unhandledRejection', fatal);
  // A reader that stops early (`| head`) closes the pipe: not an error of ours.
  process.stdout.on('error', (e: NodeJS.ErrnoException) => (e.code === 'EPIPE' ? process.exit() : fatal(e)));
  process.exitCode = await main(process.argv.slice(2));
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await runCli();
