// The `--json` document of a run (DESIGN.md section 4) with each table's and output's verdict.
// A table that was not analysed carries its signals, gaps, conflicts and problems, and no form.
import { count, cube, cubeToPattern } from '../logic/index.js';
import { analysisJson, problemJson, type ProblemJson } from '../report/index.js';
import { gapCubes, type Problem } from '../table/index.js';
import { outputSignals, type TableResult, type Workbook } from './examine.js';
import { verdictWords, type Verdict } from './verdict.js';

interface VerdictJson {
  readonly kind: Verdict['kind'];
  readonly text: string;
}

function verdictJson(v: Verdict): VerdictJson {
  return { kind: v.kind, text: verdictWords(v) };
}

/** A problem beside the tables carries its sheet too. */
function problemWithSheet(p: Problem): ProblemJson & { readonly sheet: string } {
  return { ...problemJson(p), sheet: p.sheet };
}

function tableJson(t: TableResult): Record<string, unknown> {
  if (t.analysis) {
    const doc = analysisJson(t.analysis);
    // By name: over 24 inputs an output too large for the symbolic engine has no entry in `doc`.
    const signals = outputSignals(t.table);
    const verdictOf = (name: string): VerdictJson => verdictJson(t.outputs[signals.findIndex((s) => s.header === name)]!);
    return { ...doc, verdict: verdictJson(t.verdict), outputs: doc.outputs.map((o) => ({ ...o, verdict: verdictOf(o.name) })) };
  }
  const { table } = t;
  const n = table.inputs.length;
  const identifiers: Record<string, string> = {};
  for (const s of [...table.inputs, ...outputSignals(table)]) identifiers[s.header] = s.identifier;
  const combination = (k: number): string => cubeToPattern(n, cube(n === 0 ? 0 : 2 ** n - 1, k));
  const gaps = table.outputs[0] ? gapCubes(n, table.outputs[0].built.gaps) : undefined;
  return {
    sheet: table.sheet,
    range: table.range,
    inputs: table.inputs.map((s) => s.header),
    verdict: verdictJson(t.verdict),
    outputs: table.outputs.map((o, j) => ({
      name: o.signal.header,
      identifier: o.signal.identifier,
      verdict: verdictJson(t.outputs[j]!),
      safeValue: o.safe,
      gaps: (gaps?.cubes ?? []).map((c) => cubeToPattern(n, c)),
      gapCount: table.outputs[0] ? count(table.outputs[0].built.gaps) : 0,
      conflicts: o.built.conflicts.map((c) => ({
        rows: [table.rows[c.rowA]!.cells, table.rows[c.rowB]!.cells],
        example: combination(c.example),
        combinations: c.combinations,
      })),
    })),
    // Over 24 inputs the outputs' functions are not built when the table has errors: names and verdicts only.
    ...(table.wide ? { outputs: table.wide.outputs.map((o, j) => ({ name: o.signal.header, identifier: o.signal.identifier, verdict: verdictJson(t.outputs[j]!), safeValue: o.safe })) } : {}),
    problems: table.problems.map(problemJson),
    roleRule: table.roleRule,
    xReading: table.xReading,
    identifiers,
  };
}

export function workbookJson(wb: Workbook): { tables: Record<string, unknown>[]; problems: ReturnType<typeof problemWithSheet>[] } {
  return { tables: wb.tables.map(tableJson), problems: wb.problems.map(problemWithSheet) };
}
