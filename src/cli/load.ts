// Open the file and read its spec tables as the options say: shared by analyze, export, verify.
import { basename } from 'node:path';
import { fail, ok, type Result } from '../logic/result.js';
import { signalIndex } from '../logic/signals.js';
import { openFile, type FileHost } from '../hosts/file-host.js';
import { readSpecTables } from '../spec/read-tables.js';
import type { Problem, SpecOptions, SpecTable } from '../spec/types.js';
import type { SpecChoice } from './args.js';
import type { Progress } from './progress.js';
import { appendAll } from '../logic/arrays.js';

export interface Loaded {
  readonly host: FileHost;
  /** The file name, as results and hand-over files name their source. */
  readonly source: string;
  readonly tables: SpecTable[];
  /** Problems that belong to no table read (each table carries its own). */
  readonly otherProblems: Problem[];
}

function specOptions(choice: SpecChoice): SpecOptions {
  return {
    ...(choice.range !== undefined ? { range: choice.range } : {}),
    xReading: choice.xMeansDontCare ? 'dont-care' : 'none',
    ...(choice.inputs !== undefined ? { inputCount: choice.inputs } : {}),
    safeValues: choice.safe,
  };
}

/**
 * The spec tables of the file. A failure is a usage-level problem (exit 2): the file cannot
 * be opened, the sheet does not exist, a --safe names no output.
 */
export async function loadTables(file: string, choice: SpecChoice, progress: Progress): Promise<Result<Loaded, string>> {
  const opened = await progress.during(`reading ${file}`, openFile(file, choice.timeLimitMs !== undefined ? { timeLimitMs: choice.timeLimitMs } : {}));
  if (!opened.ok) return fail(opened.error.message);
  const host = opened.value;
  const names = await host.listSheets();
  if (choice.sheet !== undefined && !names.includes(choice.sheet))
    return fail(`${file}: no sheet named "${choice.sheet}" (sheets: ${names.join(', ')})`);
  if (choice.range !== undefined && choice.sheet === undefined && names.length > 1)
    return fail(`--range needs --sheet: ${file} has ${names.length} sheets`);
  const sheets = choice.sheet !== undefined ? [choice.sheet] : names;
  const tables: SpecTable[] = [];
  const otherProblems: Problem[] = [];
  for (const sheet of sheets) {
    const tooLarge = host.sheetProblem(sheet);
    if (tooLarge) {
      if (choice.sheet !== undefined) return fail(`${file}: ${tooLarge}`);
      otherProblems.push({ severity: 'warning', code: 'sheet-not-read', sheet, cell: 'A1', message: `not read: ${tooLarge}` });
      continue;
    }
    const read = readSpecTables(await host.readGrid(sheet), specOptions(choice));
    appendAll(tables, read.tables);
    appendAll(otherProblems, read.problems);
  }
  for (const name of Object.keys(choice.safe)) {
    if (!tables.some((t) => signalIndex(t.outputs.map((o) => o.signal), name) >= 0))
      return fail(`--safe ${name}: no output of the tables read has that header or identifier`);
  }
  return ok({ host, source: basename(file), tables, otherProblems });
}
