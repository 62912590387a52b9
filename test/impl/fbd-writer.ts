// A small FBD writer for the tests: PLCopen TC6 2.01 elements in the schema's order
// (see ../report/plcopen-schema.ts), one element per call. Positions are a plain grid; they
// carry no logic.

/** Where an input pin or an output variable takes its value from. */
export interface Wire {
  readonly from: number;
  /** The source block's output pin (formalParameter on the connection). */
  readonly pin?: string;
}

export interface BlockPin extends Wire {
  readonly param: string;
  readonly negated?: boolean;
}

const at = (id: number): string => `<position x="${(id % 10) * 60}" y="${Math.floor(id / 10) * 40}"/>`;
const pointOut = '<connectionPointOut><relPosition x="40" y="10"/></connectionPointOut>';
const pointIn = (wires: readonly Wire[]): string =>
  `<connectionPointIn><relPosition x="0" y="10"/>${wires
    .map((w) => `<connection refLocalId="${w.from}"${w.pin ? ` formalParameter="${w.pin}"` : ''}/>`)
    .join('')}</connectionPointIn>`;
const attrs = (a: Record<string, string | number | boolean | undefined>): string =>
  Object.entries(a)
    .filter(([, v]) => v !== undefined && v !== false)
    .map(([k, v]) => ` ${k}="${v}"`)
    .join('');

export function inVariable(id: number, expression: string, options: { negated?: boolean } = {}): string {
  return `<inVariable${attrs({ localId: id, height: 20, width: 40, negated: options.negated })}>${at(id)}${pointOut}<expression>${expression}</expression></inVariable>`;
}

export function outVariable(id: number, expression: string, wire: Wire | null, options: { negated?: boolean; order?: number } = {}): string {
  return `<outVariable${attrs({ localId: id, height: 20, width: 40, executionOrderId: options.order, negated: options.negated })}>${at(id)}${
    wire ? pointIn([wire]) : ''
  }<expression>${expression}</expression></outVariable>`;
}

export function inOutVariable(id: number, expression: string, wire: Wire | null, options: { negatedIn?: boolean; negatedOut?: boolean; order?: number } = {}): string {
  const a = attrs({ localId: id, height: 20, width: 40, executionOrderId: options.order, negatedIn: options.negatedIn, negatedOut: options.negatedOut });
  return `<inOutVariable${a}>${at(id)}${wire ? pointIn([wire]) : ''}${pointOut}<expression>${expression}</expression></inOutVariable>`;
}

export function block(
  id: number,
  typeName: string,
  inputs: readonly BlockPin[],
  outputs: readonly (string | { param: string; negated: boolean })[] = ['OUT'],
  options: { instance?: string; order?: number } = {},
): string {
  const ins = inputs.map((p) => `<variable${attrs({ formalParameter: p.param, negated: p.negated })}>${pointIn([p])}</variable>`).join('');
  const outs = outputs
    .map((o) => (typeof o === 'string' ? { param: o, negated: false } : o))
    .map((o) => `<variable${attrs({ formalParameter: o.param, negated: o.negated })}>${pointOut}</variable>`)
    .join('');
  const a = attrs({ localId: id, width: 60, height: 20 + 20 * inputs.length, typeName, instanceName: options.instance, executionOrderId: options.order });
  return `<block${a}>${at(id)}<inputVariables>${ins}</inputVariables><inOutVariables/><outputVariables>${outs}</outputVariables></block>`;
}

export function connector(id: number, name: string, wire: Wire): string {
  return `<connector${attrs({ name, localId: id, height: 20, width: 40 })}>${at(id)}${pointIn([wire])}</connector>`;
}

export function continuation(id: number, name: string): string {
  return `<continuation${attrs({ name, localId: id, height: 20, width: 40 })}>${at(id)}${pointOut}</continuation>`;
}

export interface Interface {
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** name -> type (BOOL, a block type such as TON, a structure of `structs`, or `ARRAY [l..u] OF BOOL`). */
  readonly locals?: Readonly<Record<string, string>>;
  /** Structure types of the project: name -> its BOOL members. */
  readonly structs?: Readonly<Record<string, readonly string[]>>;
}

function typeXml(type: string): string {
  const array = /^ARRAY \[(-?\d+)\.\.(-?\d+)\] OF BOOL$/.exec(type);
  if (array) return `<array><dimension lower="${array[1]}" upper="${array[2]}"/><baseType><BOOL/></baseType></array>`;
  return type === 'BOOL' ? '<BOOL/>' : `<derived name="${type}"/>`;
}

const declare = (name: string, type: string): string => `<variable name="${name}"><type>${typeXml(type)}</type></variable>`;

const dataTypes = (structs: Readonly<Record<string, readonly string[]>>): string =>
  Object.entries(structs)
    .map(([name, members]) => `<dataType name="${name}"><baseType><struct>${members.map((m) => declare(m, 'BOOL')).join('')}</struct></baseType></dataType>`)
    .join('');

/** A whole project with one program whose body is the FBD elements given. */
export function fbdProject(pou: string, face: Interface, elements: readonly string[]): string {
  const locals = Object.entries(face.locals ?? {});
  return `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="http://www.plcopen.org/xml/tc6_0201">
<fileHeader companyName="Test" productName="FBD writer" productVersion="1" creationDateTime="2026-01-05T08:00:00"/>
<contentHeader name="${pou}"><coordinateInfo><fbd><scaling x="1" y="1"/></fbd><ld><scaling x="1" y="1"/></ld><sfc><scaling x="1" y="1"/></sfc></coordinateInfo></contentHeader>
<types><dataTypes>${dataTypes(face.structs ?? {})}</dataTypes><pous><pou name="${pou}" pouType="program"><interface>
<inputVars>${face.inputs.map((n) => declare(n, 'BOOL')).join('')}</inputVars>
<outputVars>${face.outputs.map((n) => declare(n, 'BOOL')).join('')}</outputVars>${
    locals.length > 0 ? `\n<localVars>${locals.map(([n, t]) => declare(n, t)).join('')}</localVars>` : ''
  }
</interface>
<body><FBD>
${elements.join('\n')}
</FBD></body>
</pou></pous></types>
<instances><configurations/></instances>
</project>
`;
}

/** A literal of a sum of products: input index, negated or not. */
export interface Literal {
  readonly input: number;
  readonly negated: boolean;
}

/**
 * A sum of products drawn as FBD: one input variable per input, an AND block per product of
 * two literals or more (negations on its pins), an OR block over the products (a one-literal
 * product wired straight into it, negated on the pin), each AND optionally through a
 * connector/continuation pair.
 */
export function sumOfProductsFbd(inputs: readonly string[], products: readonly (readonly Literal[])[], viaConnectors: boolean): string {
  const elements = inputs.map((name, i) => inVariable(i + 1, name));
  let next = 100;
  const terms: BlockPin[] = products.map((product, p) => {
    if (product.length === 1) return { param: '', from: product[0]!.input + 1, negated: product[0]!.negated };
    const id = next++;
    elements.push(block(id, 'AND', product.map((l, k) => ({ param: `IN${k + 1}`, from: l.input + 1, negated: l.negated }))));
    if (!viaConnectors) return { param: '', from: id };
    const c = next++;
    const d = next++;
    elements.push(connector(c, `P${p}`, { from: id }), continuation(d, `P${p}`));
    return { param: '', from: d };
  });
  const out = next++;
  if (terms.length === 0) {
    elements.push(inVariable(next, 'FALSE'), outVariable(out, 'q', { from: next }));
  } else if (terms.length === 1) {
    elements.push(outVariable(out, 'q', { from: terms[0]!.from }, { negated: terms[0]!.negated ?? false }));
  } else {
    const or = next++;
    elements.push(block(or, 'OR', terms.map((t, k) => ({ ...t, param: `IN${k + 1}` }))), outVariable(out, 'q', { from: or }));
  }
  return fbdProject('Form', { inputs, outputs: ['q'] }, elements);
}
