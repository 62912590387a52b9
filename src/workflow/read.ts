// Reading a workbook as the user chose (sheet, range, X reading, input count, safe values):
// the host brings the cells, the spec reader finds the tables. Split in two so that a host whose
// engine runs elsewhere (the pane's worker) reads the grids where its workbook lives and hands
// them over; both halves are the same in every host.
import { appendAll, fail, ok, signalIndex, type Result } from '../logic/index.js';
import type { WorkbookHost } from '../hosts/index.js';
import { readSpecTables, type Grid, type Problem, type SpecOptions, type SpecTable } from '../table/index.js';

/** The user's settings: which sheet (all when absent), and how to read it. */
export interface WorkbookChoice extends SpecOptions {
  readonly sheet?: string;
}

/** The cells read, and the sheets that could not be (warnings outside any table). */
export interface GridsRead {
  readonly grids: readonly Grid[];
  readonly problems: readonly Problem[];
}

/** Why nothing could be read as asked: a setting that does not fit the workbook. */
export interface ReadFailure {
  readonly code: 'no-sheet' | 'range-needs-sheet' | 'sheet-not-read' | 'unknown-safe-output';
  /** What the setting named (the sheet, range or output), for a host to put its own words around. */
  readonly subject: string;
  /** What is wrong with it; a host says which of its settings it was ("--range needs --sheet: "). */
  readonly message: string;
}

export interface TablesRead {
  readonly tables: readonly SpecTable[];
  /** Problems that belong to no table read (each table carries its own). */
  readonly problems: readonly Problem[];
}

/** The grids of the chosen sheet (or of every sheet) through the host. `source` names the workbook in messages. */
export async function readGrids(host: WorkbookHost, choice: WorkbookChoice, source: string): Promise<Result<GridsRead, ReadFailure>> {
  const names = await host.listSheets();
  if (choice.sheet !== undefined && !names.includes(choice.sheet))
    return fail({ code: 'no-sheet', subject: choice.sheet, message: `${source}: no sheet named "${choice.sheet}" (sheets: ${names.join(', ')})` });
  if (choice.range !== undefined && choice.sheet === undefined && names.length > 1)
    return fail({ code: 'range-needs-sheet', subject: choice.range, message: `${source} has ${names.length} sheets` });
  const sheets = choice.sheet !== undefined ? [choice.sheet] : names;
  const grids: Grid[] = [];
  // What the host found about the file and whole sheets (hidden, damaged, not read) comes first.
  const problems: Problem[] = (host.fileProblems?.() ?? []).filter((p) => sheets.includes(p.sheet));
  const lost = new Set(problems.filter((p) => p.severity === 'error').map((p) => p.sheet));
  for (const sheet of sheets) {
    try {
      grids.push(await host.readGrid(sheet, choice.range));
    } catch (e) {
      // A host says why a sheet cannot be read by throwing (too large, refused by Excel).
      const why = e instanceof Error ? e.message : String(e);
      if (choice.sheet !== undefined) return fail({ code: 'sheet-not-read', subject: sheet, message: why });
      if (!lost.has(sheet)) problems.push({ severity: 'warning', code: 'sheet-not-read', sheet, cell: 'A1', message: `not read: ${why}` });
    }
  }
  return ok({ grids, problems });
}

/** The spec tables of the grids; a safe value for an output no table has is refused. */
export function readTables(read: GridsRead, choice: WorkbookChoice): Result<TablesRead, ReadFailure> {
  const tables: SpecTable[] = [];
  const problems: Problem[] = [...read.problems];
  const { sheet: _sheet, ...options } = choice;
  for (const grid of read.grids) {
    const found = readSpecTables(grid, options);
    appendAll(tables, found.tables);
    appendAll(problems, found.problems);
  }
  for (const name of Object.keys(choice.safeValues ?? {})) {
    if (!tables.some((t) => signalIndex(t.outputs.map((o) => o.signal), name) >= 0))
      return fail({ code: 'unknown-safe-output', subject: name, message: `no output of the tables read has that header or identifier` });
  }
  return ok({ tables, problems });
}
