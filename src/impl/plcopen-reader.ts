// PLCopen XML (TC6 2.0 and 2.01) read back: each POU's interface, and its body in Structured
// Text, Ladder Diagram or FBD. Element names as in the published schemas (tc6_xml_v201.xsd).
import { fail, ok, type Result } from '../logic/index.js';
import { readFbdBody } from './fbd-network.js';
import { functionTable } from './functions.js';
import { readLdBody } from './ld-network.js';
import { tokenize, type Token } from './st-lexer.js';
import { readStBody, stText, type StBlock, type StBody, type StText } from './st-reader.js';
import type { PouHeader } from './symbolic.js';
import type { CannotJudge, ImplPou, ImplProgram, ImplVariable, PouKind, ReadContext, StructType, VarSection } from './types.js';
import { childNamed, childrenNamed, localName, parseXml, type XmlElement } from './xml.js';
import { LineError } from './line-error.js';

export const PLCOPEN_NAMESPACES: readonly string[] = ['http://www.plcopen.org/xml/tc6_0201', 'http://www.plcopen.org/xml/tc6_0200'];

const POU_TYPES: Readonly<Record<string, PouKind>> = {
  program: 'PROGRAM',
  functionBlock: 'FUNCTION_BLOCK',
  function: 'FUNCTION',
};

const VAR_LISTS: Readonly<Record<string, VarSection>> = {
  inputVars: 'input',
  outputVars: 'output',
  inOutVars: 'in-out',
  localVars: 'local',
  tempVars: 'temp',
  externalVars: 'external',
  globalVars: 'global',
};

export function readPlcopen(file: string, text: string): Result<ImplProgram> {
  const parsed = parseXml(text);
  if (!parsed.ok) return fail({ message: `${file} ${parsed.error.message}` });
  const root = parsed.value;
  try {
    if (localName(root.name) !== 'project') throw new LineError(root.line, `root element is <${root.name}>, not a PLCopen <project>`);
    const ns = root.attrs['xmlns'] ?? '';
    if (!PLCOPEN_NAMESPACES.includes(ns)) {
      throw new LineError(root.line, `namespace '${ns}' is not PLCopen TC6 2.01 or 2.0 (${PLCOPEN_NAMESPACES.join(', ')})`);
    }
    const pouElements = descend(root, ['types', 'pous', 'pou']);
    const globals = globalVariables(root);
    const blockTypes = new Set(pouElements.filter((p) => p.attrs['pouType'] === 'functionBlock').map((p) => (p.attrs['name'] ?? '').toUpperCase()));
    const headers = pouElements.map((el) => ({ ...pouHeader(el), el }));
    const functions = functionTable(headers, (h) => readPou(context, h.el, h));
    const context: ReadContext = {
      file,
      globals,
      blockTypes,
      pouVariables: new Map(headers.map((h) => [h.name.toUpperCase(), h.variables])),
      types: dataTypes(root),
      functionNamed: functions.named,
    };
    const pous: ImplPou[] = [];
    for (const h of headers) {
      const read = functions.read(h);
      if (!read.ok) return read;
      pous.push(read.value);
    }
    if (pous.length === 0) throw new LineError(root.line, 'the project has no POU');
    return ok({ file, format: 'plcopen', pous, types: { types: context.types, blockTypes, pouVariables: context.pouVariables } });
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `${file} line ${e.line}: ${e.message}` });
    throw e;
  }
}

function descend(el: XmlElement, path: readonly string[]): XmlElement[] {
  let level = [el];
  for (const name of path) level = level.flatMap((x) => childrenNamed(x, name));
  return level;
}

/** Global variables of configurations and resources. */
function globalVariables(root: XmlElement): ImplVariable[] {
  const configurations = descend(root, ['instances', 'configurations', 'configuration']);
  const lists = [
    ...configurations.flatMap((c) => childrenNamed(c, 'globalVars')),
    ...configurations.flatMap((c) => descend(c, ['resource', 'globalVars'])),
  ];
  return lists.flatMap((l) => variablesOf(l, 'global'));
}

/** A variable list's variables; `constant="true"` on the list makes them constants. */
function variablesOf(list: XmlElement, section: VarSection): ImplVariable[] {
  const constant = list.attrs['constant'] === 'true' || list.attrs['constant'] === '1';
  return childrenNamed(list, 'variable').map((v) => {
    const name = v.attrs['name'];
    if (!name) throw new LineError(v.line, 'a <variable> has no name');
    const initial = childNamed(v, 'initialValue');
    // An initial value other than a simple value (an array, a structure) is kept as its kind, so it is never read as FALSE.
    const value = initial ? (childNamed(initial, 'simpleValue')?.attrs['value'] ?? `<${initial.children[0]?.name ?? 'initialValue'}>`) : undefined;
    const address = v.attrs['address'];
    return {
      name,
      section,
      type: typeName(childNamed(v, 'type')),
      line: v.line,
      ...(value !== undefined ? { initial: value } : {}),
      ...(address ? { address } : {}),
      ...(constant ? { constant } : {}),
    };
  });
}

/**
 * BOOL, INT, a derived type's name (TON, a structure...), an array as ST writes it
 * (`ARRAY [1..8] OF BOOL`), or the kind of another composite type.
 */
function typeName(type: XmlElement | undefined): string {
  const inner = type?.children[0];
  if (!inner) return '';
  const kind = localName(inner.name);
  if (kind === 'array') {
    const bounds = childrenNamed(inner, 'dimension').map((d) => `${d.attrs['lower'] ?? '?'}..${d.attrs['upper'] ?? '?'}`);
    return `ARRAY [${bounds.join(', ')}] OF ${typeName(childNamed(inner, 'baseType'))}`;
  }
  return kind === 'derived' ? (inner.attrs['name'] ?? 'derived') : kind;
}

/** The project's <dataTypes>: structures by their members, other types by what they stand for. */
function dataTypes(root: XmlElement): Map<string, StructType> {
  const out = new Map<string, StructType>();
  for (const t of descend(root, ['types', 'dataTypes', 'dataType'])) {
    const name = t.attrs['name'];
    if (!name) throw new LineError(t.line, 'a <dataType> has no name');
    const base = childNamed(t, 'baseType');
    const struct = base && childNamed(base, 'struct');
    out.set(name.toUpperCase(), struct ? { name, line: t.line, members: variablesOf(struct, 'local') } : { name, line: t.line, members: [], alias: typeName(base) });
  }
  return out;
}

/** A POU's name, kind and interface. */
function pouHeader(el: XmlElement): PouHeader {
  const name = el.attrs['name'];
  if (!name) throw new LineError(el.line, '<pou> has no name');
  const kind = POU_TYPES[el.attrs['pouType'] ?? ''];
  if (!kind) throw new LineError(el.line, `POU ${name} has pouType '${el.attrs['pouType'] ?? ''}' (expected program, functionBlock or function)`);
  const variables: ImplVariable[] = [];
  const face = childNamed(el, 'interface');
  if (face) {
    const returns = childNamed(face, 'returnType');
    if (returns) variables.push({ name, section: 'output', type: typeName(returns), line: returns.line });
    for (const list of face.children) {
      const section = VAR_LISTS[localName(list.name)];
      if (section) variables.push(...variablesOf(list, section));
    }
  }
  return { name, kind, language: 'ST', line: el.line, variables };
}

/** The language element of a <body> (ST, LD, FBD...). */
function bodyContent(body: XmlElement | undefined): XmlElement | undefined {
  return body?.children.find((c) => !['documentation', 'addData'].includes(localName(c.name)));
}

/** An ST body's code in document order (text around child elements too), lines as in the file. */
function stCode(content: XmlElement): { code: string; line: number } {
  const xhtml = content.children[0];
  const holder = xhtml ?? content;
  const line = holder.contentLine;
  const parts: string[] = [];
  let at = line;
  const stack: (string | XmlElement)[] = [...holder.content].reverse();
  while (stack.length > 0) {
    const x = stack.pop()!;
    if (typeof x === 'string') {
      parts.push(x);
      at += x.split('\n').length - 1;
    } else {
      // A child element's text starts where it does in the file.
      if (x.contentLine > at) parts.push('\n'.repeat(x.contentLine - at));
      at = Math.max(at, x.contentLine);
      for (let i = x.content.length - 1; i >= 0; i--) stack.push(x.content[i]!);
    }
  }
  return { code: parts.join(''), line };
}

function stTokens(file: string, what: string, content: XmlElement): { tokens: Token[]; text: StText } {
  const { code, line } = stCode(content);
  const tokens = tokenize(code, line);
  if (!tokens.ok) throw new ReadFailure(`${file} ${tokens.error.message} (${what})`);
  return { tokens: tokens.value, text: stText(code, tokens.value) };
}

/** A lexer error inside an ST body: its message already names the file and line. */
class ReadFailure {
  constructor(readonly message: string) {}
}

function readPou(context: ReadContext, el: XmlElement, face: PouHeader): Result<ImplPou> {
  const name = face.name;
  const content = bodyContent(childNamed(el, 'body'));
  if (!content) throw new LineError(el.line, `POU ${name} has no body`);
  const language = localName(content.name);
  const header = (lang: PouHeader['language']): PouHeader => ({ ...face, language: lang });
  try {
    const { actions, elsewhere } = actionsOf(context.file, el);
    if (language === 'ST') {
      const { tokens, text } = stTokens(context.file, `ST body of ${name}`, content);
      const body: StBody = { tokens, text, actions, elsewhere };
      return readStBody(context, header('ST'), body);
    }
    if (language === 'LD' || language === 'FBD') {
      const read = language === 'LD' ? readLdBody(context, header('LD'), content) : readFbdBody(context, header('FBD'), content);
      // A ladder or FBD body calls no action: what actions and transitions write is not modelled.
      const others = [...actions.map((a) => ({ what: `action ${a.name}`, line: a.line })), ...elsewhere];
      return read.ok && others.length > 0 ? ok(taintAll(read.value, others)) : read;
    }
  } catch (e) {
    if (e instanceof ReadFailure) return fail({ message: e.message });
    throw e;
  }
  if (language === 'IL' || language === 'SFC') return ok(unreadBody(header(language), content.line));
  throw new LineError(content.line, `POU ${name} has a body in <${content.name}>, which is not a PLCopen language`);
}

/** The POU's <actions> (ST bodies are run where the body calls them) and <transitions>. */
function actionsOf(file: string, pou: XmlElement): { actions: StBlock[]; elsewhere: StBody['elsewhere'][number][] } {
  const actions: StBlock[] = [];
  const elsewhere: StBody['elsewhere'][number][] = [];
  for (const a of descend(pou, ['actions', 'action'])) {
    const name = a.attrs['name'] ?? '';
    const content = bodyContent(childNamed(a, 'body'));
    const language = content ? localName(content.name) : 'no';
    if (content && language === 'ST') actions.push({ name, line: a.line, ...stTokens(file, `action ${name}`, content) });
    else elsewhere.push({ what: `action ${name}`, line: a.line, everyOutput: `its ${language} body is not read, so what it writes is not known` });
  }
  for (const t of descend(pou, ['transitions', 'transition'])) {
    elsewhere.push({ what: `transition ${t.attrs['name'] ?? ''}`, line: t.line, everyOutput: 'sequential function chart elements are not read' });
  }
  return { actions, elsewhere };
}

/** Every output of a POU unchecked for the given reasons (what it cannot see may write them). */
function taintAll(pou: ImplPou, others: readonly { what: string; line: number }[]): ImplPou {
  const items: CannotJudge[] = others.map((o) => ({ kind: 'unsupported', pou: pou.name, line: o.line, what: `${o.what} (line ${o.line}) of ${pou.name} is not run with the ladder body` }));
  return {
    ...pou,
    outputs: pou.outputs.map((o) => ({ name: o.name, section: o.section, line: o.line, cannotJudge: [...o.cannotJudge, ...items] })),
    cannotJudge: [...pou.cannotJudge, ...items],
  };
}

/** A body in a language not read: every output variable is reported, none judged. */
function unreadBody(header: PouHeader, line: number): ImplPou {
  const item = { kind: 'unsupported' as const, pou: header.name, line, what: `${header.language} body of ${header.name} is not read` };
  const outputs = header.variables
    .filter((v) => (v.section === 'output' || v.section === 'in-out') && v.type.toUpperCase() === 'BOOL')
    .map((v) => ({ name: v.name, section: v.section, line, cannotJudge: [item] }));
  return { ...header, paths: [], inputs: [], undriven: [], outputs, cannotJudge: [item], notes: [] };
}
