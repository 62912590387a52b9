import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readImplementation } from '../../src/impl/read.js';
import { childNamed, localName, parseXml, textContent, type XmlElement } from '../../src/impl/xml.js';

const fixture = (name: string): string => readFileSync(join(import.meta.dirname, 'fixtures', name), 'utf8');

function parsed(text: string): XmlElement {
  const r = parseXml(text);
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

function errorOf(text: string): string {
  const r = parseXml(text);
  if (r.ok) throw new Error('expected a failure');
  return r.error.message;
}

describe('XML reader', () => {
  it('keeps mixed content in document order: text around child elements reads as written', () => {
    const root = parsed('<x>one <b>two</b> three <![CDATA[four]]><c>five<d>six</d></c></x>');
    expect(textContent(root)).toBe('one two three fourfivesix');
    expect(root.content.map((c) => (typeof c === 'string' ? c : `<${c.name}>`))).toEqual(['one ', '<b>', ' three ', 'four', '<c>']);
  });

  it('reads elements, attributes, text and the line of each element', () => {
    const root = parsed('<?xml version="1.0"?>\n<!-- note -->\n<a x="1" y=\'two\'>\n  <b>hi</b>\n  <c/>\n</a>\n');
    expect(root.name).toBe('a');
    expect(root.attrs).toEqual({ x: '1', y: 'two' });
    expect(root.line).toBe(3);
    expect(root.children.map((c) => [c.name, c.line])).toEqual([['b', 4], ['c', 5]]);
    expect(root.children[0]!.text).toBe('hi');
  });

  it('decodes the five predefined entities and numeric character references', () => {
    const root = parsed('<a t="&lt;&amp;&#65;">&lt;&gt;&amp;&quot;&apos; &#x263A; &#66;</a>');
    expect(root.text).toBe(`<>&"' \u263A B`);
    expect(root.attrs['t']).toBe('<&A');
  });

  it('keeps CDATA as text and tells where the text of an element starts', () => {
    const root = parsed('<a>\n<b\n  k="v">x := a &lt; b;<![CDATA[ <raw> & ]]></b></a>');
    const b = root.children[0]!;
    expect(b.text).toBe('x := a < b; <raw> & ');
    expect(b.line).toBe(2);
    expect(b.contentLine).toBe(3);
  });

  it('strips a namespace prefix in localName and finds children by local name', () => {
    const root = parsed('<p:project xmlns:p="urn:x"><p:types>t<p:i>u</p:i></p:types></p:project>');
    expect(localName(root.name)).toBe('project');
    const types = childNamed(root, 'types')!;
    expect(textContent(types)).toBe('tu');
  });

  it('names the line of a closing tag that does not match', () => {
    expect(errorOf('<a>\n<b>\n</a>')).toBe('line 3: closing tag </a> does not match <b> opened on line 2');
  });

  it('refuses an unclosed element, a second root and text outside the root', () => {
    expect(errorOf('<a>\n<b></b>')).toBe('line 1: <a> is not closed');
    expect(errorOf('<a/><b/>')).toMatch(/second root element/);
    expect(errorOf('<a/>junk')).toMatch(/text outside the root element/);
  });

  it('refuses an attribute given twice and an unquoted value', () => {
    expect(errorOf('<a x="1" x="2"/>')).toMatch(/attribute x given twice/);
    expect(errorOf('<a x=1/>')).toMatch(/must be quoted/);
  });

  it('refuses an unknown entity rather than leaving it or guessing', () => {
    expect(errorOf('<a>\n&nbsp;</a>')).toBe(
      'line 2: unknown entity &nbsp; (only &lt; &gt; &amp; &quot; &apos; and numeric references are accepted)',
    );
  });

  it('refuses elements nested deeper than it reads', () => {
    expect(errorOf('<a>'.repeat(300) + '</a>'.repeat(300))).toBe('line 1: elements nest deeper than 256 levels');
  });

  it('refuses an external entity (XXE) before reading any of the document', () => {
    expect(errorOf(fixture('xxe.xml'))).toBe('line 3: DOCTYPE with entity declarations is not accepted');
  });

  it('refuses an entity-expansion bomb ("billion laughs") at once', () => {
    expect(errorOf(fixture('billion-laughs.xml'))).toBe('line 3: DOCTYPE with entity declarations is not accepted');
  });

  it('reports both attack files through readImplementation with the file name', () => {
    const r = readImplementation('attack.xml', fixture('xxe.xml'));
    expect(r.ok ? '' : r.error.message).toBe('attack.xml line 3: DOCTYPE with entity declarations is not accepted');
  });

  it('skips a DOCTYPE that only names an external DTD, which it never fetches; its entities stay unknown', () => {
    expect(parsed('<!DOCTYPE a SYSTEM "http://example.invalid/a.dtd">\n<a>x</a>').text).toBe('x');
    expect(errorOf('<!DOCTYPE a SYSTEM "http://example.invalid/a.dtd">\n<a>&ext;</a>')).toMatch(/^line 2: unknown entity &ext;/);
  });

  it('reads back any tree it is given in escaped form (property)', () => {
    const name = fc.stringMatching(/^[a-z][a-z0-9]{0,5}$/);
    const text = fc.string({ maxLength: 12 }).map((s) => s.replace(/[^\t\n\u0020-\uD7FF]/g, ''));
    const escape = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
    interface Tree {
      name: string;
      attr: string;
      text: string;
      children: Tree[];
    }
    const treeAt = (depth: number): fc.Arbitrary<Tree> =>
      fc.record({ name, attr: text, text, children: depth === 0 ? fc.constant([]) : fc.array(treeAt(depth - 1), { maxLength: 3 }) });
    const tree = treeAt(3);
    const write = (t: Tree): string => `<${t.name} v="${escape(t.attr)}">${escape(t.text)}${t.children.map(write).join('')}</${t.name}>`;
    const same = (t: Tree, e: XmlElement): void => {
      expect(e.name).toBe(t.name);
      expect(e.attrs['v']).toBe(t.attr.replace(/[\t\n]/g, ' '));
      expect(e.text).toBe(t.text);
      expect(e.children.length).toBe(t.children.length);
      t.children.forEach((c, i) => same(c, e.children[i]!));
    };
    fc.assert(fc.property(tree, (t) => same(t, parsed(write(t)))), { numRuns: 200 });
  });
});
