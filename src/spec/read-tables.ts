// A grid of cells -> the spec tables on it, with every problem pinned to an A1 cell.
import { buildFunction, type OutputValue, type SafeValue, type TableRow } from '../logic/boolfn.js';
import { MAX_INPUTS, count } from '../logic/bits.js';
import { WIDE_MAX_INPUTS, type WideCube } from '../logic/wide-cube.js';
import { readWide, wideRowCube } from './read-wide.js';
import { cube, cubeToPattern, type Cube } from '../logic/cube.js';
import { toIdentifiers } from '../logic/identifiers.js';
import type { Signal } from '../logic/signals.js';
import { clip, isBlank, isText, looksLikeData, readDataCell } from './cell-values.js';
import { findBlocks } from './find-blocks.js';
import {
  cellAddress,
  columnLetters,
  gridCell,
  gridExtent,
  gridOrigin,
  gridWidth,
  parseRange,
  qualifiedAddress,
  rangeAddress,
  restrictGrid,
  MAX_COLUMNS,
  MAX_ROWS,
  type CellRef,
} from './grid.js';
import { decideRoles } from './roles.js';
import { joinSeparated, signalColumns, type BlockLayout, type CellAt } from './table-layout.js';
import type { Grid, OutputSpec, Problem, Severity, SpecOptions, SpecRow, SpecTable, XReading } from './types.js';
import { gapCubes } from './uncovered.js';

export interface SpecTablesRead {
  readonly tables: SpecTable[];
  /** Problems that belong to no table returned (each table carries its own in `problems`). */
  readonly problems: Problem[];
}

/** How many uncovered cubes a gap warning spells out. */
const GAP_CUBES_SHOWN = 8;

const WHOLE_SHEET = { top: 0, left: 0, bottom: MAX_ROWS - 1, right: MAX_COLUMNS - 1 };

/**
 * Find and read every spec table of the grid (or of `options.range`). A table with errors is
 * still returned when its signals and roles are known, so that all problems show at once;
 * any problem of severity 'error' means the sheet needs fixing.
 */
export function readSpecTables(grid: Grid, options: SpecOptions = {}): SpecTablesRead {
  const problems: Problem[] = [];
  const origin = gridOrigin(grid);
  if (!origin) {
    const message = `bug in the host: the grid's origin "${clip(grid.origin)}" is not an A1 address`;
    return { tables: [], problems: [{ severity: 'error', sheet: grid.sheet, cell: 'A1', message }] };
  }
  const range = options.range === undefined ? WHOLE_SHEET : parseRange(options.range);
  if (!range) {
    const message = `the range "${clip(options.range ?? '')}" is not an A1 range such as A1:H20`;
    return { tables: [], problems: [{ severity: 'error', sheet: grid.sheet, cell: grid.origin, message }] };
  }
  // Also cuts a grid that a host let run past the sheet's last row or column.
  const area = restrictGrid(grid, range);
  if (!area) {
    const where = options.range === undefined ? 'the sheet' : `the range ${rangeAddress(range)}`;
    const message = `no spec table found: ${where} holds no filled cells`;
    return { tables: [], problems: [{ severity: 'warning', sheet: grid.sheet, cell: grid.origin, message }] };
  }
  const sheet = new SheetCells(area);
  const tables: SpecTable[] = [];
  const layouts = joinSeparated(sheet.cellAt, sheet.filled, findBlocks(sheet.filled, sheet.width));
  for (const layout of layouts) {
    if (layout.isNote) {
      if (filledCount(sheet, layout) > 1) {
        const message = 'not read as a spec table: no cell reads 1, 0, TRUE, FALSE or -';
        problems.push(sheet.problem('info', sheet.range(layout.block), message));
      }
      continue;
    }
    // Rows cut off from a table above by an empty row look like a table with no header row.
    const below = layouts.some(
      (l) => l !== layout && l.block.bottom < layout.block.top && l.block.left === layout.block.left && l.block.right === layout.block.right,
    );
    const read = readTable(sheet, layout, options, below);
    if (read.table) tables.push(read.table);
    else problems.push(...read.problems);
  }
  if (tables.length === 0 && !problems.some((p) => p.severity === 'error')) {
    const extent = gridExtent(area);
    const where = extent ? rangeAddress(extent) : area.origin;
    problems.push(sheet.problem('warning', where, `no spec table found in ${where}: a table is a header row of signal names above rows of 1, 0 and -`));
  }
  return { tables, problems };
}

/** Every problem of a reading: those of the tables and those beside them. */
export function allProblems(read: SpecTablesRead): Problem[] {
  return [...read.problems, ...read.tables.flatMap((t) => t.problems)];
}

/** A problem as one line for a person: "Capper!D7: blank cell in a data row; write 1, 0 or -". */
export function problemText(p: Problem): string {
  return `${qualifiedAddress(p.sheet, p.cell)}: ${p.message}`;
}

/** The grid as the reader needs it: cells by grid position, what is filled, sheet addresses. */
class SheetCells {
  readonly width: number;
  readonly filled: boolean[][];
  readonly cellAt: CellAt;
  private readonly origin: CellRef;

  constructor(readonly grid: Grid) {
    this.origin = gridOrigin(grid)!;
    this.width = gridWidth(grid);
    this.filled = grid.cells.map((row) => Array.from({ length: this.width }, (_, c) => !isBlank(row[c] ?? null)));
    this.cellAt = (r, c) => gridCell(grid, r, c);
  }

  /** Sheet address of a grid position. */
  address(row: number, col: number): string {
    return cellAddress(this.origin.row + row, this.origin.col + col);
  }

  columnLetters(col: number): string {
    return columnLetters(this.origin.col + col);
  }

  range(r: { top: number; left: number; bottom: number; right: number }): string {
    return rangeAddress({
      top: this.origin.row + r.top,
      left: this.origin.col + r.left,
      bottom: this.origin.row + r.bottom,
      right: this.origin.col + r.right,
    });
  }

  problem(severity: Severity, cell: string, message: string): Problem {
    return { severity, sheet: this.grid.sheet, cell, message };
  }
}

function filledCount(sheet: SheetCells, layout: BlockLayout): number {
  let n = 0;
  for (let r = layout.block.top; r <= layout.block.bottom; r++)
    for (let c = layout.block.left; c <= layout.block.right; c++) if (sheet.filled[r]![c]) n++;
  return n;
}

interface TableRead {
  readonly table?: SpecTable;
  readonly problems: Problem[];
}

function readTable(sheet: SheetCells, layout: BlockLayout, options: SpecOptions, belowTable: boolean): TableRead {
  const problems: Problem[] = [];
  const { block, headerRow } = layout;
  const columns = signalColumns(layout);
  const headerRange = sheet.range({ top: headerRow, left: block.left, bottom: headerRow, right: block.right });
  const tableRange = sheet.range({ top: layout.top, left: block.left, bottom: block.bottom, right: block.right });
  const headerValues = columns.map((c) => sheet.cellAt(headerRow, c));
  if (!headerValues.some((v) => isText(v) && !looksLikeData(v))) {
    const message =
      'no header row: the first row of a spec table names its signals (text), ' +
      (layout.roleRow === undefined ? 'with an optional input/output row above it' : 'below the input/output row') +
      (belowTable ? '; if these rows belong to the table above, delete the empty row between them' : '');
    return { problems: [sheet.problem('error', headerRange, message)] };
  }

  const decided = decideRoles(sheet.cellAt, layout, columns, options.inputCount);
  if ('complaints' in decided) {
    const complaints = decided.complaints.map((c) =>
      sheet.problem('error', c.col === undefined ? headerRange : sheet.address(c.row, c.col), c.message),
    );
    return { problems: complaints };
  }
  const { roles } = decided;

  const names = new Map<number, string>();
  for (const col of [...roles.inputs, ...roles.outputs]) names.set(col, headerName(sheet, headerRow, col, problems));
  reportDuplicates(sheet, headerRow, [...roles.inputs, ...roles.outputs], names, problems);
  const wrongShape = shapeProblem(sheet, headerRow, headerRange, roles.inputs, roles.outputs);
  if (wrongShape) return { problems: [...problems, wrongShape] };

  const headers = [...roles.inputs, ...roles.outputs].map((c) => names.get(c)!);
  const ids = toIdentifiers(headers);
  const signals: Signal[] = headers.map((header, i) => ({ header, identifier: ids[i]! }));
  const inputs = signals.slice(0, roles.inputs.length);
  const outputSignals = signals.slice(roles.inputs.length);

  const xReading = options.xReading ?? 'none';
  const rows: SpecRow[] = [];
  const wideCubes: WideCube[] = [];
  let xCells = 0;
  for (let r = headerRow + 1; r <= block.bottom; r++) {
    const row = readRow(sheet, r, layout, roles.inputs, roles.outputs, xReading, problems);
    if (row) {
      rows.push(row.row);
      if (row.wideCube) wideCubes.push(row.wideCube);
      xCells += row.xCells;
    }
  }
  if (headerRow === block.bottom) problems.push(sheet.problem('error', headerRange, 'no data rows below the header row'));
  if (xCells > 0)
    problems.push(
      sheet.problem('info', tableRange, `${xCells} cell${xCells === 1 ? '' : 's'} reading X taken as - (any / don't-care), as set`),
    );

  // Over 24 inputs the symbolic engine takes the table (read-wide.ts): no bit-set outputs.
  const wide = inputs.length > MAX_INPUTS;
  const outputs = wide ? [] : outputSignals.map((signal, j) => buildOutput(sheet, signal, j, rows, inputs, options, problems));
  if (rows.length > 0 && !wide) reportGaps(sheet, tableRange, inputs, outputs, problems);
  const safeOf = (signal: Signal): { signal: Signal; safe: SafeValue } => ({ signal, safe: safeValueOf(signal, options) });
  const wideSpec = wide && readWide(rows, wideCubes, inputs, outputSignals.map(safeOf), tableRange, (...p) => sheet.problem(...p), problems);

  const table: SpecTable = {
    sheet: sheet.grid.sheet,
    range: tableRange,
    inputs,
    outputs,
    rows,
    roleRule: roles.rule,
    xReading,
    headerCells: [...roles.inputs, ...roles.outputs].map((c) => sheet.address(headerRow, c)),
    problems,
    ...(wideSpec ? { wide: wideSpec } : {}),
  };
  return { table, problems };
}

/** The header text of a signal column, or a stand-in naming the column after a complaint. */
function headerName(sheet: SheetCells, row: number, col: number, problems: Problem[]): string {
  const v = sheet.cellAt(row, col);
  if (isText(v)) return v.trim();
  const where = sheet.address(row, col);
  problems.push(
    sheet.problem(
      'error',
      where,
      isBlank(v) ? 'empty signal name above a data column; name the signal' : 'a signal name must be text; name the signal in words',
    ),
  );
  return `Column ${sheet.columnLetters(col)}`;
}

function reportDuplicates(
  sheet: SheetCells,
  row: number,
  columns: readonly number[],
  names: ReadonlyMap<number, string>,
  problems: Problem[],
): void {
  const first = new Map<string, number>();
  for (const col of columns) {
    const key = names.get(col)!.toLowerCase();
    const earlier = first.get(key);
    if (earlier === undefined) first.set(key, col);
    else
      problems.push(
        sheet.problem(
          'error',
          sheet.address(row, col),
          `the signal name "${clip(names.get(col)!)}" is already used at ${sheet.address(row, earlier)}; names must differ (ignoring case)`,
        ),
      );
  }
}

/** No input, no output, or more inputs than the engine takes. */
function shapeProblem(
  sheet: SheetCells,
  row: number,
  headerRange: string,
  inputs: readonly number[],
  outputs: readonly number[],
): Problem | undefined {
  if (inputs.length === 0) return sheet.problem('error', headerRange, 'no input column: mark at least one column as an input');
  if (outputs.length === 0) return sheet.problem('error', headerRange, 'no output column: mark at least one column as an output');
  if (inputs.length > WIDE_MAX_INPUTS) {
    const cells = sheet.range({ top: row, left: inputs[0]!, bottom: row, right: inputs[inputs.length - 1]! });
    return sheet.problem('error', cells, `${inputs.length} inputs: at most ${WIDE_MAX_INPUTS} are handled; split the table`);
  }
  return undefined;
}

/** One data row, or undefined when a cell of it cannot be read (each such cell is reported). */
function readRow(
  sheet: SheetCells,
  r: number,
  layout: BlockLayout,
  inputCols: readonly number[],
  outputCols: readonly number[],
  xReading: XReading,
  problems: Problem[],
): { row: SpecRow; xCells: number; wideCube?: WideCube } | undefined {
  const n = inputCols.length;
  let good = true;
  let xCells = 0;
  const read = (col: number): OutputValue | undefined => {
    const cell = readDataCell(sheet.cellAt(r, col), xReading);
    if (!cell.ok) {
      problems.push(sheet.problem('error', sheet.address(r, col), cell.reason));
      good = false;
      return undefined;
    }
    if (cell.x) xCells++;
    return cell.value;
  };
  let mask = 0;
  let bits = 0;
  const inputValues = inputCols.map(read);
  inputValues.forEach((v, i) => {
    const bit = 1 << (n - 1 - i);
    if (v === 1 || v === 0) mask |= bit;
    if (v === 1) bits |= bit;
  });
  const values = outputCols.map(read);
  if (!good) return undefined;
  const wide = n > MAX_INPUTS;
  const row: SpecRow = {
    cells: sheet.range({ top: r, left: layout.block.left, bottom: r, right: layout.block.right }),
    inputCells: inputCols.map((c) => sheet.address(r, c)),
    outputCells: outputCols.map((c) => sheet.address(r, c)),
    cube: wide ? cube(0, 0) : cube(mask, bits),
    values: values as OutputValue[],
  };
  return { row, xCells, ...(wide ? { wideCube: wideRowCube(inputValues) } : {}) };
}

/** The safe value set for an output by its header or identifier (any case); 0 when none is. */
function safeValueOf(signal: Signal, options: SpecOptions): SafeValue {
  for (const [name, value] of Object.entries(options.safeValues ?? {})) {
    const key = name.trim().toLowerCase();
    if (key === signal.header.toLowerCase() || key === signal.identifier.toLowerCase()) return value;
  }
  return 0;
}

function buildOutput(
  sheet: SheetCells,
  signal: Signal,
  j: number,
  rows: readonly SpecRow[],
  inputs: readonly Signal[],
  options: SpecOptions,
  problems: Problem[],
): OutputSpec {
  const safe = safeValueOf(signal, options);
  const tableRows: TableRow[] = rows.map((row) => ({ cube: row.cube, value: row.values[j]! }));
  const built = buildFunction(inputs.length, tableRows, safe);
  if (!built.ok) throw new Error(`bug: ${built.error.message}`);
  for (const c of built.value.conflicts) {
    const a = rows[c.rowA]!;
    const b = rows[c.rowB]!;
    const both = cube(a.cube.mask | b.cube.mask, a.cube.bits | b.cube.bits);
    const plural = c.combinations === 1 ? 'combination takes' : 'combinations take';
    const message =
      `rows ${a.cells} and ${b.cells} both cover ${describeCube(both, inputs)} but ask ${signal.header} ` +
      `for ${a.values[j]} and ${b.values[j]}; ${c.combinations} ${plural} the safe value ${safe}`;
    problems.push(sheet.problem('error', b.outputCells[j]!, message));
  }
  return { signal, safe, built: built.value };
}

/** "GuardA=1, GuardB=0", or "every combination" for the cube of all inputs. */
export function describeCube(c: Cube, inputs: readonly Signal[]): string {
  const n = inputs.length;
  const parts = inputs.flatMap((s, i) => {
    const bit = 1 << (n - 1 - i);
    return c.mask & bit ? [`${s.header}=${c.bits & bit ? 1 : 0}`] : [];
  });
  return parts.length === 0 ? 'every combination' : parts.join(', ');
}

/** One warning per table: the rows leave the same combinations uncovered for every output. */
function reportGaps(
  sheet: SheetCells,
  tableRange: string,
  inputs: readonly Signal[],
  outputs: readonly OutputSpec[],
  problems: Problem[],
): void {
  const gaps = outputs[0]!.built.gaps;
  const gapCount = count(gaps);
  if (gapCount === 0) return;
  const n = inputs.length;
  const { cubes, cut } = gapCubes(n, gaps);
  const shown = cubes.slice(0, GAP_CUBES_SHOWN).map((c) => cubeToPattern(n, c));
  const more = cubes.length - shown.length;
  const safes = outputs.map((o) => `${o.signal.header} ${o.safe}`).join(', ');
  const plural = gapCount === 1 ? 'combination is' : 'combinations are';
  const message =
    `${gapCount} input ${plural} covered by no row; there each output takes its safe value (${safes}). ` +
    `Uncovered, as patterns over ${inputs.map((s) => s.header).join(', ')} (- = any): ` +
    shown.join(', ') +
    (more > 0 ? ` and ${more}${cut ? '+' : ''} more` : '');
  problems.push(sheet.problem('warning', tableRange, message));
}
