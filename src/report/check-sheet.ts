// The implementation check as a sheet: what was checked, the verdict per output, the
// counterexamples as rows (inputs 0/1, expected, actual, the spec row they contradict), the
// ANF monomials by which implementation and spec differ, and the don't-care/gap notes. A pasted
// expression (one output) and a program file (every output) come to the same sections.
import { appendAll, combinationPattern, maxOf, type CounterexampleKind, type Signal } from '../logic/index.js';
import { kindWord, type OutputVerdict, type VerifyReport } from '../impl/index.js';
import { qualifiedAddress, type SpecTable } from '../table/index.js';
import { sideCountsText, sideTotals } from './verify-report.js';
import { CAUTION_LINES } from './caution.js';
import { CELL_CHARS, code, heading, label } from './results-sheet.js';
import type { BlockCell, SheetBlock } from './sheet-block.js';
import { sheetName } from './test-steps.js';
import { fit, plural } from './text.js';

export type CheckSubject =
  /** An expression typed or pasted for one output of a table, checked by `verifyExpression`. */
  | { readonly kind: 'expression'; readonly table: SpecTable; readonly expression: string; readonly verdict: OutputVerdict }
  /** A program file checked against every output by `verifyImplementation`. */
  | { readonly kind: 'program'; readonly report: VerifyReport };

type Row = (BlockCell | null)[];

/** One output's check as the sheet shows it, whichever kind of check it came from. */
interface Section
  extends Pick<
    OutputVerdict,
    'output' | 'cell' | 'status' | 'combinations' | 'mismatchCount' | 'unsafeCount' | 'spuriousTripCount' | 'unsafeWhen' | 'spuriousTripWhen' | 'differenceMonomials' | 'differenceMonomialCount'
  > {
  readonly inputs: readonly Signal[];
  readonly safe: 0 | 1;
  readonly implementation: BlockCell;
  readonly counterexamples: readonly {
    readonly inputs: readonly (0 | 1)[];
    readonly expected: 0 | 1;
    readonly actual: 0 | 1;
    readonly kind: CounterexampleKind;
    readonly specRow: string;
  }[];
  /** Label and text: reasons, don't-cares, gaps, conflicts. */
  readonly notes: readonly (readonly [string, string])[];
}

interface CheckView {
  readonly name: string;
  readonly title: string;
  readonly about: readonly (readonly [string, BlockCell])[];
  readonly sections: readonly Section[];
  /** Program-wide lists (unmatched names, what a truth table cannot judge). */
  readonly lists: readonly { readonly title: string; readonly items: readonly string[] }[];
}

const VERDICT_WORD: Readonly<Record<OutputVerdict['status'], string>> = { equal: 'EQUAL', differs: 'DIFFERS', unchecked: 'UNCHECKED', 'not-found': 'NOT FOUND' };

export function checkSheet(subject: CheckSubject): SheetBlock {
  return layout(subject.kind === 'expression' ? expressionView(subject) : programView(subject.report));
}

function layout(view: CheckView): SheetBlock {
  const rows: Row[] = [[{ value: view.title, style: 'title' }]];
  for (const line of CAUTION_LINES) rows.push([{ value: line, style: 'caution' }]);
  rows.push([]);
  for (const [what, cell] of view.about) rows.push([label(what), cell]);
  rows.push([]);
  for (const s of view.sections) appendAll(rows, sectionRows(s)).push([]);
  for (const list of view.lists) {
    if (list.items.length === 0) continue;
    rows.push([heading(list.title)]);
    for (const item of list.items) rows.push([{ value: item }]);
    rows.push([]);
  }
  const widest = maxOf(view.sections.map((s) => s.inputs.length), 0);
  return { name: view.name, rows, columnWidths: [30, ...Array.from({ length: widest + 2 }, () => 14), 40] };
}

function sectionRows(s: Section): Row[] {
  const rows: Row[] = [
    [heading(`Output ${s.output.header} (${s.output.identifier})`)],
    [label('Spec cell'), { value: s.cell }],
    [label('Implementation'), s.implementation],
    [label('Verdict'), { value: VERDICT_WORD[s.status], style: 'status' }, { value: verdictText(s) }],
  ];
  if (s.status === 'differs') {
    rows.push([label('Unsafe combinations'), { value: countValue(s.unsafeCount), style: s.unsafeCount > 0 ? 'unsafe' : 'number' }, { value: `the spec requires the safe value ${s.safe}, the implementation gives ${1 - s.safe}` }]);
    rows.push([label('Spurious trips'), { value: countValue(s.spuriousTripCount), style: 'number' }, { value: `the spec requires ${1 - s.safe}, the implementation holds the safe value ${s.safe}` }]);
    if (s.unsafeWhen) rows.push([label('Unsafe when'), { value: s.unsafeWhen.sentence, style: 'unsafe' }]);
    if (s.spuriousTripWhen) rows.push([label('Spurious trip when'), { value: s.spuriousTripWhen.sentence }]);
  }
  if (s.counterexamples.length > 0) {
    const shown = s.counterexamples.length < s.mismatchCount ? `${s.counterexamples.length} of ${s.mismatchCount} (the first of each kind, unsafe first)` : `all ${s.mismatchCount}, unsafe first`;
    rows.push([label('Counterexamples'), { value: shown }]);
    rows.push([...s.inputs.map((i) => heading(i.header)), heading('Expected (spec)'), heading('Actual (implementation)'), heading('Kind'), heading('Spec row it contradicts')]);
    for (const c of s.counterexamples) {
      rows.push([
        ...c.inputs.map((v): BlockCell => ({ value: v, style: 'input' })),
        { value: c.expected, style: 'number' },
        { value: c.actual, style: 'number' },
        c.kind === 'unsafe' ? { value: 'unsafe', style: 'unsafe' } : { value: 'spurious trip' },
        { value: c.specRow },
      ]);
    }
  }
  if (s.differenceMonomialCount > 0) {
    const more = s.differenceMonomialCount > s.differenceMonomials.length ? ` (first ${s.differenceMonomials.length} shown)` : '';
    rows.push([label('Detail: XOR of'), { value: `${plural(s.differenceMonomialCount, 'ANF monomial')}${more} by which spec and implementation differ` }]);
    for (const m of s.differenceMonomials) rows.push([null, code(m)]);
  }
  for (const [what, text] of s.notes) rows.push([label(what), { value: text }]);
  return rows;
}

function verdictText(s: Section): string {
  switch (s.status) {
    case 'equal':
      return `equal on all ${s.combinations} combinations`;
    case 'differs':
      return `differs on ${s.mismatchCount} of ${s.combinations} combinations`;
    case 'unchecked':
      return 'not checked: see why below';
    case 'not-found':
      return 'no implementation found: see why below';
  }
}

/** One output's verdict as a section; `word` names what was checked ("expression", "implementation"). */
function sectionOf(v: OutputVerdict, inputs: readonly Signal[], implementation: BlockCell, word: string): Section {
  const safe = v.gaps.safe;
  const notes: [string, string][] = v.reasons.map((r) => [v.status === 'not-found' ? 'Why not found' : 'Why unchecked', r]);
  if (v.status === 'equal' || v.status === 'differs') {
    if (v.dontCare.count > 0) notes.push(["Don't-care", `${plural(v.dontCare.count, 'combination')}; the ${word} turns ${v.dontCare.implementationOn} of them ON (not counted as differences)`]);
    if (v.gaps.count > 0 && v.gaps.judged) notes.push(['Gaps', `${plural(v.gaps.count, 'combination')} no row covers; they take the safe value ${safe} and are checked against it`]);
    if (v.gaps.count > 0 && !v.gaps.judged) {
      const examples = v.gaps.unsafeExamples.slice(0, 10).map((k) => combinationPattern(inputs.length, BigInt(k)));
      notes.push([
        'Gaps',
        `${plural(v.gaps.count, 'combination')} no row covers (safe value ${safe}); the ${word} is not at the safe value on ${v.gaps.unsafe} of them` +
          `${examples.length > 0 ? `, e.g. ${examples.join(', ')}` : ''} (not judged: not counted as differences)`,
      ]);
    }
    if (v.conflicted > 0) notes.push(['Conflicts', `${plural(v.conflicted, 'combination')} the spec asks to be both 1 and 0; they take the safe value ${safe} and are checked against it`]);
  }
  const openNote = (source: OutputVerdict['counterexamples'][number]['source']): string =>
    source === 'gap' ? `gap (no row covers it): safe value ${safe}` : source === 'conflict' ? `conflict: safe value ${safe}` : '-';
  return {
    ...v,
    safe,
    inputs,
    implementation,
    counterexamples: v.counterexamples.map((c) => ({ ...c, specRow: c.specRow ? specRowText(c.specRow) : openNote(c.source) })),
    notes,
  };
}

function expressionView(subject: Extract<CheckSubject, { kind: 'expression' }>): CheckView {
  const { table, verdict } = subject;
  const where = qualifiedAddress(table.sheet, table.range);
  return {
    name: sheetName(table.sheet, ' check'),
    title: `Interlock Algebra implementation check: ${where}`,
    about: [
      ['Checked', { value: `an expression for output ${verdict.output.header}` }],
      ['Expression', code(fit(subject.expression, CELL_CHARS))],
      ['Spec table', { value: where }],
    ],
    sections: [sectionOf(verdict, table.inputs, { value: 'the expression above' }, 'expression')],
    lists: [],
  };
}

function programView(report: VerifyReport): CheckView {
  const tally = (s: OutputVerdict['status']): number => report.outputs.filter((o) => o.status === s).length;
  const tables = [...new Set(report.outputs.map((o) => o.table))];
  const sections = report.outputs.map((v) =>
    sectionOf(v, report.inputs[v.table] ?? [], { value: v.variable ? `${v.variable} (line ${v.line})` : 'none found' }, 'implementation'),
  );
  return {
    name: sheetName(report.file.replace(/\.[^.]*$/, ''), ' check'),
    title: `Interlock Algebra implementation check: ${report.file}`,
    about: [
      ['Checked', { value: `program file ${report.file}` }],
      ...(report.mapping ? [['Names mapped by', { value: report.mapping }] as const] : []),
      [tables.length === 1 ? 'Spec table' : 'Spec tables', { value: tables.join(', ') }],
      [
        'Result',
        { value: `${tally('equal')} equal, ${tally('differs')} differ, ${tally('unchecked')} unchecked, ${tally('not-found')} not found of ${plural(report.outputs.length, 'output')}` },
      ],
      ...(tally('differs') > 0 ? [['Differences', differencesCell(sideTotals(report.outputs))] as const] : []),
    ],
    sections,
    lists: [
      { title: 'Spec signals not matched to the program', items: report.unmatchedSpec },
      { title: 'Program variables not matched to the spec', items: report.unmatchedProgram },
      { title: 'Mapping entries that cannot be used (the outputs they touch are UNCHECKED)', items: report.unusedMapping },
      { title: 'What a truth table cannot judge (combinational logic only)', items: report.cannotJudge.map((c) => `${c.pou} line ${c.line}: ${kindWord(c.kind)}: ${c.what}`) },
      { title: 'Notes', items: report.notes },
    ],
  };
}

/** Both counts in one cell, marked when any is unsafe. */
function differencesCell(totals: Pick<OutputVerdict, 'unsafeCount' | 'spuriousTripCount'>): BlockCell {
  return { value: `${sideCountsText(totals)} in all`, ...(totals.unsafeCount > 0 ? { style: 'unsafe' as const } : {}) };
}

function specRowText(row: NonNullable<OutputVerdict['counterexamples'][number]['specRow']>): string {
  return `${row.cells} (output cell ${row.outputCell})`;
}

/** A count as a cell: a number while exact in a double, else its decimal digits (wide tables). */
function countValue(c: number | bigint): number | string {
  return typeof c === 'number' || c <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(c) : c.toString();
}
