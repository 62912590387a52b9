// `analyze --json` for a table of more than 24 inputs: the fields of analysis-json.ts, with
// counts that may pass 2^53 written as decimal strings, and what the symbolic engine adds.
import { combinationPattern, countJson, inputBit, widePattern, XOR_PRINT_LIMIT, type WideXor } from '../logic/index.js';
import type { TableAnalysis, WideOutputAnalysis, WideTableAnalysis } from '../analysis/index.js';
import type { DontCarePolicy } from '../table/index.js';
import { formHead, namedForms, type MismatchJson, type OutputJson, type TableJson } from './analysis-json.js';

/** A count: a number while exact, else decimal digits. */
type Count = number | string;

/**
 * `xor` is Structured Text, or "N terms: not printed (more than 64)"; null (with `xorTerms`,
 * `xorProofOf`, `bestXor` and `degree`) where the table was analysed on its rows' cubes.
 */
export interface WideOutputJson extends Pick<OutputJson, 'name' | 'identifier' | 'andOr' | 'proven' | 'terms' | 'literals'> {
  readonly xor: string | null;
  readonly xorTerms: Count | null;
  /** Terms are printed up to this many. */
  readonly xorPrintLimit: number;
  /** What the XOR proofs checked: the printed expression, or the computed terms when not printed. */
  readonly xorProofOf: WideXor['proofOf'] | null;
  readonly check: { readonly combinations: Count; readonly mismatchCount: Count; readonly mismatches: MismatchJson[] };
  readonly permitsAlso: string[];
  readonly permitsAlsoCount: Count;
  readonly safeValue: 0 | 1;
  readonly dontCares: DontCarePolicy;
  readonly bestXor: { readonly expr: string; readonly terms: Count; readonly complemented: string[]; readonly exhaustive: boolean; readonly proofOf: WideXor['proofOf'] } | null;
  readonly degree: number | null;
  /** The AND/OR form's proven lower bound: every form has at least this many terms. */
  readonly termsAtLeast: number;
  readonly unusedInputs: string[];
  readonly gaps: string[];
  /** Exact, or bounds where the count on the rows' cubes stopped at its time limit. */
  readonly gapCount: Count | { readonly atLeast: Count; readonly atMost: Count };
  readonly dontCareCount: Count;
  readonly conflicts: { readonly rows: [string, string]; readonly notes?: [string | null, string | null]; readonly example: string; readonly combinations: Count }[];
  /** The unique-cause test steps, combinations as patterns. */
  readonly steps: { readonly combination: string; readonly expected: 0 | 1; readonly reason: string }[];
}

export interface WideTableJson extends Omit<TableJson, 'outputs'> {
  /** `symbolic`: decision diagrams; `row-cubes`: the rows had none of workable size. */
  readonly engine: 'symbolic' | 'row-cubes';
  readonly outputs: WideOutputJson[];
}

export function wideAnalysisJson(analysis: TableAnalysis, wide: WideTableAnalysis, table: Omit<TableJson, 'outputs'>): WideTableJson {
  const { n } = wide;
  const headers = analysis.inputs.map((s) => s.header);
  const output = (o: WideOutputAnalysis): WideOutputJson => {
    const forms = namedForms<{ proof: WideXor['proof'] } | null>(o).flatMap(([form, f]) => (f ? [[form, f] as const] : []));
    const { xor, bestXor } = o;
    return {
      ...formHead(o, xor?.text ?? null),
      xorTerms: xor && countJson(xor.terms),
      xorPrintLimit: XOR_PRINT_LIMIT,
      xorProofOf: xor?.proofOf ?? null,
      check: {
        combinations: countJson(o.andOr.proof.combinations),
        mismatchCount: countJson(forms.reduce((k, [, f]) => k + f.proof.mismatchCount, 0n)),
        mismatches: forms.flatMap(([form, f]) => f.proof.mismatches.map((k) => ({ form, combination: combinationPattern(n, k) }))),
      },
      permitsAlso: o.permitsAlso.map((k) => combinationPattern(n, k)),
      permitsAlsoCount: countJson(o.permitsAlsoCount),
      safeValue: o.safe,
      dontCares: o.dontCares,
      bestXor: bestXor && {
        expr: bestXor.text,
        terms: countJson(bestXor.terms),
        complemented: headers.filter((_, i) => bestXor.polarity & inputBit(n, i)),
        exhaustive: bestXor.exhaustive,
        proofOf: bestXor.proofOf,
      },
      degree: o.degree,
      termsAtLeast: o.andOr.lowerBound.terms,
      unusedInputs: o.unusedInputs.map((i) => headers[i]!),
      gaps: wide.gaps.map((c) => widePattern(n, c)),
      gapCount: wide.gapCount.atLeast === wide.gapCount.atMost ? countJson(wide.gapCount.atLeast) : { atLeast: countJson(wide.gapCount.atLeast), atMost: countJson(wide.gapCount.atMost) },
      dontCareCount: countJson(o.dontCareCount),
      conflicts: o.conflicts.map((c) => ({
        rows: [c.rowCellsA, c.rowCellsB],
        ...(c.notes ? { notes: [c.notes[0] ?? null, c.notes[1] ?? null] } : {}),
        example: combinationPattern(n, c.example),
        combinations: countJson(c.combinations),
      })),
      steps: o.steps.map((s) => ({ combination: combinationPattern(n, s.combination), expected: s.expected, reason: s.reason })),
    };
  };
  return { ...table, engine: wide.engine === 'rows' ? 'row-cubes' : 'symbolic', outputs: wide.outputs.map(output) };
}
