// A PLCopen Ladder Diagram body read back: power flows from the left rail through contacts
// (series = AND; several connections into one input = OR) into coils. Coils are taken in
// execution order, so a coil's variable used as a contact further down is substituted.
import { TRUE, type Expr } from '../logic/expr/ast.js';
import type { Result } from '../logic/result.js';
import { bodyElements, namedValue, readBody, unevaluatedBlock, type BodyElement } from './graphic-parts.js';
import { PouBuilder, andFolded, notFolded, orFolded, type PouHeader } from './symbolic.js';
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

type Node = BodyElement;

export function readLdBody(context: ReadContext, header: PouHeader, ld: XmlElement): Result<ImplPou> {
  return readBody(context, () => new Network(context, header, ld).read());
}

class Network {
  private readonly nodes = new Map<string, Node>();
  private readonly order: Node[] = [];
  private readonly blocks = new Map<string, CannotJudge>();
  private readonly b: PouBuilder;
  private memo = new Map<string, Expr>();

  constructor(
    private readonly context: ReadContext,
    private readonly header: PouHeader,
    ld: XmlElement,
  ) {
    for (const node of bodyElements(ld, header.name, KNOWN, IGNORED)) {
      this.nodes.set(node.id, node);
      this.order.push(node);
    }
    const assigned = new Set(this.order.filter((n) => WRITERS.has(n.kind)).map((n) => this.variableOf(n).toLowerCase()));
    this.b = new PouBuilder(header, context.globals, assigned);
  }

  read(): ImplPou {
    this.checkReferences();
    this.checkCycles();
    for (const node of this.order) {
      if (node.kind === 'block') {
        this.blocks.set(node.id, unevaluatedBlock(this.b, this.context, node.el, node.id));
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
    if (/[.[]/.test(name)) {
      this.b.cannotJudge('unsupported', `${node.kind} writes ${name}, localId ${node.id}`, line);
    } else if (this.b.isBool(name, line)) {
      this.b.assign(name, value, line);
    }
    this.memo = new Map();
  }

  /** The variable a contact, coil or variable element names. */
  private variableOf(node: Node): string {
    const holder = node.kind === 'contact' || node.kind === 'coil' ? childNamed(node.el, 'variable') : childNamed(node.el, 'expression');
    const name = holder ? textContent(holder).trim() : '';
    if (name === '') throw new LineError(node.el.line, `<${node.kind}> localId ${node.id} names no variable`);
    return name;
  }

  /** The power or value flowing out of a node (of one of its outputs, for a block). */
  private outputOf(node: Node, parameter: string | undefined): Expr {
    const key = `${node.id}/${parameter ?? ''}`;
    const known = this.memo.get(key);
    if (known) return known;
    const line = node.el.line;
    let value: Expr;
    switch (node.kind) {
      case 'leftPowerRail':
        value = TRUE;
        break;
      case 'contact': {
        const name = this.variableOf(node);
        const edge = node.el.attrs['edge'] ?? 'none';
        let contact: Expr;
        if (edge !== 'none') contact = this.b.opaque('edge', `${edge}-edge contact ${name}, localId ${node.id}`, line);
        else contact = this.readVariable(node, name);
        if (node.el.attrs['negated'] === 'true') contact = notFolded(contact);
        value = andFolded(this.inputOf(node), contact);
        break;
      }
      case 'coil':
      case 'inOutVariable':
        value = this.inputOf(node);
        break;
      case 'inVariable': {
        const v = this.readVariable(node, this.variableOf(node));
        value = node.el.attrs['negated'] === 'true' ? notFolded(v) : v;
        break;
      }
      case 'block':
        value = this.b.leafFor(this.blocks.get(node.id)!, `${node.el.attrs['instanceName'] ?? node.el.attrs['typeName']}.${parameter ?? ''}`);
        break;
      case 'continuation': {
        const name = node.el.attrs['name'];
        const connector = this.order.find((n) => n.kind === 'connector' && n.el.attrs['name'] === name);
        if (!connector) throw new LineError(line, `continuation ${name ?? ''} (localId ${node.id}) has no connector of that name`);
        value = this.inputOf(connector);
        break;
      }
      default:
        throw new LineError(line, `a connection refers to localId ${node.id}, a ${node.kind}, which has no output`);
    }
    this.memo.set(key, value);
    return value;
  }

  private readVariable(node: Node, name: string): Expr {
    return namedValue(this.b, this.context, name, node.id, node.el.line);
  }

  /** OR of everything connected into the node's input (a contact, coil...); nothing connected is no power (an open rung). */
  private inputOf(node: Node): Expr {
    const point = childNamed(node.el, 'connectionPointIn');
    const connections = point ? childrenNamed(point, 'connection') : [];
    return orFolded(...connections.map((c) => this.outputOf(this.nodes.get(c.attrs['refLocalId']!)!, c.attrs['formalParameter'])));
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
      const connector = this.order.find((n) => n.kind === 'connector' && n.el.attrs['name'] === c.el.attrs['name']);
      if (connector) into.set(c.id, [connector.id]);
    }
    const state = new Map<string, 'open' | 'done'>();
    const path: string[] = [];
    const visit = (id: string): void => {
      if (state.get(id) === 'done') return;
      if (state.get(id) === 'open') {
        const loop = [...path.slice(path.indexOf(id)), id].reverse();
        throw new LineError(this.nodes.get(id)!.el.line, `connections form a loop in ${this.header.name}: localId ${loop.join(' -> ')}`);
      }
      state.set(id, 'open');
      path.push(id);
      for (const from of into.get(id) ?? []) visit(from);
      path.pop();
      state.set(id, 'done');
    };
    for (const node of this.order) visit(node.id);
  }
}
