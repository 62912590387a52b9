// The results sheet of one spec table: caution, per output its forms with cost and proof,
// inputs that do not matter, gaps, conflicts and don't-cares turned on; the signal names; the
// test steps. For up to 12 inputs a live check sheet of its own recomputes every form with
// Excel formulas from the input cells, one row per combination, with a status that reads
// OK/DIFFERS under frozen column titles; the results sheet counts its DIFFERS near the top.
import {
  boundsWords,
  appendAll,
  has,
  inputBit,
  ok,
  printExcel,
  truthTable,
  type Combination,
  type Expr,
  type Result,
} from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { cellAddress, qualifiedAddress } from '../table/index.js';
import { CAUTION_LINES } from './caution.js';
import { quotedSheet, type BlockCell, type SheetBlock } from './sheet-block.js';
import { printSetup } from './sheet-looks.js';
import { chosenForm, FORM_LABEL, minimumWords, type FormChoice } from './st-export.js';
import { outputViews, type OutputView } from './output-view.js';
import { cautionRows, recordSteps, sheetName, stepBlockRows } from './test-steps.js';
import { NO_XOR, plural } from './text.js';

/** The live check writes one row per combination up to this many inputs (4,096 rows). */
export const LIVE_CHECK_MAX_INPUTS = 12;
/** Combinations or patterns listed by name in one cell; the count is always complete. */
const LISTED = 20;
/** Excel holds at most 32,767 characters in a cell (Microsoft support, "Excel specifications and limits"; from memory). */
export const CELL_CHARS = 32_000;

const FORMS: readonly FormChoice[] = ['andOr', 'xor', 'bestXor'];
const SHORT: Readonly<Record<FormChoice, string>> = { andOr: 'AND/OR', xor: 'XOR', bestXor: 'best XOR' };

type Row = (BlockCell | null)[];

/** The sheets of one table's results: the results sheet, then its live check (up to 12 inputs), which the first one's summary names. */
export function resultsSheets(analysis: TableAnalysis, options: { source?: string } = {}): SheetBlock[] {
  const live = liveCheckOf(analysis);
  const results = resultsBlock(analysis, options, live);
  return live ? [{ ...results, refersTo: [1] }, liveCheckBlock(analysis, live)] : [results];
}

/** The results sheet alone; its summary names the live check sheet of `liveCheckSheet`. */
export function resultsSheet(analysis: TableAnalysis, options: { source?: string } = {}): SheetBlock {
  return resultsBlock(analysis, options, liveCheckOf(analysis));
}

/**
 * The live check of a table of up to 12 inputs as a sheet of its own: title, caution, what it
 * does, then the column titles, frozen, and one row per combination. Undefined above 12 inputs.
 */
export function liveCheckSheet(analysis: TableAnalysis): SheetBlock | undefined {
  const live = liveCheckOf(analysis);
  return live && liveCheckBlock(analysis, live);
}

/** The sheet name a table's live check asks for. */
export function liveCheckSheetName(analysis: TableAnalysis): string {
  return sheetName(analysis.table.sheet, ' live check');
}

function resultsBlock(analysis: TableAnalysis, options: { source?: string }, live: LiveCheck | undefined): SheetBlock {
  const { table } = analysis;
  const n = analysis.inputs.length;
  const rows: Row[] = [];
  rows.push([{ value: `Interlock Algebra results: ${qualifiedAddress(table.sheet, table.range)}`, style: 'title' }]);
  if (options.source) rows.push([label('Source'), { value: options.source }]);
  for (const line of CAUTION_LINES) rows.push([{ value: line, style: 'caution' }]);
  rows.push([]);
  if (live) {
    const where = liveCheckSheetName(analysis);
    rows.push(
      [label('Combinations that differ (live check)'), { value: live.differs, formula: `COUNTIF(${quotedSheet(where)}!${live.statusRange},"DIFFERS")`, style: 'status' }],
      [label('Live check'), { value: `on its own sheet, ${where}: one row per combination, every form recomputed from the input cells` }],
    );
  } else {
    const reason = `Live check left out: ${n} inputs give ${2n ** BigInt(n)} combinations; the live check is written for tables of up to ${LIVE_CHECK_MAX_INPUTS} inputs (${2 ** LIVE_CHECK_MAX_INPUTS} rows).`;
    rows.push([label('Live check'), { value: reason }]);
  }
  rows.push([]);

  if (analysis.problems.length > 0) {
    rows.push([heading('Spec problems')], [heading('Severity'), heading('Cell'), heading('Message')]);
    for (const p of analysis.problems) rows.push([{ value: p.severity }, { value: qualifiedAddress(p.sheet, p.cell) }, { value: p.message }]);
    rows.push([]);
  }
  const outputs = outputViews(analysis);
  for (const output of outputs) appendAll(rows, outputSection(analysis, output)).push([]);

  rows.push([heading('Signals')], [heading('Header'), heading('Identifier'), heading('Role')]);
  for (const s of analysis.inputs) rows.push([{ value: s.header }, code(s.identifier), { value: 'input' }]);
  for (const o of outputs) rows.push([{ value: o.signal.header }, code(o.signal.identifier), { value: `output, safe value ${o.safe}` }]);
  rows.push([]);

  rows.push([heading('Test steps (unique cause)')]);
  appendAll(rows, stepBlockRows(recordSteps(analysis), outputs.length));
  return {
    name: sheetName(table.sheet, ' results'),
    rows,
    columnWidths: [30, 48, 22, 30, 40, ...Array.from({ length: 2 * outputs.length + 6 }, () => 12)],
    print: printSetup(`Results of ${qualifiedAddress(table.sheet, table.range)}`),
  };
}

/** Rows of the live check sheet above its column titles. */
function liveCheckTop(analysis: TableAnalysis): Row[] {
  return [[{ value: `Live check: ${qualifiedAddress(analysis.table.sheet, analysis.table.range)}`, style: 'title' }], ...cautionRows()];
}

function liveCheckOf(analysis: TableAnalysis): LiveCheck | undefined {
  return analysis.inputs.length <= LIVE_CHECK_MAX_INPUTS ? liveCheck(analysis, liveCheckTop(analysis).length) : undefined;
}

function liveCheckBlock(analysis: TableAnalysis, live: LiveCheck): SheetBlock {
  const where = qualifiedAddress(analysis.table.sheet, analysis.table.range);
  return {
    name: liveCheckSheetName(analysis),
    rows: [...liveCheckTop(analysis), ...live.rows],
    freezeRows: live.titleRow + 1,
    columnWidths: [8, ...Array.from({ length: analysis.inputs.length + 4 * analysis.outputs.length }, () => 12), 10, 30],
    statusRanges: [live.statusRange],
    print: printSetup(`Live check of ${where}`, live.titleRow + 1),
  };
}

function outputSection(analysis: TableAnalysis, o: OutputView): Row[] {
  const n = analysis.inputs.length;
  const rows: Row[] = [
    [heading(`Output ${o.signal.header} (${o.signal.identifier}), safe value ${o.safe}`)],
    [heading('Form'), heading('Structured Text'), heading('Cost'), heading('Minimum'), heading('Proof')],
  ];
  for (const form of FORMS) {
    const f = chosenForm(o, form);
    if (!f) {
      rows.push([label(FORM_LABEL[form]), { value: NO_XOR }]);
      continue;
    }
    const cost = form === 'andOr' ? `${plural(o.andOr.terms, 'term')}, ${plural(o.andOr.literals, 'literal')}` : plural(f.terms, 'term');
    rows.push([label(FORM_LABEL[form]), code(cellText(f.text)), { value: cost }, { value: minimumText(o, form, n) }, { value: proofCell(f) }]);
  }
  const unused = o.unusedInputs.map((i) => analysis.inputs[i]!.header);
  rows.push([label('Inputs that do not matter'), { value: unused.length === 0 ? 'none' : unused.join(', ') }]);
  rows.push([
    label('Gaps (take the safe value)'),
    { value: o.gapCount.atMost === 0n ? 'none' : `${boundsWords(o.gapCount, 'combination')}: ${listed(o.gaps, o.gaps.length)}` },
  ]);
  if (o.conflicts.length === 0) rows.push([label('Conflicts'), { value: 'none' }]);
  for (const c of o.conflicts) {
    rows.push([
      label('Conflict (takes the safe value)'),
      { value: `rows ${c.rowCellsA} and ${c.rowCellsB} ask for 1 and 0 on ${plural(c.combinations, 'combination')}, e.g. ${c.example}` },
    ]);
  }
  rows.push([label("Don't-care combinations"), { value: `${o.dontCareCount}` }]);
  for (const form of FORMS) {
    const f = chosenForm(o, form);
    if (!f || f.permitsAlsoCount === 0n) continue;
    rows.push([label(`${FORM_LABEL[form]} turns on`), { value: listed(f.permitsAlso, f.permitsAlsoCount) }]);
  }
  return rows;
}

function minimumText(o: OutputView, form: FormChoice, n: number): string {
  if (form === 'andOr') return minimumWords(o.andOr);
  if (form === 'xor' || !o.bestXor) return 'unique (algebraic normal form)';
  const { polarity, exhaustive } = o.bestXor;
  const complemented = [];
  for (let i = 0; i < n; i++) if (polarity & inputBit(n, i)) complemented.push(i);
  const which = complemented.length === 0 ? 'no input complemented' : `${plural(complemented.length, 'input')} complemented`;
  return `${which}; ${exhaustive ? `fewest terms of all 2^${n} polarities` : 'best found, not all polarities searched'}`;
}

function proofCell(p: { combinations: bigint; mismatchCount: bigint }): string {
  return `${p.combinations} combinations checked, ${p.mismatchCount} mismatch${p.mismatchCount === 1n ? '' : 'es'}`;
}

interface LiveCheck {
  readonly rows: Row[];
  /** 0-based sheet row of the column titles. */
  readonly titleRow: number;
  readonly statusRange: string;
  readonly differs: number;
}

/**
 * The live check, starting at 0-based sheet row `top`: an explanation, column
 * titles, then one row per combination: its number, the inputs (0/1), and per output the
 * spec value and one formula per form; then a status formula and a note on gaps.
 */
function liveCheck(analysis: TableAnalysis, top: number): LiveCheck {
  const n = analysis.inputs.length;
  const outputs = analysis.outputs;
  const specs = analysis.table.outputs;
  const rows: Row[] = [
    [{ value: "Each row recomputes every form from its input cells. Status reads OK when every form equals the spec value ('-' = don't-care: any value is OK); the spec column shows the safe value where the spec leaves a gap or conflict." }],
  ];
  const titles: Row = [heading('#'), ...analysis.inputs.map((s) => heading(s.identifier))];
  for (const o of outputs) {
    titles.push(heading(`${o.signal.identifier} spec`), ...FORMS.map((f) => heading(`${o.signal.identifier} ${SHORT[f]}`)));
  }
  titles.push(heading('Status'), heading('Note'));
  const titleRow = top + rows.length;
  rows.push(titles);

  const values = outputs.map((o) => FORMS.map((f) => truthTable(chosenForm(o, f).expr, n)));
  const statusCol = 1 + n + 4 * outputs.length;
  const firstRow = top + rows.length;
  const formulas = outputs.map((o) => FORMS.map((f) => rowFormulas(chosenForm(o, f).expr, firstRow, firstRow + 2 ** n - 1)));
  let differs = 0;
  for (let k: Combination = 0; k < 2 ** n; k++) {
    const r = firstRow + k;
    const row: Row = [{ value: k, style: 'number' }];
    for (let i = 0; i < n; i++) row.push({ value: (k >>> (n - 1 - i)) & 1, style: 'input' });
    const conditions: string[] = [];
    let matches = true;
    const notes: string[] = [];
    outputs.forEach((o, j) => {
      const spec = specs[j]!.built;
      const specCol = 1 + n + 4 * j;
      const specRef = cellAddress(r, specCol);
      const dontCare = has(spec.fn.dc, k);
      const specValue = dontCare ? '-' : has(spec.fn.on, k) ? 1 : 0;
      row.push({ value: specValue, style: 'number' });
      if (has(spec.gaps, k)) notes.push(`${o.signal.identifier}: gap, safe value`);
      if (has(spec.conflicted, k)) notes.push(`${o.signal.identifier}: conflict, safe value`);
      const equal: string[] = [];
      values[j]!.forEach((set, f) => {
        const value = has(set, k) ? 1 : 0;
        if (!dontCare && value !== specValue) matches = false;
        const excel = formulas[j]![f]!(r);
        if (excel.ok) {
          row.push({ value, formula: `IF(${excel.value},1,0)`, style: 'number' });
          equal.push(`${cellAddress(r, specCol + 1 + f)}=${specRef}`);
        } else row.push({ value: `not written as a formula: ${excel.error.message}` });
      });
      if (equal.length > 0) conditions.push(`OR(${specRef}="-",${equal.length === 1 ? equal[0] : `AND(${equal.join(',')})`})`);
    });
    if (!matches) differs++;
    const test = conditions.length === 0 ? 'TRUE' : conditions.length === 1 ? conditions[0] : `AND(${conditions.join(',')})`;
    row.push({ value: matches ? 'OK' : 'DIFFERS', formula: `IF(${test},"OK","DIFFERS")`, style: 'status' });
    row.push(notes.length > 0 ? { value: notes.join('; ') } : null);
    rows.push(row);
  }
  const statusRange = `${cellAddress(firstRow, statusCol)}:${cellAddress(firstRow + 2 ** n - 1, statusCol)}`;
  return { rows, titleRow, statusRange, differs };
}

/**
 * The formula of a form for each sheet row from `first` to `last`, inputs in columns B...
 * printExcel runs once on a template; rows only fill in their references. A formula only
 * grows with the row number's digits, so it fits on every row when it fits on the last, and
 * on none when it does not fit on the first; rows in between are tried one by one.
 */
function rowFormulas(expr: Expr, first: number, last: number): (row: number) => Result<string> {
  const refsOf = (row: number) => (input: number) => cellAddress(row, 1 + input);
  const atLast = printExcel(expr, refsOf(last));
  const atFirst = atLast.ok ? atLast : printExcel(expr, refsOf(first));
  if (!atFirst.ok) return () => atFirst;
  if (!atLast.ok) return (row) => printExcel(expr, refsOf(row));
  const template = printExcel(expr, (input) => `@${input}@`);
  if (!template.ok) return (row) => printExcel(expr, refsOf(row));
  return (row) => ok(template.value.replace(/@(\d+)@/g, (_, input: string) => cellAddress(row, 1 + Number(input))));
}

function listed(items: readonly string[], total: number | bigint): string {
  const shown = items.slice(0, LISTED).join(', ');
  return total > LISTED ? `${shown} and ${BigInt(total) - BigInt(LISTED)} more` : shown;
}

function cellText(s: string): string {
  return s.length <= CELL_CHARS ? s : `${s.slice(0, CELL_CHARS)} … (cut at ${CELL_CHARS} of ${s.length} characters; see the Structured Text export)`;
}

export function label(value: string): BlockCell {
  return { value, style: 'label' };
}

export function heading(value: string): BlockCell {
  return { value, style: 'heading' };
}

export function code(value: string): BlockCell {
  return { value, style: 'code' };
}
