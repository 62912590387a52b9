// PLCopen XML (TC6 2.0 and 2.01) read back: each POU's interface, and its body in Structured
// Text, Ladder Diagram or FBD. Element names as in the published schemas (tc6_xml_v201.xsd).
import { fail, ok, type Result } from '../logic/result.js';
import { readFbdBody } from './fbd-network.js';
import { readLdBody } from './ld-network.js';
import { tokenize } from './st-lexer.js';
import { readStBody } from './st-reader.js';
import type { PouHeader } from './symbolic.js';
import type { ImplPou, ImplProgram, ImplVariable, PouKind, VarSection } from './types.js';
import { childNamed, childrenNamed, localName, parseXml, textContent, type XmlElement } from './xml.js';
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
    const pous: ImplPou[] = [];
    for (const el of pouElements) {
      const read = readPou(file, el, globals, blockTypes);
      if (!read.ok) return read;
      pous.push(read.value);
    }
    if (pous.length === 0) throw new LineError(root.line, 'the project has no POU');
    return ok({ file, format: 'plcopen', pous });
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

function variablesOf(list: XmlElement, section: VarSection): ImplVariable[] {
  return childrenNamed(list, 'variable').map((v) => {
    const name = v.attrs['name'];
    if (!name) throw new LineError(v.line, 'a <variable> has no name');
    const initial = childNamed(v, 'initialValue');
    const simple = initial ? childNamed(initial, 'simpleValue')?.attrs['value'] : undefined;
    return { name, section, type: typeName(childNamed(v, 'type')), line: v.line, ...(simple !== undefined ? { initial: simple } : {}) };
  });
}

/** BOOL, INT, a derived type's name (TON, a structure...), or the kind of a composite type. */
function typeName(type: XmlElement | undefined): string {
  const inner = type?.children[0];
  if (!inner) return '';
  const kind = localName(inner.name);
  return kind === 'derived' ? (inner.attrs['name'] ?? 'derived') : kind;
}

function readPou(file: string, el: XmlElement, globals: readonly ImplVariable[], blockTypes: ReadonlySet<string>): Result<ImplPou> {
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
  const body = childNamed(el, 'body');
  const content = body?.children.find((c) => !['documentation', 'addData'].includes(localName(c.name)));
  if (!body || !content) throw new LineError(el.line, `POU ${name} has no body`);
  const language = localName(content.name);
  const header = (lang: PouHeader['language']): PouHeader => ({ name, kind, language: lang, line: el.line, variables });
  if (language === 'ST') {
    const xhtml = content.children[0];
    const code = xhtml ? textContent(xhtml) : content.text;
    const tokens = tokenize(code, xhtml ? xhtml.contentLine : content.contentLine);
    if (!tokens.ok) return fail({ message: `${file} ${tokens.error.message} (ST body of ${name})` });
    return readStBody({ file, source: code, globals, blockTypes }, header('ST'), tokens.value);
  }
  if (language === 'LD') return readLdBody({ file, globals, blockTypes }, header('LD'), content);
  if (language === 'FBD') return readFbdBody({ file, globals, blockTypes }, header('FBD'), content);
  if (language === 'IL' || language === 'SFC') return ok(unreadBody(header(language), content.line));
  throw new LineError(content.line, `POU ${name} has a body in <${content.name}>, which is not a PLCopen language`);
}

/** A body in a language not read: every output variable is reported, none judged. */
function unreadBody(header: PouHeader, line: number): ImplPou {
  const item = { kind: 'unsupported' as const, pou: header.name, line, what: `${header.language} body of ${header.name} is not read` };
  const outputs = header.variables
    .filter((v) => (v.section === 'output' || v.section === 'in-out') && v.type.toUpperCase() === 'BOOL')
    .map((v) => ({ name: v.name, section: v.section, line, cannotJudge: [item] }));
  return { ...header, inputs: [], outputs, cannotJudge: [item], notes: [] };
}
