import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equals } from '../../src/logic/bits.js';
import { and, not, or, variable, xor, type Expr } from '../../src/logic/expr/ast.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { sharedTruthTable } from '../../src/logic/implcheck.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import { readStFile } from '../../src/impl/st-reader.js';
import type { CannotJudgeKind, ImplOutput, ImplPou } from '../../src/impl/types.js';

function pouOf(text: string, index = 0): ImplPou {
  const r = readStFile('t.st', text);
  if (!r.ok) throw new Error(r.error.message);
  return r.value.pous[index]!;
}

function errorOf(text: string): string {
  const r = readStFile('t.st', text);
  if (r.ok) throw new Error('expected a failure');
  return r.error.message;
}

function output(pou: ImplPou, name: string): ImplOutput {
  const out = pou.outputs.find((o) => o.name === name);
  if (!out) throw new Error(`no output ${name} in ${pou.outputs.map((o) => o.name).join(', ')}`);
  return out;
}

/** The output's function equals the expected expression, over the POU's inputs. */
function expectFunction(pou: ImplPou, name: string, expected: string): void {
  const out = output(pou, name);
  expect(out.cannotJudge).toEqual([]);
  const signals = pou.inputs.map((n) => ({ header: n, identifier: n }));
  const want = parseExpression(expected, signals);
  if (!want.ok) throw new Error(want.error.message);
  const n = Math.max(1, pou.inputs.length);
  expect(equals(truthTable(out.expr!, n), truthTable(want.value, n)), `${name}: ${printSt(out.expr!)} vs ${expected}`).toBe(true);
}

function kinds(out: ImplOutput): CannotJudgeKind[] {
  return out.cannotJudge.map((c) => c.kind);
}

/** Reads that are inputs only when a mapping names them: name and kind. */
function sources(pou: ImplPou): [string, CannotJudgeKind][] {
  return pou.undriven.map((u) => [u.name, u.item.kind]);
}

const program = (vars: string, body: string): string =>
  `PROGRAM P\nVAR_INPUT\n  a, b, c, d : BOOL;\nEND_VAR\nVAR_OUTPUT\n  q, r : BOOL;\nEND_VAR\n${vars}\n${body}\nEND_PROGRAM\n`;

describe('Structured Text reader: declarations and comments', () => {
  it('reads every variable section with its type, initial value and line', () => {
    const pou = pouOf(`FUNCTION_BLOCK Fb
VAR_INPUT x AT %IX0.1 : BOOL; n : INT := 3; END_VAR
VAR_OUTPUT RETAIN y : BOOL := TRUE; END_VAR
VAR_TEMP t : BOOL; END_VAR
VAR T1 : TON; arr : ARRAY [1..2] OF BOOL; END_VAR
y := x;
END_FUNCTION_BLOCK`);
    expect(pou.kind).toBe('FUNCTION_BLOCK');
    expect(pou.variables.map((v) => [v.name, v.section, v.type, v.initial ?? null, v.line])).toEqual([
      ['x', 'input', 'BOOL', null, 2],
      ['n', 'input', 'INT', '3', 2],
      ['y', 'output', 'BOOL', 'TRUE', 3],
      ['t', 'temp', 'BOOL', null, 4],
      ['T1', 'local', 'TON', null, 5],
      ['arr', 'local', 'ARRAY [1..2] OF BOOL', null, 5],
    ]);
  });

  it('drops (* *) comments, nested ones too, and // and /* */ comments', () => {
    const pou = pouOf(program('', 'q := a (* and (* not *) b *) AND c; // OR d\n/* r := d; */ r := d;'));
    expectFunction(pou, 'q', 'a AND c');
    expectFunction(pou, 'r', 'd');
  });

  it('reads several POUs and the global variables of the file', () => {
    const text = `VAR_GLOBAL g_Speed : INT; END_VAR
FUNCTION_BLOCK A VAR_INPUT x : BOOL; END_VAR VAR_OUTPUT y : BOOL; END_VAR y := NOT x; END_FUNCTION_BLOCK
PROGRAM B VAR_OUTPUT z : BOOL; END_VAR z := g_Speed > 3; END_PROGRAM`;
    expect(pouOf(text, 0).name).toBe('A');
    const b = pouOf(text, 1);
    expect(kinds(output(b, 'z'))).toEqual(['non-bool']);
  });

  it('takes an undeclared name as a BOOL input and says so', () => {
    const pou = pouOf(program('', 'q := a AND Extra;'));
    expectFunction(pou, 'q', 'a AND Extra');
    expect(pou.notes).toEqual(['Extra (line 9) is not declared in P; taken as a BOOL']);
  });

  it('reads the BOOL literals TRUE, FALSE, 1, 0 and BOOL#1', () => {
    const pou = pouOf(program('', 'q := a AND 1 AND BOOL#TRUE; r := a OR BOOL#0 OR FALSE;'));
    expectFunction(pou, 'q', 'a');
    expectFunction(pou, 'r', 'a');
  });

  it('reads the value a FUNCTION returns', () => {
    const pou = pouOf('FUNCTION Both : BOOL\nVAR_INPUT x, y : BOOL; END_VAR\nBoth := x AND y;\nEND_FUNCTION');
    expect(pou.kind).toBe('FUNCTION');
    expectFunction(pou, 'Both', 'x AND y');
  });
});

describe('Structured Text reader: symbolic values', () => {
  it('substitutes intermediate variables', () => {
    const pou = pouOf(program('VAR ok : BOOL; END_VAR', 'ok := a AND NOT b;\nq := ok OR c;\nr := ok XOR q;'));
    expectFunction(pou, 'q', '(a AND NOT b) OR c');
    expectFunction(pou, 'r', '(a AND NOT b) XOR ((a AND NOT b) OR c)');
    expectFunction(pou, 'ok', 'a AND NOT b');
  });

  it('a later assignment replaces an earlier one', () => {
    expectFunction(pouOf(program('', 'q := a;\nq := q AND b;')), 'q', 'a AND b');
  });

  it('computes IF / ELSIF / ELSE along every branch', () => {
    const pou = pouOf(program('', 'IF a THEN\n  q := b;\nELSIF c THEN\n  q := d;\n  r := TRUE;\nELSE\n  q := FALSE;\n  r := b;\nEND_IF;'));
    expectFunction(pou, 'q', '(a AND b) OR (NOT a AND c AND d)');
    expect(kinds(output(pou, 'r'))).toEqual(['seal-in']);
  });

  it('an IF without ELSE keeps the value assigned before it', () => {
    const pou = pouOf(program('', 'q := FALSE;\nIF a AND b THEN q := TRUE; END_IF\nr := c;\nIF d THEN r := NOT r; END_IF'));
    expectFunction(pou, 'q', 'a AND b');
    expectFunction(pou, 'r', 'c XOR d');
  });

  it('nested IFs combine their conditions', () => {
    const pou = pouOf(program('', 'q := FALSE;\nIF a THEN\n  IF b THEN q := c; ELSE q := d; END_IF;\nEND_IF;'));
    expectFunction(pou, 'q', 'a AND ((b AND c) OR (NOT b AND d))');
  });

  it('a VAR_TEMP starts every scan at its initial value, so reading it first is no memory', () => {
    const pou = pouOf(program('VAR_TEMP t : BOOL; u : BOOL := TRUE; END_VAR', 'q := t OR a;\nr := u AND b;'));
    expectFunction(pou, 'q', 'a');
    expectFunction(pou, 'r', 'b');
  });

  it('reads an expression spread over lines with Excel-style AND(...) and the & operator', () => {
    expectFunction(pouOf(program('', 'q := AND(a,\n  b) & NOT(c);')), 'q', 'a AND b AND NOT c');
  });
});

describe('Structured Text reader: what a truth table cannot judge', () => {
  it('a seal-in is named with its POU and line, and its output left unchecked', () => {
    const pou = pouOf(program('VAR Run : BOOL; END_VAR', 'q := a;\nRun := (a OR Run) AND NOT b;'));
    const run = output(pou, 'Run');
    expect(run.expr).toBeUndefined();
    expect(run.cannotJudge).toEqual([{ kind: 'seal-in', pou: 'P', line: 10, what: 'Run feeds back into itself (seal-in / latch), read at line 10' }]);
    expectFunction(pou, 'q', 'a');
  });

  it('an IF that leaves an output unassigned on some branch is a latch', () => {
    const out = output(pouOf(program('', 'IF a THEN q := TRUE; ELSIF b THEN q := FALSE; END_IF;')), 'q');
    expect(out.cannotJudge.map((c) => c.what)).toEqual(['q keeps its previous value when no branch of the IF at line 9 assigns it (latch)']);
  });

  it('reading a variable before the scan assigns it uses its previous-scan value', () => {
    const out = output(pouOf(program('', 'q := r AND a;\nr := b;')), 'q');
    expect(kinds(out)).toEqual(['previous-scan']);
    expect(out.cannotJudge[0]!.what).toMatch(/q \(line 9\) uses r from the previous scan/);
  });

  it('a timer instance, its call and its output are reported; its output is a named source; outputs not using it stay checked', () => {
    const pou = pouOf(program('VAR T_Clamp : TON; END_VAR', 'T_Clamp(IN := a, PT := T#2s);\nq := T_Clamp.Q AND b;\nr := c;'));
    expect(pou.cannotJudge.map((c) => [c.kind, c.line, c.what])).toEqual([
      ['timer', 9, 'timer T_Clamp (TON) called at line 9'],
      [
        'timer',
        10,
        "T_Clamp.Q is a member of the timer T_Clamp (TON), read at line 10: its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one",
      ],
    ]);
    expectFunction(pou, 'q', 'T_Clamp.Q AND b');
    expect(sources(pou)).toEqual([['T_Clamp.Q', 'timer']]);
    expectFunction(pou, 'r', 'c');
  });

  it('a call output written with => is the block member it names', () => {
    const pou = pouOf(program('VAR Cnt : CTU; END_VAR', 'Cnt(CU := a, PV := 3, Q => q);'));
    expectFunction(pou, 'q', 'Cnt.Q');
    expect(sources(pou)).toEqual([['Cnt.Q', 'counter']]);
  });

  it('R_TRIG and F_TRIG outputs are named sources of edge detection', () => {
    const pou = pouOf(program('VAR Up : R_TRIG; END_VAR', 'Up(CLK := a);\nq := Up.Q;'));
    expect(sources(pou)).toEqual([['Up.Q', 'edge']]);
  });

  it('S= and R= are set/reset storage; an SR output is a named source of its kind', () => {
    const pou = pouOf(program('VAR Latch : SR; END_VAR', 'q S= a;\nq R= b;\nLatch(S1 := a, R := b);\nr := Latch.Q1;'));
    expect(output(pou, 'q').cannotJudge.map((c) => [c.kind, c.what])).toEqual([
      ['set-reset', 'S= on q at line 9'],
      ['set-reset', 'R= on q at line 10'],
    ]);
    expect(sources(pou)).toEqual([['Latch.Q1', 'set-reset']]);
  });

  it('a function other than AND, OR, XOR, NOT is a function call', () => {
    const out = output(pouOf(program('', 'q := a AND SEL(b, c, d);')), 'q');
    expect(out.cannotJudge.map((c) => [c.kind, c.what])).toEqual([['function-call', 'function SEL(...) at line 9']]);
  });

  it('comparisons and arithmetic are non-BOOL', () => {
    const pou = pouOf(program('VAR n : INT; END_VAR', 'q := a AND (n > 2);\nr := n MOD 2 = 0;'));
    expect(kinds(output(pou, 'q'))).toEqual(['non-bool']);
    expect(kinds(output(pou, 'r'))).toEqual(['non-bool']);
  });

  it('a CASE or a loop makes what it assigns unjudgeable', () => {
    const pou = pouOf(program('VAR n : INT; END_VAR', 'CASE n OF\n  1: q := a;\n  2: q := b;\nEND_CASE;\nr := c;'));
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['CASE at line 9 assigns q']);
    expectFunction(pou, 'r', 'c');
  });

  it('an expression that doubles per statement is read as shared parts and stays judged', () => {
    // Written out as a tree this is 6.4e9 operations; as shared parts it is a few per statement.
    const pou = pouOf(program('VAR t : BOOL; END_VAR', 't := a;\n' + 't := (t AND b) OR (t AND c);\n'.repeat(30) + 'q := t;'));
    const q = output(pou, 'q');
    expect(q.cannotJudge).toEqual([]);
    const [a, b, c] = ['a', 'b', 'c'].map((n) => variable(pou.inputs.indexOf(n), n)) as [Expr, Expr, Expr];
    expect(equals(sharedTruthTable(q.expr!, 3), truthTable(and(a, or(b, c)), 3))).toBe(true);
  });

  it('a RETURN before the end leaves every output unchecked', () => {
    const pou = pouOf(program('', 'q := a;\nIF b THEN RETURN; END_IF;\nr := c;'));
    expect(kinds(output(pou, 'q'))).toEqual(['control-flow']);
    expect(kinds(output(pou, 'r'))).toEqual(['control-flow']);
  });
});

describe('Structured Text reader: errors', () => {
  it('refuses IF statements nested beyond 100 levels', () => {
    expect(errorOf(program('', 'IF a THEN '.repeat(101) + 'q := b;' + ' END_IF;'.repeat(101)))).toBe('t.st line 9: IF statements nest deeper than 100 levels');
  });

  it('names the file and line of an IF without END_IF', () => {
    expect(errorOf(program('', 'IF a THEN\n q := b;'))).toBe('t.st line 9: IF has no END_IF');
  });

  it('names the line and what the parser expected in a bad expression', () => {
    expect(errorOf(program('', 'q := a;\nr := a AND OR b;'))).toMatch(/^t\.st line 10: in "a AND OR b": expected .* near 'OR'$/);
  });

  it('names the line of an unclosed comment', () => {
    expect(errorOf('(* one\n(* two *)\nPROGRAM P END_PROGRAM')).toBe('t.st line 1: comment (* is not closed');
  });

  it('refuses text that is not a POU', () => {
    expect(errorOf('x := 1;')).toBe("t.st line 1: expected PROGRAM, FUNCTION_BLOCK or FUNCTION, found 'x'");
  });

  it('refuses a POU with no END', () => {
    expect(errorOf('PROGRAM P\nVAR_OUTPUT q : BOOL; END_VAR\nq := TRUE;')).toBe('t.st line 1: PROGRAM P has no END_PROGRAM');
  });
});

describe('Structured Text reader: property', () => {
  const names = ['a', 'b', 'c', 'd'];
  const exprAt = (depth: number): fc.Arbitrary<Expr> =>
    depth === 0
      ? fc.integer({ min: 0, max: 3 }).map((i) => variable(i, names[i]!))
      : fc.oneof(
          exprAt(0),
          exprAt(depth - 1).map((e) => not(e)),
          fc.array(exprAt(depth - 1), { minLength: 2, maxLength: 3 }).map((args) => and(...args)),
          fc.array(exprAt(depth - 1), { minLength: 2, maxLength: 3 }).map((args) => or(...args)),
          fc.array(exprAt(depth - 1), { minLength: 2, maxLength: 3 }).map((args) => xor(...args)),
        );

  it('an assignment of any printed expression reads back to the same function', () => {
    fc.assert(
      fc.property(exprAt(3), (e) => {
        const pou = pouOf(program('', `q := ${printSt(e)};`));
        const out = output(pou, 'q');
        // The reader's inputs are in order of first use; line its columns up with a..d.
        const back = pou.inputs.map((n) => names.indexOf(n));
        const remap = (x: Expr): Expr =>
          x.kind === 'var' ? variable(back[x.input]!, x.name) : x.kind === 'not' ? not(remap(x.arg)) : x.kind === 'const' ? x : { kind: x.kind, args: x.args.map(remap) };
        expect(equals(truthTable(remap(out.expr!), 4), truthTable(e, 4))).toBe(true);
      }),
      { numRuns: 200 },
    );
  });

  it('an IF chain equals its case-by-case reading on every combination', () => {
    fc.assert(
      fc.property(exprAt(1), exprAt(1), exprAt(1), exprAt(1), (c1, v1, c2, v2) => {
        const text = program('', `q := d;\nIF ${printSt(c1)} THEN q := ${printSt(v1)}; ELSIF ${printSt(c2)} THEN q := ${printSt(v2)}; END_IF;`);
        const pou = pouOf(text);
        const back = pou.inputs.map((n) => names.indexOf(n));
        const remap = (x: Expr): Expr =>
          x.kind === 'var' ? variable(back[x.input]!, x.name) : x.kind === 'not' ? not(remap(x.arg)) : x.kind === 'const' ? x : { kind: x.kind, args: x.args.map(remap) };
        const d = variable(3, 'd');
        const expected = or(and(c1, v1), and(not(c1), c2, v2), and(not(c1), not(c2), d));
        expect(equals(truthTable(remap(output(pou, 'q').expr!), 4), truthTable(expected, 4))).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});

describe('Structured Text reader: values, inputs and undriven reads', () => {
  it('a CONSTANT and an initialised local never written are their values; a VAR_TEMP starts each scan at its own', () => {
    const pou = pouOf(program('VAR CONSTANT on : BOOL := TRUE; END_VAR VAR off : BOOL := FALSE; END_VAR', 'q := a AND on;\nr := b OR off;'));
    expectFunction(pou, 'q', 'a');
    expectFunction(pou, 'r', 'b');
    expect(pou.inputs).toEqual(['a', 'b']);
  });

  it('a global CONSTANT reached through VAR_EXTERNAL has the global\'s value', () => {
    const text = 'VAR_GLOBAL CONSTANT g : BOOL := TRUE; END_VAR\nPROGRAM P VAR_EXTERNAL CONSTANT g : BOOL; END_VAR VAR_INPUT a : BOOL; END_VAR VAR_OUTPUT q : BOOL; END_VAR q := a AND g; END_PROGRAM';
    expectFunction(pouOf(text), 'q', 'a');
  });

  it('a local at an input address (AT %IX) is an input; a plain local never written is undriven', () => {
    const pou = pouOf(program('VAR sw AT %IX0.3 : BOOL; idle : BOOL; END_VAR', 'q := sw;\nr := idle;'));
    expectFunction(pou, 'q', 'sw');
    expect(pou.undriven.map((u) => [u.name, u.item.kind, u.item.line])).toEqual([['idle', 'undriven', 10]]);
  });

  it('an initial value that is not a BOOL literal is not read as FALSE', () => {
    const out = output(pouOf(program('VAR m : BOOL := SOME_CONST; END_VAR', 'q := a AND m;')), 'q');
    expect(out.cannotJudge.map((c) => c.what)).toEqual(["initial value 'SOME_CONST' of m (line 8) is not read"]);
  });

  it('assigning a CONSTANT is an error with its line', () => {
    expect(errorOf(program('VAR CONSTANT k : BOOL := TRUE; END_VAR', 'k := a;'))).toBe('t.st line 9: k is a CONSTANT (line 8) and cannot be assigned');
  });
});

describe('Structured Text reader: calls that write back', () => {
  it('an output written with => inside an expression call is not judged', () => {
    const pou = pouOf(program('VAR n : INT; END_VAR', 'q := a;\nn := Calc(IN := 2, DONE => q);'));
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['output DONE of Calc (=> q) at line 10']);
  });

  it('a positional argument of a FUNCTION of the file lands on its VAR_IN_OUT: written back', () => {
    const text = `FUNCTION Flip : BOOL
VAR_INPUT x : BOOL; END_VAR
VAR_IN_OUT y : BOOL; END_VAR
y := NOT y; Flip := x;
END_FUNCTION
${program('', 'q := a;\nr := Flip(b, q);')}`;
    const pou = pouOf(text, 1);
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['VAR_IN_OUT y of Flip (Flip) writes back into q at line 15']);
  });

  it('an input of a FUNCTION of the file is not written back', () => {
    const text = `FUNCTION Same : BOOL\nVAR_INPUT x : BOOL; END_VAR\nSame := x;\nEND_FUNCTION\n${program('', 'q := a;\nr := Same(q);')}`;
    expectFunction(pouOf(text, 1), 'q', 'a');
  });

  it('standard functions and blocks write only their => outputs', () => {
    const pou = pouOf(program('VAR T1 : TON; END_VAR', 'q := a;\nT1(IN := q, PT := T#1s);\nr := SEL(b, q, c);'));
    expectFunction(pou, 'q', 'a');
  });

  it('a block of the file that declares a global as VAR_EXTERNAL may write that global', () => {
    const text = `VAR_GLOBAL g : BOOL; END_VAR
FUNCTION_BLOCK Reset VAR_EXTERNAL g : BOOL; END_VAR g := FALSE; END_FUNCTION_BLOCK
PROGRAM P VAR_INPUT a : BOOL; END_VAR VAR_EXTERNAL g : BOOL; END_VAR VAR R1 : Reset; END_VAR
g := a;
R1();
END_PROGRAM`;
    expect(output(pouOf(text, 1), 'g').cannotJudge.map((c) => c.what)).toEqual(['R1 (Reset) may write the global g (its VAR_EXTERNAL) at line 5']);
  });

  it('a method of an instance called with a variable may write it back', () => {
    const pou = pouOf(program('VAR Drive : Motor; END_VAR', 'q := a;\nDrive.Start(q);'));
    expect(kinds(output(pou, 'q'))).toEqual(['function-block']);
  });
});

describe('Structured Text reader: actions, methods and sequential elements', () => {
  it('an action runs where the body calls it, as often as it is called', () => {
    const pou = pouOf(program('', 'q := a;\nFlipQ();\nFlipQ();\nr := q;\nACTION FlipQ:\n  q := NOT q;\nEND_ACTION'));
    expectFunction(pou, 'q', 'a');
    expectFunction(pou, 'r', 'a');
  });

  it('an action called inside a loop makes what it writes unjudged', () => {
    const pou = pouOf(program('VAR n : INT; END_VAR', 'q := a;\nFOR n := 1 TO 3 DO Set(); END_FOR;\nACTION Set:\n  q := b;\nEND_ACTION'));
    expect(kinds(output(pou, 'q'))).toEqual(['control-flow']);
  });

  it('what a METHOD writes of its block is unchecked: it runs when called from outside', () => {
    const text = 'FUNCTION_BLOCK Fb\nVAR_INPUT a : BOOL; END_VAR\nVAR_OUTPUT q : BOOL; END_VAR\nq := a;\nMETHOD Reset : BOOL\n  q := FALSE;\nEND_METHOD\nEND_FUNCTION_BLOCK';
    expect(output(pouOf(text), 'q').cannotJudge.map((c) => c.what)).toEqual(['method Reset (line 5) writes q; it runs when called from outside the scan']);
  });

  it('steps and transitions leave every output unchecked', () => {
    const pou = pouOf(program('', 'q := a;\nINITIAL_STEP Start: END_STEP\nTRANSITION FROM Start TO Start := b; END_TRANSITION'));
    expect(kinds(output(pou, 'q'))).toEqual(['unsupported', 'unsupported']);
  });
});
