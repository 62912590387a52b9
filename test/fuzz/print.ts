// Generated programs written out the way the readers take them: a Structured Text file, or a
// PLCopen XML project (TC6 2.01) whose POUs have ST bodies, plain or as mixed xhtml content.
import type { BExpr, CallValue, Decl, Pou, Program, Section, Stmt, VarBlock } from './ast.js';
import { Prng } from './prng.js';

/** Binding strength in ST: NOT > AND > XOR > OR. */
const PREC = { or: 1, xor: 2, and: 3, not: 4, atom: 5 } as const;

function precOf(e: BExpr): number {
  return e.k === 'and' || e.k === 'or' || e.k === 'xor' ? PREC[e.k] : e.k === 'not' ? PREC.not : PREC.atom;
}

/** Options of the printer that vary the text but not the meaning. */
export interface Spelling {
  /** Write AND as `&` in some places. */
  readonly ampersand: boolean;
  /** Parentheses beyond those the precedence needs. */
  readonly extraParens: boolean;
}

export const PLAIN: Spelling = { ampersand: false, extraParens: false };

export function printExpr(e: BExpr, spelling: Spelling = PLAIN, rng?: Prng): string {
  const go = (x: BExpr, parent: number): string => {
    let text: string;
    switch (x.k) {
      case 'const':
        text = x.v ? 'TRUE' : 'FALSE';
        break;
      case 'ref':
        text = x.name;
        break;
      case 'member':
        text = `${x.inst}.${x.field}`;
        break;
      case 'fcall':
        text = `${x.fn}(${x.args.map((a) => go(a, 0)).join(', ')})`;
        break;
      case 'not':
        // NOT NOT a is not ST: the inner NOT gets parentheses.
        text = `NOT ${x.a.k === 'not' ? `(${go(x.a, 0)})` : go(x.a, PREC.not + 1)}`;
        break;
      default: {
        const op = x.k === 'and' && spelling.ampersand && rng?.chance(0.5) ? '&' : x.k.toUpperCase();
        text = x.args.map((a) => go(a, PREC[x.k] + (a.k === x.k ? 0 : 1))).join(` ${op} `);
      }
    }
    const needs = precOf(x) < parent;
    const extra = spelling.extraParens && precOf(x) < PREC.atom && rng?.chance(0.2);
    return needs || extra ? `(${text})` : text;
  };
  return go(e, 0);
}

function callValue(v: CallValue, spelling: Spelling, rng?: Prng): string {
  return v.k === 'literal' ? v.text : printExpr(v, spelling, rng);
}

/** Statements as lines, indented. */
export function printStatements(stmts: readonly Stmt[], indent: string, spelling: Spelling = PLAIN, rng?: Prng): string[] {
  const lines: string[] = [];
  const e = (x: BExpr): string => printExpr(x, spelling, rng);
  for (const s of stmts) {
    switch (s.k) {
      case 'assign':
        lines.push(`${indent}${s.target} := ${e(s.value)};`);
        break;
      case 'if':
        s.arms.forEach((arm, i) => {
          lines.push(`${indent}${i === 0 ? 'IF' : 'ELSIF'} ${e(arm.cond)} THEN`);
          lines.push(...printStatements(arm.body, indent + '  ', spelling, rng));
        });
        if (s.otherwise) {
          lines.push(`${indent}ELSE`);
          lines.push(...printStatements(s.otherwise, indent + '  ', spelling, rng));
        }
        lines.push(`${indent}END_IF;`);
        break;
      case 'case':
        lines.push(`${indent}CASE ${s.selector} OF`);
        for (const arm of s.arms) {
          lines.push(`${indent}  ${arm.labels.join(', ')}:`);
          lines.push(...printStatements(arm.body, indent + '    ', spelling, rng));
        }
        if (s.otherwise) {
          lines.push(`${indent}  ELSE`);
          lines.push(...printStatements(s.otherwise, indent + '    ', spelling, rng));
        }
        lines.push(`${indent}END_CASE;`);
        break;
      case 'call': {
        const args = [
          ...s.inputs.map((a) => `${a.param} := ${callValue(a.value, spelling, rng)}`),
          ...s.inOuts.map((a) => `${a.param} := ${a.target}`),
          ...s.outputs.map((a) => `${a.param} => ${a.target}`),
        ];
        lines.push(`${indent}${s.inst}(${args.join(', ')});`);
        break;
      }
      case 'action':
        lines.push(`${indent}${s.name}();`);
        break;
    }
  }
  return lines;
}

function declLine(d: Decl): string {
  return `  ${d.name} : ${d.type}${d.init !== undefined ? ` := ${d.init}` : ''};`;
}

function pouSt(pou: Pou, spelling: Spelling, rng?: Prng): string[] {
  const lines = [`${pou.kind} ${pou.name}${pou.kind === 'FUNCTION' ? ' : BOOL' : ''}`];
  for (const b of pou.blocks) {
    lines.push(`${b.section}${b.constant ? ' CONSTANT' : ''}`, ...b.decls.map(declLine), 'END_VAR');
  }
  for (const a of pou.actions) {
    lines.push(`ACTION ${a.name}:`, ...printStatements(a.body, '  ', spelling, rng), 'END_ACTION');
  }
  lines.push(...printStatements(pou.body, '', spelling, rng), `END_${pou.kind}`);
  return lines;
}

/** The spelling a program is printed with comes from its mix seed, so a program prints one way. */
function spellingOf(p: Program): { spelling: Spelling; rng: Prng } {
  const rng = new Prng(p.mixSeed);
  return { spelling: { ampersand: rng.chance(0.3), extraParens: rng.chance(0.3) }, rng };
}

export function printSt(p: Program): string {
  const { spelling, rng } = spellingOf(p);
  const types = p.struct ? ['TYPE', `  ${p.struct.name} : STRUCT`, ...p.struct.members.map((m) => `    ${m} : BOOL;`), '  END_STRUCT;', 'END_TYPE', ''] : [];
  return ['(* generated by the implementation-check fuzz *)', ...types, ...p.pous.flatMap((pou) => [...pouSt(pou, spelling, rng), ''])].join('\n');
}

const XML_LISTS: Readonly<Record<Section, string>> = {
  VAR_INPUT: 'inputVars',
  VAR_OUTPUT: 'outputVars',
  VAR_IN_OUT: 'inOutVars',
  VAR: 'localVars',
  VAR_TEMP: 'tempVars',
};

const escapeXml = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

function xmlType(type: string): string {
  const array = /^ARRAY \[(-?\d+)\.\.(-?\d+)\] OF BOOL$/.exec(type);
  if (array) return `<array><dimension lower="${array[1]}" upper="${array[2]}"/><baseType><BOOL/></baseType></array>`;
  return ['BOOL', 'INT'].includes(type.toUpperCase()) ? `<${type.toUpperCase()}/>` : `<derived name="${escapeXml(type)}"/>`;
}

function xmlBlock(b: VarBlock): string[] {
  const lines = [`<${XML_LISTS[b.section]}${b.constant ? ' constant="true"' : ''}>`];
  for (const d of b.decls) {
    const init = d.init !== undefined ? `<initialValue><simpleValue value="${escapeXml(d.init)}"/></initialValue>` : '';
    lines.push(`  <variable name="${escapeXml(d.name)}"><type>${xmlType(d.type)}</type>${init}</variable>`);
  }
  lines.push(`</${XML_LISTS[b.section]}>`);
  return lines;
}

/** ST text as xhtml content: one text, or lines split into text, <p> elements and <br/>. */
function xhtml(lines: readonly string[], mixed: boolean, rng: Prng): string {
  const open = '<xhtml xmlns="http://www.w3.org/1999/xhtml">';
  if (!mixed) return `${open}${escapeXml(lines.join('\n'))}</xhtml>`;
  let out = '';
  for (const line of lines) {
    const text = escapeXml(line + '\n');
    const r = rng.next();
    out += r < 0.35 ? `<p>${text}</p>` : r < 0.55 ? `${text}<br/>` : text;
  }
  return `${open}${out}</xhtml>`;
}

export function printPlcopen(p: Program): string {
  const { spelling, rng } = spellingOf(p);
  const mixed = p.xhtml === 'mixed';
  // Its own generator, so that a program's expressions print alike, mixed or not.
  const mix = new Prng(p.mixSeed ^ 0x5bd1e995);
  const out = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<project xmlns="http://www.plcopen.org/xml/tc6_0201">',
    '<fileHeader companyName="Fuzz" productName="Fuzz" productVersion="1" creationDateTime="2026-01-01T00:00:00"/>',
    '<contentHeader name="Fuzz"><coordinateInfo><fbd><scaling x="1" y="1"/></fbd><ld><scaling x="1" y="1"/></ld><sfc><scaling x="1" y="1"/></sfc></coordinateInfo></contentHeader>',
    p.struct
      ? `<types><dataTypes><dataType name="${p.struct.name}"><baseType><struct>${p.struct.members.map((m) => `<variable name="${escapeXml(m)}"><type><BOOL/></type></variable>`).join('')}</struct></baseType></dataType></dataTypes><pous>`
      : '<types><dataTypes/><pous>',
  ];
  for (const pou of p.pous) {
    out.push(`<pou name="${escapeXml(pou.name)}" pouType="${pou.kind === 'PROGRAM' ? 'program' : pou.kind === 'FUNCTION' ? 'function' : 'functionBlock'}">`);
    out.push('<interface>', ...(pou.kind === 'FUNCTION' ? ['<returnType><BOOL/></returnType>'] : []), ...pou.blocks.flatMap(xmlBlock), '</interface>');
    if (pou.actions.length > 0) {
      out.push('<actions>');
      for (const a of pou.actions) {
        out.push(`<action name="${escapeXml(a.name)}"><body><ST>${xhtml(printStatements(a.body, '', spelling, rng), mixed, mix)}</ST></body></action>`);
      }
      out.push('</actions>');
    }
    out.push(`<body><ST>${xhtml(printStatements(pou.body, '', spelling, rng), mixed, mix)}</ST></body>`, '</pou>');
  }
  out.push('</pous></types>', '<instances><configurations/></instances>', '</project>', '');
  return out.join('\n');
}

/** The file name and text the product is given. */
export function programFile(p: Program): { name: string; text: string } {
  return p.format === 'xml' ? { name: 'fuzz.xml', text: printPlcopen(p) } : { name: 'fuzz.st', text: printSt(p) };
}
