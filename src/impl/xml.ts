// A small XML reader for PLCopen files. It never fetches anything and never expands
// user-defined entities: a DOCTYPE that declares entities is refused outright (this closes
// external-entity reads and entity-expansion bombs), and only the five predefined entities
// and numeric character references are decoded.
import { fail, ok, type Result } from '../logic/index.js';
import { LineError } from './line-error.js';

export interface XmlElement {
  /** Qualified name as written (`ppx:pou` keeps its prefix; see localName). */
  readonly name: string;
  readonly attrs: Readonly<Record<string, string>>;
  readonly children: readonly XmlElement[];
  /** The character data directly inside this element (CDATA included), entities decoded. */
  readonly text: string;
  /** Character data and child elements in document order (mixed content as written). */
  readonly content: readonly (string | XmlElement)[];
  /** 1-based line of the element's `<`. */
  readonly line: number;
  /** 1-based line just after the start tag, where `text` begins. */
  readonly contentLine: number;
}

interface Building {
  name: string;
  attrs: Record<string, string>;
  children: XmlElement[];
  text: string;
  content: (string | XmlElement)[];
  line: number;
  contentLine: number;
}

/** Far deeper than any PLCopen file; keeps the readers' walks over the tree shallow. */
export const MAX_DEPTH = 256;

const PREDEFINED: Readonly<Record<string, string>> = { lt: '<', gt: '>', amp: '&', quot: '"', apos: "'" };
const NAME_START = /[A-Za-z_:\u00C0-\uFFFF]/;
const NAME_CHAR = /[-A-Za-z0-9_:.\u00B7\u00C0-\uFFFF]/;

/** The name without its namespace prefix: `ppx:pou` -> `pou`. */
export function localName(name: string): string {
  const i = name.indexOf(':');
  return i < 0 ? name : name.slice(i + 1);
}

/** Children with the given local name. */
export function childrenNamed(el: XmlElement, name: string): XmlElement[] {
  return el.children.filter((c) => localName(c.name) === name);
}

export function childNamed(el: XmlElement, name: string): XmlElement | undefined {
  return el.children.find((c) => localName(c.name) === name);
}

/** All character data inside the element and its descendants, in document order. */
export function textContent(el: XmlElement): string {
  const parts: string[] = [];
  const stack: (string | XmlElement)[] = [el];
  while (stack.length > 0) {
    const x = stack.pop()!;
    if (typeof x === 'string') parts.push(x);
    else for (let i = x.content.length - 1; i >= 0; i--) stack.push(x.content[i]!);
  }
  return parts.join('');
}

/** Parse a whole document; the result is its root element. */
export function parseXml(text: string): Result<XmlElement> {
  try {
    return ok(new Reader(text).document());
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `line ${e.line}: ${e.message}` });
    throw e;
  }
}

class Reader {
  private pos = 0;
  private line = 1;

  constructor(private readonly src: string) {}

  document(): XmlElement {
    if (this.src.charCodeAt(0) === 0xfeff) this.pos = 1;
    let root: XmlElement | undefined;
    const stack: Building[] = [];
    while (this.pos < this.src.length) {
      const lt = this.src.indexOf('<', this.pos);
      const textEnd = lt < 0 ? this.src.length : lt;
      if (textEnd > this.pos) {
        const startLine = this.line;
        const raw = this.take(textEnd);
        const top = stack[stack.length - 1];
        if (top) {
          const text = this.decode(raw, startLine);
          top.text += text;
          top.content.push(text);
        }
        else if (raw.trim() !== '') throw new LineError(startLine, 'text outside the root element');
      }
      if (lt < 0) break;
      if (this.src.startsWith('<!--', lt)) this.skipPast('-->', 'comment');
      else if (this.src.startsWith('<![CDATA[', lt)) {
        const top = stack[stack.length - 1];
        if (!top) throw new LineError(this.line, 'CDATA outside the root element');
        this.pos += 9;
        const end = this.src.indexOf(']]>', this.pos);
        if (end < 0) throw new LineError(this.line, 'CDATA section is not closed');
        const text = this.take(end);
        top.text += text;
        top.content.push(text);
        this.pos += 3;
      } else if (this.src.startsWith('<?', lt)) this.skipPast('?>', 'processing instruction');
      else if (this.src.startsWith('<!DOCTYPE', lt)) {
        if (root || stack.length > 0) throw new LineError(this.line, 'DOCTYPE after the root element started');
        this.doctype();
      } else if (this.src.startsWith('<!', lt)) throw new LineError(this.line, 'unexpected markup declaration');
      else if (this.src.startsWith('</', lt)) {
        const line = this.line;
        this.pos += 2;
        const name = this.name();
        this.space();
        this.expect('>');
        const open = stack.pop();
        if (!open) throw new LineError(line, `closing tag </${name}> without an opening tag`);
        if (open.name !== name) {
          throw new LineError(line, `closing tag </${name}> does not match <${open.name}> opened on line ${open.line}`);
        }
        const done: XmlElement = open;
        const parent = stack[stack.length - 1];
        if (parent) {
          parent.children.push(done);
          parent.content.push(done);
        } else root = done;
      } else {
        if (root) throw new LineError(this.line, 'a second root element');
        const el = this.startTag();
        if (el.selfClosing) {
          const parent = stack[stack.length - 1];
          if (parent) {
            parent.children.push(el.element);
            parent.content.push(el.element);
          } else root = el.element;
        } else {
          if (stack.length >= MAX_DEPTH) throw new LineError(el.element.line, `elements nest deeper than ${MAX_DEPTH} levels`);
          stack.push(el.element);
        }
      }
    }
    const open = stack.pop();
    if (open) throw new LineError(open.line, `<${open.name}> is not closed`);
    if (!root) throw new LineError(this.line, 'no root element');
    return root;
  }

  /** Advance to `end`, counting lines; returns the text passed over. */
  private take(end: number): string {
    const s = this.src.slice(this.pos, end);
    for (let i = s.indexOf('\n'); i >= 0; i = s.indexOf('\n', i + 1)) this.line++;
    this.pos = end;
    return s;
  }

  private skipPast(end: string, what: string): void {
    const line = this.line;
    const i = this.src.indexOf(end, this.pos);
    if (i < 0) throw new LineError(line, `${what} is not closed`);
    this.take(i + end.length);
  }

  /** Skip a DOCTYPE, refusing any entity declaration in its internal subset. Nothing is fetched. */
  private doctype(): void {
    const line = this.line;
    let i = this.pos + 9;
    let quote = '';
    let depth = 0;
    for (; i < this.src.length; i++) {
      const c = this.src[i]!;
      if (quote) {
        if (c === quote) quote = '';
      } else if (c === '"' || c === "'") quote = c;
      else if (c === '[') depth++;
      else if (c === ']') depth--;
      else if (c === '<' && depth > 0 && this.src.startsWith('<!ENTITY', i)) {
        throw new LineError(line, 'DOCTYPE with entity declarations is not accepted');
      } else if (c === '>' && depth === 0) break;
    }
    if (i >= this.src.length) throw new LineError(line, 'DOCTYPE is not closed');
    this.take(i + 1);
  }

  private startTag(): { element: Building; selfClosing: boolean } {
    const line = this.line;
    this.pos++;
    const name = this.name();
    const attrs: [string, string][] = [];
    const seen = new Set<string>();
    for (;;) {
      const spaced = this.space();
      const c = this.src[this.pos];
      if (c === '>' || c === '/') break;
      if (c === undefined) throw new LineError(line, `<${name}> is not closed`);
      if (!spaced) throw new LineError(this.line, `expected a space before attribute in <${name}>`);
      const attrLine = this.line;
      const key = this.name();
      if (seen.has(key)) throw new LineError(attrLine, `attribute ${key} given twice in <${name}>`);
      seen.add(key);
      this.space();
      this.expect('=');
      this.space();
      attrs.push([key, this.attrValue()]);
    }
    const selfClosing = this.src[this.pos] === '/';
    if (selfClosing) this.pos++;
    this.expect('>');
    const element: Building = {
      name,
      attrs: Object.fromEntries(attrs),
      children: [],
      text: '',
      content: [],
      line,
      contentLine: this.line,
    };
    return { element, selfClosing };
  }

  private attrValue(): string {
    const line = this.line;
    const q = this.src[this.pos];
    if (q !== '"' && q !== "'") throw new LineError(line, 'attribute value must be quoted');
    const end = this.src.indexOf(q, this.pos + 1);
    if (end < 0) throw new LineError(line, 'attribute value is not closed');
    this.pos++;
    const raw = this.take(end);
    this.pos++;
    if (raw.includes('<')) throw new LineError(line, "'<' inside an attribute value");
    return this.decode(raw, line).replace(/[\t\n\r]/g, ' ');
  }

  private name(): string {
    const start = this.pos;
    if (!NAME_START.test(this.src[this.pos] ?? '')) throw new LineError(this.line, 'expected a name');
    this.pos++;
    while (this.pos < this.src.length && NAME_CHAR.test(this.src[this.pos]!)) this.pos++;
    return this.src.slice(start, this.pos);
  }

  private space(): boolean {
    let end = this.pos;
    while (end < this.src.length && /\s/.test(this.src[end]!)) end++;
    if (end === this.pos) return false;
    this.take(end);
    return true;
  }

  private expect(c: string): void {
    if (this.src[this.pos] !== c) throw new LineError(this.line, `expected '${c}'`);
    this.pos++;
  }

  private decode(raw: string, line: number): string {
    if (!raw.includes('&')) return raw;
    return raw.replace(/&([^;\s&<]*);?/g, (whole: string, ref: string, offset: number) => {
      // The line is only worked out for an error: most texts hold many entities.
      const at = (): number => line + (raw.slice(0, offset).match(/\n/g)?.length ?? 0);
      if (!whole.endsWith(';')) throw new LineError(at(), `'&' must start an entity reference ending in ';'`);
      const named = PREDEFINED[ref];
      if (named !== undefined && Object.hasOwn(PREDEFINED, ref)) return named;
      const num = /^#(?:x([0-9A-Fa-f]+)|([0-9]+))$/.exec(ref);
      if (num) {
        const code = num[1] !== undefined ? parseInt(num[1], 16) : parseInt(num[2]!, 10);
        if (code > 0 && code <= 0x10ffff && !(code >= 0xd800 && code <= 0xdfff)) return String.fromCodePoint(code);
        throw new LineError(at(), `character reference &${ref}; is not a valid character`);
      }
      throw new LineError(
        at(),
        `unknown entity &${ref}; (only &lt; &gt; &amp; &quot; &apos; and numeric references are accepted)`,
      );
    });
  }
}
