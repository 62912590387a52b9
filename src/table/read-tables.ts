// A grid of cells -> the spec tables on it, with every problem pinned to an A1 cell.
import {
  appendAll,
  buildFunction,
  count,
  cube,
  cubeToPattern,
  fullIdentifier,
  MAX_INPUTS,
  maxOf,
  minOf,
  toIdentifiers,
  WIDE_MAX_INPUTS,
  type OutputValue,
  type SafeValue,
  type Signal,
  type TableRow,
  type WideCube,
} from '../logic/index.js';
import { readWide, wideRowCube } from './read-wide.js';
import {
  HOW_TO_WRITE,
  X_REFUSED,
  clip,
  isBlank,
  isFreeText,
  isNoteWord,
  isTagWord,
  isText,
  looksLikeData,
  readDataCell,
  type BadCellKind,
} from './cell-values.js';
import { describeCube } from './describe.js';
import { findBlocks } from './find-blocks.js';
import {
  cellAddress,
  columnLetters,
  gridCell,
  gridExtent,
  gridOrigin,
  gridWidth,
  intersectRanges,
  parseRange,
  qualifiedAddress,
  rangeAddress,
  restrictGrid,
  MAX_COLUMNS,
  MAX_ROWS,
  type CellRef,
} from './grid.js';
import { decideRoles } from './roles.js';
import { settingName } from './settings.js';
import { joinSeparated, signalColumns, type BlockLayout, type CellAt, type MergeAt } from './table-layout.js';
import type {
  AnnotationColumn,
  AnnotationReason,
  Grid,
  HostKind,
  OutputSpec,
  Problem,
  ProblemCode,
  Severity,
  SpecOptions,
  SpecRow,
  SpecTable,
  ValueReading,
  XReading,
} from './types.js';
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
  const located: Problem[] = [];
  const read = readCells(grid, options, located);
  return withReadProblems(read, [...(grid.readProblems ?? []), ...located]);
}

/** The host's reading problems (and others found at a cell) go to the table whose range holds their cell, the rest beside the tables. */
function withReadProblems(read: SpecTablesRead, hostProblems: readonly Problem[]): SpecTablesRead {
  if (hostProblems.length === 0) return read;
  const ranges = read.tables.map((t) => parseRange(t.range));
  const perTable: Problem[][] = read.tables.map(() => []);
  const beside: Problem[] = [];
  for (const p of hostProblems) {
    const at = parseRange(p.cell);
    const i = at ? ranges.findIndex((r) => r !== undefined && intersectRanges(r, at) !== undefined) : -1;
    if (i >= 0) perTable[i]!.push(p);
    else beside.push(p);
  }
  return {
    tables: read.tables.map((t, i) => (perTable[i]!.length === 0 ? t : { ...t, problems: [...perTable[i]!, ...t.problems] })),
    problems: [...beside, ...read.problems],
  };
}

/** `located`: problems at cells that go to the table holding them, as the host's do. */
function readCells(grid: Grid, options: SpecOptions, located: Problem[]): SpecTablesRead {
  const problems: Problem[] = [];
  const origin = gridOrigin(grid);
  if (!origin) {
    const message = `bug in the host: the grid's origin "${clip(grid.origin)}" is not an A1 address`;
    return { tables: [], problems: [{ severity: 'error', code: 'host-bug', sheet: grid.sheet, cell: 'A1', message }] };
  }
  const range = options.range === undefined ? WHOLE_SHEET : parseRange(options.range);
  if (!range) {
    const message = `the range "${clip(options.range ?? '')}" is not an A1 range such as A1:H20`;
    return { tables: [], problems: [{ severity: 'error', code: 'bad-range', sheet: grid.sheet, cell: grid.origin, message }] };
  }
  // Also cuts a grid that a host let run past the sheet's last row or column.
  const area = restrictGrid(grid, range);
  if (!area) {
    const where = options.range === undefined ? 'the sheet' : `the range ${rangeAddress(range)}`;
    const message = `no spec table found: ${where} holds no filled cells`;
    return { tables: [], problems: [{ severity: 'warning', code: 'no-table', sheet: grid.sheet, cell: grid.origin, message }] };
  }
  // A range the user gives is the table: blank rows inside it are skipped, not a split.
  const compacted = options.range === undefined ? undefined : withoutBlankRows(area);
  const sheet = new SheetCells(compacted?.grid ?? area, grid.merges ?? [], compacted?.rows);
  if (compacted && compacted.skipped.length > 0) {
    const at = (r: number): string => rangeAddress({ top: r, left: sheet.firstColumn, bottom: r, right: sheet.lastColumn });
    const cells = compacted.skipped.map(at);
    const plural = cells.length === 1 ? 'blank row' : 'blank rows';
    const message = `${cells.length} ${plural} inside the range ${rangeAddress(range)} skipped (${cells.join(', ')}): the range is read as one table`;
    located.push({ ...sheet.problem('info', 'blank-rows-skipped', cells[0]!, message), cells });
  }
  const tables: SpecTable[] = [];
  const layouts = joinSeparated(sheet.cellAt, sheet.filled, findBlocks(sheet.filled, sheet.width));
  const host = options.host ?? 'any';
  for (const layout of layouts) {
    if (layout.isNote) {
      if (filledCount(sheet, layout) > 1) {
        const message = 'not read as a spec table: no cell reads 1, 0, TRUE, FALSE or -';
        problems.push(sheet.problem('info', 'note-block', sheet.range(layout.block), message));
      }
      continue;
    }
    // Rows cut off from a table above by an empty row look like a table with no header row.
    const below = layouts.some(
      (l) => l !== layout && l.block.bottom < layout.block.top && l.block.left === layout.block.left && l.block.right === layout.block.right,
    );
    const read = readTable(sheet, layout, options, below, host);
    if (read.table) tables.push(read.table);
    else appendAll(problems, read.problems);
  }
  if (tables.length === 0 && !problems.some((p) => p.severity === 'error')) {
    const extent = gridExtent(area);
    const where = extent ? rangeAddress(extent) : area.origin;
    problems.push(sheet.problem('warning', 'no-table', where, `no spec table found in ${where}: a table is a header row of signal names above rows of 1, 0 and -`));
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

/**
 * The grid as the reader needs it: cells by grid position, what is filled, sheet addresses.
 * `rows` maps grid rows to rows of the area read when blank rows were taken out of a range.
 */
class SheetCells {
  readonly width: number;
  readonly filled: boolean[][];
  readonly cellAt: CellAt;
  readonly mergeAt: MergeAt;
  private readonly origin: CellRef;

  constructor(
    readonly grid: Grid,
    merges: readonly string[],
    private readonly rows?: readonly number[],
  ) {
    this.origin = gridOrigin(grid)!;
    this.width = gridWidth(grid);
    this.filled = grid.cells.map((row) => Array.from({ length: this.width }, (_, c) => !isBlank(row[c] ?? null)));
    this.cellAt = (r, c) => gridCell(grid, r, c);
    const areas = merges.flatMap((m) => parseRange(m) ?? []);
    this.mergeAt = (r, c) => {
      const row = this.sheetRow(r);
      const col = this.origin.col + c;
      const m = areas.find((a) => a.top === row && a.left === col);
      return m && { top: r, left: c, bottom: r + (m.bottom - m.top), right: c + (m.right - m.left) };
    };
  }

  get firstColumn(): number {
    return this.origin.col;
  }

  get lastColumn(): number {
    return this.origin.col + this.width - 1;
  }

  private sheetRow(row: number): number {
    return this.origin.row + (this.rows?.[row] ?? row);
  }

  /** Sheet address of a grid position. */
  address(row: number, col: number): string {
    return cellAddress(this.sheetRow(row), this.origin.col + col);
  }

  columnLetters(col: number): string {
    return columnLetters(this.origin.col + col);
  }

  range(r: { top: number; left: number; bottom: number; right: number }): string {
    return rangeAddress({
      top: this.sheetRow(r.top),
      left: this.origin.col + r.left,
      bottom: this.sheetRow(r.bottom),
      right: this.origin.col + r.right,
    });
  }

  problem(severity: Severity, code: ProblemCode, cell: string, message: string): Problem {
    return { severity, code, sheet: this.grid.sheet, cell, message };
  }
}

/** The area without its fully blank rows between filled ones: the rows kept (area rows) and the sheet rows skipped. */
function withoutBlankRows(area: Grid): { grid: Grid; rows: number[]; skipped: number[] } {
  const origin = gridOrigin(area)!;
  const blank = area.cells.map((row) => row.every((v) => isBlank(v ?? null)));
  const first = blank.indexOf(false);
  const last = blank.lastIndexOf(false);
  const rows: number[] = [];
  const skipped: number[] = [];
  area.cells.forEach((_, r) => {
    if (blank[r] && r > first && r < last) skipped.push(origin.row + r);
    else rows.push(r);
  });
  return { grid: { ...area, cells: rows.map((r) => area.cells[r]!) }, rows, skipped };
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

function readTable(sheet: SheetCells, layout: BlockLayout, options: SpecOptions, belowTable: boolean, host: HostKind): TableRead {
  const problems: Problem[] = [];
  const { block, headerRow } = layout;
  const headerRange = sheet.range({ top: headerRow, left: block.left, bottom: headerRow, right: block.right });
  const tableRange = sheet.range({ top: layout.top, left: block.left, bottom: block.bottom, right: block.right });
  const dataRows: number[] = [];
  for (let r = layout.dataTop; r <= block.bottom; r++) dataRows.push(r);
  const annotations = annotationColumns(sheet, layout, dataRows);
  const columns = signalColumns(layout).filter((c) => !annotations.has(c));
  const headerValues = columns.map((c) => sheet.cellAt(headerRow, c));
  if (!headerValues.some((v) => isText(v) && !looksLikeData(v))) {
    const message =
      'no header row: the first row of a spec table names its signals (text), ' +
      (layout.roleRow === undefined ? 'with an optional input/output row above it' : 'below the input/output row') +
      (belowTable ? '; if these rows belong to the table above, delete the empty row between them' : '');
    return { problems: [sheet.problem('error', 'no-header-row', headerRange, message)] };
  }

  const decided = decideRoles(sheet.cellAt, sheet.mergeAt, layout, columns, options.inputCount, host);
  if ('complaints' in decided) {
    const complaints = decided.complaints.map((c) => ({
      ...sheet.problem('error', 'roles-unknown', c.col === undefined ? headerRange : sheet.address(c.row, c.col), c.message),
      ...(c.col === undefined && layout.roleRow === undefined ? { setting: 'inputs' as const } : {}),
    }));
    return { problems: complaints };
  }
  const { roles } = decided;
  for (const col of roles.outside) {
    if (!holdsValues(sheet, col, dataRows)) annotations.set(col, 'outside-roles');
    else {
      const message =
        `column ${sheet.columnLetters(col)} holds truth values but no role cell covers it: write input or output above it ` +
        '(or widen the merged role cell over it), or head it Notes if it is not a signal';
      problems.push(sheet.problem('error', 'no-role', sheet.address(headerRow, col), message));
    }
  }
  const signalCols = [...roles.inputs, ...roles.outputs];

  const names = new Map<number, string>();
  for (const col of signalCols) names.set(col, headerName(sheet, headerRow, col, problems));
  reportDuplicates(sheet, headerRow, signalCols, names, problems);
  const wrongShape = shapeProblem(sheet, headerRow, headerRange, roles.inputs, roles.outputs);
  if (wrongShape) return { problems: [...problems, wrongShape] };

  const headers = signalCols.map((c) => names.get(c)!);
  const signals = namedSignals(sheet, layout, signalCols, headers, problems);
  const inputs = signals.slice(0, roles.inputs.length);
  const outputSignals = signals.slice(roles.inputs.length);
  const noteCols = [...annotations.keys()].sort((a, b) => a - b);

  const xReading = options.xReading ?? 'none';
  const rows: SpecRow[] = [];
  const wideCubes: WideCube[] = [];
  const bad = new BadCells();
  const readings = new Set<ValueReading>();
  for (const r of dataRows) {
    const row = readRow(sheet, r, layout, roles.inputs, roles.outputs, noteCols, xReading, bad, readings);
    if (row) {
      rows.push(row.row);
      if (row.wideCube) wideCubes.push(row.wideCube);
    }
  }
  problems.push(...bad.problems(sheet, host));
  if (dataRows.length === 0) problems.push(sheet.problem('error', 'no-data-rows', headerRange, 'no data rows below the header row'));
  const xCells = bad.xRead;
  if (xCells > 0)
    problems.push(
      sheet.problem('info', 'x-read', tableRange, `${xCells} cell${xCells === 1 ? '' : 's'} reading X taken as - (any / don't-care), as set`),
    );
  const ordered = READING_ORDER.filter((r) => readings.has(r));
  if (ordered.some((r) => r === 'ON/OFF' || r === 'Y/N' || r === 'YES/NO'))
    problems.push(sheet.problem('info', 'values-read', tableRange, `truth values read as written: ${ordered.join(', ')}`));
  const annotationList: AnnotationColumn[] = noteCols.map((c) => {
    const v = sheet.cellAt(headerRow, c);
    return { header: isText(v) ? v.trim() : '', cell: sheet.address(headerRow, c), reason: annotations.get(c)! };
  });
  if (annotationList.length > 0) problems.push(annotationProblem(sheet, annotationList));

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
    dontCares: options.dontCares ?? 'minimal',
    readings: ordered,
    annotations: annotationList,
    wording: host,
    ...(layout.tagRow === undefined ? {} : { tagRow: sheet.range({ top: layout.tagRow, left: block.left, bottom: layout.tagRow, right: block.right }) }),
    headerCells: signalCols.map((c) => sheet.address(headerRow, c)),
    problems,
    ...(wideSpec ? { wide: wideSpec } : {}),
  };
  return { table, problems };
}

const READING_ORDER: readonly ValueReading[] = ['1/0', 'TRUE/FALSE', 'ON/OFF', 'Y/N', 'YES/NO', '-', 'X'];

const ANNOTATION_WHY: Readonly<Record<AnnotationReason, string>> = {
  'note-header': 'headed as notes',
  'outside-roles': 'no role cell covers it',
  'free-text': 'it holds free text',
};

function annotationProblem(sheet: SheetCells, list: readonly AnnotationColumn[]): Problem {
  const described = list.map((a) => `${a.cell}${a.header ? ` "${clip(a.header)}"` : ''} (${ANNOTATION_WHY[a.reason]})`);
  const message = `taken as annotation, not as signals: ${described.join(', ')}; their text is shown beside each row`;
  return { ...sheet.problem('info', 'annotation', list[0]!.cell, message), cells: list.map((a) => a.cell) };
}

/**
 * Columns that are notes whatever the roles say: headed with a note word, the label column
 * of a tag row, or holding free text (words or numbers other than 0/1 in most filled cells).
 */
function annotationColumns(sheet: SheetCells, layout: BlockLayout, dataRows: readonly number[]): Map<number, AnnotationReason> {
  const out = new Map<number, AnnotationReason>();
  for (const col of signalColumns(layout)) {
    if (isNoteWord(sheet.cellAt(layout.headerRow, col))) out.set(col, 'note-header');
    else if (layout.tagRow !== undefined && isTagWord(sheet.cellAt(layout.tagRow, col))) out.set(col, 'outside-roles');
    else if (freeTextColumn(sheet, col, dataRows)) out.set(col, 'free-text');
  }
  return out;
}

function freeTextColumn(sheet: SheetCells, col: number, dataRows: readonly number[]): boolean {
  let free = 0;
  let values = 0;
  let other = 0;
  for (const r of dataRows) {
    const v = sheet.cellAt(r, col);
    if (isBlank(v)) continue;
    if (looksLikeData(v)) values++;
    else if (isFreeText(v)) free++;
    else other++;
  }
  return free > 0 && free + other > values;
}

function holdsValues(sheet: SheetCells, col: number, dataRows: readonly number[]): boolean {
  return dataRows.some((r) => looksLikeData(sheet.cellAt(r, col)));
}

/**
 * Each signal's header and identifier: the tag row's name when there is one (the header is
 * then its description), else one made from the header. A name that had to be cut or made
 * unique is one warning per table, saying how to choose it.
 */
function namedSignals(sheet: SheetCells, layout: BlockLayout, cols: readonly number[], headers: readonly string[], problems: Problem[]): Signal[] {
  const tagRow = layout.tagRow;
  const tags = cols.map((c) => {
    const v = tagRow === undefined ? null : sheet.cellAt(tagRow, c);
    return isText(v) ? v.trim() : undefined;
  });
  if (tagRow !== undefined) reportDuplicates(sheet, tagRow, cols, new Map(cols.map((c, i) => [c, tags[i] ?? `\u0000${i}`])), problems, 'tag');
  const sources = headers.map((h, i) => tags[i] ?? h);
  const ids = toIdentifiers(sources);
  const changed = sources.flatMap((src, i) => {
    const asDerived = fullIdentifier(src) || `Signal_${i + 1}`;
    return ids[i] !== asDerived || (tags[i] !== undefined && ids[i] !== tags[i]) ? [i] : [];
  });
  if (changed.length > 0) {
    const pairs = changed.map((i) => `${tags[i] !== undefined ? `tag "${clip(tags[i]!)}"` : `"${clip(headers[i]!)}"`} -> ${ids[i]}`);
    const how =
      tagRow === undefined
        ? 'to choose the names, add a tag row: a row with the word tag in a cell beside the table, and each signal\'s program name above its header'
        : 'write each tag as a valid name (letters, digits and single underscores, starting with a letter, at most 24 characters)';
    const plural = changed.length === 1 ? 'identifier was' : 'identifiers were';
    const message = `${changed.length} ${plural} cut to 24 characters or made unique: ${pairs.join(', ')}; ${how}`;
    const cells = changed.map((i) => sheet.address(tagRow !== undefined && tags[i] !== undefined ? tagRow : layout.headerRow, cols[i]!));
    problems.push({ ...sheet.problem('warning', 'identifier-changed', cells[0]!, message), cells });
  }
  return headers.map((header, i) => ({ header, identifier: ids[i]! }));
}

/** The header text of a signal column, or a stand-in naming the column after a complaint. */
function headerName(sheet: SheetCells, row: number, col: number, problems: Problem[]): string {
  const v = sheet.cellAt(row, col);
  if (isText(v)) return v.trim();
  const where = sheet.address(row, col);
  problems.push(
    sheet.problem(
      'error',
      'bad-signal-name',
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
  what: 'signal name' | 'tag' = 'signal name',
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
          what === 'tag' ? 'duplicate-tag' : 'duplicate-name',
          sheet.address(row, col),
          `the ${what} "${clip(names.get(col)!)}" is already used at ${sheet.address(row, earlier)}; ${what}s must differ (ignoring case)`,
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
  if (inputs.length === 0) return sheet.problem('error', 'no-inputs', headerRange, 'no input column: mark at least one column as an input');
  if (outputs.length === 0) return sheet.problem('error', 'no-outputs', headerRange, 'no output column: mark at least one column as an output');
  if (inputs.length > WIDE_MAX_INPUTS) {
    const cells = sheet.range({ top: row, left: inputs[0]!, bottom: row, right: inputs[inputs.length - 1]! });
    return sheet.problem('error', 'too-many-inputs', cells, `${inputs.length} inputs: at most ${WIDE_MAX_INPUTS} are handled; split the table`);
  }
  return undefined;
}

/** One data row, or undefined when a cell of it cannot be read (each such cell goes to `bad`). */
function readRow(
  sheet: SheetCells,
  r: number,
  layout: BlockLayout,
  inputCols: readonly number[],
  outputCols: readonly number[],
  noteCols: readonly number[],
  xReading: XReading,
  bad: BadCells,
  readings: Set<ValueReading>,
): { row: SpecRow; wideCube?: WideCube } | undefined {
  const n = inputCols.length;
  let good = true;
  const read = (col: number): OutputValue | undefined => {
    const cell = readDataCell(sheet.cellAt(r, col), xReading);
    if (!cell.ok) {
      bad.add(cell.kind, r, col, cell.reason);
      good = false;
      return undefined;
    }
    if (cell.x) bad.xRead++;
    readings.add(cell.reading);
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
  const notes = noteCols.flatMap((c) => {
    const v = sheet.cellAt(r, c);
    return isBlank(v) ? [] : [typeof v === 'object' && v !== null ? ('error' in v ? v.error : String(v.date)) : String(v).trim()];
  });
  const wide = n > MAX_INPUTS;
  const row: SpecRow = {
    cells: sheet.range({ top: r, left: layout.block.left, bottom: r, right: layout.block.right }),
    inputCells: inputCols.map((c) => sheet.address(r, c)),
    outputCells: outputCols.map((c) => sheet.address(r, c)),
    cube: wide ? cube(0, 0) : cube(mask, bits),
    values: values as OutputValue[],
    ...(notes.length > 0 ? { note: notes.join('; ') } : {}),
  };
  return { row, ...(wide ? { wideCube: wideRowCube(inputValues) } : {}) };
}

/** What the bad cells of one kind say together, after "N cells in B4:F9". */
const BAD_KIND_WORDS: Readonly<Record<BadCellKind, string>> = {
  blank: 'are blank',
  x: 'hold X',
  number: 'hold numbers other than 1 and 0',
  error: 'show error values',
  date: 'hold dates',
  text: 'hold text that is not a truth value',
};

/** The unreadable cells of a table by kind: one problem per kind, with every cell listed. */
class BadCells {
  xRead = 0;
  private readonly byKind = new Map<BadCellKind, { row: number; col: number; reason: string }[]>();

  add(kind: BadCellKind, row: number, col: number, reason: string): void {
    const list = this.byKind.get(kind) ?? [];
    list.push({ row, col, reason });
    this.byKind.set(kind, list);
  }

  problems(sheet: SheetCells, host: HostKind): Problem[] {
    return [...this.byKind].map(([kind, list]) => {
      const setting = kind === 'x' ? { setting: 'x-means-dont-care' as const } : {};
      const advice = kind === 'x' ? `${X_REFUSED} ${settingName('x-means-dont-care', host)}` : undefined;
      const first = list[0]!;
      if (list.length === 1)
        return { ...sheet.problem('error', 'bad-cell', sheet.address(first.row, first.col), advice ?? first.reason), ...setting };
      const box = sheet.range({
        top: minOf(list.map((b) => b.row)),
        left: minOf(list.map((b) => b.col)),
        bottom: maxOf(list.map((b) => b.row), 0),
        right: maxOf(list.map((b) => b.col), 0),
      });
      const example = kind === 'x' || kind === 'blank' ? '' : ` (first at ${sheet.address(first.row, first.col)}: ${first.reason.replace(/;.*$/, '')})`;
      const message = `${list.length} cells in ${box} ${BAD_KIND_WORDS[kind]}${example}: ${advice ?? HOW_TO_WRITE}`;
      return { ...sheet.problem('error', 'bad-cell', box, message), cells: list.map((b) => sheet.address(b.row, b.col)), ...setting };
    });
  }
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
    const noted = (row: SpecRow): string => (row.note ? ` ("${clip(row.note)}")` : '');
    const message =
      `rows ${a.cells}${noted(a)} and ${b.cells}${noted(b)} both cover ${describeCube(both, inputs)} but ask ${signal.header} ` +
      `for ${a.values[j]} and ${b.values[j]}; ${c.combinations} ${plural} the safe value ${safe}`;
    problems.push(sheet.problem('error', 'conflict', b.outputCells[j]!, message));
  }
  return { signal, safe, built: built.value };
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
  problems.push(sheet.problem('warning', 'gaps', tableRange, message));
}
