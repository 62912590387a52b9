// Against sympy (registry library, Debian python3-sympy; version recorded in the data file's
// "source"): test/external/data/sympy-reference.json, written by scripts/sympy_reference.py
// (`npm run ref:sympy` proves it still matches sympy). No Python is needed to run this file.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { add, emptySet } from '../../src/logic/bits.js';
import { anfOf } from '../../src/logic/anf.js';
import { minimiseSop } from '../../src/logic/sop.js';

interface ReferenceCase {
  n: number;
  on: number[];
  dc: number[];
  sopTerms: number;
  sopLiterals: number;
  /** sympy ANFform monomials (first variable = most significant bit); only without don't-cares. */
  anf?: number[];
}

const reference = JSON.parse(readFileSync(new URL('./data/sympy-reference.json', import.meta.url), 'utf8')) as {
  source: string;
  cases: ReferenceCase[];
};

function setOf(n: number, members: number[]) {
  const s = emptySet(n);
  members.forEach((k) => add(s, k));
  return s;
}

describe(`against ${reference.source}`, () => {
  it('the reference data holds functions with and without don\'t-cares', () => {
    expect(reference.cases.length).toBeGreaterThanOrEqual(200);
    expect(reference.cases.some((c) => c.dc.length > 0)).toBe(true);
    expect(reference.cases.filter((c) => c.anf).length).toBeGreaterThanOrEqual(100);
  });

  it('our proven AND/OR forms never have more terms than SOPform, nor more literals at equal terms', () => {
    for (const c of reference.cases) {
      const form = minimiseSop({ n: c.n, on: setOf(c.n, c.on), dc: setOf(c.n, c.dc) });
      expect(form.proven).toBe(true);
      const ours = [form.terms, form.literals];
      const label = `n=${c.n} on=${c.on.join(',')} dc=${c.dc.join(',')}`;
      expect(form.terms, label).toBeLessThanOrEqual(c.sopTerms);
      if (form.terms === c.sopTerms) expect(ours[1], label).toBeLessThanOrEqual(c.sopLiterals);
    }
  });

  it('our XOR forms (ANF) equal ANFform\'s monomials exactly', () => {
    for (const c of reference.cases.filter((x) => x.anf)) {
      const ours = [...anfOf(setOf(c.n, c.on), c.n)].sort((a, b) => a - b);
      expect(ours, `n=${c.n} on=${c.on.join(',')}`).toEqual(c.anf);
    }
  });
});
