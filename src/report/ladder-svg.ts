// A ladder picture of one output's AND/OR form in IEC 61131-3 graphical symbols:
// power rails, normally open contact | |, normally closed contact |/|, coil ( ).
// Plain black on white, text no smaller than 11 px, wrapped for a task pane (~320 px).
import type { Signal } from '../logic/signals.js';
import type { OutputAnalysis } from '../spec/analysis-types.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import { LADDER, ladderGraph, type LadderGraph, type LadderNode } from './ladder-graph.js';
import { escapeXml, fit, plural, wrap } from './text.js';

export { ladderGraph } from './ladder-graph.js';

const FONT = 11;
/** Width of one character at 11 px, generous so that labels never overrun (common practice). */
const CHAR_PX = 6.6;
const LINE_PX = 13;

export function ladderSvg(output: OutputAnalysis, inputs: readonly Signal[], options: { width?: number } = {}): string {
  const graph = ladderGraph(output.andOr.cubes, inputs, options.width ?? 320);
  const byId = new Map(graph.nodes.map((node) => [node.id, node]));
  const title = `${output.signal.header} (${output.signal.identifier}) := ${output.andOr.text}`;
  const notes = footerLines(output, graph);
  const height = graph.height + notes.length * LINE_PX + 12;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${graph.width}" height="${height}" viewBox="0 0 ${graph.width} ${height}" font-family="sans-serif" font-size="${FONT}">`,
    `<title>${escapeXml(title)}</title>`,
    `<desc>${escapeXml(CAUTION)}</desc>`,
    `<rect x="0" y="0" width="${graph.width}" height="${height}" fill="#ffffff"/>`,
    `<g stroke="#000000" stroke-width="1.5" fill="none">`,
  );
  const left = byId.get(1)!;
  const right = graph.nodes.find((node) => node.kind === 'right-rail')!;
  parts.push(line(left.x, graph.railTop, left.x, graph.railBottom), line(right.x, graph.railTop, right.x, graph.railBottom));
  for (const wire of graph.wires) parts.push(`<polyline points="${wire.points.map(([x, y]) => `${x},${y}`).join(' ')}"/>`);
  for (const node of graph.nodes) {
    if (node.kind === 'contact') parts.push(contactSymbol(node));
    if (node.kind === 'coil') parts.push(coilSymbol(node));
  }
  if (graph.constant === 'false') {
    const coil = graph.nodes.find((node) => node.kind === 'coil')!;
    parts.push(line(left.x, coil.y, left.x + 40, coil.y), line(coil.x - 40, coil.y, coil.x, coil.y));
  }
  parts.push('</g>', '<g fill="#000000" stroke="none">');
  const coil = graph.nodes.find((node) => node.kind === 'coil')!;
  const labelEnd = graph.width - LADDER.railX - 4;
  const coilChars = Math.floor((labelEnd - (coil.x - LADDER.busLead)) / CHAR_PX);
  parts.push(text(labelEnd, coil.y - 14, fit(output.signal.identifier, coilChars), 'end', output.signal.identifier));
  const titleChars = Math.floor((graph.width - 2 * LADDER.railX) / CHAR_PX);
  const header = output.signal.header.trim();
  const heading = header === output.signal.identifier ? header : `${header} (${output.signal.identifier})`;
  parts.push(text(left.x, 16, fit(heading, titleChars), 'start', heading, 'bold'));
  for (const node of graph.nodes) if (node.kind === 'contact') parts.push(...contactLabels(node, inputs[node.input!]!));
  notes.forEach((note, i) => parts.push(text(left.x, graph.height + 8 + i * LINE_PX, note, 'start')));
  parts.push('</g>', '</svg>');
  return parts.join('\n') + '\n';
}

/** The notes under the rung: what a constant rung means, and the start of the caution. */
function footerLines(output: OutputAnalysis, graph: LadderGraph): string[] {
  const chars = Math.floor((graph.width - 2 * LADDER.railX) / CHAR_PX);
  const lines: string[] = [];
  if (graph.constant === 'true') lines.push(...wrap('Always energised: the form is TRUE, no input matters.', chars));
  if (graph.constant === 'false') lines.push(...wrap('Open rung, never energised: the form is FALSE.', chars));
  const status = output.andOr.proven ? 'proven minimum' : 'heuristic';
  lines.push(...wrap(`${plural(output.andOr.terms, 'branch', 'branches')}, ${plural(output.andOr.literals, 'contact')} (${status}).`, chars));
  lines.push(...wrap(CAUTION_LINES[0]!, chars));
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

/** Header text above the contact (up to two lines), identifier below when it differs. */
function contactLabels(node: LadderNode, signal: Signal): string[] {
  const chars = Math.max(4, Math.floor((node.width - 4) / CHAR_PX));
  const mid = node.x + node.width / 2;
  const header = wrap(signal.header.trim(), chars);
  const shown = header.length > 2 ? [header[0]!, fit(header.slice(1).join(' '), chars)] : header;
  const out = shown.map((lineText, i) => text(mid, node.y - 12 - (shown.length - 1 - i) * LINE_PX, lineText, 'middle', signal.header));
  if (signal.identifier !== signal.header.trim()) {
    const id = wrapIdentifier(signal.identifier, chars);
    id.forEach((lineText, i) => out.push(text(mid, node.y + 22 + i * LINE_PX, lineText, 'middle', signal.identifier)));
  }
  return out;
}

/** An identifier on at most two lines, broken after an underscore. */
function wrapIdentifier(id: string, chars: number): string[] {
  if (id.length <= chars) return [id];
  const cut = id.lastIndexOf('_', chars - 1);
  if (cut <= 0) return [fit(id, chars)];
  return [id.slice(0, cut + 1), fit(id.slice(cut + 1), chars)];
}

function line(x1: number, y1: number, x2: number, y2: number): string {
  return `<line x1="${x1}" y1="${y1}" x2="${x2}" y2="${y2}"/>`;
}

function text(x: number, y: number, content: string, anchor: 'start' | 'middle' | 'end', full = content, weight?: 'bold'): string {
  const tooltip = full !== content ? `<title>${escapeXml(full)}</title>` : '';
  const bold = weight ? ` font-weight="${weight}"` : '';
  return `<text x="${x}" y="${y}" text-anchor="${anchor}"${bold}>${tooltip}${escapeXml(content)}</text>`;
}
