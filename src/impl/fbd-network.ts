// A PLCopen Function Block Diagram body read back. Values flow along connections (refLocalId,
// with formalParameter naming the source block's output pin) from input variables through
// AND, OR, XOR, NOT and MOVE blocks into output variables; any other block is a construct a
// truth table cannot judge. Output variables are taken in execution order, so a variable
// written above and read further down is substituted. Every walk is iterative and the depth of
// a network is capped: the file never decides how deep the call stack goes.
import { FALSE, TRUE, xor, type Expr, type Result } from '../logic/index.js';
import { bodyElements, namedValue, readBody, unevaluatedBlock, writeNamed, type BodyElement } from './graphic-parts.js';
import { pathKey } from './paths.js';
import { LineError } from './line-error.js';
import { PouBuilder, andFolded, notFolded, orFolded, type PouHeader } from './symbolic.js';
import type { CannotJudge, ImplPou, ReadContext } from './types.js';
import { childNamed, childrenNamed, textContent, type XmlElement } from './xml.js';

/** Longest chain of elements from an input to an output variable; far beyond a drawn network. */
export const MAX_NETWORK_DEPTH = 1000;

/** Functions evaluated, with the input pins they take (IN1..INn, or IN). */
const LOGIC: Readonly<Record<string, 'many' | 'one'>> = { AND: 'many', OR: 'many', XOR: 'many', NOT: 'one', MOVE: 'one' };

/** Elements after which no output of the POU can be judged. */
const TAINTS: Readonly<Record<string, { kind: 'control-flow' | 'unsupported'; what: string }>> = {
  jump: { kind: 'control-flow', what: 'jump' },
  return: { kind: 'control-flow', what: 'return' },
  error: { kind: 'unsupported', what: 'conversion error kept by the exporting tool' },
  vendorElement: { kind: 'unsupported', what: 'vendor-specific element' },
  actionBlock: { kind: 'unsupported', what: 'action block' },
};
const KNOWN = new Set(['comment', 'label', 'inVariable', 'outVariable', 'inOutVariable', 'block', 'connector', 'continuation', ...Object.keys(TAINTS)]);
/** Elements whose output can be connected to an input. */
const SOURCES = new Set(['inVariable', 'inOutVariable', 'block', 'continuation']);

type Node = BodyElement;

/** A value leaving a node: a block's output pin (upper case), '' for any other node. */
interface Source {
  readonly node: Node;
  readonly pin: string;
}

/** An input of a node: a block's input pin (formalParameter), or the one input of a variable or connector. */
interface Input {
  readonly pin: string;
  readonly el: XmlElement;
  readonly from: readonly Source[];
}

export function readFbdBody(context: ReadContext, header: PouHeader, fbd: XmlElement): Result<ImplPou> {
  return readBody(context, () => new Network(context, header, fbd).read());
}

const keyOf = (s: Source): string => `${s.node.id}/${s.pin}`;
const flag = (el: XmlElement, name: string): boolean => el.attrs[name] === 'true' || el.attrs[name] === '1';
const modifier = (el: XmlElement, name: string): string => el.attrs[name] ?? 'none';

class Network {
  private readonly nodes = new Map<string, Node>();
  private readonly order: Node[] = [];
  private readonly connectors = new Map<string, Node>();
  private readonly inputs = new Map<string, Input[]>();
  private readonly unevaluated = new Map<string, CannotJudge>();
  private readonly b: PouBuilder;
  private memo = new Map<string, Expr>();
  /** Names the input and in-out variables read (lower case). */
  private readonly readNames = new Set<string>();

  constructor(
    private readonly context: ReadContext,
    private readonly header: PouHeader,
    fbd: XmlElement,
  ) {
    for (const node of bodyElements(fbd, header.name, KNOWN)) {
      this.nodes.set(node.id, node);
      this.order.push(node);
      if (node.kind === 'connector') {
        const name = this.connectorName(node);
        const other = this.connectors.get(name.toLowerCase());
        if (other) throw new LineError(node.el.line, `connector ${name} (localId ${node.id}) is drawn twice (also localId ${other.id}, line ${other.el.line})`);
        this.connectors.set(name.toLowerCase(), node);
      }
    }
    for (const node of this.order) {
      this.inputs.set(node.id, this.inputsOf(node));
      if (node.kind === 'inVariable' || node.kind === 'inOutVariable') this.readNames.add(pathKey(this.variableOf(node)));
    }
    const assigned = new Set(this.writers().map((n) => pathKey(this.variableOf(n))));
    this.b = new PouBuilder(header, context.globals, assigned, context);
  }

  read(): ImplPou {
    this.checkOrder();
    for (const node of this.order) {
      const taint = TAINTS[node.kind];
      if (taint) this.b.taintEveryOutput(taint.kind, `${taint.what}, localId ${node.id}`, node.el.line);
      else if (node.kind === 'block' && !this.isLogic(node)) this.unevaluated.set(node.id, unevaluatedBlock(this.b, this.context, node.el, node.id));
    }
    for (const node of this.inExecutionOrder(this.writers())) this.write(node);
    return this.b.finish();
  }

  /** Output variables, and in-out variables with something connected to their input. */
  private writers(): Node[] {
    return this.order.filter((n) => n.kind === 'outVariable' || (n.kind === 'inOutVariable' && this.inputs.get(n.id)![0]!.from.length > 0));
  }

  /** By executionOrderId when every writer has one, else in document order. */
  private inExecutionOrder(writers: Node[]): Node[] {
    if (writers.length === 0 || !writers.every((n) => n.el.attrs['executionOrderId'] !== undefined)) return writers;
    return [...writers].sort((a, c) => Number(a.el.attrs['executionOrderId']) - Number(c.el.attrs['executionOrderId']));
  }

  /** AND, OR, XOR, NOT, MOVE called as functions: no instance name, no EN input connected. */
  private isLogic(node: Node): boolean {
    if (node.kind !== 'block' || LOGIC[(node.el.attrs['typeName'] ?? '').toUpperCase()] === undefined || node.el.attrs['instanceName']) return false;
    const pins = childrenNamed(childNamed(node.el, 'inputVariables') ?? node.el, 'variable');
    return !pins.some((v) => v.attrs['formalParameter']?.toUpperCase() === 'EN' && this.sourcesInto(node, v).length > 0);
  }

  private write(node: Node): void {
    const name = this.variableOf(node);
    const line = node.el.line;
    const [input] = this.inputs.get(node.id)!;
    const suffix = node.kind === 'inOutVariable' ? 'In' : '';
    const value = this.modified(node, node.el, suffix, this.valueOf(this.single(node, input!)), `${node.kind} ${name}`);
    const wide = writeNamed(this.b, name, value, line, `${node.kind} writes ${name}, localId ${node.id}`);
    // Values computed so far stay true unless some element reads the variable just written.
    if (wide || this.readNames.has(pathKey(name))) this.memo = new Map();
  }

  /**
   * A value through the modifiers of a pin or variable (attribute names end in `suffix`:
   * negatedIn, edgeIn... on an in-out variable): an edge or a storage modifier makes it opaque.
   */
  private modified(node: Node, el: XmlElement, suffix: string, value: Expr, what: string): Expr {
    const edge = modifier(el, `edge${suffix}`);
    const storage = modifier(el, `storage${suffix}`);
    const line = el.line;
    if (edge !== 'none') return this.b.opaque('edge', `${edge}-edge ${what}, localId ${node.id}`, line);
    if (storage !== 'none') return this.b.opaque('set-reset', `${storage} ${what}, localId ${node.id}`, line);
    return flag(el, `negated${suffix}`) ? notFolded(value) : value;
  }

  /** The one source connected to an input; none or several is a fault in the drawing. */
  private single(node: Node, input: Input): Source {
    const where = input.pin ? `input ${input.pin} of ${this.describe(node)}` : this.describe(node);
    if (input.from.length === 0) throw new LineError(input.el.line, `${where} has nothing connected`);
    if (input.from.length > 1) throw new LineError(input.el.line, `${where} has ${input.from.length} connections; FBD joins values only through blocks`);
    return input.from[0]!;
  }

  private describe(node: Node): string {
    if (node.kind === 'block') return `block ${node.el.attrs['typeName'] ?? ''} (localId ${node.id})`;
    if (node.kind === 'connector') return `connector ${this.connectorName(node)} (localId ${node.id})`;
    return `${node.kind} ${this.variableOf(node)} (localId ${node.id})`;
  }

  /** The value at a source, computed with an explicit stack (sources before their users). */
  private valueOf(root: Source): Expr {
    const stack: Source[] = [root];
    while (stack.length > 0) {
      const top = stack[stack.length - 1]!;
      if (this.memo.has(keyOf(top))) {
        stack.pop();
        continue;
      }
      const missing = this.needs(top).filter((s) => !this.memo.has(keyOf(s)));
      if (missing.length > 0) {
        // Reversed, so the first input is computed first: leaves come in drawing order.
        for (let i = missing.length - 1; i >= 0; i--) stack.push(missing[i]!);
        continue;
      }
      this.memo.set(keyOf(top), this.compute(top));
      stack.pop();
    }
    return this.memo.get(keyOf(root))!;
  }

  /** The sources whose values a source's value is made from. */
  private needs(s: Source): Source[] {
    const { node } = s;
    switch (node.kind) {
      case 'continuation':
        return [{ node: this.connectorOf(node), pin: '' }];
      case 'connector':
      case 'inOutVariable':
        return this.inputs.get(node.id)!.flatMap((i) => i.from);
      case 'block':
        return this.isLogic(node) ? this.inputs.get(node.id)!.flatMap((i) => i.from) : [];
      default:
        return [];
    }
  }

  /** A source's value once every source it needs is known. */
  private compute(s: Source): Expr {
    const { node } = s;
    const line = node.el.line;
    switch (node.kind) {
      case 'inVariable':
        return this.modified(node, node.el, '', this.expression(node), `inVariable ${this.variableOf(node)}`);
      case 'continuation':
        return this.memo.get(keyOf({ node: this.connectorOf(node), pin: '' }))!;
      case 'connector':
        return this.memo.get(keyOf(this.single(node, this.inputs.get(node.id)![0]!)))!;
      case 'inOutVariable': {
        const name = this.variableOf(node);
        const [input] = this.inputs.get(node.id)!;
        const written = input!.from.length > 0;
        const value = written
          ? this.modified(node, node.el, 'In', this.memo.get(keyOf(this.single(node, input!)))!, `inOutVariable ${name}`)
          : namedValue(this.b, this.context, name, node.id, line);
        return this.modified(node, node.el, 'Out', value, `inOutVariable ${name}`);
      }
      default: {
        const item = this.unevaluated.get(node.id);
        let value: Expr;
        const instance = node.el.attrs['instanceName'];
        // An instance's BOOL output pin is a named source (`T1.Q`), one per block element.
        const member = item && instance ? this.b.resolve(`${instance}.${s.pin}`, node.el.line) : undefined;
        if (member?.ok && member.variable.source && member.variable.type === 'BOOL') value = this.b.sourceValue(member.variable, node.el.line, `block localId ${node.id}`);
        else if (item) value = this.b.leafFor(item, `${instance ?? node.el.attrs['typeName']}.${s.pin}`);
        else if (s.pin === 'ENO') value = this.b.opaque('unsupported', `ENO output of ${this.describe(node)}`, line);
        else value = this.logic(node);
        const pinEl = this.outputPins(node).get(s.pin);
        return pinEl ? this.modified(node, pinEl, '', value, `output ${s.pin} of ${this.describe(node)}`) : value;
      }
    }
  }

  /** AND, OR, XOR of the input pins, NOT or MOVE of the one. */
  private logic(node: Node): Expr {
    const type = (node.el.attrs['typeName'] ?? '').toUpperCase();
    const values = this.inputs.get(node.id)!.map((input) => {
      const value = this.memo.get(keyOf(this.single(node, input)))!;
      return this.modified(node, input.el, '', value, `input ${input.pin} of ${this.describe(node)}`);
    });
    if (type === 'AND') return andFolded(...values);
    if (type === 'OR') return orFolded(...values);
    if (type === 'XOR') return xorFolded(values);
    if (type === 'NOT') return notFolded(values[0]!);
    return values[0]!;
  }

  /** The value an inVariable's expression names: TRUE/FALSE, a variable, or opaque. */
  private expression(node: Node): Expr {
    const text = this.variableOf(node);
    const line = node.el.line;
    if (/^(BOOL#)?(TRUE|1)$/i.test(text)) return TRUE;
    if (/^(BOOL#)?(FALSE|0)$/i.test(text)) return FALSE;
    if (/^[A-Za-z_][A-Za-z0-9_]*$/.test(text)) {
      return this.b.isBool(text, line) ? this.b.read(text, line) : this.b.opaque('non-bool', `${text} (${this.b.variable(text, line).type}), localId ${node.id}`, line);
    }
    if (/^[A-Za-z_][A-Za-z0-9_]*([.[][A-Za-z0-9_.[\]]*)$/.test(text)) return namedValue(this.b, this.context, text, node.id, line);
    return this.b.opaque('unsupported', `expression '${text}' in inVariable, localId ${node.id}`, line);
  }

  /** The variable (or expression) a variable element names. */
  private variableOf(node: Node): string {
    const holder = childNamed(node.el, 'expression');
    const name = holder ? textContent(holder).trim() : '';
    if (name === '') throw new LineError(node.el.line, `<${node.kind}> localId ${node.id} names no variable`);
    return name;
  }

  private connectorName(node: Node): string {
    const name = node.el.attrs['name'];
    if (!name) throw new LineError(node.el.line, `<${node.kind}> localId ${node.id} has no name`);
    return name;
  }

  private connectorOf(continuation: Node): Node {
    const name = this.connectorName(continuation);
    const connector = this.connectors.get(name.toLowerCase());
    if (!connector) throw new LineError(continuation.el.line, `continuation ${name} (localId ${continuation.id}) has no connector of that name`);
    return connector;
  }

  /** A block's output pins by upper-case name (output and in-out variables). */
  private outputPins(node: Node): Map<string, XmlElement> {
    const pins = new Map<string, XmlElement>();
    if (node.kind !== 'block') return pins;
    for (const list of ['outputVariables', 'inOutVariables']) {
      for (const v of childrenNamed(childNamed(node.el, list) ?? node.el, 'variable')) {
        if (list === 'inOutVariables' && !childNamed(v, 'connectionPointOut')) continue;
        pins.set(this.pinName(v), v);
      }
    }
    return pins;
  }

  private pinName(v: XmlElement): string {
    const name = v.attrs['formalParameter'];
    if (name === undefined) throw new LineError(v.line, 'a block pin <variable> has no formalParameter');
    return name.toUpperCase();
  }

  /** A node's inputs with their connections resolved to sources; every reference is checked here. */
  private inputsOf(node: Node): Input[] {
    if (node.kind === 'block') {
      // An EN input with nothing connected is TRUE: the block always runs.
      const pins = childrenNamed(childNamed(node.el, 'inputVariables') ?? node.el, 'variable').filter(
        (v) => v.attrs['formalParameter']?.toUpperCase() !== 'EN' || this.sourcesInto(node, v).length > 0,
      );
      for (const v of childrenNamed(childNamed(node.el, 'inOutVariables') ?? node.el, 'variable')) if (childNamed(v, 'connectionPointIn')) pins.push(v);
      const inputs = pins.map((v) => ({ pin: this.pinName(v), el: v, from: this.sourcesInto(node, v) }));
      if (this.isLogic(node)) this.checkLogicPins(node, inputs);
      return inputs;
    }
    if (node.kind === 'inVariable' || node.kind === 'continuation' || node.kind === 'comment' || node.kind === 'label') return [];
    return [{ pin: '', el: node.el, from: this.sourcesInto(node, node.el) }];
  }

  private sourcesInto(node: Node, holder: XmlElement): Source[] {
    const point = childNamed(holder, 'connectionPointIn');
    return (point ? childrenNamed(point, 'connection') : []).map((c) => this.sourceOf(node, c));
  }

  private sourceOf(node: Node, connection: XmlElement): Source {
    const ref = connection.attrs['refLocalId'];
    if (ref === undefined) throw new LineError(connection.line, `a connection of localId ${node.id} has no refLocalId`);
    const from = this.nodes.get(ref);
    if (!from) throw new LineError(connection.line, `localId ${node.id} (${node.kind}) connects to refLocalId ${ref}, which does not exist in ${this.header.name}`);
    if (!SOURCES.has(from.kind)) throw new LineError(connection.line, `localId ${node.id} connects to localId ${ref}, a ${from.kind}, which has no output`);
    if (from.kind !== 'block') return { node: from, pin: '' };
    const asked = (connection.attrs['formalParameter'] ?? '').toUpperCase();
    const pins = [...this.outputPins(from).keys()];
    if (asked !== '' && (pins.includes(asked) || (pins.length === 0 && this.isLogic(from) && asked === 'OUT'))) return { node: from, pin: asked };
    if (asked === '' && pins.length <= 1 && (pins.length === 1 || this.isLogic(from))) return { node: from, pin: pins[0] ?? 'OUT' };
    const offered = pins.length > 0 ? pins.join(', ') : 'none';
    throw new LineError(
      connection.line,
      asked === ''
        ? `localId ${node.id} connects to block ${from.el.attrs['typeName'] ?? ''} (localId ${ref}) without naming one of its outputs (${offered})`
        : `localId ${node.id} connects to output ${asked} of block ${from.el.attrs['typeName'] ?? ''} (localId ${ref}), which has outputs ${offered}`,
    );
  }

  /** AND/OR/XOR take IN1..INn, NOT and MOVE take IN; an EN input or any other pin is refused. */
  private checkLogicPins(node: Node, inputs: readonly Input[]): void {
    const type = (node.el.attrs['typeName'] ?? '').toUpperCase();
    const many = LOGIC[type] === 'many';
    const seen = new Set<string>();
    for (const input of inputs) {
      const fits = many ? /^IN[1-9][0-9]*$/.test(input.pin) : input.pin === 'IN';
      if (!fits) throw new LineError(input.el.line, `block ${type} (localId ${node.id}) has an input ${input.pin || '(unnamed)'}; it takes ${many ? 'IN1, IN2, ...' : 'IN'} only`);
      if (seen.has(input.pin)) throw new LineError(input.el.line, `block ${type} (localId ${node.id}) has input ${input.pin} twice`);
      seen.add(input.pin);
    }
    if (inputs.length === 0 || (!many && inputs.length > 1)) throw new LineError(node.el.line, `block ${type} (localId ${node.id}) has ${inputs.length} inputs`);
  }

  /**
   * Values flow one way: a loop of connections is an error naming its localIds, and so is a
   * chain longer than MAX_NETWORK_DEPTH. Kahn's algorithm, so nothing here recurses.
   */
  private checkOrder(): void {
    const from = new Map<string, string[]>();
    for (const node of this.order) {
      const ids = (this.inputs.get(node.id) ?? []).flatMap((i) => i.from.map((s) => s.node.id));
      if (node.kind === 'continuation') ids.push(this.connectorOf(node).id);
      from.set(node.id, ids);
    }
    const users = new Map<string, string[]>();
    const waiting = new Map<string, number>();
    for (const [id, ids] of from) {
      waiting.set(id, ids.length);
      for (const f of ids) {
        const list = users.get(f) ?? [];
        list.push(id);
        users.set(f, list);
      }
    }
    const depth = new Map<string, number>();
    const ready = this.order.filter((n) => waiting.get(n.id) === 0).map((n) => n.id);
    while (ready.length > 0) {
      const id = ready.pop()!;
      const d = 1 + from.get(id)!.reduce((m, f) => Math.max(m, depth.get(f)!), 0);
      if (d > MAX_NETWORK_DEPTH) {
        throw new LineError(this.nodes.get(id)!.el.line, `localId ${id} is ${d} elements deep in ${this.header.name}, more than the ${MAX_NETWORK_DEPTH} read`);
      }
      depth.set(id, d);
      for (const u of users.get(id) ?? []) {
        const left = waiting.get(u)! - 1;
        waiting.set(u, left);
        if (left === 0) ready.push(u);
      }
    }
    const stuck = this.order.find((n) => !depth.has(n.id));
    if (stuck) {
      // Every element left waits on another one left: walking back along them must come round.
      const path: string[] = [];
      const at = new Map<string, number>();
      let id = stuck.id;
      while (!at.has(id)) {
        at.set(id, path.length);
        path.push(id);
        id = from.get(id)!.find((f) => !depth.has(f))!;
      }
      const loop = [...path.slice(at.get(id)!), id].reverse();
      throw new LineError(this.nodes.get(id)!.el.line, `connections form a loop in ${this.header.name}: localId ${loop.join(' -> ')}`);
    }
  }
}

function xorFolded(values: readonly Expr[]): Expr {
  let flip = false;
  const rest: Expr[] = [];
  for (const v of values) {
    if (v.kind === 'const') flip = flip !== v.value;
    else rest.push(v);
  }
  const x = xor(...rest);
  return flip ? notFolded(x) : x;
}
