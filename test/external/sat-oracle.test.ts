// Equivalence of the printed forms and their spec, decided by a SAT solver rather than by our
// own evaluator. Source of the check: npm `logic-solver` 2.0.1 (MiniSat compiled to JavaScript).
// A form is equal to its spec on the care set exactly when (form XOR spec) AND care has no
// satisfying assignment.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import Logic from 'logic-solver';
import { anfOf } from '../../src/logic/anf.js';
import { careSet } from '../../src/logic/boolfn.js';
import { members } from '../../src/logic/bits.js';
import { cubeFromPattern, type Cube } from '../../src/logic/cube.js';
import { and, not, or, variable, xor, type Expr } from '../../src/logic/expr/ast.js';
import { anfToExpr, sopToExpr } from '../../src/logic/expr/forms.js';
import { bestPolarity } from '../../src/logic/polarity.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { letterSignals, makeSpec, specArb, xorValues, type RandomSpec } from '../logic/expr/arbitraries.js';

const name = (input: number): string => `x${input}`;
const row = (pattern: string, value: 0 | 1 | '-') => ({ cube: cubeFromPattern(pattern), value });

/** A product term (cube) as a solver formula over x0 (leftmost input) ... x(n-1). */
function cubeFormula(n: number, c: Cube): Logic.Operand {
  const literals: Logic.Operand[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (c.mask & bit) literals.push(c.bits & bit ? name(i) : Logic.not(name(i)));
  }
  return Logic.and(...literals);
}

/**
 * The spec straight from its rows, as the design states it: a definite 1 or 0 wins over a
 * don't-care; 1 against 0 (conflict) and no row at all (gap) take the safe value.
 */
function specFormulas(s: RandomSpec): { on: Logic.Operand; care: Logic.Operand } {
  const rowsOf = (v: 0 | 1 | '-') => Logic.or(...s.rows.filter((r) => r.value === v).map((r) => cubeFormula(s.n, r.cube)));
  const one = rowsOf(1);
  const zero = rowsOf(0);
  const dontCare = rowsOf('-');
  const dc = Logic.and(dontCare, Logic.not(one), Logic.not(zero));
  const on = s.safe === 0 ? Logic.and(one, Logic.not(zero)) : Logic.or(one, Logic.and(Logic.not(zero), Logic.not(dontCare)));
  return { on, care: Logic.not(dc) };
}

function exprFormula(e: Expr): Logic.Operand {
  switch (e.kind) {
    case 'const':
      return e.value ? Logic.TRUE : Logic.FALSE;
    case 'var':
      return name(e.input);
    case 'not':
      return Logic.not(exprFormula(e.arg));
    default: {
      const args = e.args.map(exprFormula);
      return e.kind === 'and' ? Logic.and(...args) : e.kind === 'or' ? Logic.or(...args) : Logic.xor(...args);
    }
  }
}

/** A combination where form and spec differ on the care set, or null when there is none. */
function counterexample(s: RandomSpec, form: Expr): number | null {
  // The library's own argument checks are off while encoding: they cost more than the solving.
  const solution = Logic.disablingAssertions(() => {
    const { on, care } = specFormulas(s);
    const solver = new Logic.Solver();
    solver.require(Logic.and(care, Logic.xor(exprFormula(form), on)));
    return solver.solve();
  });
  if (!solution) return null;
  const trueVars = new Set(solution.getTrueVars());
  let k = 0;
  for (let i = 0; i < s.n; i++) if (trueVars.has(name(i))) k |= 1 << (s.n - 1 - i);
  return k;
}

/** The minterm of combination k: true there and nowhere else. */
function minterm(n: number, k: number): Expr {
  const sigs = letterSignals(n);
  return and(...sigs.map((sig, i) => ((k >>> (n - 1 - i)) & 1 ? variable(i, sig.identifier) : not(variable(i, sig.identifier)))));
}

describe('printed forms against their spec, decided by a SAT solver (npm logic-solver, MiniSat)', () => {
  it('the AND/OR form and the XOR form equal the spec on every specified combination, up to 16 inputs', () => {
    fc.assert(
      fc.property(specArb(1, 16, 8), (s) => {
        const sigs = letterSignals(s.n);
        const andOr = sopToExpr(minimiseSop(s.fn, { budgetMs: 300 }).cubes, sigs);
        expect(counterexample(s, andOr)).toBeNull();
        expect(counterexample(s, anfToExpr(anfOf(xorValues(s), s.n), sigs))).toBeNull();
      }),
      { numRuns: 40 },
    );
  });

  it('the best-polarity XOR form equals the spec on every specified combination, up to 10 inputs', () => {
    fc.assert(
      fc.property(specArb(1, 10, 8), (s) => {
        const best = bestPolarity(xorValues(s), s.n);
        expect(counterexample(s, anfToExpr(best.monomials, letterSignals(s.n), best.polarity))).toBeNull();
      }),
      { numRuns: 40 },
    );
  });

  it('finds the one combination where a deliberately wrong form differs', () => {
    fc.assert(
      fc.property(specArb(1, 16, 8), fc.nat(), (s, pick) => {
        const care = members(careSet(s.fn), 4096);
        fc.pre(care.length > 0);
        const k = care[pick % care.length]!;
        const form = sopToExpr(minimiseSop(s.fn, { budgetMs: 300 }).cubes, letterSignals(s.n));
        expect(counterexample(s, xor(form, minterm(s.n, k)))).toBe(k);
      }),
      { numRuns: 30 },
    );
  });

  it('tells a AND b from a OR b: they differ where exactly one input is on', () => {
    const a = variable(0, 'a');
    const b = variable(1, 'b');
    const strict = makeSpec(2, [row('11', 1), row('0-', 0), row('10', 0)]);
    expect([1, 2]).toContain(counterexample(strict, or(a, b)));
    // with every other combination a don't-care, a OR b is as good as a AND b
    const loose = makeSpec(2, [row('11', 1), row('--', '-')]);
    expect(counterexample(loose, or(a, b))).toBeNull();
  });
});
