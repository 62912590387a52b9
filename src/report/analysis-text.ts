// The readable report of `analyze`: per table its signals, per output its forms, proof,
// gaps, conflicts and don't-cares turned on, then the problems with sheet!cell, then the caution.
import { wideOutputLines } from './analysis-text-wide.js';
import { appendAll, maxOf, type Signal } from '../logic/index.js';
import { CAUTION_LINES } from './caution.js';
import { combinationTableLines, cubeTableLines } from './pattern-table.js';
import type { FormProof, OutputAnalysis, TableAnalysis, XorForm } from '../analysis/index.js';
import { qualifiedAddress, type Problem, type RoleRule } from '../table/index.js';

const ROLE_RULE: Readonly<Record<RoleRule, string>> = {
  'role-row': 'the role row above the headers',
  'separator-column': 'the empty column between them',
  'user-choice': 'the --inputs option',
};

export function problemLine(p: Problem): string {
  return `  ${p.severity.padEnd(7)} ${qualifiedAddress(p.sheet, p.cell)}  ${p.message}`;
}

function plural(n: number, word: string): string {
  return `${n} ${word}${n === 1 ? '' : 's'}`;
}

function proofWord(proof: FormProof): string {
  if (proof.mismatchCount === 0) return 'OK';
  return `DIFFERS at ${plural(proof.mismatchCount, 'combination')}`;
}

function complemented(form: XorForm, inputs: readonly Signal[]): string {
  const n = inputs.length;
  const names = inputs.filter((_, i) => form.polarity & (1 << (n - 1 - i))).map((s) => s.identifier);
  return names.length === 0 ? 'no input complemented' : `complemented: ${names.join(', ')}`;
}

function outputLines(o: OutputAnalysis, inputs: readonly Signal[]): string[] {
  const id = o.signal.identifier;
  const lines: string[] = [];
  lines.push('', `Output ${o.signal.header} (${id}), safe value ${o.safe}`);
  const a = o.andOr;
  const bound = `best found: ${a.terms} terms / ${a.literals} literals; lower bound ${a.lowerBound.terms} / ${a.lowerBound.literals}`;
  lines.push(`  AND/OR form, ${a.proven ? `proven minimum: ${plural(a.terms, 'term')}, ${plural(a.literals, 'literal')}` : `heuristic (not proven minimal), ${bound}`}`);
  lines.push(`    ${id} := ${a.text};`);
  lines.push(`  XOR form: ${plural(o.xor.terms, 'term')}, degree ${o.degree}`);
  lines.push(`    ${id} := ${o.xor.text};`);
  const exhaustive = o.bestXor.exhaustive ? 'best of all polarities' : 'best polarity found (search not exhaustive)';
  lines.push(`  Best-polarity XOR form: ${plural(o.bestXor.terms, 'term')}, ${exhaustive}, ${complemented(o.bestXor, inputs)}`);
  lines.push(`    ${id} := ${o.bestXor.text};`);
  lines.push(
    `  Proof over all ${a.proof.combinations} combinations: AND/OR ${proofWord(a.proof)}, XOR ${proofWord(o.xor.proof)}, best XOR ${proofWord(o.bestXor.proof)}`,
  );
  for (const [label, proof] of [['AND/OR', a.proof], ['XOR', o.xor.proof], ['best XOR', o.bestXor.proof]] as const) {
    if (proof.mismatchCount > 0)
      lines.push(`    ${label} differs from the spec at:`, ...combinationTableLines(inputs, proof.mismatches, '      ', proof.mismatchCount));
  }
  const unused = o.unusedInputs.map((i) => inputs[i]!.identifier);
  lines.push(`  Inputs that do not matter: ${unused.length === 0 ? 'none' : unused.join(', ')}`);
  if (o.gapCount === 0) lines.push('  Gaps: none');
  else
    lines.push(
      `  Gaps: ${plural(o.gapCount, 'combination')} no row covers, set to the safe value ${o.safe} ('-' = any):`,
      ...cubeTableLines(inputs, o.gaps, '    '),
    );
  if (o.conflicts.length === 0) lines.push('  Conflicts: none');
  for (const c of o.conflicts)
    lines.push(
      `  Conflict: rows ${c.rowCellsA} and ${c.rowCellsB} ask for 1 and 0 at ${plural(c.combinations, 'combination')}; the safe value ${o.safe} is used. For example:`,
      ...combinationTableLines(inputs, [c.example], '    '),
    );
  if (o.dontCareCount === 0) lines.push("  Don't-cares: none");
  else {
    const on = o.permitsAlsoCount;
    const how = o.dontCares === 'minimal' ? 'as the minimal AND/OR form uses them' : 'at the safe value';
    lines.push(`  Don't-cares: ${plural(o.dontCareCount, 'combination')}, resolved ${how}; every form turns ${on === 0 ? 'none of them' : `${on} of them`} ON${on === 0 ? '' : " ('-' = any):"}`);
    if (on > 0) lines.push(...cubeTableLines(inputs, o.permitsAlsoCubes, '    '), '    (check each is acceptable; write 0 in the table where it is not)');
  }
  return lines;
}

export function tableReport(analysis: TableAnalysis): string[] {
  const t = analysis.table;
  const inputs = analysis.inputs;
  const lines: string[] = [];
  const title = `Table ${qualifiedAddress(t.sheet, t.range)}: ${plural(inputs.length, 'input')}, ${plural(analysis.outputs.length + (analysis.wide?.outputs.length ?? 0), 'output')}, ${plural(t.rows.length, 'row')}`;
  lines.push(title, '='.repeat(Math.min(title.length, 100)));
  lines.push(`Inputs and outputs told apart by ${ROLE_RULE[t.roleRule]}.${t.xReading === 'dont-care' ? " X cells read as '-' (any / don't-care)." : ''}`);
  lines.push('Signals (header -> identifier):');
  const width = Math.min(40, maxOf([...inputs, ...analysis.outputs.map((o) => o.signal)].map((s) => s.header.length), 0));
  for (const s of inputs) lines.push(`  in   ${s.header.padEnd(width)} -> ${s.identifier}`);
  for (const o of analysis.outputs) lines.push(`  out  ${o.signal.header.padEnd(width)} -> ${o.signal.identifier}`);
  for (const o of analysis.outputs) appendAll(lines, outputLines(o, inputs));
  for (const o of analysis.wide?.outputs ?? []) appendAll(lines, wideOutputLines(o, inputs, analysis.wide!));
  if (analysis.problems.length > 0) {
    lines.push('', 'Problems:');
    for (const p of analysis.problems) lines.push(problemLine(p));
  }
  return lines;
}

/** The whole report: each table, the problems outside any table, a verdict line and the caution. */
export function analysisReport(analyses: readonly TableAnalysis[], otherProblems: readonly Problem[], verdict: string): string {
  const lines: string[] = [];
  for (const a of analyses) appendAll(lines, tableReport(a)).push('');
  if (otherProblems.length > 0) {
    lines.push('Problems outside the tables above:');
    for (const p of otherProblems) lines.push(problemLine(p));
    lines.push('');
  }
  lines.push(verdict, '');
  appendAll(lines, CAUTION_LINES);
  return lines.join('\n') + '\n';
}
