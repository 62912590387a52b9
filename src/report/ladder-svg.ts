// A ladder picture of one output's AND/OR form in IEC 61131-3 graphical symbols:
// power rails, normally open contact | |, normally closed contact |/|, coil ( ), and the
// connector / continuation pair >n> where a branch continues on the next line.
// Plain black on white, text no smaller than 11 px; labels wrap, never cut; as wide as the
// rung needs, up to the width asked for.
import type { Cube, FormBound, Signal, WideCube } from '../logic/index.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import { LADDER, ladderGraph, wrapWhole, type LadderGraph, type LadderNode, type LadderWire } from './ladder-graph.js';
import { escapeXml, plural } from './text.js';

export { ladderGraph } from './ladder-graph.js';

/** What a rung is drawn from: either engine's output (OutputAnalysis, OutputView). */
export interface RungSource {
  readonly signal: Signal;
  readonly andOr: {
    readonly cubes: readonly (Cube | WideCube)[];
    readonly text: string;
    readonly proven: boolean;
    readonly terms: number | bigint;
    readonly literals: number;
    readonly lowerBound: FormBound;
  };
}

export function ladderSvg(output: RungSource, inputs: readonly Signal[], options: { width?: number } = {}): string {
  const graph = ladderGraph(output.andOr.cubes, inputs, options.width ?? 320, output.signal);
  const title = `${output.signal.header} (${output.signal.identifier}) := ${output.andOr.text}`;
  const notes = footerLines(output, graph);
  const height = graph.height + notes.length * LADDER.linePx + 12;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${graph.width}" height="${height}" viewBox="0 0 ${graph.width} ${height}" font-family="sans-serif" font-size="${LADDER.font}">`,
    `<title>${escapeXml(title)}</title>`,
    `<desc>${escapeXml(CAUTION)}</desc>`,
    `<rect x="0" y="0" width="${graph.width}" height="${height}" fill="#ffffff"/>`,
    `<g stroke="#000000" stroke-width="1.5" fill="none">`,
  );
  const left = graph.nodes.find((node) => node.kind === 'left-rail')!;
  const right = graph.nodes.find((node) => node.kind === 'right-rail')!;
  const coil = graph.nodes.find((node) => node.kind === 'coil')!;
  parts.push(line(left.x, graph.railTop, left.x, graph.railBottom), line(right.x, graph.railTop, right.x, graph.railBottom));
  for (const wire of drawnWires(graph)) parts.push(`<polyline points="${wire.points.map(([x, y]) => `${x},${y}`).join(' ')}"/>`);
  for (const node of graph.nodes) {
    if (node.kind === 'contact') parts.push(contactSymbol(node));
    if (node.kind === 'coil') parts.push(coilSymbol(node));
    if (node.kind === 'connector' || node.kind === 'continuation') parts.push(connectorSymbol(node));
  }
  if (graph.constant === 'false') parts.push(line(left.x, coil.y, left.x + 40, coil.y), line(coil.x - 40, coil.y, coil.x, coil.y));
  parts.push('</g>', '<g fill="#000000" stroke="none">');
  graph.heading.forEach((h, i) => parts.push(text(left.x, LADDER.top + (i + 1) * LADDER.linePx - 2, h, 'start', 'bold')));
  // The coil's label is centred over the room between the bus and the right rail, which is sized for it.
  for (const node of graph.nodes) parts.push(...nodeLabels(node, node.kind === 'coil' ? (graph.busX + right.x) / 2 : node.x + node.width / 2));
  notes.forEach((note, i) => parts.push(text(left.x, graph.height + 8 + i * LADDER.linePx, note, 'start')));
  parts.push('</g>', '</svg>');
  return parts.join('\n') + '\n';
}

/** The wires a picture draws: all but a connector's jump to its continuation. */
export function drawnWires(graph: LadderGraph): LadderWire[] {
  return graph.wires.filter((w) => w.points.length >= 2);
}

/** The notes under the rung: what a constant rung means, how connectors read, and the start of the caution. */
function footerLines(output: RungSource, graph: LadderGraph): string[] {
  const chars = Math.floor((graph.width - 2 * LADDER.railX) / LADDER.charPx);
  const lines: string[] = [];
  if (graph.constant === 'true') lines.push(...wrapWhole('Always energised: the form is TRUE, no input matters.', chars));
  if (graph.constant === 'false') lines.push(...wrapWhole('Open rung, never energised: the form is FALSE.', chars));
  if (graph.nodes.some((node) => node.kind === 'connector'))
    lines.push(...wrapWhole('A branch too long for one line continues, in series, at the continuation of the same number.', chars));
  const b = output.andOr.lowerBound;
  const status = output.andOr.proven ? 'proven minimum' : `heuristic; proven lower bound ${plural(b.terms, 'branch', 'branches')}, ${plural(b.literals, 'contact')}`;
  lines.push(...wrapWhole(`${plural(output.andOr.terms, 'branch', 'branches')}, ${plural(output.andOr.literals, 'contact')} (${status}).`, chars));
  lines.push(...wrapWhole(CAUTION_LINES[0]!, chars));
  return lines;
}

function contactSymbol(node: LadderNode): string {
  const mid = node.x + node.width / 2;
  const y = node.y;
  const parts = [
    line(node.x, y, mid - 5, y),
    line(mid - 5, y - 9, mid - 5, y + 9),
    line(mid + 5, y - 9, mid + 5, y + 9),
    line(mid + 5, y, node.x + node.width, y),
  ];
  if (node.negated) parts.push(line(mid - 8, y + 9, mid + 8, y - 9));
  return `<g>${parts.join('')}</g>`;
}

function coilSymbol(node: LadderNode): string {
  const { x, y, width } = node;
  return (
    `<g>${line(x, y, x + 8, y)}` +
    `<path d="M ${x + 12} ${y - 9} A 10 10 0 0 0 ${x + 12} ${y + 9}"/>` +
    `<path d="M ${x + width - 12} ${y - 9} A 10 10 0 0 1 ${x + width - 12} ${y + 9}"/>` +
    `${line(x + width - 8, y, x + width, y)}</g>`
  );
}

/** IEC 61131-3 connector at a line's end and continuation at the next line's start: a box pointing right, named inside. */
function connectorSymbol(node: LadderNode): string {
  const { x, y, width } = node;
  const box = `${x + 6},${y - 8} ${x + width - 10},${y - 8} ${x + width - 2},${y} ${x + width - 10},${y + 8} ${x + 6},${y + 8}`;
  const lead = node.kind === 'connector' ? line(x, y, x + 6, y) : line(x + width - 2, y, x + width, y);
  return `<g>${lead}<polygon points="${box}"/></g>`;
}

/** Text above a symbol (its last line nearest to it) and below it, centred; a connector's name inside it. */
function nodeLabels(node: LadderNode, mid: number): string[] {
  if (node.kind === 'connector' || node.kind === 'continuation') return [text(node.x + node.width / 2 - 2, node.y + 4, node.name!, 'middle')];
  const above = node.above ?? [];
  const below = node.below ?? [];
  return [
    ...above.map((t, i) => text(mid, node.y - LADDER.aboveGap - (above.length - 1 - i) * LADDER.linePx, t, 'middle')),
    ...below.map((t, i) => text(mid, node.y + LADDER.belowGap + i * LADDER.linePx, t, 'middle')),
  ];
}

function line(x1: number, y1: number, x2: number, y2: number): string {
  return `<line x1="${x1}" y1="${y1}" x2="${x2}" y2="${y2}"/>`;
}

function text(x: number, y: number, content: string, anchor: 'start' | 'middle' | 'end', weight?: 'bold'): string {
  const bold = weight ? ` font-weight="${weight}"` : '';
  return `<text x="${x}" y="${y}" text-anchor="${anchor}"${bold}>${escapeXml(content)}</text>`;
}
