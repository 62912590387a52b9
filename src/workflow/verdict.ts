// The verdict of a table and of each of its outputs: one word per claim, never stronger than
// what was read. A table with an error is not analysed at all, so no form of it can be shown
// as proven and no proof line can be printed for it.
import type { OutputAnalysis, WideOutputAnalysis } from '../analysis/index.js';
import { qualifiedAddress, type Problem } from '../table/index.js';
import { plural } from '../report/index.js';

export type Verdict =
  /** Every form agrees with the spec on every combination; the AND/OR form is a proven minimum. */
  | { readonly kind: 'proven' }
  /** Every form agrees with the spec; the AND/OR form is the best found, not proven minimal. */
  | { readonly kind: 'heuristic' }
  /** A form disagrees with the spec (a bug in the engine): nothing of it may be used. */
  | { readonly kind: 'differs'; readonly combinations: number }
  /** The table has errors (its own or the host's reading problems): nothing was derived. */
  | { readonly kind: 'not-analysed'; readonly errors: number; readonly first: string };

export function errorsOf(problems: readonly Problem[]): Problem[] {
  return problems.filter((p) => p.severity === 'error');
}

/** The verdict of a table that has errors, or undefined when it has none (it may be analysed). */
export function notAnalysed(problems: readonly Problem[]): Verdict | undefined {
  const errors = errorsOf(problems);
  const first = errors[0];
  return first ? { kind: 'not-analysed', errors: errors.length, first: qualifiedAddress(first.sheet, first.cell) } : undefined;
}

/** Either engine's output: proven needs every proof without a mismatch and a finished minimum search. */
export function outputVerdict(o: OutputAnalysis | WideOutputAnalysis): Verdict {
  const differing = Math.max(...[o.andOr, o.xor, o.bestXor].map((f) => (f ? Number(f.proof.mismatchCount) : 0)));
  if (differing > 0) return { kind: 'differs', combinations: differing };
  return o.andOr.proven ? { kind: 'proven' } : { kind: 'heuristic' };
}

const RANK: Readonly<Record<Verdict['kind'], number>> = { proven: 0, heuristic: 1, differs: 2, 'not-analysed': 3 };

/** The weakest of the outputs' verdicts: a table is proven only when every output is. */
export function weakest(verdicts: readonly Verdict[]): Verdict {
  return verdicts.reduce<Verdict>((w, v) => (RANK[v.kind] > RANK[w.kind] ? v : w), { kind: 'proven' });
}

/** Forms that agree with the spec on every combination, from a table without errors. */
export function cleared(v: Verdict): boolean {
  return v.kind === 'proven' || v.kind === 'heuristic';
}

/** The words every host shows for a verdict. */
export function verdictWords(v: Verdict): string {
  switch (v.kind) {
    case 'proven':
      return 'proven minimum';
    case 'heuristic':
      return 'heuristic (not proven minimal)';
    case 'differs':
      return `DIFFERS from the spec at ${plural(v.combinations, 'combination')}: do not use it`;
    case 'not-analysed':
      return `not analysed: ${plural(v.errors, 'error')}, the first at ${v.first}`;
  }
}
