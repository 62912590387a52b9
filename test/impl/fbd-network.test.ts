// FBD bodies element by element: what is evaluated, what is named as cannot-judge, and the
// errors that name the element.
import { describe, expect, it } from 'vitest';
import { MAX_NETWORK_DEPTH } from '../../src/impl/fbd-network.js';
import { readPlcopen } from '../../src/impl/plcopen-reader.js';
import type { ImplPou } from '../../src/impl/types.js';
import { block, connector, continuation, fbdProject, inOutVariable, inVariable, outVariable, type Interface } from './fbd-writer.js';
import { expectFunction, kinds, output } from './pou-checks.js';

const FACE: Interface = { inputs: ['a', 'b', 'c'], outputs: ['q', 'r'] };

function read(elements: string[], face: Interface = FACE): ImplPou {
  const r = readPlcopen('t.xml', fbdProject('P', face, elements));
  if (!r.ok) throw new Error(r.error.message);
  return r.value.pous[0]!;
}

function errorOf(elements: string[], face: Interface = FACE): string {
  const r = readPlcopen('t.xml', fbdProject('P', face, elements));
  if (r.ok) throw new Error('expected a failure');
  return r.error.message.replace(/^t\.xml line \d+: /, '');
}

const ab = [inVariable(1, 'a'), inVariable(2, 'b')];

describe('FBD logic blocks', () => {
  it('an XOR block is the exclusive or of its inputs', () => {
    const pou = read([...ab, block(3, 'XOR', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3 })]);
    expectFunction(pou, 'q', 'a XOR b');
  });

  it('TRUE and FALSE in input variables are constants', () => {
    const pou = read([
      inVariable(1, 'a'),
      inVariable(2, 'TRUE'),
      inVariable(3, 'FALSE'),
      block(4, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]),
      block(5, 'OR', [{ param: 'IN1', from: 4 }, { param: 'IN2', from: 3 }]),
      outVariable(6, 'q', { from: 5 }),
    ]);
    expectFunction(pou, 'q', 'a');
  });

  it('an EN input with nothing connected leaves the block a plain AND', () => {
    const en = block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]).replace(
      '<inputVariables>',
      '<inputVariables><variable formalParameter="EN"><connectionPointIn/></variable>',
    );
    expectFunction(read([...ab, en, outVariable(4, 'q', { from: 3 })]), 'q', 'a AND b');
  });

  it('an EN input connected makes the block a call that is not evaluated', () => {
    const pou = read([...ab, inVariable(5, 'c'), block(3, 'AND', [{ param: 'EN', from: 5 }, { param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3 })]);
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['function call block AND, localId 3']);
  });

  it('the ENO output of a logic block is not judged', () => {
    const pou = read([...ab, block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }], ['OUT', 'ENO']), outVariable(4, 'q', { from: 3, pin: 'ENO' })]);
    expect(kinds(output(pou, 'q'))).toEqual(['unsupported']);
  });
});

describe('FBD variables', () => {
  it('an in-out variable writes NOT its input with negatedIn, and negatedOut negates what it passes on', () => {
    const pou = read(
      [inVariable(1, 'a'), inOutVariable(2, 'r', { from: 1 }, { negatedIn: true, negatedOut: true }), outVariable(3, 'q', { from: 2 })],
      { inputs: ['a'], outputs: ['q', 'r'] },
    );
    expectFunction(pou, 'r', 'NOT a');
    expectFunction(pou, 'q', 'a');
  });

  it('an in-out variable with nothing connected only reads its variable', () => {
    const pou = read([inOutVariable(1, 'a', null), outVariable(2, 'q', { from: 1 })], { inputs: ['a'], outputs: ['q'] });
    expectFunction(pou, 'q', 'a');
    expect(pou.outputs.map((o) => o.name)).toEqual(['q']);
  });

  it('a variable read above the block that writes it gives its previous-scan value', () => {
    const pou = read([inVariable(1, 'r'), outVariable(2, 'q', { from: 1 }), inVariable(3, 'a'), outVariable(4, 'r', { from: 3 })]);
    expect(kinds(output(pou, 'q'))).toEqual(['previous-scan']);
    expectFunction(pou, 'r', 'a');
  });

  it('an output variable feeding itself through a block is a seal-in', () => {
    const pou = read([inVariable(1, 'a'), inVariable(2, 'q'), block(3, 'OR', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3 })]);
    expect(kinds(output(pou, 'q'))).toEqual(['seal-in']);
  });

  it('edge and storage modifiers are named: a rising-edge input, a set output', () => {
    const pou = read([
      inVariable(1, 'a').replace('<inVariable', '<inVariable edge="rising"'),
      outVariable(2, 'q', { from: 1 }),
      inVariable(3, 'b'),
      outVariable(4, 'r', { from: 3 }).replace('<outVariable', '<outVariable storage="set"'),
    ]);
    expect(kinds(output(pou, 'q'))).toEqual(['edge']);
    expect(kinds(output(pou, 'r'))).toEqual(['set-reset']);
  });

  it('a non-BOOL variable, an expression and a member are each named, not guessed', () => {
    const face: Interface = { inputs: ['a'], outputs: ['q', 'r'], locals: { n: 'INT', T1: 'TON' } };
    const pou = read(
      [
        inVariable(1, 'n'),
        inVariable(2, 'a AND a'),
        block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]),
        outVariable(4, 'q', { from: 3 }),
        inVariable(5, 'T1.Q'),
        outVariable(6, 'r', { from: 5 }),
      ],
      face,
    );
    expect(kinds(output(pou, 'q'))).toEqual(['non-bool', 'unsupported']);
    expect(output(pou, 'r').cannotJudge.map((c) => c.what)).toEqual(['timer T1 (TON): T1.Q, localId 5']);
  });

  it('a structure member and an array element are read as variables of their own', () => {
    const face: Interface = { inputs: [], outputs: ['q'], locals: { io: 'ST_In', aIn: 'ARRAY [1..4] OF BOOL' }, structs: { ST_In: ['bClosed'] } };
    const pou = read([inVariable(1, 'io.bClosed'), inVariable(2, 'aIn[3]'), block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3 })], face);
    expect(pou.undriven.map((u) => u.name)).toEqual(['io.bClosed', 'aIn[3]']);
    expectFunction(pou, 'q', 'io.bClosed AND "aIn[3]"');
  });

  it('a member written above is substituted where it is read below', () => {
    const face: Interface = { inputs: ['a', 'b'], outputs: ['q'], locals: { st: 'ST_In' }, structs: { ST_In: ['bClosed'] } };
    const pou = read([inVariable(1, 'a'), outVariable(2, 'st.bClosed', { from: 1 }), inVariable(3, 'st.bClosed'), inVariable(4, 'b'), block(5, 'OR', [{ param: 'IN1', from: 3 }, { param: 'IN2', from: 4 }]), outVariable(6, 'q', { from: 5 })], face);
    expectFunction(pou, 'q', 'a OR b');
  });

  it('writing a member of an instance is named as unsupported', () => {
    const pou = read([inVariable(1, 'a'), outVariable(2, 'T1.IN', { from: 1 })], { inputs: ['a'], outputs: [], locals: { T1: 'TON' } });
    expect(pou.cannotJudge.map((c) => [c.kind, c.what])).toEqual([['unsupported', 'outVariable writes T1.IN, localId 2']]);
  });
});

describe('FBD function block instances and other blocks are named, never evaluated', () => {
  const through = (typeName: string, instance?: string): ImplPou =>
    read([
      ...ab,
      block(3, typeName, [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }], ['Q1'], instance ? { instance } : {}),
      outVariable(4, 'q', { from: 3, pin: 'Q1' }),
      outVariable(5, 'r', { from: 1 }),
    ]);

  it('a set/reset bistable, an edge detector, a user block, a counter', () => {
    expect(output(through('SR', 'Latch'), 'q').cannotJudge.map((c) => [c.kind, c.what])).toEqual([['set-reset', 'set/reset block Latch (SR), localId 3']]);
    expect(kinds(output(through('R_TRIG', 'Edge1'), 'q'))).toEqual(['edge']);
    expect(kinds(output(through('Debounce', 'D1'), 'q'))).toEqual(['function-block']);
    expect(kinds(output(through('CTU', 'C1'), 'q'))).toEqual(['counter']);
  });

  it('an AND block drawn with an instance name is an instance, not the function', () => {
    expect(kinds(output(through('AND', 'A1'), 'q'))).toEqual(['function-block']);
  });

  it('a function other than AND, OR, XOR, NOT, MOVE is a function call', () => {
    expect(kinds(output(through('GT'), 'q'))).toEqual(['function-call']);
  });

  it('outputs that do not pass through the block are still judged', () => {
    expectFunction(through('TON', 'T1'), 'r', 'a');
  });
});

describe('FBD elements after which nothing is judged', () => {
  it('a jump leaves every output unchecked as control flow', () => {
    const jump = '<jump localId="9" label="L1"><position x="0" y="0"/></jump>';
    const pou = read([...ab, outVariable(3, 'q', { from: 1 }), jump]);
    expect(kinds(output(pou, 'q'))).toEqual(['control-flow']);
  });

  it('a conversion error kept by the exporting tool leaves every output unchecked', () => {
    const error = '<error localId="9" height="20" width="40"><position x="0" y="0"/><content><xhtml xmlns="http://www.w3.org/1999/xhtml">lost</xhtml></content></error>';
    const pou = read([...ab, outVariable(3, 'q', { from: 1 }), error]);
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['conversion error kept by the exporting tool, localId 9']);
  });
});

describe('FBD errors name the element', () => {
  it('a dangling refLocalId', () => {
    expect(errorOf([inVariable(1, 'a'), outVariable(2, 'q', { from: 7 })])).toBe('localId 2 (outVariable) connects to refLocalId 7, which does not exist in P');
  });

  it('a localId used twice, with the line of the first', () => {
    expect(errorOf([inVariable(1, 'a'), inVariable(1, 'b')])).toMatch(/^localId 1 is used twice in P \(first on line \d+\)$/);
  });

  it('an element that is not an FBD object', () => {
    expect(errorOf(['<contact localId="1"><position x="0" y="0"/><variable>a</variable></contact>'])).toBe('unknown element <contact> in the FBD body of P');
  });

  it('an input pin with nothing connected', () => {
    const open = block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]).replace('<connection refLocalId="2"/>', '');
    expect(errorOf([...ab, open, outVariable(4, 'q', { from: 3 })])).toBe('input IN2 of block AND (localId 3) has nothing connected');
  });

  it('two connections into one input: FBD has no wired OR', () => {
    const twice = outVariable(3, 'q', { from: 1 }).replace('<connection refLocalId="1"/>', '<connection refLocalId="1"/><connection refLocalId="2"/>');
    expect(errorOf([...ab, twice])).toBe('outVariable q (localId 3) has 2 connections; FBD joins values only through blocks');
  });

  it('a connection naming an output pin the block does not have', () => {
    expect(errorOf([...ab, block(3, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3, pin: 'Q' })])).toBe(
      'localId 4 connects to output Q of block AND (localId 3), which has outputs OUT',
    );
  });

  it('a connection to a block of several outputs naming none of them', () => {
    const ton = block(3, 'TON', [{ param: 'IN', from: 1 }], ['Q', 'ET'], { instance: 'T1' });
    expect(errorOf([...ab, ton, outVariable(4, 'q', { from: 3 })])).toBe('localId 4 connects to block TON (localId 3) without naming one of its outputs (Q, ET)');
  });

  it('a connection from an output variable, which has no output', () => {
    expect(errorOf([...ab, outVariable(3, 'q', { from: 1 }), outVariable(4, 'r', { from: 3 })])).toBe('localId 4 connects to localId 3, a outVariable, which has no output');
  });

  it('a continuation without its connector, and a connector drawn twice', () => {
    expect(errorOf([continuation(1, 'X'), outVariable(2, 'q', { from: 1 })])).toBe('continuation X (localId 1) has no connector of that name');
    expect(errorOf([...ab, connector(3, 'X', { from: 1 }), connector(4, 'X', { from: 2 })])).toMatch(/^connector X \(localId 4\) is drawn twice \(also localId 3, line \d+\)$/);
  });

  it('a logic block with a pin it does not take', () => {
    expect(errorOf([...ab, block(3, 'OR', [{ param: 'A', from: 1 }, { param: 'IN2', from: 2 }]), outVariable(4, 'q', { from: 3 })])).toBe(
      'block OR (localId 3) has an input A; it takes IN1, IN2, ... only',
    );
    expect(errorOf([...ab, block(3, 'NOT', [{ param: 'IN', from: 1 }, { param: 'IN', from: 2 }]), outVariable(4, 'q', { from: 3 })])).toBe(
      'block NOT (localId 3) has input IN twice',
    );
  });

  it('a loop through a connector and its continuation', () => {
    const elements = [inVariable(1, 'a'), block(2, 'AND', [{ param: 'IN1', from: 1 }, { param: 'IN2', from: 4 }]), connector(3, 'L', { from: 2 }), continuation(4, 'L')];
    expect(errorOf(elements)).toBe('connections form a loop in P: localId 2 -> 3 -> 4 -> 2');
  });
});

describe('FBD depth is bounded by the reader, not by the call stack', () => {
  /** inVariable a, then `moves` MOVE blocks in a chain, then q. */
  const chain = (moves: number): string[] => [
    inVariable(1, 'a'),
    ...Array.from({ length: moves }, (_, i) => block(i + 2, 'MOVE', [{ param: 'IN', from: i + 1 }])),
    outVariable(moves + 2, 'q', { from: moves + 1 }),
  ];

  it(`a chain of ${MAX_NETWORK_DEPTH} elements is read`, () => {
    expectFunction(read(chain(MAX_NETWORK_DEPTH - 2), { inputs: ['a'], outputs: ['q'] }), 'q', 'a');
  });

  it('a chain of 20 000 blocks is an error naming the element, not a stack overflow', () => {
    expect(errorOf(chain(20_000), { inputs: ['a'], outputs: ['q'] })).toBe(`localId ${MAX_NETWORK_DEPTH + 1} is ${MAX_NETWORK_DEPTH + 1} elements deep in P, more than the ${MAX_NETWORK_DEPTH} read`);
  });
});
