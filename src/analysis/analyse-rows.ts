// A wide table whose rows have no decision diagram of workable size, analysed on its rows'
// cubes (src/logic row-cover.ts, row-steps.ts): per output the AND/OR form of the union of its
// ON rows, with a proven lower bound and a proof on every combination, and its test steps. No
// XOR form (it needs the diagram). An output with don't-care rows, safe value 1 or conflicting
// rows gets an error instead of a form: its function is then not the plain union of rows.
import {
  deadlineAt,
  DEFAULT_BUDGET_MS,
  inputBit,
  now,
  proveRowCover,
  rowCover,
  rowUniqueCauseSteps,
  StepsTimedOut,
  widePattern,
  wideContains,
  wideDisjoint,
  wideSopToExpr,
  printSt,
  type WideCube,
} from '../logic/index.js';
import type { AnalyseOptions } from './analyse.js';
import type { TableAnalysis } from './analysis-types.js';
import type { Problem, SpecTable, WideSpec } from '../table/index.js';
import type { WideOutputAnalysis, WideStepFacts } from './wide-types.js';

export function analyseRows(table: SpecTable, wide: WideSpec & { noDiagram: NonNullable<WideSpec['noDiagram']> }, options: AnalyseOptions = {}): TableAnalysis {
  const n = table.inputs.length;
  const budget = options.budgetMs ?? DEFAULT_BUDGET_MS;
  const problems: Problem[] = [...table.problems];
  const total = wide.outputs.length;
  const onRows: WideCube[][] = [];
  const outputs = wide.outputs.flatMap((o, j): WideOutputAnalysis[] => {
    const cell = table.headerCells[n + j]!;
    const fail = (why: string): [] => {
      problems.push({ severity: 'error', code: 'too-large', sheet: table.sheet, cell, message: `${o.signal.header}: no form derived: ${why}` });
      options.onProgress?.(j + 1, total, `${o.signal.header}: no form`);
      return [];
    };
    const values = table.rows.map((r) => r.values[j]);
    if (o.safe === 1) return fail("on the rows' cubes only outputs whose safe value is 0 are analysed (the function is then the union of the ON rows)");
    if (values.includes('-')) return fail("on the rows' cubes don't-care rows are not analysed; write 0 or 1 in them, or split the table");
    const on = wide.cubes.filter((_, i) => values[i] === 1);
    const off = wide.cubes.filter((_, i) => values[i] === 0);
    if (on.some((a) => off.some((b) => !wideDisjoint(a, b)))) return fail('its rows conflict (see the conflict errors)');
    const cover = rowCover(n, on, deadlineAt(now() + budget));
    const proof = proveRowCover(n, cover.cubes, on, deadlineAt(now() + budget));
    if (proof === 'unknown') return fail(`the proof of its AND/OR form did not finish in ${budget / 1000} s`);
    if (!proof.equal) return fail(`its AND/OR form failed its proof at ${widePattern(n, { mask: (1n << BigInt(n)) - 1n, bits: proof.at })}: do not use it`);
    let steps: WideOutputAnalysis['steps'] = [];
    try {
      steps = rowUniqueCauseSteps(n, cover.cubes, on, table.inputs, deadlineAt(now() + budget));
    } catch (e) {
      if (!(e instanceof StepsTimedOut)) throw e;
      problems.push({ severity: 'warning', code: 'no-test-steps', sheet: table.sheet, cell, message: `${o.signal.header}: its test steps were not found in ${budget / 1000} s; none are given` });
    }
    const expr = wideSopToExpr(cover.cubes, table.inputs);
    const used = cover.cubes.reduce((m, c) => m | c.mask, 0n);
    const unusedInputs = table.inputs.flatMap((_, i) => (used & inputBit(n, i) ? [] : [i]));
    const noPermits = { combinations: 1n << BigInt(n), mismatchCount: 0n, mismatches: [], permitsAlso: [], permitsAlsoCount: 0n };
    if (!cover.proven)
      problems.push({ severity: 'info', code: 'not-proven', sheet: table.sheet, cell, message: `the AND/OR form of ${o.signal.header} is the best found on the rows' cubes, not proven minimal (at least ${cover.lowerBound.terms} terms)` });
    if (unusedInputs.length > 0)
      problems.push({ severity: 'info', code: 'unused-inputs', sheet: table.sheet, cell, message: `${o.signal.header} does not depend on ${unusedInputs.map((i) => table.inputs[i]!.header).join(', ')}` });
    onRows.push(on);
    options.onProgress?.(j + 1, total, `${o.signal.header}: forms`);
    return [
      {
        signal: o.signal,
        safe: o.safe,
        andOr: { ...cover, expr, text: printSt(expr), proof: noPermits },
        xor: null,
        bestXor: null,
        degree: null,
        unusedInputs,
        dontCareCount: 0n,
        dontCares: table.dontCares ?? 'minimal',
        permitsAlso: [],
        permitsAlsoCount: 0n,
        conflicts: [],
        steps,
      },
    ];
  });
  const { gaps } = wide.noDiagram;
  const inAny = (cubes: readonly WideCube[], k: bigint): boolean => cubes.some((c) => wideContains(c, k));
  const seen = new Set<bigint>();
  const stepFacts: WideStepFacts[] = [];
  for (const o of outputs)
    for (const s of o.steps) {
      if (seen.has(s.combination)) continue;
      seen.add(s.combination);
      stepFacts.push({
        combination: s.combination,
        expected: onRows.map((on) => (inAny(on, s.combination) ? 1 : 0)),
        gap: !inAny(wide.cubes, s.combination),
        conflicted: outputs.map(() => false),
        dontCare: outputs.map(() => false),
      });
    }
  return { table, inputs: table.inputs, outputs: [], problems, wide: { n, engine: 'rows', outputs, gaps: gaps.cubes, gapCount: gaps, stepFacts } };
}
