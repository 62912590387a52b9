// XOR forms over up to 64 inputs from the BDD: the algebraic normal form as a ZDD of
// monomials (exact term counts in BigInt, the degree, the support) and a best polarity.
import type { Dd, Node } from './bdd.js';
import { now } from './deadline.js';
import { inputBit } from './wide-cube.js';

/** XOR forms list their terms only up to this many; beyond, only the count is given. */
export const XOR_PRINT_LIMIT = 64;

/** Best-polarity search tries every polarity when the function depends on at most this many inputs. */
export const WIDE_EXHAUSTIVE_POLARITY_INPUTS = 10;

/** Time a polarity search may take beyond its first candidates (ms). */
export const POLARITY_BUDGET_MS = 1000;

export interface WideAnf {
  /** The ZDD of monomials (in the function's Dd). */
  readonly zdd: Node;
  readonly terms: bigint;
  /** Monomials as masks in Combination positions (bit n-1-i = input i), printed order; only when terms <= XOR_PRINT_LIMIT. */
  readonly monomials: bigint[] | null;
  readonly degree: number;
  /** Inputs in some monomial (Combination positions): those the function depends on. */
  readonly support: bigint;
}

export function wideAnf(dd: Dd, f: Node): WideAnf {
  const zdd = dd.anf(f);
  const terms = dd.zCount(zdd);
  const monomials = terms <= BigInt(XOR_PRINT_LIMIT) ? sortMonomials(dd.zMembers(zdd, XOR_PRINT_LIMIT)) : null;
  return { zdd, terms, monomials, degree: dd.zDegree(zdd), support: dd.support(zdd) };
}

/** Degree first, then the printed order of inputs (the larger mask first), as `monomialsOf`. */
function sortMonomials(ms: bigint[]): bigint[] {
  const degree = (m: bigint): number => m.toString(2).replace(/0/g, '').length;
  return ms.sort((a, b) => degree(a) - degree(b) || (a > b ? -1 : a < b ? 1 : 0));
}

export interface WidePolarity {
  /** Bit set (Combination positions): that input is used complemented. */
  readonly polarity: bigint;
  readonly anf: WideAnf;
  readonly exhaustive: boolean;
}

interface Cost {
  readonly terms: bigint;
  readonly complemented: bigint;
  readonly polarity: bigint;
}

/**
 * The fixed-polarity form with fewest terms, then fewest complemented literals, then the
 * lowest polarity. Exhaustive over the inputs the function depends on, up to
 * WIDE_EXHAUSTIVE_POLARITY_INPUTS of them (2^10 ANFs); above, a search from
 * polarity 0 and from every input complemented (an OR of many inputs is TRUE XOR the AND of
 * their complements there), flipping single inputs while the cost falls, within the budget.
 */
export function wideBestPolarity(dd: Dd, f: Node, budgetMs = POLARITY_BUDGET_MS): WidePolarity {
  const { n } = dd;
  const support = dd.support(f);
  const cost = (polarity: bigint): Cost => {
    const z = dd.anf(dd.flip(f, polarity));
    return { terms: dd.zCount(z), complemented: dd.zLiteralsIn(z, polarity), polarity };
  };
  const better = (a: Cost, b: Cost): boolean =>
    a.terms < b.terms || (a.terms === b.terms && (a.complemented < b.complemented || (a.complemented === b.complemented && a.polarity < b.polarity)));
  let used = 0;
  for (let m = support; m !== 0n; m &= m - 1n) used++;
  const exhaustive = used <= WIDE_EXHAUSTIVE_POLARITY_INPUTS;
  let best = cost(0n);
  if (exhaustive) {
    // Inputs the function does not depend on never change the terms: only subsets of the support.
    for (let p = (0n - support) & support; p !== 0n; p = (p - support) & support) {
      const c = cost(p);
      if (better(c, best)) best = c;
    }
  } else {
    const deadline = now() + budgetMs;
    const all = cost(support);
    if (better(all, best)) best = all;
    for (let improved = true; improved && now() <= deadline; ) {
      improved = false;
      for (let i = 0; i < n && now() <= deadline; i++) {
        const bit = inputBit(n, i);
        if (!(support & bit)) continue;
        const c = cost(best.polarity ^ bit);
        if (better(c, best)) {
          best = c;
          improved = true;
        }
      }
    }
  }
  return { polarity: best.polarity, anf: wideAnf(dd, dd.flip(f, best.polarity)), exhaustive };
}
