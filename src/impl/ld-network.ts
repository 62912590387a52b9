// A PLCopen Ladder Diagram body read back: power flows from the left rail through contacts
// (series = AND; several connections into one input = OR) into coils. Coils are taken in
// execution order, so a coil's variable used as a contact further down is substituted.
import { fail, ok, TRUE, type Expr, type Result } from '../logic/index.js';
import { blockKind, kindWord } from './constructs.js';
import { namedValue, writeNamed } from './graphic-parts.js';
import { pathKey } from './paths.js';
import { PouBuilder, andFolded, anyOf, notFolded, type PouHeader } from './symbolic.js';
import type { CannotJudge, ImplPou, ReadContext } from './types.js';
import { childNamed, childrenNamed, localName, textContent, type XmlElement } from './xml.js';
import { LineError } from './line-error.js';

/** Elements that carry no logic. */
const IGNORED = new Set(['comment', 'error', 'vendorElement', 'addData', 'documentation']);
/** Elements that assign a variable, in execution order. */
const WRITERS = new Set(['coil', 'outVariable', 'inOutVariable']);
const KNOWN = new Set([
  ...IGNORED,
  ...WRITERS,
  'leftPowerRail', 'rightPowerRail', 'contact', 'block', 'inVariable',
  'connector', 'continuation', 'jump', 'label', 'return',
]);

interface Node {
  readonly el: XmlElement;
  readonly kind: string;
  readonly id: string;
}

export function readLdBody(context: ReadContext, header: PouHeader, ld: XmlElement): Result<ImplPou> {
  try {
    return ok(new Network(context, header, ld).read());
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `${context.file} line ${e.line}: ${e.message}` });
    throw e;
  }
}

class Network {
  private readonly nodes = new Map<string, Node>();
  private readonly order: Node[] = [];
  private readonly blocks = new Map<string, CannotJudge>();
  private readonly connectors = new Map<string, Node>();
  private readonly b: PouBuilder;
  private memo = new Map<string, Expr>();

  constructor(
    private readonly context: ReadContext,
    private readonly header: PouHeader,
    ld: XmlElement,
  ) {
    for (const el of ld.children) {
      const kind = localName(el.name);
      if (!KNOWN.has(kind)) throw new LineError(el.line, `unknown element <${el.name}> in the LD body of ${header.name}`);
      if (IGNORED.has(kind)) continue;
      const id = el.attrs['localId'];
      if (id === undefined) throw new LineError(el.line, `<${kind}> in ${header.name} has no localId`);
      if (this.nodes.has(id)) throw new LineError(el.line, `localId ${id} is used twice in ${header.name} (first on line ${this.nodes.get(id)!.el.line})`);
      const node = { el, kind, id };
      this.nodes.set(id, node);
      this.order.push(node);
      const connectorName = el.attrs['name'];
      if (kind === 'connector' && connectorName !== undefined && !this.connectors.has(connectorName)) this.connectors.set(connectorName, node);
    }
    const assigned = new Set(this.order.filter((n) => WRITERS.has(n.kind)).map((n) => pathKey(this.variableOf(n))));
    this.b = new PouBuilder(header, context.globals, assigned, context);
  }

  read(): ImplPou {
    this.checkReferences();
    this.checkCycles();
    for (const node of this.order) {
      if (node.kind === 'block') {
        const type = node.el.attrs['typeName'] ?? '';
        const kind = blockKind(type, this.context.blockTypes);
        const name = node.el.attrs['instanceName'];
        const what = `${kindWord(kind)} block ${name ? `${name} (${type})` : type}, localId ${node.id}`;
        this.blocks.set(node.id, this.b.cannotJudge(kind, what, node.el.line));
      } else if (node.kind === 'jump' || node.kind === 'return') {
        this.b.taintEveryOutput('control-flow', `${node.kind} element, localId ${node.id}`, node.el.line);
      }
    }
    for (const node of this.writersInOrder()) this.write(node);
    return this.b.finish();
  }

  /** Coils and output variables by executionOrderId when all have one, else top to bottom, left to right. */
  private writersInOrder(): Node[] {
    const writers = this.order.filter((n) => WRITERS.has(n.kind));
    const orderId = (n: Node): number => Number(n.el.attrs['executionOrderId'] ?? 0);
    if (writers.length > 0 && writers.every((n) => orderId(n) > 0)) return [...writers].sort((a, c) => orderId(a) - orderId(c));
    const at = (n: Node, axis: 'x' | 'y'): number => Number(childNamed(n.el, 'position')?.attrs[axis] ?? 0);
    return writers
      .map((n, i) => ({ n, i }))
      .sort((a, c) => at(a.n, 'y') - at(c.n, 'y') || at(a.n, 'x') - at(c.n, 'x') || a.i - c.i)
      .map((e) => e.n);
  }

  private write(node: Node): void {
    const name = this.variableOf(node);
    const line = node.el.line;
    const power = this.inputOf(node);
    let value: Expr;
    if (node.kind === 'coil') {
      const storage = node.el.attrs['storage'] ?? 'none';
      const edge = node.el.attrs['edge'] ?? 'none';
      if (storage !== 'none') value = this.b.opaque('set-reset', `${storage} coil ${name}, localId ${node.id}`, line);
      else if (edge !== 'none') value = this.b.opaque('edge', `${edge}-edge coil ${name}, localId ${node.id}`, line);
      else value = node.el.attrs['negated'] === 'true' ? notFolded(power) : power;
    } else value = node.el.attrs['negated'] === 'true' ? notFolded(power) : power;
    writeNamed(this.b, name, value, line, `${node.kind} writes ${name}, localId ${node.id}`);
    this.memo = new Map();
  }

  /** The variable a contact, coil or variable element names. */
  private variableOf(node: Node): string {
    const holder = node.kind === 'contact' || node.kind === 'coil' ? childNamed(node.el, 'variable') : childNamed(node.el, 'expression');
    const name = holder ? textContent(holder).trim() : '';
    if (name === '') throw new LineError(node.el.line, `<${node.kind}> localId ${node.id} names no variable`);
    return name;
  }

  /**
   * The power or value flowing out of a node (of one of its outputs, for a block). Rungs can
   * be thousands of contacts long: the network is walked with an explicit stack.
   */
  private outputOf(start: Node, parameter: string | undefined): Expr {
    const keyOf = (n: Node, p: string | undefined): string => `${n.id}/${p ?? ''}`;
    const stack: { node: Node; parameter: string | undefined }[] = [{ node: start, parameter }];
    while (stack.length > 0) {
      const top = stack[stack.length - 1]!;
      const key = keyOf(top.node, top.parameter);
      if (this.memo.has(key)) {
        stack.pop();
        continue;
      }
      const inputs = this.sources(top.node);
      const missing = inputs.filter((d) => !this.memo.has(keyOf(d.node, d.parameter)));
      if (missing.length > 0) {
        stack.push(...missing);
        continue;
      }
      const power = anyOf(inputs.map((d) => this.memo.get(keyOf(d.node, d.parameter))!));
      this.memo.set(key, this.value(top.node, top.parameter, power));
      stack.pop();
    }
    return this.memo.get(keyOf(start, parameter))!;
  }

  /** What flows into a node: its connections (a continuation: those of its connector). */
  private sources(node: Node): { node: Node; parameter: string | undefined }[] {
    if (node.kind === 'continuation') {
      const connector = this.connector(node);
      return connector ? this.connectionsInto(connector) : [];
    }
    return node.kind === 'contact' || node.kind === 'coil' || node.kind === 'inOutVariable' ? this.connectionsInto(node) : [];
  }

  private connectionsInto(node: Node): { node: Node; parameter: string | undefined }[] {
    const point = childNamed(node.el, 'connectionPointIn');
    const connections = point ? childrenNamed(point, 'connection') : [];
    return connections.map((c) => ({ node: this.nodes.get(c.attrs['refLocalId']!)!, parameter: c.attrs['formalParameter'] }));
  }

  private connector(node: Node): Node | undefined {
    return this.connectors.get(node.el.attrs['name'] ?? '');
  }

  /** A node's output, given the OR of what flows into it. */
  private value(node: Node, parameter: string | undefined, power: Expr): Expr {
    const line = node.el.line;
    switch (node.kind) {
      case 'leftPowerRail':
        return TRUE;
      case 'contact': {
        const name = this.variableOf(node);
        const edge = node.el.attrs['edge'] ?? 'none';
        let contact: Expr;
        if (edge !== 'none') contact = this.b.opaque('edge', `${edge}-edge contact ${name}, localId ${node.id}`, line);
        else contact = this.readVariable(node, name);
        if (node.el.attrs['negated'] === 'true') contact = notFolded(contact);
        return andFolded(power, contact);
      }
      case 'coil':
      case 'inOutVariable':
        return power;
      case 'inVariable': {
        const v = this.readVariable(node, this.variableOf(node));
        return node.el.attrs['negated'] === 'true' ? notFolded(v) : v;
      }
      case 'block':
        return this.b.leafFor(this.blocks.get(node.id)!, `${node.el.attrs['instanceName'] ?? node.el.attrs['typeName']}.${parameter ?? ''}`);
      case 'continuation': {
        if (!this.connector(node)) throw new LineError(line, `continuation ${node.el.attrs['name'] ?? ''} (localId ${node.id}) has no connector of that name`);
        return power;
      }
      default:
        throw new LineError(line, `a connection refers to localId ${node.id}, a ${node.kind}, which has no output`);
    }
  }

  private readVariable(node: Node, name: string): Expr {
    const line = node.el.line;
    return namedValue(this.b, this.context, name, node.id, line);
  }

  /** OR of everything connected into the node's input (a contact, coil...); nothing connected is no power (an open rung). */
  private inputOf(node: Node): Expr {
    return anyOf(this.connectionsInto(node).map((d) => this.outputOf(d.node, d.parameter)));
  }

  /** Every connection in the body, with the node it belongs to. */
  private connections(): { node: Node; connection: XmlElement }[] {
    const out: { node: Node; connection: XmlElement }[] = [];
    const walk = (node: Node, el: XmlElement): void => {
      for (const c of el.children) {
        if (localName(c.name) === 'connection') out.push({ node, connection: c });
        else walk(node, c);
      }
    };
    for (const node of this.order) walk(node, node.el);
    return out;
  }

  private checkReferences(): void {
    for (const { node, connection } of this.connections()) {
      const ref = connection.attrs['refLocalId'];
      if (ref === undefined) throw new LineError(connection.line, `a connection of localId ${node.id} has no refLocalId`);
      if (!this.nodes.has(ref)) {
        throw new LineError(connection.line, `localId ${node.id} (${node.kind}) connects to refLocalId ${ref}, which does not exist in ${this.header.name}`);
      }
    }
  }

  /** Power must flow one way: a loop of connections is an error, named by its localIds. */
  private checkCycles(): void {
    const into = new Map<string, string[]>();
    for (const { node, connection } of this.connections()) {
      const list = into.get(node.id) ?? [];
      list.push(connection.attrs['refLocalId']!);
      into.set(node.id, list);
    }
    for (const c of this.order.filter((n) => n.kind === 'continuation')) {
      const connector = this.connector(c);
      if (connector) into.set(c.id, [connector.id]);
    }
    const state = new Map<string, 'open' | 'done'>();
    for (const root of this.order) {
      if (state.has(root.id)) continue;
      // Depth-first with an explicit stack: `path` holds the open nodes and how far each got.
      const path: { id: string; next: number }[] = [{ id: root.id, next: 0 }];
      state.set(root.id, 'open');
      while (path.length > 0) {
        const top = path[path.length - 1]!;
        const from = (into.get(top.id) ?? [])[top.next++];
        if (from === undefined) {
          state.set(top.id, 'done');
          path.pop();
        } else if (state.get(from) === 'open') {
          const ids = path.map((p) => p.id);
          const loop = [...ids.slice(ids.indexOf(from)), from].reverse();
          throw new LineError(this.nodes.get(from)!.el.line, `connections form a loop in ${this.header.name}: localId ${loop.join(' -> ')}`);
        } else if (!state.has(from)) {
          state.set(from, 'open');
          path.push({ id: from, next: 0 });
        }
      }
    }
  }
}
