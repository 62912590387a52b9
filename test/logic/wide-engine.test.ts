// The symbolic engine against the bit-set engine on the same tables (6-20 inputs), and known
// answers at 40 inputs.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { count, emptySet, equals, union, type BitSet } from '../../src/logic/bits.js';
import { buildFunction, type OutputValue, type SafeValue } from '../../src/logic/boolfn.js';
import { cube, cubeToSet } from '../../src/logic/cube.js';
import { anfDegree, anfOf, anfSupport } from '../../src/logic/anf.js';
import { Dd, TRUE, type Node } from '../../src/logic/bdd.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { bestPolarity } from '../../src/logic/polarity.js';
import { prove } from '../../src/logic/proof.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { analyseWideOutput } from '../../src/logic/wide-analysis.js';
import { WIDE_EXHAUSTIVE_POLARITY_INPUTS, wideAnf } from '../../src/logic/wide-anf.js';
import { inputBit, toNarrow, toWide, wideCube } from '../../src/logic/wide-cube.js';
import { buildWide, type WideRow } from '../../src/logic/wide-fn.js';
import { proveWide } from '../../src/logic/wide-proof.js';

const signals = (n: number) => Array.from({ length: n }, (_, i) => ({ header: `In ${i + 1}`, identifier: `In_${i + 1}` }));

/** The combinations of a BDD as a bit set (n <= 24), from its disjoint path cubes. */
function bitSetOf(dd: Dd, f: Node): BitSet {
  const set = emptySet(dd.n);
  for (const c of dd.pathCubes(f).cubes) cubeToSet(dd.n, toNarrow(c), set);
  return set;
}

interface Table {
  n: number;
  safe: SafeValue;
  rows: { mask: number; bits: number; value: OutputValue }[];
}

/** A table of n inputs: rows of mostly '-' cells, outputs 1, 0 or '-'. */
const table = (minInputs: number, maxInputs: number, maxRows: number) =>
  fc.integer({ min: minInputs, max: maxInputs }).chain((n) =>
    fc.record({
      n: fc.constant(n),
      safe: fc.constantFrom<SafeValue>(0, 1),
      rows: fc.array(
        fc.record({
          mask: fc.integer({ min: 0, max: 2 ** n - 1 }),
          bits: fc.integer({ min: 0, max: 2 ** n - 1 }),
          value: fc.constantFrom<OutputValue>(1, 1, 0, 0, '-'),
        }),
        { minLength: 1, maxLength: maxRows },
      ),
    }),
  );

function bothEngines(t: Table) {
  const rows = t.rows.map((r) => ({ cube: cube(r.mask, r.bits), value: r.value }));
  const narrow = buildFunction(t.n, rows, t.safe);
  if (!narrow.ok) throw new Error(narrow.error.message);
  const dd = new Dd(t.n);
  const wideRows: WideRow[] = rows.map((r) => ({ cube: toWide(r.cube), value: r.value }));
  const wide = buildWide(dd, wideRows, wideRows.map((r) => dd.cube(r.cube)), t.safe);
  return { narrow: narrow.value, wide, dd };
}

describe('the symbolic engine beside the bit-set engine (properties)', () => {
  it("builds the same on-set, don't-cares, gaps and conflicts from the rows", () => {
    fc.assert(
      fc.property(table(6, 16, 12), (t) => {
        const { narrow, wide, dd } = bothEngines(t);
        expect(equals(bitSetOf(dd, wide.fn.on), narrow.fn.on)).toBe(true);
        expect(equals(bitSetOf(dd, wide.fn.dc), narrow.fn.dc)).toBe(true);
        expect(dd.satCount(wide.gaps)).toBe(BigInt(count(narrow.gaps)));
        expect(dd.satCount(wide.fn.dc)).toBe(BigInt(count(narrow.fn.dc)));
        expect(wide.conflicts.map((c) => [c.rowA, c.rowB, Number(c.example), Number(c.combinations)])).toEqual(
          narrow.conflicts.map((c) => [c.rowA, c.rowB, c.example, c.combinations]),
        );
      }),
      { numRuns: 60 },
    );
  });

  it('counts the same ANF terms, degree and support', () => {
    fc.assert(
      fc.property(table(6, 18, 10), (t) => {
        const { narrow, wide, dd } = bothEngines(t);
        const values = t.safe === 1 ? union(narrow.fn.on, narrow.fn.dc) : narrow.fn.on;
        const monos = anfOf(values, t.n);
        const anf = wideAnf(dd, t.safe === 1 ? dd.or(wide.fn.on, wide.fn.dc) : wide.fn.on);
        expect(anf.terms).toBe(BigInt(monos.length));
        expect(anf.degree).toBe(anfDegree(monos));
        const support = anfSupport(monos, t.n);
        for (let i = 0; i < t.n; i++) expect((anf.support & inputBit(t.n, i)) !== 0n).toBe(support[i]);
        if (anf.monomials) expect(anf.monomials.map(Number)).toEqual(monos);
      }),
      { numRuns: 40 },
    );
  });

  it('derives forms that prove against the spec, as the bit-set engine checks them; AND/OR costs equal when both are proven', () => {
    fc.assert(
      fc.property(table(6, 12, 10), (t) => {
        const { narrow, wide } = bothEngines(t);
        const forms = analyseWideOutput(wide.fn, t.safe, signals(t.n));
        for (const form of [forms.andOr, forms.xor, forms.bestXor]) expect(form.proof.mismatchCount).toBe(0n);
        // The bit-set engine's own proof of the symbolic engine's printed forms.
        expect(prove(narrow.fn, truthTable(forms.andOr.expr, t.n)).mismatchCount).toBe(0);
        if (forms.bestXor.expr) expect(prove(narrow.fn, truthTable(forms.bestXor.expr, t.n)).mismatchCount).toBe(0);
        expect(forms.dontCareCount).toBe(BigInt(count(narrow.fn.dc)));
        const sop = minimiseSop(narrow.fn);
        if (sop.proven && forms.andOr.proven) expect([forms.andOr.terms, forms.andOr.literals]).toEqual([sop.terms, sop.literals]);
      }),
      { numRuns: 30 },
    );
  });

  it('finds the best polarity the bit-set search finds where both try every polarity, and never fewer terms than it otherwise', () => {
    fc.assert(
      fc.property(table(6, 13, 8), (t) => {
        const { narrow, wide } = bothEngines(t);
        const values = t.safe === 1 ? union(narrow.fn.on, narrow.fn.dc) : narrow.fn.on;
        const theirs = bestPolarity(values, t.n);
        const ours = analyseWideOutput(wide.fn, t.safe, signals(t.n), { dontCares: 'safe' }).bestXor;
        const used = anfSupport(anfOf(values, t.n), t.n).filter(Boolean).length;
        expect(ours.exhaustive).toBe(used <= WIDE_EXHAUSTIVE_POLARITY_INPUTS);
        if (ours.exhaustive) {
          expect(ours.terms).toBe(BigInt(theirs.monomials.length));
          expect(Number(ours.polarity)).toBe(theirs.polarity);
        } else expect(ours.terms >= BigInt(theirs.monomials.length)).toBe(true);
      }),
      { numRuns: 25 },
    );
  });

  it('reports a wrong form symbolically with the same mismatches as the bit-set proof', () => {
    fc.assert(
      fc.property(table(6, 20, 6), fc.integer({ min: 0, max: 19 }), (t, input) => {
        const { narrow, wide, dd } = bothEngines(t);
        const wrong = dd.xor(wide.fn.on, dd.variable(input % t.n));
        const ours = proveWide(wide.fn, wrong);
        const theirs = prove(narrow.fn, bitSetOf(dd, wrong));
        expect(ours.mismatchCount).toBe(BigInt(theirs.mismatchCount));
        expect(ours.mismatches.map(Number)).toEqual(theirs.mismatches);
        expect(ours.permitsAlso.map(Number)).toEqual(theirs.permitsAlso);
        expect(ours.permitsAlsoCount).toBe(BigInt(theirs.permitsAlsoCount));
      }),
      { numRuns: 25 },
    );
  });
});

/** Rows of an OR trip of n causes (one row per cause, all at 0 is OFF). */
function orTrip(n: number): WideRow[] {
  const rows: WideRow[] = [];
  for (let i = 0; i < n; i++) rows.push({ cube: wideCube(inputBit(n, i), inputBit(n, i)), value: 1 });
  rows.push({ cube: wideCube((1n << BigInt(n)) - 1n, 0n), value: 0 });
  return rows;
}

function analyseRows(n: number, rows: WideRow[]) {
  const dd = new Dd(n);
  const built = buildWide(dd, rows, rows.map((r) => dd.cube(r.cube)));
  return { dd, built, forms: analyseWideOutput(built.fn, 0, signals(n)) };
}

// OR of n = XOR of its 2^n - 1 non-empty monomials, and with every input complemented
// TRUE XOR (NOT a AND NOT b ...): De Morgan and the ANF of AND (from memory).
describe('a 40-cause OR trip', () => {
  const { built, forms } = analyseRows(40, orTrip(40));

  it('has no gaps and no conflicts', () => {
    expect(built.fn.dd.satCount(built.gaps)).toBe(0n);
    expect(built.conflicts).toEqual([]);
  });

  it('has the AND/OR form of 40 single-literal terms, proven minimal and proven against every combination', () => {
    expect([forms.andOr.terms, forms.andOr.literals, forms.andOr.proven]).toEqual([40, 40, true]);
    expect(forms.andOr.text).toBe(signals(40).map((s) => s.identifier).join(' OR '));
    expect(forms.andOr.proof.combinations).toBe(1n << 40n);
    expect(forms.andOr.proof.mismatchCount).toBe(0n);
  });

  it('has an XOR form of 2^40 - 1 terms of degree 40, counted, not printed, and its terms proven', () => {
    expect(forms.xor.terms).toBe((1n << 40n) - 1n);
    expect(forms.xor.degree).toBe(40);
    expect(forms.xor.text).toBe('1099511627775 terms: not printed (more than 64)');
    expect(forms.xor.proofOf).toBe('terms');
    expect(forms.xor.proof.mismatchCount).toBe(0n);
  });

  it('has the best-polarity XOR form TRUE XOR (NOT a AND NOT b ...) of 2 terms, found by the search', () => {
    expect(forms.bestXor.terms).toBe(2n);
    expect(forms.bestXor.exhaustive).toBe(false);
    expect(forms.bestXor.polarity).toBe((1n << 40n) - 1n);
    expect(forms.bestXor.text).toBe(`TRUE XOR (${signals(40).map((s) => `NOT ${s.identifier}`).join(' AND ')})`);
    expect(forms.bestXor.proof.mismatchCount).toBe(0n);
  });
});

describe('a 40-condition AND permissive', () => {
  const rows: WideRow[] = [{ cube: wideCube((1n << 40n) - 1n, (1n << 40n) - 1n), value: 1 }];
  for (let i = 0; i < 40; i++) rows.push({ cube: wideCube(inputBit(40, i), 0n), value: 0 });
  const { forms } = analyseRows(40, rows);

  it('is one term of 40 literals both ways, proven', () => {
    expect([forms.andOr.terms, forms.andOr.literals, forms.andOr.proven]).toEqual([1, 40, true]);
    expect(forms.xor.terms).toBe(1n);
    expect(forms.xor.degree).toBe(40);
    expect(forms.bestXor.terms).toBe(1n);
    expect(forms.bestXor.polarity).toBe(0n);
  });
});

// Majority of 5 (at least 3 of 5): the monomials of 3 and of 4 inputs, 10 + 5 = 15 terms of
// degree 4 (threshold-function coefficients C(d-1, 2) mod 2; from memory), checked beside the
// bit-set engine.
describe('majority of 5', () => {
  const rows: WideRow[] = [];
  for (let k = 0; k < 32; k++) rows.push({ cube: wideCube(31n, BigInt(k)), value: k.toString(2).replace(/0/g, '').length >= 3 ? 1 : 0 });
  const { forms } = analyseRows(5, rows);

  it('has an XOR form of 15 terms of degree 4 and an AND/OR form of the 10 three-input terms', () => {
    expect(forms.xor.terms).toBe(15n);
    expect(forms.xor.degree).toBe(4);
    expect([forms.andOr.terms, forms.andOr.literals, forms.andOr.proven]).toEqual([10, 30, true]);
  });
});

describe('a function of parity 30', () => {
  it('gives up its AND/OR form (2^29 terms) as too large rather than running on', () => {
    const dd = new Dd(30);
    let f: Node = TRUE;
    for (let i = 0; i < 30; i++) f = dd.xor(f, dd.variable(i));
    const parity = dd.not(f);
    expect(dd.zCount(dd.anf(parity))).toBe(30n);
    expect(() => analyseWideOutput({ dd, on: parity, dc: 0 }, 0, signals(30), { budgetMs: 200 })).toThrow(/more than 100,000 disjoint cubes/);
  });
});

describe('wide cubes', () => {
  it('keep the positions of cubes: leftmost input in the highest bit', () => {
    expect(toNarrow(toWide(cube(0b101, 0b100)))).toEqual(cube(0b101, 0b100));
    expect(inputBit(64, 0)).toBe(1n << 63n);
  });
});
