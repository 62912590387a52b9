import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { add, emptySet, equals, type BitSet } from '../../src/logic/bits.js';
import { fromOnSet } from '../../src/logic/boolfn.js';
import { cube, cubeFromPattern, type Cube } from '../../src/logic/cube.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { sopToExpr } from '../../src/logic/expr/forms.js';
import { prove } from '../../src/logic/proof.js';
import type { Signal } from '../../src/logic/signals.js';
import { LADDER, ladderGraph, type LadderGraph } from '../../src/report/ladder-graph.js';

const signals = (n: number): Signal[] => Array.from({ length: n }, (_, i) => ({ header: `Input ${i + 1}`, identifier: `I${i + 1}` }));

/**
 * The function the drawn rung computes: for each combination, does power flow from the left
 * rail to the coil through wires and closed contacts? (A normally open contact closes when
 * its input is 1, a normally closed one when it is 0.) Series contacts give AND, parallel
 * branches OR, without the test assuming either.
 */
function powerFlow(graph: LadderGraph, n: number): BitSet {
  const values = emptySet(n);
  const byId = new Map(graph.nodes.map((node) => [node.id, node]));
  const left = graph.nodes.find((node) => node.kind === 'left-rail')!;
  const coil = graph.nodes.find((node) => node.kind === 'coil')!;
  for (let k = 0; k < 2 ** n; k++) {
    const conducts = (id: number): boolean => {
      const node = byId.get(id)!;
      if (node.kind !== 'contact') return true;
      const v = (k >>> (n - 1 - node.input!)) & 1;
      return node.negated ? v === 0 : v === 1;
    };
    const seen = new Set<number>([left.id]);
    const queue = [left.id];
    while (queue.length > 0) {
      const id = queue.shift()!;
      for (const w of graph.wires) {
        if (w.from !== id || seen.has(w.to) || !conducts(w.to)) continue;
        seen.add(w.to);
        queue.push(w.to);
      }
    }
    if (seen.has(coil.id)) add(values, k);
  }
  return values;
}

const cubes = (...patterns: string[]): Cube[] => patterns.map(cubeFromPattern);

describe('the drawn ladder graph', () => {
  it('draws A AND NOT B OR C as two branches: NO A and NC B in series, NO C alone', () => {
    const graph = ladderGraph(cubes('10-', '--1'), signals(3));
    const contacts = graph.nodes.filter((node) => node.kind === 'contact');
    expect(contacts.map((c) => [c.branch, c.input, c.negated])).toEqual([
      [0, 0, false],
      [0, 1, true],
      [1, 2, false],
    ]);
    const coil = graph.nodes.find((node) => node.kind === 'coil')!;
    expect(graph.wires.filter((w) => w.to === coil.id)).toHaveLength(2);
    expect(graph.constant).toBe('none');
  });

  it('rebuilt by power flow, the rung computes its AND/OR form on every combination', () => {
    const cubeArb = (n: number) =>
      fc.array(fc.array(fc.constantFrom('0', '1', '-'), { minLength: n, maxLength: n }).map((p) => cubeFromPattern(p.join(''))), { maxLength: 6 });
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 7 }).chain((n) => fc.tuple(fc.constant(n), cubeArb(n), fc.integer({ min: 200, max: 900 }))),
        ([n, terms, width]) => {
          const graph = ladderGraph(terms, signals(n), width);
          const form = truthTable(sopToExpr(terms, signals(n)), n);
          const proof = prove(fromOnSet(n, form), powerFlow(graph, n));
          expect(proof.mismatchCount).toBe(0);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('a TRUE form is a plain wire from the left rail to the coil', () => {
    const graph = ladderGraph([cube(0, 0)], signals(2));
    expect(graph.constant).toBe('true');
    expect(graph.nodes.filter((node) => node.kind === 'contact')).toHaveLength(0);
    expect(graph.wires.some((w) => w.from === 1 && w.to === 2)).toBe(true);
    expect(equals(powerFlow(graph, 2), truthTable(sopToExpr([cube(0, 0)], signals(2)), 2))).toBe(true);
  });

  it('a FALSE form is an open rung: nothing reaches the coil', () => {
    const graph = ladderGraph([], signals(2));
    expect(graph.constant).toBe('false');
    expect(graph.wires.filter((w) => w.to === 2)).toHaveLength(0);
    expect(equals(powerFlow(graph, 2), emptySet(2))).toBe(true);
  });

  it('at task-pane width a long product term continues on further rows, inside the rails', () => {
    const graph = ladderGraph(cubes('10101010'), signals(8), 320);
    const contacts = graph.nodes.filter((node) => node.kind === 'contact');
    const rows = new Set(contacts.map((c) => c.y));
    expect(rows.size).toBe(Math.ceil(8 / graph.perRow));
    const coil = graph.nodes.find((node) => node.kind === 'coil')!;
    for (const c of contacts) {
      expect(c.x).toBeGreaterThan(LADDER.railX);
      expect(c.x + c.width).toBeLessThan(coil.x);
    }
    for (const w of graph.wires) for (const [x, y] of w.points) {
      expect(x).toBeGreaterThanOrEqual(LADDER.railX);
      expect(x).toBeLessThanOrEqual(graph.width - LADDER.railX);
      expect(y).toBeLessThanOrEqual(graph.railBottom);
    }
  });

  it('every wire starts where its source ends and ends where its target begins', () => {
    const graph = ladderGraph(cubes('1-0-1', '01---', '---11'), signals(5), 320);
    const byId = new Map(graph.nodes.map((node) => [node.id, node]));
    for (const w of graph.wires) {
      const from = byId.get(w.from)!;
      const to = byId.get(w.to)!;
      const [sx, sy] = w.points[0]!;
      const [ex, ey] = w.points[w.points.length - 1]!;
      if (from.kind === 'left-rail') expect(sx).toBe(LADDER.railX);
      else expect([sx, sy]).toEqual([from.x + from.width, from.y]);
      if (to.kind === 'right-rail') expect(ex).toBe(to.x);
      else expect([ex, ey]).toEqual([to.x, to.y]);
    }
  });
});
