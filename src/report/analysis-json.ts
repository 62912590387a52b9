// One element of the `tables` array of `analyze --json` (DESIGN.md section 4), plus more.
// Input combinations are written as patterns over the table's inputs, in the order of
// `inputs`: "101" is first input 1, second 0, third 1; in a cube, '-' is "any".
import { cube, cubeToPattern, type Combination, type Cube, type FormBound } from '../logic/index.js';
import type {
  AnnotationColumn,
  DontCarePolicy,
  PatternTable,
  Problem,
  ProblemCode,
  RoleRule,
  Setting,
  Severity,
  ValueReading,
  XReading,
} from '../table/index.js';
import type { OutputAnalysis, TableAnalysis, XorForm } from '../analysis/index.js';
import { wideAnalysisJson, type WideTableJson } from './analysis-json-wide.js';

export interface MismatchJson {
  readonly form: 'andOr' | 'xor' | 'bestXor';
  readonly combination: string;
}

export interface OutputJson {
  readonly name: string;
  readonly identifier: string;
  /** AND/OR form (sum of products), Structured Text. */
  readonly andOr: string;
  /** XOR form (algebraic normal form), Structured Text. */
  readonly xor: string;
  /** The AND/OR form is a proven minimum (terms, then literals); false: heuristic. */
  readonly proven: boolean;
  readonly terms: number;
  readonly literals: number;
  /** What was proven of the AND/OR form: at least this many terms, then literals. */
  readonly lowerBound: FormBound;
  readonly xorTerms: number;
  /** Every form checked on every combination; mismatches of any form, first 50 each. */
  readonly check: { readonly combinations: number; readonly mismatchCount: number; readonly mismatches: MismatchJson[] };
  /** Don't-care combinations the resolved function (so every form) turns ON (first 50; count complete). */
  readonly permitsAlso: string[];
  readonly permitsAlsoCount: number;
  readonly safeValue: 0 | 1;
  /** How the don't-cares were resolved: the one function every form, step and file is of. */
  readonly dontCares: DontCarePolicy;
  readonly bestXor: { readonly expr: string; readonly terms: number; readonly complemented: string[]; readonly exhaustive: boolean };
  readonly degree: number;
  /** Input headers the output does not depend on (don't-cares at the safe value). */
  readonly unusedInputs: string[];
  /** Combinations no row covers (they take the safe value), as cubes. */
  readonly gaps: string[];
  readonly gapCount: number;
  readonly dontCareCount: number;
  readonly conflicts: {
    readonly rows: [string, string];
    /** The rows' notes (annotation columns), null where a row has none; absent when neither has. */
    readonly notes?: [string | null, string | null];
    readonly example: string;
    readonly combinations: number;
  }[];
  readonly steps: { readonly combination: string; readonly expected: 0 | 1; readonly reason: string }[];
}

export interface ProblemJson {
  readonly severity: Severity;
  readonly code: ProblemCode;
  readonly cell: string;
  readonly message: string;
  /** Every cell, when the problem stands for several of one kind. */
  readonly cells?: readonly string[];
  readonly setting?: Setting;
  /** Combinations or cubes concerned: one column per signal. */
  readonly patterns?: PatternTable;
}

export interface TableJson {
  readonly sheet: string;
  readonly range: string;
  readonly inputs: string[];
  readonly outputs: OutputJson[];
  readonly problems: ProblemJson[];
  readonly roleRule: RoleRule;
  readonly xReading: XReading;
  /** Spellings of truth values found in the data cells (1/0, TRUE/FALSE, ON/OFF, Y/N, YES/NO, -, X). */
  readonly readings: readonly ValueReading[];
  /** Columns taken as annotation (notes beside the rows), never signals. */
  readonly annotations: readonly AnnotationColumn[];
  /** A1 range of the tag row, when the identifiers come from one. */
  readonly tagRow?: string;
  /** Header -> Structured Text identifier, inputs and outputs. */
  readonly identifiers: Record<string, string>;
}

/** The three forms by their JSON names, for the mismatch list (both engines' outputs). */
export function namedForms<F>(o: { andOr: F; xor: F; bestXor: F }): [MismatchJson['form'], F][] {
  return [
    ['andOr', o.andOr],
    ['xor', o.xor],
    ['bestXor', o.bestXor],
  ];
}

/** The fields every output's JSON opens with (both engines' outputs; a wide one's `xor` may be null). */
export function formHead<X extends string | null>(
  o: { signal: { header: string; identifier: string }; andOr: { text: string; proven: boolean; terms: number; literals: number } },
  xor: X,
): Pick<OutputJson, 'name' | 'identifier' | 'andOr' | 'proven' | 'terms' | 'literals'> & { xor: X } {
  return {
    name: o.signal.header,
    identifier: o.signal.identifier,
    andOr: o.andOr.text,
    xor,
    proven: o.andOr.proven,
    terms: o.andOr.terms,
    literals: o.andOr.literals,
  };
}

export function analysisJson(analysis: TableAnalysis): TableJson | WideTableJson {
  const { table } = analysis;
  const n = analysis.inputs.length;
  const identifiers: Record<string, string> = {};
  for (const s of [...analysis.inputs, ...analysis.outputs.map((o) => o.signal), ...(analysis.wide?.outputs ?? []).map((o) => o.signal)])
    identifiers[s.header] = s.identifier;
  const tableFields = {
    sheet: table.sheet,
    range: table.range,
    inputs: analysis.inputs.map((s) => s.header),
    problems: analysis.problems.map(problemJson),
    roleRule: table.roleRule,
    xReading: table.xReading,
    readings: table.readings ?? [],
    annotations: table.annotations ?? [],
    ...(table.tagRow === undefined ? {} : { tagRow: table.tagRow }),
    identifiers,
  };
  if (analysis.wide) return wideAnalysisJson(analysis, analysis.wide, tableFields);
  return { ...tableFields, outputs: analysis.outputs.map((o) => outputJson(o, analysis)) };

  function outputJson(o: OutputAnalysis, a: TableAnalysis): OutputJson {
    const combination = (k: Combination): string => cubeToPattern(n, cube((1 << n) - 1, k));
    const pattern = (c: Cube): string => cubeToPattern(n, c);
    const forms = namedForms<{ proof: XorForm['proof'] }>(o);
    return {
      ...formHead(o, o.xor.text),
      lowerBound: o.andOr.lowerBound,
      xorTerms: o.xor.terms,
      check: {
        combinations: o.andOr.proof.combinations,
        mismatchCount: forms.reduce((k, [, f]) => k + f.proof.mismatchCount, 0),
        mismatches: forms.flatMap(([form, f]) => f.proof.mismatches.map((k) => ({ form, combination: combination(k) }))),
      },
      permitsAlso: o.permitsAlso.map(combination),
      permitsAlsoCount: o.permitsAlsoCount,
      safeValue: o.safe,
      dontCares: o.dontCares,
      bestXor: {
        expr: o.bestXor.text,
        terms: o.bestXor.terms,
        complemented: a.inputs.filter((_, i) => (o.bestXor.polarity >>> (n - 1 - i)) & 1).map((s) => s.header),
        exhaustive: o.bestXor.exhaustive,
      },
      degree: o.degree,
      unusedInputs: o.unusedInputs.map((i) => a.inputs[i]!.header),
      gaps: o.gaps.map(pattern),
      gapCount: o.gapCount,
      dontCareCount: o.dontCareCount,
      conflicts: o.conflicts.map((c) => ({
        rows: [c.rowCellsA, c.rowCellsB],
        ...(c.notes ? { notes: [c.notes[0] ?? null, c.notes[1] ?? null] as [string | null, string | null] } : {}),
        example: combination(c.example),
        combinations: c.combinations,
      })),
      steps: o.steps.map((s) => ({ combination: combination(s.combination), expected: s.expected, reason: s.reason })),
    };
  }
}

/** A problem in the JSON document: the contract's fields, and every cell of a summarised one. */
export function problemJson(p: Problem): ProblemJson {
  return {
    severity: p.severity,
    code: p.code,
    cell: p.cell,
    message: p.message,
    ...(p.cells ? { cells: p.cells } : {}),
    ...(p.setting ? { setting: p.setting } : {}),
    ...(p.patterns ? { patterns: p.patterns } : {}),
  };
}
