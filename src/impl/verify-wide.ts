// The implementation check of an output of a spec table of more than 24 inputs (up to 64):
// the program's expression and the spec as BDDs over the spec's inputs, compared on every one
// of the 2^n combinations by symbolic equality (never by sampling), counts exact in BigInt.
// Gaps and conflicts take the safe value as in verify.ts; don't-cares are never differences.
// Disagreements are split into unsafe ones and spurious trips, listed unsafe first.
import {
  combinationPattern,
  DdTooLarge,
  exprToBdd,
  kindOf,
  LISTED,
  sideSentence,
  wideSideForm,
  type Dd,
  type Expr,
  type WideBuilt,
} from '../logic/index.js';
import { wideBuilt, type SpecTable } from '../table/index.js';
import { printMonomial, specRowOf, type CounterexampleRow, type Judged, type VerifyOptions } from './verify.js';

/** A wide table's functions, built once for all of its outputs; or why they could not be. */
export type SymbolicSpec = { readonly dd: Dd; readonly built: readonly WideBuilt[] } | { readonly tooLarge: string };

export function symbolicSpec(table: SpecTable): SymbolicSpec {
  try {
    return wideBuilt(table.inputs.length, table.wide!, table.rows);
  } catch (e) {
    if (!(e instanceof DdTooLarge)) throw e;
    return { tooLarge: tooLargeWords(table.inputs.length, e) };
  }
}

/** Output `o` of a wide table against the program's expression over the spec's inputs. */
export function compareSymbolically(expr: Expr, table: SpecTable, o: number, options: VerifyOptions, spec: SymbolicSpec): Judged | { tooLarge: string } {
  if ('tooLarge' in spec) return spec;
  try {
    return judge(expr, table, o, options, spec.dd, spec.built[o]!);
  } catch (e) {
    if (!(e instanceof DdTooLarge)) throw e;
    return { tooLarge: tooLargeWords(table.inputs.length, e) };
  }
}

function tooLargeWords(n: number, e: DdTooLarge): string {
  return `too large to compare symbolically over ${n} inputs (${e.message}, inputs in the spec's column order)`;
}

function judge(expr: Expr, table: SpecTable, o: number, options: VerifyOptions, dd: Dd, b: WideBuilt): Judged {
  const n = table.inputs.length;
  const safe = table.wide!.outputs[o]!.safe;
  const { fn, gaps, conflicted } = b;
  // --gaps-free frees the gaps; otherwise they, like conflicts, are at the safe value already.
  const on = options.gapsFree ? dd.minus(fn.on, gaps) : fn.on;
  const free = options.gapsFree ? dd.or(fn.dc, gaps) : fn.dc;
  const values = exprToBdd(dd, expr);
  const wrong = dd.minus(dd.xor(values, on), free);
  // Where the program gives the non-safe value, a disagreement is unsafe (as difference.ts).
  const notSafe = safe === 0 ? values : dd.not(values);
  const unsafe = dd.and(wrong, notSafe);
  const spuriousTrip = dd.minus(wrong, notSafe);
  const counterexamples = [...dd.minterms(unsafe, LISTED), ...dd.minterms(spuriousTrip, LISTED)].map((k): CounterexampleRow => {
    const expected = dd.evaluate(on, k) ? 1 : 0;
    const source = dd.evaluate(gaps, k) ? 'gap' : dd.evaluate(conflicted, k) ? 'conflict' : 'row';
    const specRow = source === 'row' ? specRowOf(table, o, k, expected) : undefined;
    const inputs = [...combinationPattern(n, k)].map((c): 0 | 1 => (c === '1' ? 1 : 0));
    const actual = dd.evaluate(values, k) ? 1 : 0;
    return { combination: k, inputs, expected, actual, kind: kindOf(expected, safe), source, ...(specRow ? { specRow } : {}) };
  });
  const unsafeWhen = sideSentence('unsafe', n, wideSideForm(dd, unsafe, free), table.inputs);
  const spuriousTripWhen = sideSentence('spurious-trip', n, wideSideForm(dd, spuriousTrip, free), table.inputs);
  // The difference's algebraic normal form: spec completed with the program's values on the
  // don't-cares, XOR the program, which is `wrong` itself.
  const difference = dd.anf(wrong);
  const dc = dd.minus(fn.dc, dd.or(gaps, conflicted));
  const unsafeGaps = safe === 1 ? dd.minus(gaps, values) : dd.and(gaps, values);
  return {
    status: wrong === 0 ? 'equal' : 'differs',
    mismatchCount: dd.satCount(wrong),
    unsafeCount: dd.satCount(unsafe),
    spuriousTripCount: dd.satCount(spuriousTrip),
    counterexamples,
    ...(unsafeWhen ? { unsafeWhen } : {}),
    ...(spuriousTripWhen ? { spuriousTripWhen } : {}),
    differenceMonomials: dd.zMembers(difference, LISTED).map((m) => printMonomial(m, table.inputs)),
    differenceMonomialCount: dd.zCount(difference),
    dontCare: { count: dd.satCount(dc), implementationOn: dd.satCount(dd.and(dc, values)) },
    gaps: {
      count: dd.satCount(gaps),
      implementationOn: dd.satCount(dd.and(gaps, values)),
      safe,
      unsafe: dd.satCount(unsafeGaps),
      unsafeExamples: dd.minterms(unsafeGaps, LISTED),
      judged: !options.gapsFree,
    },
    conflicted: dd.satCount(conflicted),
    reasons: [],
  };
}
