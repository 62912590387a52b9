// Open the file and read its spec tables through the workflow, as the options say: shared by
// analyze, export, verify. The file host and its messages are the command line's own.
import { basename } from 'node:path';
import { fail, ok, type Result } from '../logic/index.js';
import { openFile, type FileHost } from '../hosts/node.js';
import type { SpecTable } from '../table/index.js';
import { examine, readGrids, readTables, type ReadFailure, type TablesRead, type Workbook, type WorkbookChoice } from '../workflow/index.js';
import type { SpecChoice } from './args.js';
import type { Progress } from './progress.js';

export interface Loaded {
  readonly host: FileHost;
  /** The file name, as results and hand-over files name their source. */
  readonly source: string;
  readonly read: TablesRead;
}

function workbookChoice(choice: SpecChoice): WorkbookChoice {
  return {
    ...(choice.sheet !== undefined ? { sheet: choice.sheet } : {}),
    ...(choice.range !== undefined ? { range: choice.range } : {}),
    xReading: choice.xMeansDontCare ? 'dont-care' : 'none',
    ...(choice.inputs !== undefined ? { inputCount: choice.inputs } : {}),
    safeValues: choice.safe,
    ...(choice.dontCares !== undefined ? { dontCares: choice.dontCares } : {}),
    host: 'cli',
  };
}

/** A setting that does not fit the file, in the command line's words (its option names). */
function failureText(f: ReadFailure): string {
  switch (f.code) {
    case 'range-needs-sheet':
      return `--range needs --sheet: ${f.message}`;
    case 'unknown-safe-output':
      return `--safe ${f.subject}: ${f.message}`;
    case 'sheet-not-read':
    case 'no-sheet':
      return f.message;
  }
}

/**
 * The spec tables of the file. A failure is a usage-level problem (exit 2): the file cannot
 * be opened, the sheet does not exist or cannot be read, a --safe names no output.
 */
export async function loadTables(file: string, choice: SpecChoice, progress: Progress): Promise<Result<Loaded, string>> {
  const opened = await progress.during(`reading ${file}`, openFile(file, choice.timeLimitMs !== undefined ? { timeLimitMs: choice.timeLimitMs } : {}));
  if (!opened.ok) return fail(opened.error.message);
  const host = opened.value;
  // A --range may name one of the workbook's Excel tables, which brings its sheet.
  const resolved = choice.range !== undefined ? host.resolveRange(choice.range, choice.sheet) : undefined;
  if (resolved && !resolved.ok) return fail(`--range ${choice.range}: ${resolved.error}`);
  const wanted = workbookChoice(resolved ? { ...choice, ...resolved.value } : choice);
  const grids = await readGrids(host, wanted, file);
  if (!grids.ok) return fail(failureText(grids.error));
  const read = readTables(grids.value, wanted);
  if (!read.ok) return fail(failureText(read.error));
  return ok({ host, source: basename(file), read: read.value });
}

/** The workflow's verdicts of what was loaded, with progress on stderr. */
export function examineLoaded(loaded: Loaded, progress: Progress): Workbook {
  return examine(loaded.read, {
    source: loaded.source,
    onProgress: ({ table, done, total }) => {
      const label = `analysing ${where(table)}`;
      if (done === 0) progress.note(`${label} (${table.inputs.length} inputs, ${table.outputs.length} output${table.outputs.length === 1 ? '' : 's'})`);
      else progress.tick(label, done, total);
    },
  });
}

function where(t: SpecTable): string {
  return `${t.sheet}!${t.range}`;
}
