// Unique-cause test steps on BDDs: the same steps as the bit-set selection on the same function
// (fast-check, 2-10 inputs), and known answers at 40 and 64 inputs.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildFunction, type OutputValue } from '../../src/logic/boolfn.js';
import { cube, cubeToSet } from '../../src/logic/cube.js';
import { Dd, FALSE, type Node } from '../../src/logic/bdd.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { uniqueCauseSteps } from '../../src/logic/steps.js';
import { inputBit, toWide, wideCube } from '../../src/logic/wide-cube.js';
import { wideStepBound, wideUniqueCauseSteps } from '../../src/logic/wide-steps.js';
import { emptySet } from '../../src/logic/bits.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { permitTable } from '../../bench/wide.bench.js';

const signals = (n: number) => Array.from({ length: n }, (_, i) => ({ header: `In ${i + 1}`, identifier: `In_${i + 1}` }));

/** The BDD of a bit set's combinations (n small). */
function bddOf(dd: Dd, on: Uint32Array, n: number): Node {
  const ks: Node[] = [];
  for (let k = 0; k < 2 ** n; k++) if ((on[k >>> 5]! >>> (k & 31)) & 1) ks.push(dd.cube(wideCube((1n << BigInt(n)) - 1n, BigInt(k))));
  return dd.orAll(ks);
}

describe('unique-cause steps on BDDs', () => {
  it('are the bit-set selection, step for step, on the same function and form', () => {
    const tables = fc.integer({ min: 2, max: 10 }).chain((n) =>
      fc.record({
        n: fc.constant(n),
        rows: fc.array(
          fc.record({ mask: fc.integer({ min: 0, max: 2 ** n - 1 }), bits: fc.integer({ min: 0, max: 2 ** n - 1 }), value: fc.constantFrom<OutputValue>(1, 0, '-') }),
          { minLength: 1, maxLength: 8 },
        ),
      }),
    );
    fc.assert(
      fc.property(tables, ({ n, rows }) => {
        const built = buildFunction(n, rows.map((r) => ({ cube: cube(r.mask, r.bits), value: r.value })), 0);
        if (!built.ok) throw new Error(built.error.message);
        const sop = minimiseSop(built.value.fn);
        // The resolved function, as analyse.ts makes it: the form's own values.
        const on = emptySet(n);
        for (const c of sop.cubes) cubeToSet(n, c, on);
        const narrow = uniqueCauseSteps(sop.cubes, { n, on, dc: emptySet(n) }, signals(n));
        const dd = new Dd(n);
        const wide = wideUniqueCauseSteps(dd, sop.cubes.map(toWide), bddOf(dd, on, n), signals(n));
        expect(wide.map((s) => ({ ...s, combination: Number(s.combination) }))).toEqual(narrow);
        const literals = sop.cubes.reduce((k, c) => k + toWide(c).mask.toString(2).replace(/0/g, '').length, 0);
        expect(wide.length).toBeLessThanOrEqual(wideStepBound(sop.cubes.length, literals));
      }),
      { numRuns: 150 },
    );
  });

  it('the OR of 40 causes: one step per cause alone, and all causes at 0', () => {
    const n = 40;
    const dd = new Dd(n);
    const cubes = Array.from({ length: n }, (_, i) => wideCube(inputBit(n, i), inputBit(n, i)));
    const steps = wideUniqueCauseSteps(dd, cubes, dd.orAll(cubes.map((c) => dd.cube(c))), signals(n));
    expect(steps).toHaveLength(n + 1);
    expect(steps.filter((s) => s.expected === 1).map((s) => s.combination)).toEqual(cubes.map((c) => c.bits));
    expect(steps.filter((s) => s.expected === 0).map((s) => s.combination)).toEqual([0n]);
  });

  it('the AND of 64 conditions: all 1, then each condition alone at 0', () => {
    const n = 64;
    const dd = new Dd(n);
    const all = (1n << 64n) - 1n;
    const steps = wideUniqueCauseSteps(dd, [wideCube(all, all)], dd.cube(wideCube(all, all)), signals(n));
    expect(steps).toHaveLength(n + 1);
    expect(steps[0]).toEqual({ combination: all, expected: 1, reason: expect.stringMatching(/^term 1 alone: In_1 AND In_2 AND/) });
    expect(steps.slice(1).map((s) => s.combination)).toEqual(Array.from({ length: n }, (_, i) => all ^ inputBit(n, i)));
    expect(steps.slice(1).every((s) => s.expected === 0)).toBe(true);
  });

  it('give the 20-24 input symbolic analysis the steps the bit-set selection gives its function', () => {
    for (const seed of [1, 2]) {
      const [table] = readSpecTables({ sheet: 'S', origin: 'A1', cells: permitTable(20, seed) }).tables;
      const [o] = analyseTable(table!, { engine: 'symbolic' }).outputs;
      expect(o!.steps).toEqual(uniqueCauseSteps(o!.andOr.cubes, o!.resolved, table!.inputs));
    }
  });

  it('a form that is FALSE gets one OFF step', () => {
    const dd = new Dd(30);
    expect(wideUniqueCauseSteps(dd, [], FALSE, signals(30))).toEqual([{ combination: 0n, expected: 0, reason: 'no product term: the output is never on' }]);
  });
});
