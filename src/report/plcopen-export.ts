// PLCopen XML (TC6 XML, version 2.01) hand-over: one POU per spec table with BOOL input and
// output variables and a body in Structured Text or, for the AND/OR forms, Ladder Diagram.
// Element order and required attributes follow the published schema tc6_xml_v201.xsd
// (PLCopen, namespace http://www.plcopen.org/xml/tc6_0201); test/report/plcopen-export.test.ts
// checks them.
import type { Signal } from '../logic/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { outputSignalsOf, outputViews, type OutputView } from './output-view.js';
import { CAUTION, CAUTION_LINES } from './caution.js';
import { ladderGraph, type LadderGraph, type LadderNode } from './ladder-graph.js';
import {
  FORM_LABEL,
  PRODUCT_NAME,
  assignmentLines,
  comment,
  headerLines,
  pouNames,
  proofText,
  type FormChoice,
  type HandOverSource,
} from './st-export.js';
import { escapeXml, xmlCommentText } from './text.js';

export const PLCOPEN_NAMESPACE = 'http://www.plcopen.org/xml/tc6_0201';
export const XHTML_NAMESPACE = 'http://www.w3.org/1999/xhtml';
export const PRODUCT_VERSION = '0.1.0';

export interface PlcopenOptions {
  /** 'LD' draws the AND/OR form of every output as a rung, whatever `form` says. */
  readonly body?: 'ST' | 'LD';
  readonly kind?: 'FUNCTION_BLOCK' | 'PROGRAM';
  readonly form?: FormChoice;
  readonly source: HandOverSource;
  /** Date or date-time (ISO 8601) of the file; default now. */
  readonly date?: string;
}

export function exportPlcopen(analyses: readonly TableAnalysis[], options: PlcopenOptions): string {
  const body = options.body ?? 'ST';
  const form: FormChoice = body === 'LD' ? 'andOr' : (options.form ?? 'andOr');
  const dateTime = xsdDateTime(options.date);
  const names = pouNames(analyses);
  const pouType = options.kind === 'PROGRAM' ? 'program' : 'functionBlock';
  const x = new XmlWriter();
  x.raw('<?xml version="1.0" encoding="UTF-8"?>');
  for (const line of CAUTION_LINES) x.raw(`<!-- ${xmlCommentText(line)} -->`);
  x.open('project', { xmlns: PLCOPEN_NAMESPACE });
  x.empty('fileHeader', {
    companyName: PRODUCT_NAME,
    productName: PRODUCT_NAME,
    productVersion: PRODUCT_VERSION,
    creationDateTime: dateTime,
    contentDescription: `Interlock logic derived from ${options.source.workbook}`,
  });
  x.open('contentHeader', { name: contentName(options.source.workbook), modificationDateTime: dateTime });
  x.text('Comment', CAUTION);
  x.open('coordinateInfo');
  for (const language of ['fbd', 'ld', 'sfc']) {
    x.open(language);
    x.empty('scaling', { x: '1', y: '1' });
    x.close();
  }
  x.close();
  x.close();
  x.open('types');
  x.empty('dataTypes');
  x.open('pous');
  analyses.forEach((analysis, t) => {
    x.open('pou', { name: names[t]!, pouType });
    x.open('interface');
    variables(x, 'inputVars', analysis.inputs);
    variables(x, 'outputVars', outputSignalsOf(analysis));
    x.close();
    const header = headerLines(analysis, form, { source: options.source, date: dateTime });
    x.open('body');
    if (body === 'LD') ladderBody(x, analysis);
    else {
      const st = [...CAUTION_LINES, ...header].map(comment).concat(assignmentLines(analysis, form));
      x.open('ST');
      x.text('xhtml', st.join('\n'), { xmlns: XHTML_NAMESPACE });
      x.close();
    }
    x.close();
    documentation(x, [CAUTION, ...header, body === 'LD' ? `Body: Ladder Diagram of the ${FORM_LABEL.andOr} of each output.` : `Body: Structured Text, ${FORM_LABEL[form]} of each output.`]);
    x.close();
  });
  x.close();
  x.close();
  x.open('instances');
  x.empty('configurations');
  x.close();
  documentation(x, [CAUTION]);
  x.close();
  return x.toString();
}

function variables(x: XmlWriter, list: 'inputVars' | 'outputVars', signals: readonly Signal[]): void {
  x.open(list);
  for (const s of signals) {
    x.open('variable', { name: s.identifier });
    x.open('type');
    x.empty('BOOL');
    x.close();
    documentation(x, [s.header]);
    x.close();
  }
  x.close();
}

/** A formattedText element: one xhtml element holding the lines. */
function documentation(x: XmlWriter, lines: readonly string[]): void {
  x.open('documentation');
  x.text('xhtml', lines.join('\n'), { xmlns: XHTML_NAMESPACE });
  x.close();
}

/**
 * One rung per output, stacked downwards, from the same graph as the ladder picture: a left
 * rail, contacts chained in series per product term, every branch's last contact connected
 * to the coil (several connections into one input are the OR), the coil into the right rail.
 */
function ladderBody(x: XmlWriter, analysis: TableAnalysis): void {
  x.open('LD');
  let nextId = 1;
  let top = 0;
  for (const output of outputViews(analysis)) {
    const graph = ladderGraph(output.andOr.cubes, analysis.inputs, 480);
    const base = nextId - 1;
    const note = rungNote(output, graph);
    x.open('comment', { localId: String(base + graph.nodes.length + 1), height: '20', width: String(graph.width) });
    x.empty('position', { x: '0', y: String(top) });
    x.open('content');
    x.text('xhtml', note, { xmlns: XHTML_NAMESPACE });
    x.close();
    x.close();
    for (const node of graph.nodes) rungElement(x, { graph, node, base, top, coil: output.signal, inputs: analysis.inputs });
    nextId = base + graph.nodes.length + 2;
    top += graph.height + 8;
  }
  x.close();
}

function rungNote(output: OutputView, graph: LadderGraph): string {
  const what =
    graph.constant === 'true' ? 'always energised (the form is TRUE)' : graph.constant === 'false' ? 'open rung, never energised (the form is FALSE)' : output.andOr.text;
  return `${output.signal.identifier} := ${what}. ${proofText(output, 'andOr')}. ${CAUTION_LINES[0]}`;
}

interface RungPlace {
  readonly graph: LadderGraph;
  readonly node: LadderNode;
  /** Added to the graph's node ids to make localIds unique in the body. */
  readonly base: number;
  /** Vertical offset of the rung in the body. */
  readonly top: number;
  readonly coil: Signal;
  readonly inputs: readonly Signal[];
}

function rungElement(x: XmlWriter, place: RungPlace): void {
  const { graph, node, base, top } = place;
  const localId = String(base + node.id);
  const into = graph.wires.filter((w) => w.to === node.id).map((w) => String(base + w.from));
  const pointIn = (): void => {
    x.open('connectionPointIn');
    x.empty('relPosition', { x: '0', y: '8' });
    for (const ref of into) x.empty('connection', { refLocalId: ref });
    x.close();
  };
  const pointOut = (): void => {
    x.open('connectionPointOut');
    x.empty('relPosition', { x: String(node.width), y: '8' });
    x.close();
  };
  switch (node.kind) {
    case 'left-rail':
    case 'right-rail': {
      const height = String(graph.railBottom - graph.railTop);
      x.open(node.kind === 'left-rail' ? 'leftPowerRail' : 'rightPowerRail', { localId, height, width: '2' });
      x.empty('position', { x: String(node.x - 1), y: String(top + graph.railTop) });
      if (node.kind === 'left-rail') {
        x.open('connectionPointOut', { formalParameter: '' });
        x.empty('relPosition', { x: '2', y: String(graph.nodes.find((n) => n.kind === 'coil')!.y - graph.railTop) });
        x.close();
      } else {
        x.open('connectionPointIn');
        x.empty('relPosition', { x: '0', y: String(node.y - graph.railTop) });
        for (const ref of into) x.empty('connection', { refLocalId: ref });
        x.close();
      }
      x.close();
      return;
    }
    case 'contact':
    case 'coil': {
      const attributes: Record<string, string> = { localId, height: '16', width: String(node.width) };
      if (node.kind === 'contact') attributes['negated'] = String(node.negated === true);
      x.open(node.kind, attributes);
      x.empty('position', { x: String(node.x), y: String(top + node.y - 8) });
      pointIn();
      pointOut();
      x.text('variable', node.kind === 'contact' ? place.inputs[node.input!]!.identifier : place.coil.identifier);
      x.close();
      return;
    }
    case 'connector':
    case 'continuation': {
      // Names are unique in the body: the rung's coil, then the number shown in the picture.
      x.open(node.kind, { name: `${place.coil.identifier}_${node.name!}`, localId, height: '16', width: String(node.width) });
      x.empty('position', { x: String(node.x), y: String(top + node.y - 8) });
      if (node.kind === 'connector') pointIn();
      else pointOut();
      x.close();
    }
  }
}

/** xsd:dateTime from a date (YYYY-MM-DD) or a full date-time; now when none is given. */
function xsdDateTime(date: string | undefined): string {
  if (date === undefined) return new Date().toISOString().replace(/\.\d{3}Z$/, 'Z');
  return /^\d{4}-\d{2}-\d{2}$/.test(date) ? `${date}T00:00:00` : date;
}

function contentName(workbook: string): string {
  const base = workbook.replace(/^.*[\\/]/, '').replace(/\.[A-Za-z0-9]+$/, '');
  return `${base || 'spec'} interlocks`;
}

/** A minimal writer of indented XML; attribute values and text are escaped. */
class XmlWriter {
  private readonly lines: string[] = [];
  private readonly stack: string[] = [];

  raw(line: string): void {
    this.lines.push(line);
  }

  open(name: string, attributes: Record<string, string> = {}): void {
    this.lines.push(`${this.indent()}<${name}${attrs(attributes)}>`);
    this.stack.push(name);
  }

  close(): void {
    const name = this.stack.pop();
    if (name === undefined) throw new Error('bug: closing an element that was never opened');
    this.lines.push(`${this.indent()}</${name}>`);
  }

  empty(name: string, attributes: Record<string, string> = {}): void {
    this.lines.push(`${this.indent()}<${name}${attrs(attributes)}/>`);
  }

  text(name: string, content: string, attributes: Record<string, string> = {}): void {
    this.lines.push(`${this.indent()}<${name}${attrs(attributes)}>${escapeXml(content)}</${name}>`);
  }

  toString(): string {
    if (this.stack.length > 0) throw new Error(`bug: unclosed elements ${this.stack.join(' > ')}`);
    return this.lines.join('\n') + '\n';
  }

  private indent(): string {
    return '  '.repeat(this.stack.length);
  }
}

function attrs(attributes: Record<string, string>): string {
  return Object.entries(attributes)
    .map(([k, v]) => ` ${k}="${escapeXml(v)}"`)
    .join('');
}
