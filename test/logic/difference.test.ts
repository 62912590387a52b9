// Unsafe combinations and spurious trips of an implementation check: known answers on small
// interlocks (safe value OFF and safe value ON), and counts and sentences against a brute force
// over every combination (fast-check).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has } from '../../src/logic/bits.js';
import { buildFunction, type BoolFunction, type TableRow } from '../../src/logic/boolfn.js';
import { cubeContains, cubeFromPattern, type Cube } from '../../src/logic/cube.js';
import type { Expr } from '../../src/logic/expr/ast.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { conditionText, kindOf, sideSentence } from '../../src/logic/difference.js';
import { checkImplementation } from '../../src/logic/implcheck.js';
import type { Signal } from '../../src/logic/signals.js';
import { exprArb, letterSignals, specArb } from './expr/arbitraries.js';
import { valueAt } from './expr/reference-value.js';

const row = (pattern: string, value: 0 | 1 | '-'): TableRow => ({ cube: cubeFromPattern(pattern), value });
const signals = (...ids: string[]): Signal[] => ids.map((identifier) => ({ identifier, header: identifier.replace(/_/g, ' ') }));

function spec(n: number, rows: TableRow[], safe: 0 | 1 = 0): BoolFunction {
  const built = buildFunction(n, rows, safe);
  if (!built.ok) throw new Error(built.error.message);
  return built.value.fn;
}

function program(text: string, sigs: readonly Signal[]): Expr {
  const r = parseExpression(text, sigs);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}


// Run permit (safe value 0): ON only with the guard closed and the start pressed.
const RUN = signals('Guard_closed', 'Start');
const RUN_SPEC = spec(2, [row('11', 1), row('0-', 0), row('10', 0)]);

// Brake applied (safe value 1: the brake must be applied unless the drive runs and is healthy).
const BRAKE = signals('Run', 'Healthy');
const BRAKE_SPEC = spec(2, [row('11', 0), row('0-', 1), row('10', 1)], 1);

describe('unsafe combinations and spurious trips', () => {
  it('a run permit that ignores the guard is unsafe exactly when the guard is open and start is pressed', () => {
    const check = checkImplementation(program('Start', RUN), RUN_SPEC, { safe: 0 });
    expect([check.unsafeCount, check.spuriousTripCount]).toEqual([1, 0]);
    expect(check.counterexamples).toEqual([{ combination: 0b01, inputs: [0, 1], expected: 0, actual: 1, kind: 'unsafe' }]);
    expect(sideSentence('unsafe', 2, check.unsafeWhen, RUN)?.sentence).toBe('unsafe exactly when Guard_closed = 0 AND Start = 1');
    expect(sideSentence('spurious-trip', 2, check.spuriousTripWhen, RUN)).toBeUndefined();
  });

  it('a run permit that never comes is a spurious trip, not unsafe', () => {
    const check = checkImplementation(program('FALSE', RUN), RUN_SPEC, { safe: 0 });
    expect([check.unsafeCount, check.spuriousTripCount]).toEqual([0, 1]);
    expect(check.counterexamples.map((c) => c.kind)).toEqual(['spurious-trip']);
    expect(sideSentence('spurious-trip', 2, check.spuriousTripWhen, RUN)?.sentence).toBe('spurious trip exactly when Guard_closed = 1 AND Start = 1');
  });

  it('with safe value ON, a brake released while the drive is unhealthy is unsafe (the program is OFF where the spec requires ON)', () => {
    const check = checkImplementation(program('NOT Run', BRAKE), BRAKE_SPEC, { safe: 1 });
    expect([check.unsafeCount, check.spuriousTripCount]).toEqual([1, 0]);
    expect(check.counterexamples).toEqual([{ combination: 0b10, inputs: [1, 0], expected: 1, actual: 0, kind: 'unsafe' }]);
    expect(sideSentence('unsafe', 2, check.unsafeWhen, BRAKE)?.sentence).toBe('unsafe exactly when Run = 1 AND Healthy = 0');
  });

  it('with safe value ON, a brake applied while the drive runs healthy is a spurious trip', () => {
    const check = checkImplementation(program('TRUE', BRAKE), BRAKE_SPEC, { safe: 1 });
    expect([check.unsafeCount, check.spuriousTripCount]).toEqual([0, 1]);
    expect(check.counterexamples.map((c) => [c.combination, c.kind])).toEqual([[0b11, 'spurious-trip']]);
  });

  it('lists unsafe counterexamples first, then spurious trips, each in order of combination', () => {
    // Spec NOT a against b: a spurious trip at 00, unsafe at 11.
    const sigs = letterSignals(2);
    const check = checkImplementation(program('b', sigs), spec(2, [row('0-', 1), row('1-', 0)]), { safe: 0 });
    expect(check.counterexamples.map((c) => [c.combination, c.kind])).toEqual([
      [0b11, 'unsafe'],
      [0b00, 'spurious-trip'],
    ]);
    expect(check.mismatchCount).toBe(check.unsafeCount + check.spuriousTripCount);
  });

  it("never counts a don't-care, and says when the sentence leans on one", () => {
    // Spec: 1- -> 1, 00 -> 0, 01 don't-care. Program TRUE turns the don't-care and 00 ON.
    const sigs = letterSignals(2);
    const check = checkImplementation(program('TRUE', sigs), spec(2, [row('1-', 1), row('00', 0), row('01', '-')]), { safe: 0 });
    expect([check.unsafeCount, check.spuriousTripCount]).toEqual([1, 0]);
    // "a = 0" is the shortest form: it holds on the don't-care 01 too.
    expect(sideSentence('unsafe', 2, check.unsafeWhen, sigs)?.sentence).toBe('unsafe exactly when a = 0 (on the combinations the spec judges)');
  });

  it('prints several terms with parentheses, and the whole input space as "every combination judged"', () => {
    const sigs = letterSignals(3);
    expect(conditionText(3, [cubeFromPattern('1-0'), cubeFromPattern('--1')], sigs)).toBe('(a = 1 AND c = 0) OR c = 1');
    const always = checkImplementation(program('TRUE', sigs), spec(3, [row('---', 0)]), { safe: 0 });
    expect(sideSentence('unsafe', 3, always.unsafeWhen, sigs)?.sentence).toBe('unsafe on every combination judged');
  });

  it('takes the kind from the value the spec requires and the safe value', () => {
    expect([kindOf(0, 0), kindOf(1, 0), kindOf(1, 1), kindOf(0, 1)]).toEqual(['unsafe', 'spurious-trip', 'unsafe', 'spurious-trip']);
  });

  it('gives the same form at the symbolic minimiser as at the bit-set one on a small case', () => {
    const check = checkImplementation(program('Start', RUN), RUN_SPEC, { safe: 0, symbolicFrom: 1 });
    expect(sideSentence('unsafe', 2, check.unsafeWhen, RUN)?.sentence).toBe('unsafe exactly when Guard_closed = 0 AND Start = 1');
  });

  it('counts and sentences equal a brute force over all 2^n combinations for random specs and programs (fast-check)', () => {
    const arb = specArb(1, 6, 8).chain((s) => fc.tuple(fc.constant(s), exprArb(letterSignals(s.n)), fc.boolean()));
    fc.assert(
      fc.property(arb, ([s, e, symbolic]) => {
        const check = checkImplementation(e, s.fn, { safe: s.safe, ...(symbolic ? { symbolicFrom: 1 } : {}) });
        const unsafe: number[] = [];
        const trips: number[] = [];
        for (let k = 0; k < 2 ** s.n; k++) {
          if (has(s.fn.dc, k)) continue;
          const expected = has(s.fn.on, k);
          const actual = valueAt(e, s.n, k);
          if (expected === actual) continue;
          (expected === (s.safe === 1) ? unsafe : trips).push(k);
        }
        expect(check.unsafeCount).toBe(unsafe.length);
        expect(check.spuriousTripCount).toBe(trips.length);
        expect(check.counterexamples.map((c) => c.combination)).toEqual([...unsafe.slice(0, 50), ...trips.slice(0, 50)]);
        // Each side's form holds on exactly its combinations among those the spec judges.
        for (const [form, side] of [
          [check.unsafeWhen, unsafe],
          [check.spuriousTripWhen, trips],
        ] as const) {
          for (let k = 0; k < 2 ** s.n; k++) {
            if (has(s.fn.dc, k)) continue;
            expect(form.cubes.some((c) => cubeContains(c as Cube, k))).toBe(side.includes(k));
          }
        }
      }),
      { numRuns: 300 },
    );
  });
});
