// One output of a wide spec (up to 64 inputs) analysed symbolically: the AND/OR form, the XOR
// form and the best-polarity XOR form, each proven against the spec on every combination.
import type { FormBound } from './sop.js';
import { FALSE, type Node } from './bdd.js';
import { FALSE as FALSE_EXPR, TRUE as TRUE_EXPR, and, not, or, variable, xor, type Expr } from './expr/ast.js';
import { printSt } from './expr/print-st.js';
import type { SafeValue } from './boolfn.js';
import type { Signal } from './signals.js';
import { XOR_PRINT_LIMIT, wideAnf, wideBestPolarity, type WideAnf } from './wide-anf.js';
import { inputBit, type WideCombination, type WideCube } from './wide-cube.js';
import { LISTED } from './proof.js';
import type { WideFunction } from './wide-fn.js';
import { exprToBdd, proveWide, type WideProof } from './wide-proof.js';
import { minimiseWide } from './wide-sop.js';

export interface WideAndOr {
  readonly cubes: WideCube[];
  readonly expr: Expr;
  readonly text: string;
  readonly proven: boolean;
  readonly terms: number;
  readonly literals: number;
  readonly lowerBound: FormBound;
  readonly proof: WideProof;
}

export interface WideXor {
  /** Exact number of terms. */
  readonly terms: bigint;
  /** The terms (Combination-position masks) when at most XOR_PRINT_LIMIT; else null. */
  readonly monomials: bigint[] | null;
  /** Bit set = that input is used complemented; 0 for the plain ANF. */
  readonly polarity: bigint;
  /** The printed expression, when the terms are few enough to print. */
  readonly expr: Expr | null;
  /** Structured Text, or "N terms: not printed (more than 64)". */
  readonly text: string;
  readonly degree: number;
  /** The best-polarity search covered every polarity. */
  readonly exhaustive: boolean;
  /** What was proven: the printed expression, or (too many terms to print) the computed terms. */
  readonly proofOf: 'expression' | 'terms';
  readonly proof: WideProof;
}

export interface WideOutputForms {
  readonly andOr: WideAndOr;
  readonly xor: WideXor;
  readonly bestXor: WideXor;
  readonly degree: number;
  /** Inputs the resolved function does not depend on, by index. */
  readonly unusedInputs: number[];
  readonly dontCareCount: bigint;
  /** How the don't-cares were resolved into the one function every form is proven equal to. */
  readonly dontCares: WidePolicy;
  /** Don't-care combinations the resolved function turns ON: the first LISTED, the count exact. */
  readonly permitsAlso: WideCombination[];
  readonly permitsAlsoCount: bigint;
}

/** As `DontCarePolicy` (table/types.ts): `minimal` as the minimal AND/OR form uses them, `safe` at the safe value. */
export type WidePolicy = 'minimal' | 'safe';

/** The spec with its don't-cares at the safe value (none left). */
function atSafeValue(fn: WideFunction, safe: SafeValue): WideFunction {
  return { dd: fn.dd, on: safe === 1 ? fn.dd.or(fn.on, fn.dc) : fn.on, dc: FALSE };
}

/** The one function of an output: `andOr` is the AND/OR form's values (minimised as the policy says). */
export function wideResolved(fn: WideFunction, safe: SafeValue, policy: WidePolicy, andOr: Node): Node {
  return policy === 'minimal' ? fn.dd.or(fn.on, fn.dd.and(andOr, fn.dc)) : atSafeValue(fn, safe).on;
}

/** A sum of products over the signals' identifiers, literals in input order. */
export function wideSopToExpr(cubes: readonly WideCube[], signals: readonly Signal[]): Expr {
  if (cubes.length === 0) return FALSE_EXPR;
  return or(...cubes.map((c) => product(c.mask, (bit) => (c.bits & bit) === 0n, signals)));
}

/** An XOR of monomials; inputs in `polarity` are printed NOT name. */
export function wideAnfToExpr(monos: readonly bigint[], signals: readonly Signal[], polarity = 0n): Expr {
  if (monos.length === 0) return FALSE_EXPR;
  return xor(...monos.map((m) => product(m, (bit) => (polarity & bit) !== 0n, signals)));
}

function product(mask: bigint, negated: (bit: bigint) => boolean, signals: readonly Signal[]): Expr {
  const n = signals.length;
  if (mask === 0n) return TRUE_EXPR;
  const literals: Expr[] = [];
  for (let i = 0; i < n; i++) {
    const bit = inputBit(n, i);
    if (!(mask & bit)) continue;
    const v = variable(i, signals[i]!.identifier);
    literals.push(negated(bit) ? not(v) : v);
  }
  return and(...literals);
}

export function analyseWideOutput(
  fn: WideFunction,
  safe: SafeValue,
  signals: readonly Signal[],
  options: { budgetMs?: number; dontCares?: WidePolicy } = {},
): WideOutputForms {
  const { dd } = fn;
  const policy = options.dontCares ?? 'minimal';
  const sop = minimiseWide(policy === 'minimal' ? fn : atSafeValue(fn, safe), options);
  const andOrExpr = wideSopToExpr(sop.cubes, signals);
  const andOrValues = exprToBdd(dd, andOrExpr);
  // Every form, the XOR forms' terms included, is of this one function.
  const resolved = wideResolved(fn, safe, policy, andOrValues);
  const andOr: WideAndOr = { ...sop, expr: andOrExpr, text: printSt(andOrExpr), proof: proveWide(fn, andOrValues, resolved) };
  const plain = wideAnf(dd, resolved);
  const best = wideBestPolarity(dd, resolved);
  const xorForm = xorOf(fn, resolved, signals, plain, 0n, true);
  const bestXor = xorOf(fn, resolved, signals, best.anf, best.polarity, best.exhaustive);
  const unusedInputs: number[] = [];
  for (let i = 0; i < dd.n; i++) if (!(plain.support & inputBit(dd.n, i))) unusedInputs.push(i);
  const permits = dd.and(resolved, fn.dc);
  return {
    andOr,
    xor: xorForm,
    bestXor,
    degree: plain.degree,
    unusedInputs,
    dontCareCount: dd.satCount(fn.dc),
    dontCares: policy,
    permitsAlso: dd.minterms(permits, LISTED),
    permitsAlsoCount: dd.satCount(permits),
  };
}

function xorOf(fn: WideFunction, resolved: Node, signals: readonly Signal[], anf: WideAnf, polarity: bigint, exhaustive: boolean): WideXor {
  const { dd } = fn;
  const expr = anf.monomials && wideAnfToExpr(anf.monomials, signals, polarity);
  const values: Node = expr ? exprToBdd(dd, expr) : dd.flip(dd.zToBdd(anf.zdd), polarity);
  return {
    terms: anf.terms,
    monomials: anf.monomials,
    polarity,
    expr,
    text: expr ? printSt(expr) : `${anf.terms} terms: not printed (more than ${XOR_PRINT_LIMIT})`,
    degree: anf.degree,
    exhaustive,
    proofOf: expr ? 'expression' : 'terms',
    proof: proveWide(fn, values, resolved),
  };
}
