import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { has, members } from '../../src/logic/bits.js';
import { buildFunction, type BoolFunction, type TableRow } from '../../src/logic/boolfn.js';
import { cubeContains, cubeFromPattern, type Cube } from '../../src/logic/cube.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { fullTableSteps, uniqueCauseSteps, type TestStep } from '../../src/logic/steps.js';
import { letterSignals, specArb } from './expr/arbitraries.js';

const row = (pattern: string, value: 0 | 1 | '-'): TableRow => ({ cube: cubeFromPattern(pattern), value });

function spec(n: number, rows: TableRow[]): BoolFunction {
  const built = buildFunction(n, rows);
  if (!built.ok) throw new Error(built.error.message);
  return built.value.fn;
}

const brief = (steps: TestStep[]) => steps.map((s) => [s.combination, s.expected, s.reason]);

describe('unique-cause test steps', () => {
  // out = (a AND NOT c) OR (b AND c): on at 3, 4, 6, 7.
  const fn = spec(3, [row('1-0', 1), row('-11', 1), row('0-0', 0), row('-01', 0)]);
  const cubes = [cubeFromPattern('1-0'), cubeFromPattern('-11')];

  it('shows each term alone turning the output on, and each of its literals alone turning it off', () => {
    expect(brief(uniqueCauseSteps(cubes, fn, letterSignals(3)))).toEqual([
      [4, 1, 'term 1 alone: a AND NOT c'],
      [0, 0, 'term 1 with a = 0: output off'],
      [5, 0, 'term 1 with c = 1: output off'],
      [3, 1, 'term 2 alone: b AND c'],
      [1, 0, 'term 2 with b = 0: output off'],
      [2, 0, 'term 2 with c = 0: output off'],
    ]);
  });

  it('names inputs I1, I2, ... when no signals are given', () => {
    expect(uniqueCauseSteps(cubes, fn)[0]!.reason).toBe('term 1 alone: I1 AND NOT I3');
  });

  it('says so when a term is never the only true term on a specified combination', () => {
    const or = spec(2, [row('1-', 1), row('-1', 1), row('00', 0)]);
    const steps = uniqueCauseSteps([cubeFromPattern('1-'), cubeFromPattern('-1'), cubeFromPattern('11')], or, letterSignals(2));
    expect(steps.find((s) => s.combination === 3)!.reason).toMatch(/term 3 \(other terms are true with it on every specified combination\): a AND b/);
  });

  it("never rests an expected value on a don't-care, and says which literal cannot be shown alone", () => {
    // on at 11, don't-care at 10, off at 0-
    const f = spec(2, [row('11', 1), row('10', '-'), row('0-', 0)]);
    const steps = uniqueCauseSteps([cubeFromPattern('11')], f, letterSignals(2));
    expect(brief(steps)).toEqual([
      [3, 1, 'term 1 alone: a AND b; flipping b alone never turns the output off on a specified combination'],
      [1, 0, 'term 1 with a = 0: output off'],
    ]);
  });

  it('gives one off step when the output is never on', () => {
    const off = spec(2, [row('--', 0)]);
    expect(brief(uniqueCauseSteps([], off))).toEqual([[0, 0, 'no product term: the output is never on']]);
  });

  it('each step is unique, expects what the spec says on a specified combination, and each term that can be alone is shown alone (fast-check)', () => {
    fc.assert(
      fc.property(specArb(1, 9, 8), (s) => {
        const { cubes: cover } = minimiseSop(s.fn);
        const steps = uniqueCauseSteps(cover, s.fn);
        expect(new Set(steps.map((t) => t.combination)).size).toBe(steps.length);
        for (const step of steps) {
          expect(has(s.fn.dc, step.combination)).toBe(false);
          expect(step.expected).toBe(has(s.fn.on, step.combination) ? 1 : 0);
        }
        cover.forEach((c, j) => {
          const aloneOn = (k: number) => has(s.fn.on, k) && cubeContains(c, k) && cover.every((o, i) => i === j || !cubeContains(o, k));
          if (members(s.fn.on).some(aloneOn)) expect(steps.some((t) => aloneOn(t.combination))).toBe(true);
        });
        if (cover.length > 0) expect(literalPairsShown(cover, s.fn, steps)).toBe(true);
      }),
      { numRuns: 300 },
    );
  });
});

/** For every literal that some specified on/off pair can show, a pair of steps shows it. */
function literalPairsShown(cover: Cube[], fn: BoolFunction, steps: TestStep[]): boolean {
  const at = new Set(steps.map((t) => t.combination));
  const offAt = (k: number) => !has(fn.on, k) && !has(fn.dc, k);
  return cover.every((c) => {
    for (let bit = 1; bit <= c.mask; bit <<= 1) {
      if (!(c.mask & bit)) continue;
      const pairs = members(fn.on).filter((k) => cubeContains(c, k) && offAt(k ^ bit));
      if (pairs.length > 0 && !pairs.some((k) => at.has(k) && at.has(k ^ bit))) return false;
    }
    return true;
  });
}

describe('full-table test steps', () => {
  it("lists every specified combination with the spec's value and skips don't-cares", () => {
    const f = spec(2, [row('11', 1), row('10', '-'), row('0-', 0)]);
    expect(brief(fullTableSteps(f))).toEqual([
      [0, 0, 'specified combination: output off'],
      [1, 0, 'specified combination: output off'],
      [3, 1, 'specified combination: output on'],
    ]);
  });
});
