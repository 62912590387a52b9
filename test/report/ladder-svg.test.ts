import { describe, expect, it } from 'vitest';
import { localName, parseXml, textContent, type XmlElement } from '../../src/impl/xml.js';
import { CAUTION } from '../../src/report/caution.js';
import { drawnWires, ladderGraph, ladderSvg } from '../../src/report/ladder-svg.js';
import { analysisOf, GUARD, VOTE } from './fixtures.js';

function svgOf(text: string): XmlElement {
  const root = parseXml(text);
  if (!root.ok) throw new Error(root.error.message);
  return root.value;
}

function all(el: XmlElement): XmlElement[] {
  return [el, ...el.children.flatMap(all)];
}

const LONG = {
  sheet: 'Spindle',
  inputs: ['Guard door A closed', 'Guard door B closed', 'Light curtain clear', 'E-stop healthy', 'Air pressure OK', 'Mode setup', 'Jog pressed'],
  outputs: ['Spindle run permit', 'Never', 'Always'],
  rows: ['1 1 1 1 1 0 0 | 1 0 1', '- - - 1 1 1 1 | 1 0 1', '- - - 0 - - - | 0 0 1', '- - - 1 0 - - | 0 0 1', '0 - - 1 1 0 - | 0 0 1', '1 0 - 1 1 0 - | 0 0 1', '1 1 0 1 1 0 - | 0 0 1', '1 1 1 1 1 0 1 | 0 0 1', '- - - 1 1 1 0 | 0 0 1'],
};

describe('ladder picture', () => {
  const vote = analysisOf(VOTE);
  const long = analysisOf(LONG);

  it('is a well-formed SVG with a title naming the output and the caution as its description', () => {
    const svg = svgOf(ladderSvg(vote.outputs[0]!, vote.inputs));
    expect(localName(svg.name)).toBe('svg');
    const kids = svg.children.map((c) => localName(c.name));
    expect(kids.slice(0, 2)).toEqual(['title', 'desc']);
    expect(textContent(svg.children[0]!)).toBe('Air OK (Air_OK) := (PS1 AND PS2) OR (PS1 AND PS3) OR (PS2 AND PS3)');
    expect(textContent(svg.children[1]!)).toBe(CAUTION);
  });

  it('is at most 320 px wide by default, and everything drawn stays inside its width', () => {
    const svg = svgOf(ladderSvg(long.outputs[0]!, long.inputs));
    const width = Number(svg.attrs['width']);
    expect(width).toBeLessThanOrEqual(320);
    for (const el of all(svg)) {
      for (const a of ['x', 'x1', 'x2']) if (el.attrs[a] !== undefined) expect(Number(el.attrs[a])).toBeLessThanOrEqual(width);
      for (const p of (el.attrs['points'] ?? '').split(' ').filter(Boolean)) expect(Number(p.split(',')[0])).toBeLessThanOrEqual(width);
    }
  });

  it('draws plain black on white, with no text below 11 px', () => {
    const text = ladderSvg(long.outputs[0]!, long.inputs);
    for (const m of text.matchAll(/(?:fill|stroke)="([^"]*)"/g)) expect(['#000000', '#ffffff', 'none']).toContain(m[1]);
    for (const m of text.matchAll(/font-size="([^"]*)"/g)) expect(Number(m[1])).toBeGreaterThanOrEqual(11);
    expect(text).not.toMatch(/style=|class=/);
  });

  it('draws one contact per literal, a slash across each normally closed one, and one coil', () => {
    const output = long.outputs[0]!;
    const svg = svgOf(ladderSvg(output, long.inputs));
    const groups = all(svg).filter((e) => localName(e.name) === 'g' && e.children.every((c) => ['line', 'path'].includes(localName(c.name))));
    const contacts = groups.filter((g) => g.children.filter((c) => localName(c.name) === 'line').length >= 4);
    expect(contacts).toHaveLength(output.andOr.literals);
    const negated = output.andOr.cubes.reduce((s, c) => s + countBits(c.mask & ~c.bits), 0);
    expect(contacts.filter((g) => g.children.length === 5)).toHaveLength(negated);
    expect(groups.filter((g) => g.children.filter((c) => localName(c.name) === 'path').length === 2)).toHaveLength(1);
  });

  it('draws every wire of the graph it is made from', () => {
    const output = long.outputs[0]!;
    const graph = ladderGraph(output.andOr.cubes, long.inputs, 320, output.signal);
    const svg = svgOf(ladderSvg(output, long.inputs));
    const polylines = all(svg).filter((e) => localName(e.name) === 'polyline').map((e) => e.attrs['points']);
    expect(polylines).toEqual(drawnWires(graph).map((w) => w.points.map(([x, y]) => `${x},${y}`).join(' ')));
  });

  it('labels each contact with its header text and, when different, its identifier', () => {
    const text = ladderSvg(vote.outputs[0]!, vote.inputs);
    expect(text.match(/>PS1</g)).toHaveLength(2);
    const guard = analysisOf(GUARD);
    const labels = all(svgOf(ladderSvg(guard.outputs[0]!, guard.inputs))).filter((e) => localName(e.name) === 'text').map((e) => e.text);
    expect(labels).toEqual(expect.arrayContaining(['Guard closed', 'Guard_closed', 'Two-hand OK', 'Two_hand_OK']));
  });

  it('continues a long branch through numbered connectors at task-pane width, and keeps it on one line when wider', () => {
    const output = long.outputs[0]!;
    const narrow = ladderSvg(output, long.inputs);
    const wide = ladderSvg(output, long.inputs, { width: 1200 });
    expect(narrow.match(/<polygon/g)!.length).toBeGreaterThan(0);
    expect(shownText(narrow)).toContain('continues, in series, at the continuation of the same number');
    expect(wide).not.toContain('<polygon');
    expect(Number(svgOf(wide).attrs['width'])).toBeGreaterThan(Number(svgOf(narrow).attrs['width']));
  });

  it('shows the whole coil name and every contact label, however long', () => {
    const texts = all(svgOf(ladderSvg(long.outputs[0]!, long.inputs))).filter((e) => localName(e.name) === 'text').map((e) => e.text);
    expect(texts.join('')).not.toContain('…');
    expect(texts.join(' ')).toContain('Spindle run permit');
  });

  it('a FALSE form is drawn as an open rung with a note, a TRUE form as a plain wire with a note', () => {
    const never = ladderSvg(long.outputs[1]!, long.inputs);
    const always = ladderSvg(long.outputs[2]!, long.inputs);
    expect(shownText(never)).toContain('Open rung, never energised: the form is FALSE.');
    expect(shownText(always)).toContain('Always energised: the form is TRUE, no input');
    for (const svg of [never, always]) {
      expect(svg.match(/<path/g)).toHaveLength(2);
      expect(svg).not.toMatch(/<g><line[^>]*\/><line[^>]*\/><line[^>]*\/><line/);
    }
  });

  it('the visible text starts with the caution\'s first words', () => {
    const labels = all(svgOf(ladderSvg(vote.outputs[0]!, vote.inputs))).filter((e) => localName(e.name) === 'text').map((e) => e.text).join(' ');
    expect(labels).toContain('CAUTION: derived logic is a design aid');
  });
});

/** The visible text of a picture, its lines joined by blanks. */
function shownText(svg: string): string {
  return all(svgOf(svg)).filter((e) => localName(e.name) === 'text').map((e) => e.text).join(' ');
}

function countBits(x: number): number {
  let c = 0;
  for (; x; x &= x - 1) c++;
  return c;
}
