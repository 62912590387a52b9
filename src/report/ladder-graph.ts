// One ladder rung as a graph of rails, contacts, coil and wires, laid out for a given width.
// The SVG picture and the PLCopen LD body are both drawn from it, so what a test proves
// about the graph (series = AND, parallel = OR) holds for what the user sees and imports.
import type { Cube } from '../logic/cube.js';
import type { Signal } from '../logic/signals.js';

export type LadderNodeKind = 'left-rail' | 'right-rail' | 'contact' | 'coil';

export interface LadderNode {
  /** 1-based, unique within the rung (PLCopen localIds are these plus an offset). */
  readonly id: number;
  readonly kind: LadderNodeKind;
  /** Left end of the symbol's slot and the height of its connection line, in px. */
  readonly x: number;
  readonly y: number;
  /** Slot width (contacts, coil); 0 for rails. */
  readonly width: number;
  /** Contacts: the input (0 = leftmost column) and whether the contact is normally closed. */
  readonly input?: number;
  readonly negated?: boolean;
  /** Contacts: the parallel branch (product term) they belong to, 0-based. */
  readonly branch?: number;
}

/** Power flows from `from` to `to` along `points` (first point at `from`'s output). */
export interface LadderWire {
  readonly from: number;
  readonly to: number;
  readonly points: readonly (readonly [number, number])[];
}

export interface LadderGraph {
  readonly nodes: readonly LadderNode[];
  readonly wires: readonly LadderWire[];
  /** Picture size, px. */
  readonly width: number;
  readonly height: number;
  /** Top and bottom of the rails. */
  readonly railTop: number;
  readonly railBottom: number;
  /** A form without inputs: 'true' is a plain wire to the coil, 'false' an open rung. */
  readonly constant: 'none' | 'true' | 'false';
  /** Contacts per row in this layout (long product terms continue on the next row). */
  readonly perRow: number;
}

export const LADDER = {
  /** Space above the first row (for the output's name). */
  top: 28,
  railX: 8,
  rowHeight: 84,
  /** Connection line of a row, below the row's top: room for two lines of header text. */
  lineOffset: 40,
  coilWidth: 30,
  /** Wire between coil and right rail. */
  coilLead: 18,
  /** Gap between the branch-collecting bus and the coil. */
  busLead: 14,
  /** Room between the last contact of a row and the bus, so that a wrap is not read as a join. */
  busGap: 20,
  /** Wire from the left rail to the first contact. */
  firstLead: 14,
  minSlot: 96,
  minWidth: 240,
} as const;

/**
 * Lay out the rung of an AND/OR form: one parallel branch per product term, its contacts in
 * series (wrapped onto continuation rows), all branches feeding one coil.
 */
export function ladderGraph(cubes: readonly Cube[], inputs: readonly Signal[], width = 320): LadderGraph {
  const n = inputs.length;
  const w = Math.max(LADDER.minWidth, Math.round(width));
  const rightX = w - LADDER.railX;
  const coilX = rightX - LADDER.coilLead - LADDER.coilWidth;
  const busX = coilX - LADDER.busLead;
  const x0 = LADDER.railX + LADDER.firstLead;
  const usable = busX - LADDER.busGap - x0;
  const perRow = Math.max(1, Math.floor(usable / LADDER.minSlot));
  const slot = Math.floor(usable / perRow);

  const constant = cubes.length === 0 ? 'false' : cubes.some((c) => c.mask === 0) ? 'true' : 'none';
  const terms = constant === 'none' ? cubes.map((c) => literalsOf(c, n)) : [];
  const nodes: LadderNode[] = [];
  const wires: LadderWire[] = [];
  const left: LadderNode = { id: 1, kind: 'left-rail', x: LADDER.railX, y: 0, width: 0 };
  const coilY = LADDER.top + LADDER.lineOffset;
  const coil: LadderNode = { id: 2, kind: 'coil', x: coilX, y: coilY, width: LADDER.coilWidth };
  const right: LadderNode = { id: 3, kind: 'right-rail', x: rightX, y: coilY, width: 0 };
  nodes.push(left, coil, right);

  let row = 0;
  let nextId = 4;
  terms.forEach((literals, branch) => {
    let previous: LadderNode = left;
    literals.forEach((lit, j) => {
      const r = row + Math.floor(j / perRow);
      const y = LADDER.top + r * LADDER.rowHeight + LADDER.lineOffset;
      const x = x0 + (j % perRow) * slot;
      const contact: LadderNode = { id: nextId++, kind: 'contact', x, y, width: slot, input: lit.input, negated: lit.negated, branch };
      nodes.push(contact);
      wires.push({ from: previous.id, to: contact.id, points: wirePoints(previous, contact, x0) });
      previous = contact;
    });
    const endX = previous.x + previous.width;
    wires.push({
      from: previous.id,
      to: coil.id,
      points: dedupe([[endX, previous.y], [busX, previous.y], [busX, coilY], [coilX, coilY]]),
    });
    row += Math.ceil(literals.length / perRow);
  });
  if (constant === 'true') wires.push({ from: left.id, to: coil.id, points: [[LADDER.railX, coilY], [coilX, coilY]] });
  wires.push({ from: coil.id, to: right.id, points: [[coilX + LADDER.coilWidth, coilY], [rightX, coilY]] });

  const rows = Math.max(1, row);
  const railTop = LADDER.top + 12;
  const railBottom = LADDER.top + (rows - 1) * LADDER.rowHeight + LADDER.lineOffset + 36;
  return {
    nodes,
    wires,
    width: w,
    height: railBottom + 8,
    railTop,
    railBottom,
    constant,
    perRow,
  };
}

function literalsOf(c: Cube, n: number): { input: number; negated: boolean }[] {
  const out: { input: number; negated: boolean }[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (c.mask & bit) out.push({ input: i, negated: (c.bits & bit) === 0 });
  }
  return out;
}

/** From the rail or a contact's right end to the next contact's left end; a wrap goes down and back. */
function wirePoints(from: LadderNode, to: LadderNode, x0: number): [number, number][] {
  if (from.kind === 'left-rail') return [[LADDER.railX, to.y], [to.x, to.y]];
  const endX = from.x + from.width;
  if (from.y === to.y) return [[endX, from.y], [to.x, to.y]];
  const midY = from.y + LADDER.rowHeight / 2 - 2;
  const backX = x0 - 6;
  return [[endX, from.y], [endX, midY], [backX, midY], [backX, to.y], [to.x, to.y]];
}

function dedupe(points: [number, number][]): [number, number][] {
  return points.filter((p, i) => i === 0 || p[0] !== points[i - 1]![0] || p[1] !== points[i - 1]![1]);
}
