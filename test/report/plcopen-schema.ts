// The parts of the PLCopen TC6 XML schema, version 2.01, that our export uses: element order
// (content models) and required attributes, transcribed by hand from the published schema
// tc6_xml_v201.xsd (PLCopen, targetNamespace http://www.plcopen.org/xml/tc6_0201; read from
// a public copy of the file, which states no licence, so it is not committed here).
// Only the elements we write are listed; a check fails on any element not listed.
import { localName, type XmlElement } from '../../src/impl/xml.js';

/**
 * Content models as lists of particles: `name` once, `name?` optional, `name*` repeated,
 * `(a|b)` a choice, `(a|b)*` a repeated choice. Keyed by element name, or by
 * `parent/name` where the same name has different models in different places.
 */
const VARS = '(localVars|tempVars|inputVars|outputVars|inOutVars|externalVars|globalVars|accessVars)*';
const LD_OBJECTS = '(comment|error|connector|continuation|actionBlock|vendorElement|block|inVariable|outVariable|inOutVariable|label|jump|return|leftPowerRail|rightPowerRail|coil|contact)*';
const VARIABLE = ['type', 'initialValue?', 'addData?', 'documentation?'];
const VAR_LIST = ['variable*', 'addData?', 'documentation?'];
const CONTACT = ['position', 'connectionPointIn?', 'connectionPointOut?', 'variable', 'addData?', 'documentation?'];

export const CONTENT: Readonly<Record<string, readonly string[]>> = {
  project: ['fileHeader', 'contentHeader', 'types', 'instances', 'addData?', 'documentation?'],
  fileHeader: [],
  contentHeader: ['Comment?', 'coordinateInfo', 'addDataInfo?', 'addData?'],
  Comment: [],
  coordinateInfo: ['pageSize?', 'fbd', 'ld', 'sfc'],
  fbd: ['scaling'],
  ld: ['scaling'],
  sfc: ['scaling'],
  scaling: [],
  types: ['dataTypes', 'pous'],
  dataTypes: ['dataType*'],
  pous: ['pou*'],
  pou: ['interface?', 'actions?', 'transitions?', 'body*', 'addData?', 'documentation?'],
  interface: ['returnType?', VARS, 'addData?', 'documentation?'],
  inputVars: VAR_LIST,
  outputVars: VAR_LIST,
  'inputVars/variable': VARIABLE,
  'outputVars/variable': VARIABLE,
  type: ['(BOOL|BYTE|WORD|DWORD|LWORD|SINT|INT|DINT|LINT|USINT|UINT|UDINT|ULINT|REAL|LREAL|TIME|DATE|DT|TOD|string|wstring|array|derived|enum|struct|subrangeSigned|subrangeUnsigned|pointer)'],
  BOOL: [],
  body: ['(IL|ST|FBD|LD|SFC)', 'addData?', 'documentation?'],
  LD: [LD_OBJECTS],
  instances: ['configurations'],
  configurations: ['configuration*'],
  leftPowerRail: ['position', 'connectionPointOut*', 'addData?', 'documentation?'],
  rightPowerRail: ['position', 'connectionPointIn*', 'addData?', 'documentation?'],
  contact: CONTACT,
  coil: CONTACT,
  // connector and continuation: from memory of the same schema (commonObjects).
  connector: ['position', 'connectionPointIn?', 'addData?', 'documentation?'],
  continuation: ['position', 'connectionPointOut?', 'addData?', 'documentation?'],
  'contact/variable': [],
  'coil/variable': [],
  comment: ['position', 'content', 'addData?', 'documentation?'],
  position: [],
  relPosition: [],
  connectionPointIn: ['relPosition?', '(connection*|expression)?', 'addData?'],
  connectionPointOut: ['relPosition?', 'expression?', 'addData?'],
  connection: ['position*', 'addData?'],
};

/** Elements of type formattedText: exactly one element of the XHTML namespace inside. */
export const FORMATTED_TEXT = new Set(['ST', 'IL', 'documentation', 'content']);

export const REQUIRED: Readonly<Record<string, readonly string[]>> = {
  fileHeader: ['companyName', 'productName', 'productVersion', 'creationDateTime'],
  contentHeader: ['name'],
  scaling: ['x', 'y'],
  pou: ['name', 'pouType'],
  'inputVars/variable': ['name'],
  'outputVars/variable': ['name'],
  leftPowerRail: ['localId'],
  'leftPowerRail/connectionPointOut': ['formalParameter'],
  rightPowerRail: ['localId'],
  contact: ['localId'],
  coil: ['localId'],
  connector: ['name', 'localId'],
  continuation: ['name', 'localId'],
  comment: ['localId', 'height', 'width'],
  position: ['x', 'y'],
  relPosition: ['x', 'y'],
  connection: ['refLocalId'],
};

/** Simple types of the attributes we write (xsd:decimal, xsd:unsignedLong, xsd:boolean, ppx:pouType, xsd:dateTime). */
export const ATTRIBUTE_TYPES: Readonly<Record<string, RegExp>> = {
  x: /^-?\d+(\.\d+)?$/,
  y: /^-?\d+(\.\d+)?$/,
  height: /^-?\d+(\.\d+)?$/,
  width: /^-?\d+(\.\d+)?$/,
  localId: /^\d+$/,
  refLocalId: /^\d+$/,
  negated: /^(true|false|1|0)$/,
  pouType: /^(function|functionBlock|program)$/,
  creationDateTime: /^-?\d{4,}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})?$/,
  modificationDateTime: /^-?\d{4,}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})?$/,
};

export const XHTML = 'http://www.w3.org/1999/xhtml';

/** Everything in the tree that breaks the rules above, as readable lines (empty: conforms). */
export function schemaViolations(root: XmlElement): string[] {
  const out: string[] = [];
  const walk = (el: XmlElement, parent: string, path: string): void => {
    const name = localName(el.name);
    const scoped = `${parent}/${name}`;
    const here = `${path}/${name}`;
    for (const a of REQUIRED[scoped] ?? REQUIRED[name] ?? []) if (el.attrs[a] === undefined) out.push(`${here}: required attribute ${a} missing (line ${el.line})`);
    for (const [a, v] of Object.entries(el.attrs)) {
      const type = ATTRIBUTE_TYPES[a];
      if (type && !(name === 'connectionPointOut' && a === 'formalParameter') && !type.test(v)) out.push(`${here}: attribute ${a}="${v}" is not of its type`);
    }
    if (FORMATTED_TEXT.has(name)) {
      if (el.children.length !== 1 || el.children[0]!.attrs['xmlns'] !== XHTML) out.push(`${here}: formatted text must hold one XHTML element`);
      return;
    }
    const model = CONTENT[scoped] ?? CONTENT[name];
    if (model === undefined) {
      out.push(`${here}: element not in the schema's content model here (line ${el.line})`);
      return;
    }
    const sequence = el.children.map((c) => `${localName(c.name)} `).join('');
    if (!contentPattern(model).test(sequence)) out.push(`${here}: children "${sequence.trim()}" do not match (${model.join(', ')})`);
    for (const c of el.children) walk(c, name, here);
  };
  walk(root, '', '');
  return out;
}

function contentPattern(model: readonly string[]): RegExp {
  const particle = (p: string): string => {
    const m = /^(\(([^)]*)\)|[A-Za-z]+)([?*]?)$/.exec(p);
    if (!m) throw new Error(`bad particle ${p}`);
    const alternatives = (m[2] ?? m[1]!).split('|').map((a) => {
      const inner = /^([A-Za-z]+)([?*]?)$/.exec(a)!;
      return `(?:${inner[1]} )${inner[2]}`;
    });
    return `(?:${alternatives.join('|')})${m[3]}`;
  };
  return new RegExp(`^${model.map(particle).join('')}$`);
}
