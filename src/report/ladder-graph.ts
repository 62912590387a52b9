// One ladder rung as a graph of rails, contacts, coil, connectors and wires, laid out for a
// width. The SVG picture and the PLCopen LD body are both drawn from it, so what a test proves
// about the graph (series = AND, parallel = OR) holds for what the user sees and imports.
//
// Series contacts stay on one line. A branch too long for the width continues on the next
// line through an IEC 61131-3 connector (end of the line) and a continuation of the same name
// (start of the next line), never through a drawn wire that could be read as a branch: the
// only vertical wires are the bus that joins the ends of the parallel branches.
import { maxOf, type Cube, type Signal, type WideCube } from '../logic/index.js';

export type LadderNodeKind = 'left-rail' | 'right-rail' | 'contact' | 'coil' | 'connector' | 'continuation';

export interface LadderNode {
  /** 1-based, unique within the rung (PLCopen localIds are these plus an offset). */
  readonly id: number;
  readonly kind: LadderNodeKind;
  /** Left end of the symbol's slot and the height of its connection line, in px. */
  readonly x: number;
  readonly y: number;
  /** Slot width (contacts, coil, connectors); 0 for rails. */
  readonly width: number;
  /** Contacts: the input (0 = leftmost column) and whether the contact is normally closed. */
  readonly input?: number;
  readonly negated?: boolean;
  /** Contacts and connectors: the parallel branch (product term) they belong to, 0-based. */
  readonly branch?: number;
  /** Connectors and continuations: the name joining the two (1, 2, ... within the rung). */
  readonly name?: string;
  /** Text lines above the symbol (contact: header; coil: identifier) and below it (contact: identifier). */
  readonly above?: readonly string[];
  readonly below?: readonly string[];
}

/** Power flows from `from` to `to` along `points` (first point at `from`'s output); a connector's jump to its continuation has no points. */
export interface LadderWire {
  readonly from: number;
  readonly to: number;
  readonly points: readonly (readonly [number, number])[];
}

export interface LadderGraph {
  readonly nodes: readonly LadderNode[];
  readonly wires: readonly LadderWire[];
  /** Picture size, px: as wide as the content needs (at most the width asked for, unless one contact per line does not fit). */
  readonly width: number;
  readonly height: number;
  /** Top and bottom of the rails. */
  readonly railTop: number;
  readonly railBottom: number;
  /** Heading lines above the rung (output header and identifier), wrapped, never cut. */
  readonly heading: readonly string[];
  /** A form without inputs: 'true' is a plain wire to the coil, 'false' an open rung. */
  readonly constant: 'none' | 'true' | 'false';
  /** Most contacts on one line in this layout (a longer branch continues through a connector). */
  readonly perLine: number;
  /** x of the bus that joins the branch ends. */
  readonly busX: number;
}

export const LADDER = {
  railX: 8,
  /** Text: size, generous width of one character (so labels never overrun; common practice), line height. */
  font: 11,
  charPx: 6.6,
  linePx: 13,
  /** Space above the heading. */
  top: 6,
  /** From the baseline of the last text line above a symbol to its connection line, and from it to the first baseline below. */
  aboveGap: 12,
  belowGap: 22,
  /** Space after a line's lowest text. */
  lineGap: 10,
  slot: 88,
  coilWidth: 30,
  /** Wire between coil and right rail: wide enough that the coil's label has room above. */
  coilLead: 44,
  /** Gap between the branch-collecting bus and the coil. */
  busLead: 14,
  /** Room between a line's last symbol and the bus, so that nothing is read as touching it. */
  busGap: 20,
  /** Wire from the left rail to the first contact. */
  firstLead: 14,
  /** Connector and continuation symbols. */
  connectorWidth: 34,
  minWidth: 240,
} as const;

/** Right of the bus: busLead + coil + coilLead, then the rail. */
const RIGHT_PART = LADDER.busLead + LADDER.coilWidth + LADDER.coilLead;
const X0 = LADDER.railX + LADDER.firstLead;
/** Contacts of a continued line start after the continuation symbol. */
const X0_CONTINUED = LADDER.railX + 4 + LADDER.connectorWidth;

interface Literal {
  readonly input: number;
  readonly negated: boolean;
}

/** One drawn line of the rung: a branch, or a part of a branch that continues below. */
interface LinePlan {
  readonly branch: number;
  readonly literals: readonly Literal[];
  readonly continued: boolean;
  readonly continues: boolean;
}

/**
 * Lay out the rung of an AND/OR form: one parallel branch per product term, its contacts in
 * series on one line (continued through connectors when wider than `width`), all branches
 * feeding one coil. With `coil`, the heading and the coil's label are laid out too.
 */
export function ladderGraph(cubes: readonly (Cube | WideCube)[], inputs: readonly Signal[], width = 320, coil?: Signal): LadderGraph {
  const n = inputs.length;
  const maxWidth = Math.max(LADDER.minWidth, Math.round(width));
  const constant = cubes.length === 0 ? 'false' : cubes.some((c) => BigInt(c.mask) === 0n) ? 'true' : 'none';
  const terms = constant === 'none' ? cubes.map((c) => literalsOf(c, n)) : [];

  // Contacts that fit one line beside the rail, and beside a continuation with a connector after.
  const room = maxWidth - LADDER.railX - RIGHT_PART - LADDER.busGap;
  const whole = Math.max(1, Math.floor((room - X0) / LADDER.slot));
  const part = Math.max(1, Math.floor((room - X0_CONTINUED - LADDER.connectorWidth) / LADDER.slot));
  const plans: LinePlan[] = [];
  terms.forEach((literals, branch) => {
    if (literals.length <= whole) {
      plans.push({ branch, literals, continued: false, continues: false });
      return;
    }
    for (let start = 0; start < literals.length; start += part) {
      const end = Math.min(literals.length, start + part);
      plans.push({ branch, literals: literals.slice(start, end), continued: start > 0, continues: end < literals.length });
    }
  });

  const firstX = (p: LinePlan): number => (p.continued ? X0_CONTINUED : X0);
  const lineEnd = (p: LinePlan): number => firstX(p) + p.literals.length * LADDER.slot + (p.continues ? LADDER.connectorWidth : 0);
  const busX = maxOf(plans.map(lineEnd), X0 + LADDER.slot) + LADDER.busGap;
  const coilX = busX + LADDER.busLead;
  const rightX = coilX + LADDER.coilWidth + LADDER.coilLead;
  const w = Math.max(LADDER.minWidth, rightX + LADDER.railX);
  const textChars = (px: number): number => Math.max(4, Math.floor(px / LADDER.charPx));
  const labelChars = textChars(LADDER.slot - 4);

  const heading = coil ? wrapWhole(headingText(coil), textChars(w - 2 * LADDER.railX)) : [];
  const coilLabel = coil ? breakIdentifier(coil.identifier, textChars(rightX - busX - 4)) : [];
  const contactText = (lit: Literal): { above: string[]; below: string[] } => {
    const signal = inputs[lit.input]!;
    const header = signal.header.trim();
    return {
      above: wrapWhole(header, labelChars),
      below: signal.identifier === header ? [] : breakIdentifier(signal.identifier, labelChars),
    };
  };

  const nodes: LadderNode[] = [];
  const wires: LadderWire[] = [];
  const left: LadderNode = { id: 1, kind: 'left-rail', x: LADDER.railX, y: 0, width: 0 };
  nodes.push(left);
  let nextId = 2;
  let top = LADDER.top + heading.length * LADDER.linePx + 6;
  const railTop = top;
  let coilY = 0;
  let previous: LadderNode = left;
  let connectors = 0;
  const lines = plans.length > 0 ? plans : [undefined];
  lines.forEach((plan, i) => {
    const labels = plan ? plan.literals.map(contactText) : [];
    const above = Math.max(1, ...labels.map((l) => l.above.length), i === 0 ? coilLabel.length : 0);
    const below = Math.max(0, ...labels.map((l) => l.below.length));
    const y = top + above * LADDER.linePx + LADDER.aboveGap;
    if (i === 0) coilY = y;
    const bottom = below > 0 ? y + LADDER.belowGap + (below - 1) * LADDER.linePx + 4 : y + LADDER.aboveGap;
    top = bottom + LADDER.lineGap;
    if (!plan) return;
    let x = firstX(plan);
    if (plan.continued) {
      const continuation: LadderNode = { id: nextId++, kind: 'continuation', x: LADDER.railX + 4, y, width: LADDER.connectorWidth, branch: plan.branch, name: String(connectors) };
      nodes.push(continuation);
      wires.push({ from: previous.id, to: continuation.id, points: [] });
      previous = continuation;
    } else previous = left;
    plan.literals.forEach((lit, j) => {
      const contact: LadderNode = { id: nextId++, kind: 'contact', x, y, width: LADDER.slot, input: lit.input, negated: lit.negated, branch: plan.branch, ...labels[j]! };
      nodes.push(contact);
      const from: readonly [number, number] = previous.kind === 'left-rail' ? [LADDER.railX, y] : [previous.x + previous.width, y];
      wires.push({ from: previous.id, to: contact.id, points: [from, [x, y]] });
      previous = contact;
      x += LADDER.slot;
    });
    if (plan.continues) {
      connectors++;
      const connector: LadderNode = { id: nextId++, kind: 'connector', x, y, width: LADDER.connectorWidth, branch: plan.branch, name: String(connectors) };
      nodes.push(connector);
      wires.push({ from: previous.id, to: connector.id, points: [[x, y], [x, y]] });
      previous = connector;
    }
  });
  const railBottom = top - LADDER.lineGap + 4;

  const coilNode: LadderNode = { id: nextId++, kind: 'coil', x: coilX, y: coilY, width: LADDER.coilWidth, above: coilLabel };
  const right: LadderNode = { id: nextId++, kind: 'right-rail', x: rightX, y: coilY, width: 0 };
  nodes.push(coilNode, right);
  // Every branch's last contact runs along its line to the bus, then along the bus to the coil's line.
  for (const contact of branchEnds(nodes)) {
    const endX = contact.x + contact.width;
    wires.push({ from: contact.id, to: coilNode.id, points: dedupe([[endX, contact.y], [busX, contact.y], [busX, coilY], [coilX, coilY]]) });
  }
  if (constant === 'true') wires.push({ from: left.id, to: coilNode.id, points: [[LADDER.railX, coilY], [coilX, coilY]] });
  wires.push({ from: coilNode.id, to: right.id, points: [[coilX + LADDER.coilWidth, coilY], [rightX, coilY]] });
  return { nodes, wires, width: w, height: railBottom + 8, railTop, railBottom, heading, constant, perLine: whole, busX };
}

function headingText(coil: Signal): string {
  const header = coil.header.trim();
  return header === coil.identifier ? header : `${header} (${coil.identifier})`;
}

/** The last contact of each branch, in branch order. */
function branchEnds(nodes: readonly LadderNode[]): LadderNode[] {
  const last = new Map<number, LadderNode>();
  for (const node of nodes) if (node.kind === 'contact') last.set(node.branch!, node);
  return [...last.values()];
}

function dedupe(points: [number, number][]): [number, number][] {
  return points.filter((p, i) => i === 0 || p[0] !== points[i - 1]![0] || p[1] !== points[i - 1]![1]);
}

/** Either engine's cube (BigInt past 32 inputs). */
function literalsOf(c: Cube | WideCube, n: number): Literal[] {
  const mask = BigInt(c.mask);
  const bits = BigInt(c.bits);
  const out: Literal[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1n << BigInt(n - 1 - i);
    if (mask & bit) out.push({ input: i, negated: (bits & bit) === 0n });
  }
  return out;
}

/** Words on lines of at most `chars` characters; a word longer than a line is broken, never cut. */
export function wrapWhole(s: string, chars: number): string[] {
  const lines: string[] = [];
  let current = '';
  for (const word of s.split(/\s+/).filter((x) => x !== '')) {
    const candidate = current === '' ? word : `${current} ${word}`;
    if (candidate.length <= chars) {
      current = candidate;
      continue;
    }
    if (current !== '') lines.push(current);
    let rest = word;
    while (rest.length > chars) {
      lines.push(rest.slice(0, chars));
      rest = rest.slice(chars);
    }
    current = rest;
  }
  if (current !== '') lines.push(current);
  return lines;
}

/** An identifier on lines of at most `chars`, broken after underscores where possible, never cut. */
export function breakIdentifier(id: string, chars: number): string[] {
  const lines: string[] = [];
  let rest = id;
  while (rest.length > chars) {
    const cut = rest.lastIndexOf('_', chars - 1);
    const at = cut > 0 ? cut + 1 : chars;
    lines.push(rest.slice(0, at));
    rest = rest.slice(at);
  }
  if (rest !== '') lines.push(rest);
  return lines;
}
