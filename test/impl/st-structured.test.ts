// Structured Text as written in combinational code: structure members, array elements with
// constant indices, the file's own functions inlined, VAR_TEMP, and block outputs as named
// sources. Each case reads a small file and checks one behaviour.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equals } from '../../src/logic/bits.js';
import { and, not, or, variable, type Expr } from '../../src/logic/expr/ast.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import { readMappingCsv } from '../../src/impl/mapping.js';
import { readPlcopen } from '../../src/impl/plcopen-reader.js';
import { verifyImplementation } from '../../src/impl/verify.js';
import { readStFile } from '../../src/impl/st-reader.js';
import type { ImplPou } from '../../src/impl/types.js';
import { tinyTable } from '../report/fixtures.js';
import { expectFunction, kinds, output } from './pou-checks.js';
import { verdict } from './verdicts.js';

function pouOf(text: string, name = 'P'): ImplPou {
  const r = readStFile('t.st', text);
  if (!r.ok) throw new Error(r.error.message);
  const pou = r.value.pous.find((p) => p.name === name);
  if (!pou) throw new Error(`no POU ${name}`);
  return pou;
}

function errorOf(text: string): string {
  const r = readStFile('t.st', text);
  if (r.ok) throw new Error('expected a failure');
  return r.error.message;
}

const whats = (pou: ImplPou, name: string): string[] => output(pou, name).cannotJudge.map((c) => c.what);

const TYPES = `TYPE
  ST_Sub : STRUCT b : BOOL; flag : BOOL := TRUE; END_STRUCT;
  ST_IO : STRUCT bClosed : BOOL; bOpen : BOOL; n : INT; sub : ST_Sub; END_STRUCT;
  T_Row : ARRAY [1..4] OF BOOL;
END_TYPE
`;

/** A program P over the types above; `vars` declares more, `body` is its statements. */
const program = (vars: string, body: string, before = ''): string =>
  `${TYPES}${before}PROGRAM P\nVAR_OUTPUT q, r : BOOL; END_VAR\n${vars}\n${body}\nEND_PROGRAM\n`;

describe('Structured Text: structure members', () => {
  it('a member of a global structure, reached through VAR_EXTERNAL, is an input named by its path', () => {
    const pou = pouOf(program('VAR_EXTERNAL io : ST_IO; END_VAR', 'q := io.bClosed AND NOT io.bOpen;', 'VAR_GLOBAL io : ST_IO; END_VAR\n'));
    expectFunction(pou, 'q', 'io.bClosed AND NOT io.bOpen');
    expect(pou.inputs).toEqual(['io.bClosed', 'io.bOpen']);
  });

  it('a member of a nested structure is read through every level, case as declared', () => {
    const pou = pouOf(program('VAR_INPUT io : ST_IO; END_VAR', 'q := IO.SUB.B;'));
    expectFunction(pou, 'q', 'io.sub.b');
  });

  it('a member assigned and read again is an intermediate: its value is substituted', () => {
    const pou = pouOf(program('VAR_INPUT a, b : BOOL; END_VAR VAR st : ST_Sub; END_VAR', 'st.b := a AND b;\nq := st.b OR a;'));
    expectFunction(pou, 'q', 'a');
  });

  it('a member of an output structure that is assigned is an output of its own', () => {
    const pou = pouOf(program('VAR_INPUT a, b : BOOL; END_VAR VAR_OUTPUT io : ST_IO; END_VAR', 'io.bOpen := a XOR b;'));
    expectFunction(pou, 'io.bOpen', 'a XOR b');
    expect(output(pou, 'io.bOpen').section).toBe('output');
  });

  it('a local structure never written takes its members\u2019 initial values', () => {
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR VAR st : ST_Sub; END_VAR', 'q := st.flag AND a;'));
    expectFunction(pou, 'q', 'a');
  });

  it('a member of a type the file does not declare is unchecked, naming the type and line', () => {
    const pou = pouOf(program('VAR_INPUT x : ST_Vendor; END_VAR', 'q := x.bReady;'));
    expect(whats(pou, 'q')).toEqual(['member x.bReady at line 9: the type ST_Vendor of x is not declared in this file']);
  });

  it('a member the structure does not have is unchecked, naming the structure', () => {
    const pou = pouOf(program('VAR_INPUT io : ST_IO; END_VAR', 'q := io.bShut;'));
    expect(whats(pou, 'q')).toEqual(['member io.bShut at line 9: ST_IO (line 3) has no member bShut']);
  });

  it('a member that is not a BOOL makes the expression non-BOOL', () => {
    const pou = pouOf(program('VAR_INPUT io : ST_IO; END_VAR', 'q := io.n > 3;'));
    expect(kinds(output(pou, 'q'))).toEqual(['non-bool']);
  });

  it('a whole structure assigned leaves its members unknown from there on', () => {
    const pou = pouOf(program('VAR_INPUT a : BOOL; other : ST_Sub; END_VAR VAR st : ST_Sub; END_VAR', 'st.b := a;\nst := other;\nq := st.b;'));
    expect(whats(pou, 'q')).toEqual(['assignment to st at line 10 is not followed member by member']);
  });
});

describe('Structured Text: arrays of BOOL', () => {
  it('an element with a constant index is an input named by its index', () => {
    const pou = pouOf(program('VAR_INPUT aIn : ARRAY [1..8] OF BOOL; END_VAR', 'q := aIn[3] AND NOT aIn[ 8 ];'));
    expectFunction(pou, 'q', '"aIn[3]" AND NOT "aIn[8]"');
  });

  it('a two-dimensional array and an array of structures, through a named array type', () => {
    const pou = pouOf(program('VAR_INPUT g : ARRAY [0..1, 0..1] OF BOOL; rows : ARRAY [1..2] OF ST_Sub; t : T_Row; END_VAR', 'q := g[1,0] OR rows[2].b OR t[4];'));
    expectFunction(pou, 'q', '"g[1,0]" OR "rows[2].b" OR "t[4]"');
  });

  it('an element read with a variable index is unchecked, with the line', () => {
    const pou = pouOf(program('VAR_INPUT aIn : ARRAY [1..8] OF BOOL; i : INT; END_VAR', 'q := aIn[i];'));
    expect(whats(pou, 'q')).toEqual(['array element aIn[i] at line 9: the index i is not a constant']);
  });

  it('an index outside the declared bounds is an error at its line', () => {
    expect(errorOf(program('VAR_INPUT aIn : ARRAY [1..8] OF BOOL; END_VAR', 'q := aIn[9];'))).toBe('t.st line 9: index 9 of aIn is outside its bounds 1..8');
  });

  it('a write with a variable index leaves every element of the array unknown', () => {
    const pou = pouOf(program('VAR_INPUT a : BOOL; i : INT; END_VAR VAR aW : ARRAY [1..4] OF BOOL; END_VAR', 'aW[2] := a;\naW[i] := FALSE;\nq := aW[2];\nr := a;'));
    expect(whats(pou, 'q')).toEqual(['assignment to aW[i] at line 10 is not followed member by member']);
    expectFunction(pou, 'r', 'a');
  });
});

describe('Structured Text: functions of the same file are inlined', () => {
  const both = 'FUNCTION Both : BOOL\nVAR_INPUT x, y : BOOL; END_VAR\nBoth := x AND NOT y;\nEND_FUNCTION\n';

  it('a call with positional arguments is the function of its arguments', () => {
    const pou = pouOf(program('VAR_INPUT a, b, c : BOOL; END_VAR', 'q := Both(a OR c, b);', both));
    expectFunction(pou, 'q', '(a OR c) AND NOT b');
  });

  it('a call with named arguments in any order; an input not given takes its initial value', () => {
    const fn = 'FUNCTION Gate : BOOL\nVAR_INPUT x : BOOL; en : BOOL := TRUE; END_VAR\nGate := x AND en;\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a, b : BOOL; END_VAR', 'q := Gate(en := b, x := a);\nr := Gate(x := a);', fn));
    expectFunction(pou, 'q', 'a AND b');
    expectFunction(pou, 'r', 'a');
  });

  it('a function calling another function of the file is inlined through both', () => {
    const outer = 'FUNCTION Outer : BOOL\nVAR_INPUT z : BOOL; END_VAR\nOuter := NOT Both(z, FALSE);\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Outer(a);', both + outer));
    expectFunction(pou, 'q', 'NOT a');
  });

  it('a function that reads a global is not inlined: unchecked, naming the global', () => {
    const fn = 'VAR_GLOBAL gReady : BOOL; END_VAR\nFUNCTION Ready : BOOL\nVAR_INPUT x : BOOL; END_VAR\nReady := x AND gReady;\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Ready(a);', fn));
    expect(whats(pou, 'q')).toEqual([
      "function Ready(...) at line 14 is not inlined: its result reads gReady, which is not one of its VAR_INPUTs (a global, an undeclared name or a block's member)",
    ]);
  });

  it('a function with a VAR_IN_OUT is not inlined', () => {
    const fn = 'FUNCTION Swap : BOOL\nVAR_IN_OUT x : BOOL; END_VAR\nSwap := x;\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Swap(a);', fn));
    expect(whats(pou, 'q')).toEqual(['function Swap(...) at line 13 is not inlined: it declares VAR_IN_OUT x (line 7): what it passes back is not inlined']);
  });

  it('a recursive function is not inlined: unchecked, naming the chain', () => {
    const fn = 'FUNCTION Loop : BOOL\nVAR_INPUT x : BOOL; END_VAR\nLoop := Loop(x);\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Loop(a);', fn));
    expect(whats(pou, 'q')).toEqual([
      'function Loop(...) at line 13 is not inlined: function Loop(...) at line 8 is not inlined: it is called within itself (Loop -> Loop): recursion is not read (line 8)',
    ]);
  });

  it('a function that calls one the file does not define is not inlined, naming that call and its line', () => {
    const fn = 'FUNCTION Wrap : BOOL\nVAR_INPUT x : BOOL; END_VAR\nWrap := Vendor(x);\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Wrap(a);', fn));
    expect(whats(pou, 'q')).toEqual(['function Wrap(...) at line 13 is not inlined: function Vendor(...) at line 8 (line 8)']);
  });

  it('a function returning something other than BOOL is not inlined', () => {
    const fn = 'FUNCTION Count : INT\nVAR_INPUT x : BOOL; END_VAR\nCount := 1;\nEND_FUNCTION\n';
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR', 'q := Count(a) = 1;', fn));
    expect(kinds(output(pou, 'q'))).toEqual(['non-bool']);
  });
});

describe('Structured Text: VAR_TEMP and block outputs', () => {
  it('a VAR_TEMP starts each scan at its initial value: read before it is written, it is that value', () => {
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR VAR_TEMP t : BOOL; u : BOOL := TRUE; END_VAR', 'q := t OR a;\nt := a;\nr := t AND u;'));
    expectFunction(pou, 'q', 'a');
    expectFunction(pou, 'r', 'a');
  });

  it('a block output read before and after the block is called is two values, two leaves of one name', () => {
    const pou = pouOf(program('VAR_INPUT a : BOOL; END_VAR VAR edge : R_TRIG; END_VAR', 'q := edge.Q;\nedge(CLK := a);\nr := edge.Q AND q;'));
    expect(pou.inputs).toEqual(['edge.Q', 'edge.Q']);
  });

  it('a member the standard block does not have is unchecked, naming it', () => {
    const pou = pouOf(program('VAR T1 : TON; END_VAR', 'q := T1.DONE;'));
    expect(whats(pou, 'q')).toEqual(['member T1.DONE at line 9: TON has no input or output DONE']);
  });
});

describe('PLCopen XML: structure and array types in ST bodies', () => {
  it('a dataType structure and an array variable are read as in an .st file', () => {
    const text = `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="http://www.plcopen.org/xml/tc6_0201"><types>
<dataTypes><dataType name="ST_IO"><baseType><struct>
<variable name="bClosed"><type><BOOL/></type></variable>
</struct></baseType></dataType></dataTypes>
<pous><pou name="P" pouType="program"><interface>
<inputVars><variable name="io"><type><derived name="ST_IO"/></type></variable>
<variable name="aIn"><type><array><dimension lower="0" upper="3"/><baseType><BOOL/></baseType></array></type></variable></inputVars>
<outputVars><variable name="q"><type><BOOL/></type></variable></outputVars>
</interface><body><ST><xhtml xmlns="http://www.w3.org/1999/xhtml">q := io.bClosed AND aIn[2];</xhtml></ST></body></pou></pous></types></project>`;
    const r = readPlcopen('p.xml', text);
    if (!r.ok) throw new Error(r.error.message);
    expectFunction(r.value.pous[0]!, 'q', 'io.bClosed AND "aIn[2]"');
  });
});

describe('property: AND/OR forms written over members and elements read back equal', () => {
  const N = 6;
  /** Input i of the form is written as a member or an element. */
  const names = ['io.bClosed', 'io.sub.b', 'aIn[1]', 'aIn[4]', 'rows[2].flag', 'g[0,1]'];
  const form = (depth: number): fc.Arbitrary<Expr> =>
    depth === 0
      ? fc.integer({ min: 0, max: N - 1 }).map((i) => variable(i, names[i]!))
      : fc.oneof(
          form(depth - 1),
          fc.tuple(form(depth - 1), form(depth - 1)).map(([a, b]) => and(a, b)),
          fc.tuple(form(depth - 1), form(depth - 1)).map(([a, b]) => or(a, b)),
          form(depth - 1).map((a) => not(a)),
        );

  it('the program read back has the form\u2019s function over the same members and elements', () => {
    fc.assert(
      fc.property(form(4), (e) => {
        const text = program(
          'VAR_EXTERNAL io : ST_IO; END_VAR VAR_INPUT aIn : T_Row; rows : ARRAY [1..3] OF ST_Sub; g : ARRAY [0..1, 0..1] OF BOOL; END_VAR',
          `q := ${printSt(e)};`,
          'VAR_GLOBAL io : ST_IO; END_VAR\n',
        );
        const pou = pouOf(text);
        const q = output(pou, 'q');
        expect(q.cannotJudge).toEqual([]);
        // Back onto the form's input numbering.
        const back = (x: Expr): Expr =>
          x.kind === 'var' ? variable(names.indexOf(pou.inputs[x.input]!), x.name) : x.kind === 'not' ? not(back(x.arg)) : x.kind === 'const' ? x : { kind: x.kind, args: x.args.map(back) };
        return equals(truthTable(back(q.expr!), N), truthTable(e, N));
      }),
      { numRuns: 150 },
    );
  });
});

describe('implementation check over members and elements, by mapping', () => {
  const spec = tinyTable({ inputs: ['Door closed', 'Pulse'], outputs: ['Run'], rows: ['0 0 | 0', '0 1 | 0', '1 0 | 1', '1 1 | 0'] });
  const check = (text: string, map: string) => {
    const read = readStFile('t.st', text);
    const m = readMappingCsv('map.csv', map);
    if (!read.ok || !m.ok) throw new Error('bad fixture');
    return verifyImplementation([spec], read.value, m.value);
  };

  it('an array element and a POU-qualified member mapped to spec inputs: equal', () => {
    const text = program('VAR_INPUT aIn : T_Row; io : ST_IO; END_VAR VAR_OUTPUT Run : BOOL; END_VAR', 'Run := aIn[2] AND NOT io.sub.b;');
    const r = check(text, 'Door closed,aIn[ 2 ]\nPulse,P.io.sub.b\n');
    expect(verdict(r, 'Run').status).toBe('equal');
    expect(r.unusedMapping).toEqual([]);
    expect(verdict(r, 'Run').byMapping).toEqual([
      'aIn[2] taken as the spec input Door closed, by mapping (map.csv line 1)',
      'io.sub.b taken as the spec input Pulse, by mapping (map.csv line 2)',
    ]);
  });

  it('a block output read before and after its call cannot stand for one spec input: unchecked', () => {
    const text = program('VAR_INPUT a : BOOL; END_VAR VAR_OUTPUT Run : BOOL; END_VAR VAR edge : R_TRIG; END_VAR', 'q := edge.Q;\nedge(CLK := a);\nRun := a AND NOT (edge.Q OR q);');
    const r = check(text, 'Door closed,a\nPulse,edge.Q\n');
    expect(verdict(r, 'Run').status).toBe('unchecked');
    expect(verdict(r, 'Run').reasons).toEqual(['Run reads edge.Q before and after its block is called (two values in one scan): one spec input cannot stand for both']);
  });
});

describe('mapping pairs naming members the body does not read', () => {
  it('a member the program declares but never reads is known: no problem, the output still judged', () => {
    const spec = tinyTable({ inputs: ['Door closed', 'Reset'], outputs: ['Run'], rows: ['0 - | 0', '1 - | 1'] });
    const read = readStFile('t.st', program('VAR_INPUT io : ST_IO; END_VAR VAR_OUTPUT Run : BOOL; END_VAR', 'Run := io.bClosed;'));
    const m = readMappingCsv('map.csv', 'Door closed,io.bClosed\nReset,io.sub.flag\n');
    if (!read.ok || !m.ok) throw new Error('bad fixture');
    const r = verifyImplementation([spec], read.value, m.value);
    expect(r.mappingProblems).toEqual([]);
    expect(verdict(r, 'Run').status).toBe('equal');
  });

  it('a member the structure does not have is an unknown variable at its mapping line', () => {
    const spec = tinyTable({ inputs: ['Door closed'], outputs: ['Run'], rows: ['0 | 0', '1 | 1'] });
    const read = readStFile('t.st', program('VAR_INPUT io : ST_IO; END_VAR VAR_OUTPUT Run : BOOL; END_VAR', 'Run := io.bClosed;'));
    const m = readMappingCsv('map.csv', 'Door closed,io.bShut\n');
    if (!read.ok || !m.ok) throw new Error('bad fixture');
    const r = verifyImplementation([spec], read.value, m.value);
    expect(r.mappingProblems.map((p) => [p.code, p.where, p.message])).toEqual([
      ['mapping-unknown-variable', 'map.csv line 1', "the program has no variable, member or element 'io.bShut'"],
    ]);
    expect(verdict(r, 'Run').status).toBe('unchecked');
  });
});
