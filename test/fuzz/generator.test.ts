// The fuzz's generator, printers, judge and shrinker on their own (the fuzz run itself is
// `npm run fuzz`, not part of the unit tests).
import { describe, expect, it } from 'vitest';
import { ref, type Program } from './ast.js';
import { contradictionOf } from './check.js';
import { generateCase, type FuzzCase } from './generate.js';
import { expectedVerdicts, TooManyStates, type Expected } from './interpreter.js';
import { printExpr, printPlcopen, printSt } from './print.js';
import { shrink } from './shrink.js';
import { hasGaps, specValue } from './spec.js';

const SEEDS = Array.from({ length: 150 }, (_, i) => 1000 + 7 * i);
const cases = SEEDS.map(generateCase);

/** Features that change what a program computes (or make it depend on state). */
const CHANGING = ['mutated', 'random', 'constant-as-input', 'init-local-as-input', 'seal-in', 'timer'];

describe('fuzz generator', () => {
  it('gives the same case for the same seed, to the printed text', () => {
    for (const seed of [1, 42, 4_000_000_000]) {
      const [x, y] = [generateCase(seed), generateCase(seed)];
      expect(y).toEqual(x);
      expect(printSt(y.program)).toBe(printSt(x.program));
      expect(printPlcopen(y.program)).toBe(printPlcopen(x.program));
    }
  });

  it('gives different cases for different seeds', () => {
    expect(new Set(cases.map((c) => printSt(c.program))).size).toBeGreaterThan(cases.length * 0.9);
  });

  it('makes tables of 2-6 inputs and 1-3 outputs with no conflicting rows, some with gaps', () => {
    for (const { spec } of cases) {
      expect(spec.inputs.length).toBeGreaterThanOrEqual(2);
      expect(spec.inputs.length).toBeLessThanOrEqual(6);
      expect(spec.outputs.length).toBeGreaterThanOrEqual(1);
      expect(spec.outputs.length).toBeLessThanOrEqual(3);
      for (let o = 0; o < spec.outputs.length; o++) for (let k = 0; k < 2 ** spec.inputs.length; k++) expect(() => specValue(spec, o, k)).not.toThrow();
    }
    const gaps = cases.filter((c) => hasGaps(c.spec)).length;
    expect(gaps).toBeGreaterThan(10);
    expect(gaps).toBeLessThan(cases.length);
  });

  it('uses every style over a run of seeds, in both file formats', () => {
    const seen = new Set(cases.flatMap((c) => c.program.features));
    for (const f of ['constant', 'init-local', 'locals', 'temp', 'if', 'case', 'fb', 'in-out', 'action', 'last-wins', 'timer', 'seal-in', 'mutated', 'xml', 'mixed-xhtml', 'constant-as-input', 'member-input', 'element-input', 'function']) {
      expect(seen, f).toContain(f);
    }
    expect(cases.some((c) => c.program.format === 'st')).toBe(true);
  });

  it('writes programs from the rows that the interpreter finds equal where no gap can tell', () => {
    // Without gaps, the OR of the 1 rows and the NOT of the OR of the 0 rows are both the spec.
    let judged = 0;
    for (const c of cases) {
      if (c.program.features.some((f) => CHANGING.includes(f)) || hasGaps(c.spec)) continue;
      let expected: Expected[];
      try {
        expected = expectedVerdicts(c.program, c.spec);
      } catch (e) {
        if (e instanceof TooManyStates) continue;
        throw e;
      }
      expect(expected.map((e) => e.verdict), `seed ${c.seed}`).toEqual(c.spec.outputs.map(() => 'equal'));
      judged++;
    }
    expect(judged).toBeGreaterThan(10);
  });
});

describe('fuzz printers', () => {
  const [a, b, c] = [ref('a'), ref('b'), ref('c')];
  it('writes only the parentheses the ST precedence NOT > AND > XOR > OR needs', () => {
    expect(printExpr({ k: 'or', args: [{ k: 'and', args: [a, b] }, c] })).toBe('a AND b OR c');
    expect(printExpr({ k: 'and', args: [{ k: 'or', args: [a, b] }, c] })).toBe('(a OR b) AND c');
    expect(printExpr({ k: 'xor', args: [{ k: 'or', args: [a, b] }, c] })).toBe('(a OR b) XOR c');
    expect(printExpr({ k: 'or', args: [{ k: 'xor', args: [a, b] }, c] })).toBe('a XOR b OR c');
    expect(printExpr({ k: 'not', a: { k: 'and', args: [a, b] } })).toBe('NOT (a AND b)');
    expect(printExpr({ k: 'not', a: { k: 'not', a } })).toBe('NOT (NOT a)');
  });

  it('writes the same ST body as plain or mixed xhtml content, in document order', () => {
    const mixed = cases.find((x) => x.program.xhtml === 'mixed' && /<p>|<br\/>/.test(printPlcopen(x.program)))!.program;
    const plain: Program = { ...mixed, xhtml: 'plain' };
    const bodies = (xml: string): string[] =>
      [...xml.matchAll(/<xhtml[^>]*>([\s\S]*?)<\/xhtml>/g)].map((m) => m[1]!.replace(/<br\/>|<\/?p>/g, '').replace(/\n$/, ''));
    expect(bodies(printPlcopen(mixed))).toEqual(bodies(printPlcopen(plain)));
  });
});

describe('fuzz judge', () => {
  const equal: Expected = { verdict: 'equal', mismatches: new Map(), outcomes: [] };
  const differs: Expected = { verdict: 'differs', mismatches: new Map([[2, { expected: 0, actual: 1 }]]), outcomes: [] };
  const state: Expected = { verdict: 'state', mismatches: new Map(), outcomes: [] };
  const gaps = { count: 0, implementationOn: 0, safe: 0 as const, unsafe: 0, unsafeExamples: [], judged: true };
  const at2 = [{ combination: 2, inputs: [1, 0] as (0 | 1)[], expected: 0 as const, actual: 1 as const, kind: 'unsafe' as const, source: 'row' as const }];

  it('takes an EQUAL only where the interpreter knows the output equal', () => {
    expect(contradictionOf(equal, { status: 'equal', counterexamples: [], gaps })).toBeUndefined();
    expect(contradictionOf(differs, { status: 'equal', counterexamples: [], gaps })).toBe('false-equal');
    expect(contradictionOf(state, { status: 'equal', counterexamples: [], gaps })).toBe('false-equal');
  });

  it('takes a DIFFERS only with counterexamples the interpreter confirms, values included', () => {
    expect(contradictionOf(differs, { status: 'differs', counterexamples: at2, gaps })).toBeUndefined();
    expect(contradictionOf(equal, { status: 'differs', counterexamples: at2, gaps })).toBe('unconfirmed-differs');
    expect(contradictionOf(differs, { status: 'differs', counterexamples: [{ ...at2[0]!, expected: 1, actual: 0, kind: 'spurious-trip' }], gaps })).toBe('unconfirmed-differs');
    expect(contradictionOf(differs, { status: 'differs', counterexamples: [], gaps: { ...gaps, unsafe: 1, unsafeExamples: [2] } })).toBeUndefined();
  });

  it('takes a DIFFERS only when each counterexample is unsafe exactly where the spec requires the safe value', () => {
    expect(contradictionOf(differs, { status: 'differs', counterexamples: [{ ...at2[0]!, kind: 'spurious-trip' }], gaps })).toBe('unconfirmed-differs');
    const brake = { ...gaps, safe: 1 as const };
    const spuriousAtBrake = [{ ...at2[0]!, kind: 'spurious-trip' as const }];
    expect(contradictionOf(differs, { status: 'differs', counterexamples: spuriousAtBrake, gaps: brake })).toBeUndefined();
  });

  it('accepts UNCHECKED and not-found whatever the interpreter says', () => {
    for (const e of [equal, differs, state]) {
      expect(contradictionOf(e, { status: 'unchecked', counterexamples: [], gaps })).toBeUndefined();
      expect(contradictionOf(e, { status: 'not-found', counterexamples: [], gaps })).toBeUndefined();
    }
  });
});

describe('fuzz shrinker', () => {
  it('keeps what a failure needs and drops the rest', () => {
    const big = cases.find((c) => c.program.features.includes('in-out') && c.spec.rows.length > 3)!;
    const needsInOut = (c: FuzzCase): boolean => c.program.pous.some((p) => p.blocks.some((b) => b.section === 'VAR_IN_OUT'));
    const small = shrink(big, needsInOut);
    expect(needsInOut(small)).toBe(true);
    expect(small.spec.rows.length).toBe(1);
    expect(printSt(small.program).length).toBeLessThan(printSt(big.program).length);
  });
});
