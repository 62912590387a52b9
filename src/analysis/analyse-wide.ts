// A spec table of more than 24 inputs (up to 64) analysed by the symbolic engine: per output
// its forms, each proven on every combination from BDDs, and the same problems as analyse.ts.
import {
  analyseWideOutput,
  combinationPattern,
  DdTooLarge,
  exprToBdd,
  toWide,
  wideResolved,
  wideUniqueCauseSteps,
  type Dd,
  type Node,
  type WideBuilt,
  type WideOutputForms,
} from '../logic/index.js';
import { POLICY_WORDS, type AnalyseOptions } from './analyse.js';
import type { TableAnalysis } from './analysis-types.js';
import { analyseRows } from './analyse-rows.js';
import {
  GAP_CUBES_LISTED,
  settingName,
  tooLarge,
  wideBuilt,
  type DontCarePolicy,
  type Problem,
  type ProblemCode,
  type SpecTable,
  type WideSpec,
} from '../table/index.js';
import type { WideOutputAnalysis, WideStepFacts } from './wide-types.js';

export function analyseWide(table: SpecTable, wide: WideSpec, options: AnalyseOptions = {}): TableAnalysis {
  const n = table.inputs.length;
  const total = wide.outputs.length + 1;
  let done = 0;
  const progress = (what: string): void => options.onProgress?.(++done, total, what);
  const problems: Problem[] = [...table.problems];
  const nothing: TableAnalysis = { table, inputs: table.inputs, outputs: [], problems, wide: { n, engine: 'diagrams', outputs: [], gaps: [], gapCount: { atLeast: 0n, atMost: 0n }, stepFacts: [] } };
  // Reading found no diagram of workable size (and said so at the table).
  if (wide.noDiagram !== undefined) return analyseRows(table, { ...wide, noDiagram: wide.noDiagram }, options);
  let made: ReturnType<typeof wideBuilt>;
  try {
    made = wideBuilt(n, wide, table.rows);
  } catch (e) {
    if (!(e instanceof DdTooLarge)) throw e;
    problems.push({ severity: 'error', code: 'too-large', sheet: table.sheet, cell: table.range, message: tooLarge(n, e) });
    return nothing;
  }
  const { dd, built } = made;
  const gapSet = built[0]?.gaps ?? 0;
  const gaps = dd.pathCubes(gapSet, GAP_CUBES_LISTED).cubes;
  const gapCount = dd.satCount(gapSet);
  progress('gaps');
  const resolvedOf: Node[] = [];
  const builtOf: WideBuilt[] = [];
  const outputs = wide.outputs.flatMap((o, j): WideOutputAnalysis[] => {
    const b = built[j]!;
    const cell = table.headerCells[n + j]!;
    let forms: WideOutputForms;
    try {
      forms = analyseWideOutput(b.fn, o.safe, table.inputs, wideOptions(table, options));
    } catch (e) {
      if (!(e instanceof DdTooLarge)) throw e;
      problems.push({ severity: 'error', code: 'too-large', sheet: table.sheet, cell, message: `${o.signal.header}: no form derived. ${tooLarge(n, e)}` });
      progress(`${o.signal.header}: too large`);
      return [];
    }
    // The one function every form equals, as the steps expect it.
    const resolved = wideResolved(b.fn, o.safe, forms.dontCares, exprToBdd(dd, forms.andOr.expr));
    resolvedOf.push(resolved);
    builtOf.push(b);
    const analysed: WideOutputAnalysis = {
      ...forms,
      signal: o.signal,
      safe: o.safe,
      conflicts: conflictReports(table, b.conflicts),
      steps: wideUniqueCauseSteps(dd, forms.andOr.cubes, resolved, table.inputs),
    };
    problems.push(...wideProblems(table, analysed, cell));
    progress(`${o.signal.header}: forms`);
    return [analysed];
  });
  const stepFacts = factsOf(dd, outputs, resolvedOf, builtOf, gapSet);
  return { table, inputs: table.inputs, outputs: [], problems, wide: { n, engine: 'diagrams', outputs, gaps, gapCount: { atLeast: gapCount, atMost: gapCount }, stepFacts } };
}

/** Per combination of any output's steps: every output's expected value, gap, conflict and don't-care. */
function factsOf(dd: Dd, outputs: readonly WideOutputAnalysis[], resolved: readonly Node[], built: readonly WideBuilt[], gapSet: Node): WideStepFacts[] {
  const seen = new Set<bigint>();
  const out: WideStepFacts[] = [];
  for (const o of outputs)
    for (const s of o.steps) {
      const k = s.combination;
      if (seen.has(k)) continue;
      seen.add(k);
      out.push({
        combination: k,
        expected: resolved.map((f) => (dd.evaluate(f, k) ? 1 : 0)),
        gap: dd.evaluate(gapSet, k),
        conflicted: built.map((b) => dd.evaluate(b.conflicted, k)),
        dontCare: built.map((b) => dd.evaluate(b.fn.dc, k)),
      });
    }
  return out;
}

/** The symbolic engine's options from the table's don't-care policy and the analysis options. */
export function wideOptions(table: SpecTable, options: AnalyseOptions): { budgetMs?: number; dontCares: DontCarePolicy } {
  return { dontCares: table.dontCares ?? 'minimal', ...(options.budgetMs === undefined ? {} : { budgetMs: options.budgetMs }) };
}

/** How many don't-care combinations a permits-also warning spells out (its pattern table has up to LISTED). */
const PERMITS_SHOWN = 8;

/** As analyse.ts: a form that differs (error), not proven minimal, unused inputs (info), don't-cares turned ON (warning). */
function wideProblems(table: SpecTable, o: WideOutputAnalysis, cell: string): Problem[] {
  const at = (severity: Problem['severity'], code: ProblemCode, message: string): Problem => ({ severity, code, sheet: table.sheet, cell, message });
  const out: Problem[] = [];
  const forms: [string, { proof: { mismatchCount: bigint } } | null][] = [
    ['AND/OR form', o.andOr],
    ['XOR form', o.xor],
    ['best-polarity XOR form', o.bestXor],
  ];
  for (const [name, form] of forms)
    if (form && form.proof.mismatchCount > 0n)
      out.push(at('error', 'form-differs', `the ${name} of ${o.signal.header} differs from the table at ${form.proof.mismatchCount} combinations: do not use it`));
  if (!o.andOr.proven)
    out.push(at('info', 'not-proven', `the AND/OR form of ${o.signal.header} is the best found in the time given, not proven minimal`));
  if (o.unusedInputs.length > 0) {
    const names = o.unusedInputs.map((i) => table.inputs[i]!.header).join(', ');
    const where = o.dontCareCount > 0n ? ` (don't-cares resolved ${POLICY_WORDS[o.dontCares]})` : '';
    out.push(at('info', 'unused-inputs', `${o.signal.header} does not depend on ${names}${where}`));
  }
  if (o.permitsAlsoCount > 0n) {
    const n = table.inputs.length;
    const shown = o.permitsAlso.slice(0, PERMITS_SHOWN).map((k) => combinationPattern(n, k));
    const more = o.permitsAlsoCount > BigInt(shown.length) ? ` and ${o.permitsAlsoCount - BigInt(shown.length)} more` : '';
    const plural = o.permitsAlsoCount === 1n ? 'combination' : 'combinations';
    const message =
      `${o.signal.header} permits also ${o.permitsAlsoCount} don't-care ${plural} (resolved ${POLICY_WORDS[o.dontCares]}): ` +
      `ON at ${shown.join(', ')}${more} (patterns over ${table.inputs.map((s) => s.header).join(', ')}). ` +
      'Check each is acceptable; write 0 in the table where it is not' +
      (o.dontCares === 'minimal' ? `, or resolve every don't-care at the safe value: ${settingName('dont-cares', table.wording)}` : '');
    const patterns = { headers: table.inputs.map((s) => s.header), rows: o.permitsAlso.map((k) => [...combinationPattern(n, k)]) };
    out.push({ ...at('warning', 'permits-also', message), patterns });
  }
  return out;
}

/** The wide part of a table of at most 24 inputs, to run it through the symbolic engine too. */
export function wideSpecOf(table: SpecTable): WideSpec {
  return { cubes: table.rows.map((r) => toWide(r.cube)), outputs: table.outputs.map((o) => ({ signal: o.signal, safe: o.safe })) };
}

/** The rows of each conflict named by their cells, with their notes when they have any (both engines' conflicts). */
export function conflictReports<E, K>(
  table: SpecTable,
  conflicts: readonly { rowA: number; rowB: number; example: E; combinations: K }[],
): { rowCellsA: string; rowCellsB: string; notes?: readonly [string | undefined, string | undefined]; example: E; combinations: K }[] {
  return conflicts.map((c) => {
    const [a, b] = [table.rows[c.rowA]!, table.rows[c.rowB]!];
    return {
      rowCellsA: a.cells,
      rowCellsB: b.cells,
      ...(a.note !== undefined || b.note !== undefined ? { notes: [a.note, b.note] as const } : {}),
      example: c.example,
      combinations: c.combinations,
    };
  });
}
