// The implementation check as the CLI prints it: plain text with the caution, or JSON data.
import { combinationPattern, jsonCounts, LISTED } from '../logic/index.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import { kindWord, verifyExitCode, type Count, type OutputVerdict, type VerifyReport } from '../impl/index.js';
import { plural } from './text.js';

/** The report as plain JSON data (for `verify --json`), with the caution and the exit status. */
export function verifyReportJson(report: VerifyReport): unknown {
  // Counts and combinations of a table over 24 inputs are BigInt: decimal strings past 2^53.
  return jsonCounts({
    caution: CAUTION,
    file: report.file,
    ...(report.mapping ? { mapping: report.mapping } : {}),
    allEqual: verifyExitCode(report) === 0,
    outputs: report.outputs.map((o) => ({
      table: o.table,
      name: o.output.header,
      identifier: o.output.identifier,
      cell: o.cell,
      status: o.status,
      ...(o.variable ? { variable: o.variable, line: o.line } : {}),
      ...(o.byMapping && o.byMapping.length > 0 ? { byMapping: o.byMapping } : {}),
      combinations: o.combinations,
      mismatchCount: o.mismatchCount,
      unsafeCount: o.unsafeCount,
      spuriousTripCount: o.spuriousTripCount,
      ...(o.unsafeWhen ? { unsafeWhen: o.unsafeWhen } : {}),
      ...(o.spuriousTripWhen ? { spuriousTripWhen: o.spuriousTripWhen } : {}),
      counterexamples: o.counterexamples,
      differenceMonomials: o.differenceMonomials,
      differenceMonomialCount: o.differenceMonomialCount,
      dontCare: o.dontCare,
      gaps: o.gaps,
      conflicted: o.conflicted,
      reasons: o.reasons,
      cannotJudge: o.cannotJudge,
    })),
    unmatchedSpec: report.unmatchedSpec,
    unmatchedProgram: report.unmatchedProgram,
    unusedMapping: report.unusedMapping,
    mappingProblems: report.mappingProblems,
    cannotJudge: report.cannotJudge,
    notes: report.notes,
  });
}

const WORD: Readonly<Record<OutputVerdict['status'], string>> = {
  equal: 'EQUAL',
  differs: 'DIFFERS',
  unchecked: 'UNCHECKED',
  'not-found': 'NOT FOUND',
};

/** The report as text for a terminal, caution first. */
export function verifyReportText(report: VerifyReport): string {
  const lines: string[] = [...CAUTION_LINES, ''];
  lines.push(`Implementation check of ${report.file}${report.mapping ? ` (names mapped by ${report.mapping})` : ''}`);
  for (const o of report.outputs) {
    lines.push('');
    const impl = o.variable ? ` = ${o.variable} (line ${o.line})` : '';
    lines.push(`${WORD[o.status]}  ${o.output.header} [${o.cell}]${impl}`);
    if (o.status === 'equal') lines.push(`  ${equalLine(o)}`);
    if (o.status === 'differs') lines.push(...differences(report, o));
    for (const r of o.reasons) lines.push(`  ${r}`);
    if (o.status === 'equal' || o.status === 'differs') lines.push(...openLines(o));
  }
  const list = (title: string, items: readonly string[]): void => {
    if (items.length === 0) return;
    lines.push('', title);
    for (const item of items) lines.push(`  ${item}`);
  };
  list('Spec signals not matched to the program:', report.unmatchedSpec);
  list('Program variables not matched to the spec:', report.unmatchedProgram);
  list('Mapping entries that cannot be used (the outputs they touch are UNCHECKED):', report.unusedMapping);
  list(
    'What a truth table cannot judge (combinational logic only):',
    report.cannotJudge.map((c) => `${c.pou} line ${c.line}: ${kindWord(c.kind)}: ${c.what}`),
  );
  list('Notes:', report.notes);
  const tally = (s: OutputVerdict['status']): number => report.outputs.filter((o) => o.status === s).length;
  lines.push(
    '',
    `Result: ${tally('equal')} equal, ${tally('differs')} differ, ${tally('unchecked')} unchecked, ${tally('not-found')} not found` +
      ` of ${report.outputs.length} outputs` +
      (tally('differs') > 0 ? `; ${sideCountsText(sideTotals(report.outputs))} in all.` : '.'),
  );
  return lines.join('\n') + '\n';
}

/** Both sides added up over the outputs. */
export function sideTotals(outputs: readonly OutputVerdict[]): Pick<OutputVerdict, 'unsafeCount' | 'spuriousTripCount'> {
  const total = (key: 'unsafeCount' | 'spuriousTripCount') => outputs.reduce<Count>((t, o) => addCount(t, o[key]), 0);
  return { unsafeCount: total('unsafeCount'), spuriousTripCount: total('spuriousTripCount') };
}

/** Counts stay numbers up to 24 inputs and are exact BigInt beyond. */
function addCount(a: Count, b: Count): Count {
  return typeof a === 'number' && typeof b === 'number' ? a + b : BigInt(a) + BigInt(b);
}

/** "equal on all N combinations" only when all N were judged. */
function equalLine(o: OutputVerdict): string {
  if (o.gaps.judged || o.gaps.count === 0) return `equal on all ${o.combinations} combinations`;
  return `equal on the ${BigInt(o.combinations) - BigInt(o.gaps.count)} specified combinations; ${o.gaps.count} gap combinations not judged (--gaps-free)`;
}

/** Where a counterexample's expected value comes from. */
function sourceText(c: OutputVerdict['counterexamples'][number], safe: 0 | 1): string {
  if (c.source === 'gap') return `gap: no row covers it, safe value ${safe}`;
  if (c.source === 'conflict') return `conflict: rows ask for 1 and 0, safe value ${safe}`;
  return c.specRow ? `${c.specRow.cells} (output cell ${c.specRow.outputCell})` : '-';
}

/** How many of each side, unsafe first: "2 unsafe, 1 spurious trip". */
export function sideCountsText(o: Pick<OutputVerdict, 'unsafeCount' | 'spuriousTripCount'>): string {
  return `${plural(o.unsafeCount, 'unsafe combination')}, ${plural(o.spuriousTripCount, 'spurious trip')}`;
}

/** Where a counterexample stands: `!!` marks the unsafe ones (the dangerous direction), as compare marks "now permits". */
const KIND_MARK = { unsafe: '!! ', 'spurious-trip': '   ' } as const;
const KIND_WORD = { unsafe: 'unsafe', 'spurious-trip': 'spurious trip' } as const;

function differences(report: VerifyReport, o: OutputVerdict): string[] {
  const inputs = report.inputs[o.table] ?? [];
  const cut = o.mismatchCount > o.counterexamples.length ? ` (the first ${LISTED} of each shown)` : '';
  const out = [`  differs on ${o.mismatchCount} of ${o.combinations} combinations (safe value ${o.gaps.safe}): ${sideCountsText(o)}${cut}`];
  if (o.unsafeWhen) out.push(`  ${KIND_MARK.unsafe}${o.unsafeWhen.sentence}`);
  if (o.spuriousTripWhen) out.push(`  ${KIND_MARK['spurious-trip']}${o.spuriousTripWhen.sentence}`);
  const width = KIND_WORD['spurious-trip'].length;
  out.push(`     ${'kind'.padEnd(width)} ${inputs.map((s) => s.identifier).join(' ')} | spec impl | spec row`);
  for (const c of o.counterexamples) {
    const cells = c.inputs.map((v, i) => String(v).padStart(inputs[i]?.identifier.length ?? 1)).join(' ');
    const row = sourceText(c, o.gaps.safe);
    out.push(`  ${KIND_MARK[c.kind]}${KIND_WORD[c.kind].padEnd(width)} ${cells} | ${String(c.expected).padStart(4)} ${String(c.actual).padStart(4)} | ${row}`);
  }
  const more = o.differenceMonomialCount > o.differenceMonomials.length ? ` (first ${o.differenceMonomials.length} of ${o.differenceMonomialCount})` : '';
  out.push(`  detail: spec and program differ by the XOR of these ANF monomials${more}:`);
  for (const m of o.differenceMonomials) out.push(`    ${m}`);
  return out;
}

function openLines(o: OutputVerdict): string[] {
  const out: string[] = [];
  const n = Math.log2(Number(o.combinations));
  if (o.dontCare.count > 0) out.push(`  don't-care: ${o.dontCare.count} combinations, the implementation turns ${o.dontCare.implementationOn} of them ON (not counted as differences)`);
  if (o.gaps.count > 0) {
    const judged = o.gaps.judged ? 'judged at the safe value: counted as differences' : 'not judged under --gaps-free, not counted as differences';
    out.push(`  gaps (no row covers them; safe value ${o.gaps.safe}): ${o.gaps.count} combinations, ${o.gaps.unsafe} of them not at the safe value in the implementation (${judged})`);
    for (const k of o.gaps.unsafeExamples.slice(0, 10)) out.push(`    ${[...combinationPattern(n, BigInt(k))].join(' ')}`);
  }
  if (o.conflicted > 0) out.push(`  conflicts: ${o.conflicted} combinations the spec asks to be both 1 and 0 (judged at the safe value ${o.gaps.safe})`);
  return out;
}
