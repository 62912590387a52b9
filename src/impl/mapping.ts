// An explicit name mapping between spec signals and program variables: plant tags rarely
// equal spec headings (`I_GuardA_Closed` for "Guard A closed"). Two columns: spec signal,
// program variable; read from a CSV file or from a sheet.
import { fail, ok, type Result } from '../logic/index.js';
import { cellAddress, csvRecords, gridOrigin, qualifiedAddress, type CellValue, type Grid } from '../table/index.js';

export interface NamePair {
  /** The spec signal: its header or its identifier. */
  readonly spec: string;
  /**
   * The program variable: `Name`, `Pou.Name` (to pick a POU), a path (`io.bClosed`,
   * `aIn[3]`, `tonSync.Q`, also after `Pou.`) or a direct address `%IX0.1`. Spaces around its punctuation removed.
   */
  readonly program: string;
  /** Where the pair was written: "map.csv line 3" or "Map!A3" (its spec signal cell). */
  readonly where: string;
  /** Where its program variable is written: "map.csv line 3" or "Map!B3". */
  readonly programWhere: string;
}

export interface NameMapping {
  readonly source: string;
  readonly pairs: readonly NamePair[];
}

const PROGRAM_NAME = /^[A-Za-z_][A-Za-z0-9_]*(?:\.[A-Za-z_][A-Za-z0-9_]*|\[[+-]?[0-9]+(?:,[+-]?[0-9]+)*\])*$|^%[A-Za-z]+[0-9.]*$/;

interface Row {
  readonly cells: readonly string[];
  /** Where column c of this row is. */
  readonly at: (col: number) => string;
}

/**
 * A first row reading "spec signal" / "program variable" is a header (also "signal" or
 * "spec", and "variable", "program" or "tag", any case). Columns after the second are
 * ignored (room for comments); blank rows are skipped.
 */
function pairsOf(source: string, rows: readonly Row[]): Result<NameMapping> {
  const filled = rows.filter((r) => r.cells.some((c) => c.trim() !== ''));
  const first = filled[0];
  const isHeader =
    first !== undefined &&
    /^(spec( signal)?|signal)$/i.test(first.cells[0]?.trim() ?? '') &&
    /^(program( variable)?|variable|tag)$/i.test(first.cells[1]?.trim() ?? '');
  const pairs: NamePair[] = [];
  const bySpec = new Map<string, NamePair>();
  for (const row of isHeader ? filled.slice(1) : filled) {
    const spec = (row.cells[0] ?? '').trim();
    // Spaces around the punctuation of a path are dropped (`aIn[ 3 ]`); inside a name they are an error.
    const program = (row.cells[1] ?? '').trim().replace(/\s*([.[\],])\s*/g, '$1');
    if (spec === '') return fail({ message: `${row.at(0)}: the spec signal is blank (beside program variable '${program}')` });
    if (program === '') return fail({ message: `${row.at(1)}: no program variable for spec signal '${spec}'` });
    if (!PROGRAM_NAME.test(program)) {
      return fail({ message: `${row.at(1)}: '${program}' is not a program variable name (Name, Pou.Name, a member io.bClosed, an element aIn[3] or %IX0.1)` });
    }
    const pair = { spec, program, where: row.at(0), programWhere: row.at(1) };
    const twice = bySpec.get(spec.toLowerCase());
    if (twice) return fail({ message: `${row.at(0)}: spec signal '${spec}' is mapped twice (also at ${twice.where})` });
    bySpec.set(spec.toLowerCase(), pair);
    pairs.push(pair);
  }
  if (pairs.length === 0) return fail({ message: `${source}: the mapping holds no pairs` });
  return ok({ source, pairs });
}

/** A mapping written in a sheet: the first two columns of the grid. */
export function readMappingGrid(grid: Grid): Result<NameMapping> {
  const origin = gridOrigin(grid);
  if (!origin) return fail({ message: `${grid.sheet}: the grid's origin '${grid.origin}' is not an A1 address` });
  const rows: Row[] = [];
  for (let r = 0; r < grid.cells.length; r++) {
    const cells: string[] = [];
    for (const [c, value] of (grid.cells[r] ?? []).slice(0, 2).entries()) {
      const text = cellText(value);
      const where = qualifiedAddress(grid.sheet, cellAddress(origin.row + r, origin.col + c));
      if (text === undefined) return fail({ message: `${where}: a name is expected, found ${JSON.stringify(value)}` });
      cells.push(text);
    }
    rows.push({ cells, at: (c) => qualifiedAddress(grid.sheet, cellAddress(origin.row + r, origin.col + c)) });
  }
  return pairsOf(grid.sheet, rows);
}

function cellText(value: CellValue): string | undefined {
  if (value === null) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number') return String(value);
  return undefined;
}

/** A mapping CSV: comma, semicolon or tab separated (the first line decides), quotes as RFC 4180. */
export function readMappingCsv(fileName: string, text: string): Result<NameMapping> {
  const records = csvRecords(text);
  if (!records.ok) return fail({ message: `${fileName} ${records.error.message}` });
  const rows = records.value.map(({ line, fields }) => ({ cells: fields, at: () => `${fileName} line ${line}` }));
  return pairsOf(fileName, rows);
}
