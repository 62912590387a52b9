// The fuzz's own interpreter on hand-written programs. Each expected column is worked out by
// hand in the comment beside it; combinations are listed a,b = 00, 01, 10, 11 (a leftmost).
import { describe, expect, it } from 'vitest';
import { FALSE_E, TRUE_E, notE, ref, type BExpr, type Pou, type Program, type Stmt, type VarBlock } from './ast.js';
import { expectedVerdicts, outcomeTable } from './interpreter.js';
import type { GenSpec } from './spec.js';

const a = ref('a');
const b = ref('b');
const and = (...args: BExpr[]): BExpr => ({ k: 'and', args });
const or = (...args: BExpr[]): BExpr => ({ k: 'or', args });
const xor = (...args: BExpr[]): BExpr => ({ k: 'xor', args });
const set = (target: string, value: BExpr): Stmt => ({ k: 'assign', target, value });

/** A PROGRAM with inputs a, b and output y, extra blocks, actions and function blocks. */
function program(body: Stmt[], extra: VarBlock[] = [], more: { actions?: Pou['actions']; fbs?: Pou[] } = {}): Program {
  const main: Pou = {
    kind: 'PROGRAM',
    name: 'P',
    blocks: [
      { section: 'VAR_INPUT', decls: [{ name: 'a', type: 'BOOL' }, { name: 'b', type: 'BOOL' }] },
      { section: 'VAR_OUTPUT', decls: [{ name: 'y', type: 'BOOL' }] },
      ...extra,
    ],
    actions: more.actions ?? [],
    body,
  };
  return { pous: [...(more.fbs ?? []), main], format: 'st', xhtml: 'plain', mixSeed: 1, features: [] };
}

/** A spec over a, b with output y from its rows; combinations no row covers are gaps. */
function spec(rows: string[], safe: 0 | 1 = 0): GenSpec {
  return {
    inputs: ['a', 'b'],
    outputs: ['y'],
    safe: [safe],
    cells: 'numbers',
    rows: rows.map((r) => {
      const [i, o] = r.split('|').map((x) => x.trim().split(/\s+/) as ('0' | '1' | '-')[]);
      return { inputs: i!, outputs: o! };
    }),
  };
}

const ANY = spec(['- - | -']);
const column = (p: Program): (0 | 1 | 'state')[] => outcomeTable(p, ANY)[0]!;

describe('fuzz interpreter: one scan of a program', () => {
  it('evaluates AND, OR, XOR and NOT', () => {
    // y = a AND NOT b: 00->0, 01->0, 10->1, 11->0; z-style checks of OR/XOR below
    expect(column(program([set('y', and(a, notE(b)))]))).toEqual([0, 0, 1, 0]);
    // (a OR b) XOR TRUE = NOR: 1, 0, 0, 0
    expect(column(program([set('y', xor(or(a, b), TRUE_E))]))).toEqual([1, 0, 0, 0]);
  });

  it('reads a spec input the program holds as a member or an element at that location', () => {
    // a is io.a and b is aIn[1]: y = io.a AND NOT aIn[1] = a AND NOT b: 0, 0, 1, 0
    const p = program([set('y', and(ref('io.a'), notE(ref('aIn[1]'))))]);
    expect(column({ ...p, inputPaths: { a: 'io.a', b: 'aIn[1]' }, struct: { name: 'ST_In', members: ['a'] } })).toEqual([0, 0, 1, 0]);
  });

  it('runs a FUNCTION of the program on its arguments', () => {
    // Fn1(X1, X2) := X1 AND NOT X2, called as Fn1(b, a): y = b AND NOT a: 0, 1, 0, 0
    const fn: Pou = {
      kind: 'FUNCTION',
      name: 'Fn1',
      blocks: [{ section: 'VAR_INPUT', decls: [{ name: 'X1', type: 'BOOL' }, { name: 'X2', type: 'BOOL' }] }],
      actions: [],
      body: [set('Fn1', and(ref('X1'), notE(ref('X2'))))],
    };
    expect(column(program([set('y', { k: 'fcall', fn: 'Fn1', args: [b, a] })], [], { fbs: [fn] }))).toEqual([0, 1, 0, 0]);
  });

  it('takes a constant named like an input at its value, not as the input', () => {
    // b is a VAR CONSTANT TRUE here (the spec's b is ignored): y = a AND TRUE = a: 0, 0, 1, 1
    const p = program([set('y', and(a, b))]);
    const withConstant: Program = {
      ...p,
      pous: [{ ...p.pous[0]!, blocks: [{ section: 'VAR_INPUT', decls: [{ name: 'a', type: 'BOOL' }] }, p.pous[0]!.blocks[1]!, { section: 'VAR', constant: true, decls: [{ name: 'b', type: 'BOOL', init: 'TRUE' }] }] }],
    };
    expect(column(withConstant)).toEqual([0, 0, 1, 1]);
  });

  it('takes an initialised local that nothing writes at its initial value', () => {
    // Enabled := TRUE never written: y = b AND Enabled = b: 0, 1, 0, 1
    expect(column(program([set('y', and(b, ref('Enabled')))], [{ section: 'VAR', decls: [{ name: 'Enabled', type: 'BOOL', init: 'TRUE' }] }]))).toEqual([0, 1, 0, 1]);
  });

  it('lets the last assignment win and reads intermediates in order', () => {
    // t := a XOR b; y := TRUE; y := t: y = a XOR b: 0, 1, 1, 0
    const p = program([set('t', xor(a, b)), set('y', TRUE_E), set('y', ref('t'))], [{ section: 'VAR', decls: [{ name: 't', type: 'BOOL' }] }]);
    expect(column(p)).toEqual([0, 1, 1, 0]);
  });

  it('runs the first IF/ELSIF arm whose condition holds, else the ELSE', () => {
    // IF a AND b THEN y := FALSE ELSIF a THEN y := TRUE ELSE y := b: 00->0, 01->1, 10->1, 11->0
    const p = program([{ k: 'if', arms: [{ cond: and(a, b), body: [set('y', FALSE_E)] }, { cond: a, body: [set('y', TRUE_E)] }], otherwise: [set('y', b)] }]);
    expect(column(p)).toEqual([0, 1, 1, 0]);
  });

  it('runs the CASE arm of a constant selector', () => {
    // Sel = 2: the arm 2 gives y = a OR b: 0, 1, 1, 1
    const p = program(
      [{ k: 'case', selector: 'Sel', arms: [{ labels: [1], body: [set('y', a)] }, { labels: [2, 3], body: [set('y', or(a, b))] }], otherwise: [set('y', FALSE_E)] }],
      [{ section: 'VAR', constant: true, decls: [{ name: 'Sel', type: 'INT', init: '2' }] }],
    );
    expect(column(p)).toEqual([0, 1, 1, 1]);
  });

  it('writes a VAR_IN_OUT back to the variable it is bound to', () => {
    // FB: IO := IO OR IN1. y := a; Inst(IN1 := b, IO := y): y = a OR b: 0, 1, 1, 1
    const fb: Pou = {
      kind: 'FUNCTION_BLOCK',
      name: 'Fb',
      blocks: [{ section: 'VAR_INPUT', decls: [{ name: 'IN1', type: 'BOOL' }] }, { section: 'VAR_IN_OUT', decls: [{ name: 'IO', type: 'BOOL' }] }],
      actions: [],
      body: [set('IO', or(ref('IO'), ref('IN1')))],
    };
    const call: Stmt = { k: 'call', inst: 'Inst', inputs: [{ param: 'IN1', value: b }], inOuts: [{ param: 'IO', target: 'y' }], outputs: [] };
    const p = program([set('y', a), call], [{ section: 'VAR', decls: [{ name: 'Inst', type: 'Fb' }] }], { fbs: [fb] });
    expect(column(p)).toEqual([0, 1, 1, 1]);
  });

  it('reads a function block output after the call, and as state before it', () => {
    // FB: Q := NOT IN1. Inst(IN1 := a); y := Inst.Q: y = NOT a: 1, 1, 0, 0
    const fb: Pou = { kind: 'FUNCTION_BLOCK', name: 'Fb', blocks: [{ section: 'VAR_INPUT', decls: [{ name: 'IN1', type: 'BOOL' }] }, { section: 'VAR_OUTPUT', decls: [{ name: 'Q', type: 'BOOL' }] }], actions: [], body: [set('Q', notE(ref('IN1')))] };
    const call: Stmt = { k: 'call', inst: 'Inst', inputs: [{ param: 'IN1', value: a }], inOuts: [], outputs: [] };
    const decl: VarBlock = { section: 'VAR', decls: [{ name: 'Inst', type: 'Fb' }] };
    const q: BExpr = { k: 'member', inst: 'Inst', field: 'Q' };
    expect(column(program([call, set('y', q)], [decl], { fbs: [fb] }))).toEqual([1, 1, 0, 0]);
    // Read before the call: the value the last scan left, whatever it was.
    expect(column(program([set('y', q), call], [decl], { fbs: [fb] }))).toEqual(['state', 'state', 'state', 'state']);
  });

  it('runs an ACTION where the body calls it', () => {
    // y := FALSE; Act() with Act: y := a XOR b: 0, 1, 1, 0
    expect(column(program([set('y', FALSE_E), { k: 'action', name: 'Act' }], [], { actions: [{ name: 'Act', body: [set('y', xor(a, b))] }] }))).toEqual([0, 1, 1, 0]);
  });

  it('marks a value that depends on an earlier scan as state, and only there', () => {
    // y := a OR y (seal-in): a = 1 gives 1; a = 0 keeps the old y
    expect(column(program([set('y', or(a, ref('y')))]))).toEqual(['state', 'state', 1, 1]);
    // IF a THEN y := TRUE END_IF: no ELSE, y keeps its value where a = 0
    expect(column(program([{ k: 'if', arms: [{ cond: a, body: [set('y', TRUE_E)] }] }]))).toEqual(['state', 'state', 1, 1]);
    // TON: Q is FALSE while IN is FALSE; with IN TRUE it depends on how long: IN = a
    const timer: Stmt = { k: 'call', inst: 'T1', inputs: [{ param: 'IN', value: a }, { param: 'PT', value: { k: 'literal', text: 'T#1s' } }], inOuts: [], outputs: [] };
    expect(column(program([timer, set('y', { k: 'member', inst: 'T1', field: 'Q' })], [{ section: 'VAR', decls: [{ name: 'T1', type: 'TON' }] }]))).toEqual([0, 0, 'state', 'state']);
  });

  it('starts VAR_TEMP from its initial value on every scan', () => {
    // t is temp, read before written: FALSE, so y = a OR FALSE = a: 0, 0, 1, 1
    expect(column(program([set('y', or(a, ref('t'))), set('t', TRUE_E)], [{ section: 'VAR_TEMP', decls: [{ name: 't', type: 'BOOL' }] }]))).toEqual([0, 0, 1, 1]);
  });
});

describe('fuzz interpreter: expected verdicts against the spec', () => {
  it('judges gaps at the safe value: a program ON in a gap differs', () => {
    // rows: 11 -> 1, 00 -> 0; gaps 01, 10 at safe 0. y = a: ON at 10 -> differs there only
    const [e] = expectedVerdicts(program([set('y', a)]), spec(['1 1 | 1', '0 0 | 0']));
    expect(e!.verdict).toBe('differs');
    expect([...e!.mismatches]).toEqual([[2, { expected: 0, actual: 1 }]]);
  });

  it('with safe value 1, a gap must be ON', () => {
    // rows: 11 -> 1, 00 -> 0, gaps at safe 1: y = a OR b is 1 at 01, 10, 11 and 0 at 00: equal
    expect(expectedVerdicts(program([set('y', or(a, b))]), spec(['1 1 | 1', '0 0 | 0'], 1))[0]!.verdict).toBe('equal');
    // y = a AND b is OFF in both gaps: differs at 01 and 10
    expect([...expectedVerdicts(program([set('y', and(a, b))]), spec(['1 1 | 1', '0 0 | 0'], 1))[0]!.mismatches.keys()]).toEqual([1, 2]);
  });

  it('never counts a don\'t-care, even where the value depends on state', () => {
    // rows: 1 - -> 1, 0 - -> '-': y = a OR y is 1 where a = 1 and state elsewhere (a don't-care)
    expect(expectedVerdicts(program([set('y', or(a, ref('y')))]), spec(['1 - | 1', '0 - | -']))[0]!.verdict).toBe('equal');
  });

  it('says state, not equal, when a cared-for combination depends on an earlier scan', () => {
    // rows: 1 - -> 1, 0 - -> 0: y = a OR y is state where a = 0, which the spec wants 0
    expect(expectedVerdicts(program([set('y', or(a, ref('y')))]), spec(['1 - | 1', '0 - | 0']))[0]!.verdict).toBe('state');
  });
});
