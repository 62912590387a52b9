// PLCopen XML export. The structure is checked against the element order and required
// attributes of the PLCopen TC6 XML schema version 2.01 (tc6_xml_v201.xsd, PLCopen; the rules
// used are transcribed in ./plcopen-schema.ts).
import { describe, expect, it } from 'vitest';
import { add, emptySet, type BitSet } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { prove } from '../../src/logic/proof.js';
import { childNamed, childrenNamed, localName, parseXml, textContent, type XmlElement } from '../../src/impl/xml.js';
import type { TableAnalysis } from '../../src/analysis/analysis-types.js';
import { CAUTION, CAUTION_LINES } from '../../src/report/caution.js';
import { exportPlcopen, PLCOPEN_NAMESPACE } from '../../src/report/plcopen-export.js';
import { analysisOf, GUARD, VOTE } from './fixtures.js';
import { schemaViolations } from './plcopen-schema.js';

const source = { workbook: 'capper-cell.xlsx' };

function parsed(xml: string): XmlElement {
  const root = parseXml(xml);
  if (!root.ok) throw new Error(root.error.message);
  return root.value;
}

function path(el: XmlElement, ...names: string[]): XmlElement {
  let at = el;
  for (const name of names) {
    const next = childNamed(at, name);
    if (!next) throw new Error(`no ${name} under ${at.name}`);
    at = next;
  }
  return at;
}

const pous = (root: XmlElement) => childrenNamed(path(root, 'types', 'pous'), 'pou');

/** The function each coil of an LD body computes: power flow from the left rail through closed contacts. */
function ladderFunctions(ld: XmlElement, analysis: TableAnalysis): Map<string, BitSet> {
  const n = analysis.inputs.length;
  const byId = new Map(ld.children.filter((e) => e.attrs['localId'] !== undefined).map((e) => [e.attrs['localId']!, e]));
  const sources = (e: XmlElement): string[] =>
    childrenNamed(e, 'connectionPointIn').flatMap((p) => childrenNamed(p, 'connection').map((c) => c.attrs['refLocalId']!));
  const out = new Map<string, BitSet>();
  for (const coil of childrenNamed(ld, 'coil')) {
    const values = emptySet(n);
    for (let k = 0; k < 2 ** n; k++) {
      const energised = (e: XmlElement, depth: number): boolean => {
        if (depth > 1000) throw new Error('a cycle in the rung');
        const kind = localName(e.name);
        if (kind === 'leftPowerRail') return true;
        if (kind === 'contact') {
          const input = analysis.inputs.findIndex((s) => s.identifier === textContent(path(e, 'variable')));
          const v = (k >>> (n - 1 - input)) & 1;
          const closed = e.attrs['negated'] === 'true' ? v === 0 : v === 1;
          if (!closed) return false;
        }
        return sources(e).some((id) => energised(byId.get(id)!, depth + 1));
      };
      if (energised(coil, 0)) add(values, k);
    }
    out.set(textContent(path(coil, 'variable')), values);
  }
  return out;
}

/** Assignments of an ST body, comments removed. */
function stAssignments(st: string): { target: string; text: string }[] {
  const code = st.replace(/\(\*[\s\S]*?\*\)/g, ' ');
  return [...code.matchAll(/(\w+)\s*:=\s*([^;]*);/g)].map((m) => ({ target: m[1]!, text: m[2]!.replace(/\s+/g, ' ').trim() }));
}

describe('PLCopen XML export', () => {
  const guard = analysisOf(GUARD);
  const vote = analysisOf(VOTE);

  for (const body of ['ST', 'LD'] as const) {
    it(`with ${body} bodies it follows the element order and required attributes of tc6_xml_v201.xsd`, () => {
      const root = parsed(exportPlcopen([guard, vote], { body, source, date: '2026-03-04' }));
      expect(localName(root.name)).toBe('project');
      expect(root.attrs['xmlns']).toBe(PLCOPEN_NAMESPACE);
      expect(schemaViolations(root)).toEqual([]);
    });
  }

  it('the structural check itself rejects misordered children and missing required attributes', () => {
    const good = parsed(exportPlcopen([vote], { body: 'LD', source }));
    const swapped = { ...good, children: [good.children[1]!, good.children[0]!, ...good.children.slice(2)] };
    expect(schemaViolations(swapped).join('\n')).toMatch(/project: children/);
    const pou = pous(good)[0]!;
    const { pouType: _dropped, ...attrs } = pou.attrs;
    const noType = { ...pou, attrs };
    expect(schemaViolations(noType).join('\n')).toMatch(/required attribute pouType missing/);
  });

  it('the file header names the product and a creation date-time', () => {
    const root = parsed(exportPlcopen([vote], { source, date: '2026-03-04' }));
    const header = path(root, 'fileHeader');
    expect(header.attrs['productName']).toBe('Interlock Algebra');
    expect(header.attrs['creationDateTime']).toBe('2026-03-04T00:00:00');
    const scales = childrenNamed(path(root, 'contentHeader', 'coordinateInfo'), 'fbd').length;
    expect(scales).toBe(1);
  });

  it('one POU per table, a function block by default or a program, with BOOL variables named by identifier', () => {
    const root = parsed(exportPlcopen([guard, vote], { source, kind: 'PROGRAM' }));
    expect(pous(root).map((p) => [p.attrs['name'], p.attrs['pouType']])).toEqual([
      ['Guard_logic', 'program'],
      ['Vote', 'program'],
    ]);
    const iface = path(pous(root)[0]!, 'interface');
    const names = (list: string) => childrenNamed(path(iface, list), 'variable').map((v) => v.attrs['name']);
    expect(names('inputVars')).toEqual(['Guard_closed', 'Two_hand_OK', 'Mode_setup']);
    expect(names('outputVars')).toEqual(['Motor_permit', 'Lamp']);
    for (const v of childrenNamed(path(iface, 'inputVars'), 'variable')) expect(childNamed(path(v, 'type'), 'BOOL')).toBeDefined();
    expect(pous(parsed(exportPlcopen([vote], { source })))[0]!.attrs['pouType']).toBe('functionBlock');
  });

  for (const form of ['andOr', 'xor', 'bestXor'] as const) {
    it(`the ST body of the ${form} form is one XHTML element whose assignments parse back and prove equal`, () => {
      const root = parsed(exportPlcopen([guard, vote], { source, form }));
      pous(root).forEach((pou, t) => {
        const analysis = [guard, vote][t]!;
        const st = path(pou, 'body', 'ST');
        expect(st.children).toHaveLength(1);
        expect(st.children[0]!.attrs['xmlns']).toBe('http://www.w3.org/1999/xhtml');
        const assignments = stAssignments(textContent(st));
        expect(assignments.map((a) => a.target)).toEqual(analysis.outputs.map((o) => o.signal.identifier));
        assignments.forEach((a, j) => {
          const expr = parseExpression(a.text, analysis.inputs);
          if (!expr.ok) throw new Error(expr.error.message);
          expect(prove(analysis.table.outputs[j]!.built.fn, truthTable(expr.value, analysis.inputs.length)).mismatchCount).toBe(0);
        });
      });
    });
  }

  it('the LD body computes each output\'s AND/OR form: contacts in series per term, branches joined at the coil', () => {
    const root = parsed(exportPlcopen([guard, vote], { body: 'LD', source }));
    pous(root).forEach((pou, t) => {
      const analysis = [guard, vote][t]!;
      const functions = ladderFunctions(path(pou, 'body', 'LD'), analysis);
      expect([...functions.keys()]).toEqual(analysis.outputs.map((o) => o.signal.identifier));
      analysis.outputs.forEach((o, j) => {
        expect(prove(analysis.table.outputs[j]!.built.fn, functions.get(o.signal.identifier)!).mismatchCount).toBe(0);
      });
    });
  });

  it('the coil of an OR has one connection per branch in its connectionPointIn', () => {
    const root = parsed(exportPlcopen([vote], { body: 'LD', source }));
    const coil = childrenNamed(path(pous(root)[0]!, 'body', 'LD'), 'coil')[0]!;
    expect(childrenNamed(path(coil, 'connectionPointIn'), 'connection')).toHaveLength(3);
  });

  it('constant forms give a wired rung (TRUE) and an open rung (FALSE), each with a comment', () => {
    const constants = analysisOf({ sheet: 'Const', inputs: ['A', 'B'], outputs: ['Lit', 'Dark'], rows: ['- - | 1 0'] });
    const ld = path(pous(parsed(exportPlcopen([constants], { body: 'LD', source })))[0]!, 'body', 'LD');
    const functions = ladderFunctions(ld, constants);
    expect([...functions.get('Lit')!]).toEqual([0b1111]);
    expect([...functions.get('Dark')!]).toEqual([0]);
    const comments = childrenNamed(ld, 'comment').map(textContent).join('\n');
    expect(comments).toContain('always energised');
    expect(comments).toContain('open rung, never energised');
  });

  it('local ids are unique in a body and every connection refers to one of them', () => {
    const root = parsed(exportPlcopen([guard, vote], { body: 'LD', source }));
    for (const pou of pous(root)) {
      const ld = path(pou, 'body', 'LD');
      const ids = ld.children.map((e) => e.attrs['localId']!);
      expect(new Set(ids).size).toBe(ids.length);
      const refs: string[] = [];
      const walk = (e: XmlElement) => {
        if (localName(e.name) === 'connection') refs.push(e.attrs['refLocalId']!);
        e.children.forEach(walk);
      };
      walk(ld);
      for (const r of refs) expect(ids).toContain(r);
    }
  });

  it('carries the caution in an XML comment, the content header Comment, and the documentation', () => {
    const xml = exportPlcopen([vote], { source });
    expect(xml).toContain(`<!-- ${CAUTION_LINES[0]} -->`);
    const root = parsed(xml);
    expect(textContent(path(root, 'contentHeader', 'Comment'))).toBe(CAUTION);
    expect(textContent(path(root, 'documentation'))).toContain(CAUTION);
    expect(textContent(path(pous(root)[0]!, 'documentation'))).toContain(CAUTION);
    expect(textContent(path(pous(root)[0]!, 'body', 'ST'))).toContain(CAUTION_LINES[0]);
  });

  it('markup characters in headers and the workbook name are escaped and read back as written', () => {
    const odd = analysisOf({ ...VOTE, sheet: 'A&B', inputs: ['P<1>', 'P "2"', "P '3' & --"] });
    const xml = exportPlcopen([odd], { source: { workbook: 'a<b>&c--d.xlsx' } });
    const root = parsed(xml);
    const docs = childrenNamed(path(pous(root)[0]!, 'interface', 'inputVars'), 'variable').map((v) => textContent(path(v, 'documentation')).trim());
    expect(docs).toEqual(['P<1>', 'P "2"', "P '3' & --"]);
    expect(path(root, 'fileHeader').attrs['contentDescription']).toContain('a<b>&c--d.xlsx');
    expect(schemaViolations(root)).toEqual([]);
  });
});
