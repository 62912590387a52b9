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

/** The last contact of each branch, where the branch meets the bus. */
const branchEnds = (graph: LadderGraph) => {
  const last = new Map<number, (typeof graph.nodes)[number]>();
  for (const node of graph.nodes) if (node.kind === 'contact') last.set(node.branch!, node);
  return [...last.values()];
};

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

  it('at task-pane width a branch too long for one line continues through a connector and a continuation of the same name', () => {
    const graph = ladderGraph(cubes('10101010'), signals(8), 320);
    const contacts = graph.nodes.filter((node) => node.kind === 'contact');
    const connectors = graph.nodes.filter((node) => node.kind === 'connector');
    const continuations = graph.nodes.filter((node) => node.kind === 'continuation');
    const lines = new Set(contacts.map((c) => c.y));
    expect(contacts).toHaveLength(8);
    expect(lines.size).toBeGreaterThan(1);
    expect(connectors).toHaveLength(lines.size - 1);
    expect(continuations.map((c) => c.name)).toEqual(connectors.map((c) => c.name));
    for (const c of connectors) {
      const jump = graph.wires.find((w) => w.from === c.id)!;
      expect(graph.nodes.find((node) => node.id === jump.to)).toMatchObject({ kind: 'continuation', name: c.name });
      expect(jump.points).toEqual([]);
    }
    for (const w of graph.wires) for (const [x, y] of w.points) {
      expect(x).toBeGreaterThanOrEqual(LADDER.railX);
      expect(x).toBeLessThanOrEqual(graph.width - LADDER.railX);
      expect(y).toBeLessThanOrEqual(graph.railBottom);
    }
  });

  it('keeps series contacts on one line when the width allows', () => {
    const graph = ladderGraph(cubes('10101010'), signals(8), 1200);
    const contacts = graph.nodes.filter((node) => node.kind === 'contact');
    expect(new Set(contacts.map((c) => c.y)).size).toBe(1);
    expect(graph.nodes.some((node) => node.kind === 'connector')).toBe(false);
  });

  it('is as wide as its content needs, never wider than asked unless one contact per line does not fit', () => {
    const small = ladderGraph(cubes('1-', '-1'), signals(2), 800);
    expect(small.width).toBeLessThan(400);
    fc.assert(
      // From 290 px one contact fits on a continued line (continuation, contact, connector, bus, coil).
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 290, max: 1200 }), (n, width) => {
        const graph = ladderGraph([cubeFromPattern('1'.repeat(n))], signals(n), width);
        expect(graph.width).toBeLessThanOrEqual(width);
      }),
    );
  });

  it('every vertical wire is the bus, joining the ends of parallel branches and the coil line, nothing else', () => {
    const cubeArb = (n: number) =>
      fc.array(fc.array(fc.constantFrom('0', '1', '-'), { minLength: n, maxLength: n }).map((p) => cubeFromPattern(p.join(''))), { minLength: 1, maxLength: 6 });
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 10 }).chain((n) => fc.tuple(fc.constant(n), cubeArb(n), fc.integer({ min: 240, max: 900 }))),
        ([n, terms, width]) => {
          const graph = ladderGraph(terms, signals(n), width);
          const coil = graph.nodes.find((node) => node.kind === 'coil')!;
          const ends = new Set(branchEnds(graph).map((c) => c.y));
          ends.add(coil.y);
          for (const w of graph.wires)
            for (let i = 1; i < w.points.length; i++) {
              const [x1, y1] = w.points[i - 1]!;
              const [x2, y2] = w.points[i]!;
              if (x1 !== x2 || y1 === y2) continue;
              expect(x1).toBe(graph.busX);
              expect(ends.has(y1) && ends.has(y2)).toBe(true);
            }
          for (const node of graph.nodes) if (node.kind === 'contact' || node.kind === 'connector') expect(node.x + node.width).toBeLessThan(graph.busX);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('wraps contact labels onto more lines but never cuts them', () => {
    const long = [{ header: 'Light curtain muting lamp healthy and not bypassed', identifier: 'Light_curtain_muting_lamp_ok' }];
    const graph = ladderGraph(cubes('1'), long, 320, { header: 'Spindle run permit granted', identifier: 'Spindle_run_permit_granted' });
    const contact = graph.nodes.find((node) => node.kind === 'contact')!;
    const coil = graph.nodes.find((node) => node.kind === 'coil')!;
    expect(contact.above!.join(' ')).toBe(long[0]!.header);
    expect(contact.below!.join('')).toBe(long[0]!.identifier);
    expect(coil.above!.join('')).toBe('Spindle_run_permit_granted');
    expect(graph.heading.join(' ')).toBe('Spindle run permit granted (Spindle_run_permit_granted)');
    for (const text of [...contact.above!, ...contact.below!]) expect(text.length * LADDER.charPx).toBeLessThanOrEqual(LADDER.slot);
  });

  it('every wire starts where its source ends and ends where its target begins', () => {
    const graph = ladderGraph(cubes('1-0-1', '01---', '---11', '11111'), signals(5), 320);
    const byId = new Map(graph.nodes.map((node) => [node.id, node]));
    for (const w of graph.wires) {
      const from = byId.get(w.from)!;
      const to = byId.get(w.to)!;
      if (w.points.length === 0) continue; // a connector's jump to its continuation
      const [sx, sy] = w.points[0]!;
      const [ex, ey] = w.points[w.points.length - 1]!;
      if (from.kind === 'left-rail') expect(sx).toBe(LADDER.railX);
      else expect([sx, sy]).toEqual([from.x + from.width, from.y]);
      if (to.kind === 'right-rail') expect(ex).toBe(to.x);
      else expect([ex, ey]).toEqual([to.x, to.y]);
    }
  });
});
