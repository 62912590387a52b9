import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { equals } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { readPlcopen } from '../../src/impl/plcopen-reader.js';
import type { ImplOutput, ImplPou } from '../../src/impl/types.js';
import { verifyImplementation } from '../../src/impl/verify.js';
import { expectFunction, kinds, output } from './pou-checks.js';
import { exportPlcopen } from '../../src/report/plcopen-export.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { specGrid } from '../report/fixtures.js';

// Small LD networks written element by element, as a PLCopen editor stores them (TC6 2.01).
const ins = (refs: readonly number[]): string =>
  `<connectionPointIn><relPosition x="0" y="8"/>${refs.map((r) => `<connection refLocalId="${r}"/>`).join('')}</connectionPointIn>`;
const out = '<connectionPointOut><relPosition x="20" y="8"/></connectionPointOut>';
const at = (y: number): string => `<position x="0" y="${y}"/>`;
const left = (id: number, y = 0): string =>
  `<leftPowerRail localId="${id}" height="20" width="2">${at(y)}<connectionPointOut formalParameter=""/></leftPowerRail>`;
const right = (id: number, refs: number[], y = 0): string => `<rightPowerRail localId="${id}" height="20" width="2">${at(y)}${ins(refs)}</rightPowerRail>`;
const contact = (id: number, v: string, refs: number[], extra = ''): string =>
  `<contact localId="${id}" ${extra} height="16" width="20">${ins(refs)}${out}<variable>${v}</variable></contact>`;
const coil = (id: number, v: string, refs: number[], y = 0, extra = ''): string =>
  `<coil localId="${id}" ${extra} height="16" width="20">${at(y)}${ins(refs)}${out}<variable>${v}</variable></coil>`;

function project(body: string, options: { vars?: string; ns?: string; globals?: string } = {}): string {
  const vars =
    options.vars ??
    '<inputVars>' +
      ['a', 'b', 'c', 'd'].map((v) => `<variable name="${v}"><type><BOOL/></type></variable>`).join('') +
      '</inputVars><outputVars><variable name="q"><type><BOOL/></type></variable><variable name="r"><type><BOOL/></type></variable></outputVars>';
  return `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="${options.ns ?? 'http://www.plcopen.org/xml/tc6_0201'}">
<types><pous><pou name="P" pouType="program"><interface>${vars}</interface>
<body>${body}</body>
</pou></pous></types>
<instances><configurations>${options.globals ?? ''}</configurations></instances>
</project>`;
}

const ld = (...elements: string[]): string => project(`<LD>\n${elements.join('\n')}\n</LD>`);

function pouOf(text: string): ImplPou {
  const r = readPlcopen('t.xml', text);
  if (!r.ok) throw new Error(r.error.message);
  return r.value.pous[0]!;
}

function errorOf(text: string): string {
  const r = readPlcopen('t.xml', text);
  if (r.ok) throw new Error('expected a failure');
  return r.error.message;
}

describe('PLCopen LD body', () => {
  it('a contact on an array element and a coil on a structure member read and write them as variables', () => {
    const vars =
      '<inputVars><variable name="aIn"><type><array><dimension lower="0" upper="3"/><baseType><BOOL/></baseType></array></type></variable>' +
      '<variable name="a"><type><BOOL/></type></variable></inputVars><outputVars><variable name="io"><type><derived name="ST_Out"/></type></variable></outputVars>';
    const text = project(`<LD>\n${[left(1), contact(2, 'aIn[2]', [1]), contact(3, 'a', [2], 'negated="true"'), coil(4, 'io.bRun', [3]), right(5, [4])].join('\n')}\n</LD>`, { vars }).replace(
      '<types><pous>',
      '<types><dataTypes><dataType name="ST_Out"><baseType><struct><variable name="bRun"><type><BOOL/></type></variable></struct></baseType></dataType></dataTypes><pous>',
    );
    expectFunction(pouOf(text), 'io.bRun', '"aIn[2]" AND NOT a');
  });

  it('contacts in series are an AND', () => {
    expectFunction(pouOf(ld(left(1), contact(2, 'a', [1]), contact(3, 'b', [2]), coil(4, 'q', [3]), right(5, [4]))), 'q', 'a AND b');
  });

  it('several connections into one input are an OR of the branches', () => {
    const pou = pouOf(ld(left(1), contact(2, 'a', [1]), contact(3, 'b', [2]), contact(4, 'c', [1]), coil(5, 'q', [3, 4]), right(6, [5])));
    expectFunction(pou, 'q', '(a AND b) OR c');
  });

  it('a negated contact reads NOT the variable, a negated coil writes NOT the power', () => {
    const pou = pouOf(ld(left(1), contact(2, 'a', [1], 'negated="true"'), coil(3, 'q', [2]), coil(4, 'r', [2], 0, 'negated="true"'), right(5, [3, 4])));
    expectFunction(pou, 'q', 'NOT a');
    expectFunction(pou, 'r', 'a');
  });

  it('a coil with nothing connected is an open rung, never energised', () => {
    expectFunction(pouOf(ld(left(1), coil(2, 'q', []), right(3, [2]))), 'q', 'FALSE');
  });

  it('a coil used as a contact further down is substituted', () => {
    const pou = pouOf(
      ld(left(1, 0), contact(2, 'a', [1]), contact(3, 'b', [2]), coil(4, 'm', [3], 0), right(5, [4], 0),
         left(6, 40), contact(7, 'm', [6]), contact(8, 'c', [6]), coil(9, 'q', [7, 8], 40), right(10, [9], 40)),
    );
    expectFunction(pou, 'q', '(a AND b) OR c');
  });

  it('a coil read by a contact above it gives its previous-scan value', () => {
    const pou = pouOf(
      ld(left(1, 0), contact(2, 'm', [1]), coil(3, 'q', [2], 0), right(4, [3], 0),
         left(5, 40), contact(6, 'a', [5]), coil(7, 'm', [6], 40), right(8, [7], 40)),
    );
    expect(kinds(output(pou, 'q'))).toEqual(['previous-scan']);
  });

  it('executionOrderId decides the order when every coil has one', () => {
    const pou = pouOf(
      ld(left(1, 0), contact(2, 'm', [1]), coil(3, 'q', [2], 0, 'executionOrderId="2"'), right(4, [3], 0),
         left(5, 40), contact(6, 'a', [5]), coil(7, 'm', [6], 40, 'executionOrderId="1"'), right(8, [7], 40)),
    );
    expectFunction(pou, 'q', 'a');
  });

  it('a self-holding rung is a seal-in, named with the coil line', () => {
    const pou = pouOf(ld(left(1), contact(2, 'a', [1]), contact(3, 'q', [1]), contact(4, 'b', [2, 3], 'negated="true"'), coil(5, 'q', [4]), right(6, [5])));
    const q = output(pou, 'q');
    expect(kinds(q)).toEqual(['seal-in']);
    expect(q.cannotJudge[0]!.what).toMatch(/^q feeds back into itself/);
  });

  it('an edge contact, a set coil and a reset coil cannot be judged', () => {
    const pou = pouOf(
      ld(left(1), contact(2, 'a', [1], 'edge="rising"'), coil(3, 'q', [2]), contact(4, 'b', [1]),
         coil(5, 'r', [4], 10, 'storage="set"'), right(6, [3, 5])),
    );
    expect(output(pou, 'q').cannotJudge.map((c) => [c.kind, c.what])).toEqual([['edge', 'rising-edge contact a, localId 2']]);
    expect(output(pou, 'r').cannotJudge.map((c) => [c.kind, c.what])).toEqual([['set-reset', 'set coil r, localId 5']]);
  });

  it('a timer block is reported, and the coil it feeds left unchecked', () => {
    const block = `<block localId="3" typeName="TON" instanceName="T1"><position x="0" y="0"/>
      <inputVariables><variable formalParameter="IN">${ins([2])}</variable></inputVariables>
      <inOutVariables/><outputVariables><variable formalParameter="Q">${out}</variable></outputVariables></block>`;
    const pou = pouOf(ld(left(1), contact(2, 'a', [1]), block, `<coil localId="4"><connectionPointIn><connection refLocalId="3" formalParameter="Q"/></connectionPointIn><variable>q</variable></coil>`, right(5, [4])));
    expect(pou.cannotJudge.map((c) => [c.kind, c.what])).toEqual([['timer', 'timer block T1 (TON), localId 3']]);
    expect(kinds(output(pou, 'q'))).toEqual(['timer']);
  });

  it('a contact on a timer output (T1.Q) is a timer too', () => {
    const vars = '<localVars><variable name="T1"><type><derived name="TON"/></type></variable></localVars><outputVars><variable name="q"><type><BOOL/></type></variable></outputVars>';
    const pou = pouOf(project(`<LD>${left(1)}${contact(2, 'T1.Q', [1])}${coil(3, 'q', [2])}${right(4, [3])}</LD>`, { vars }));
    expect(output(pou, 'q').cannotJudge.map((c) => c.what)).toEqual(['timer T1 (TON): T1.Q, localId 2']);
  });

  it('comments and positions carry no logic', () => {
    const note = '<comment localId="9" height="10" width="10"><position x="0" y="0"/><content><xhtml xmlns="http://www.w3.org/1999/xhtml">rung</xhtml></content></comment>';
    expectFunction(pouOf(ld(note, left(1), contact(2, 'a', [1]), coil(3, 'q', [2]), right(4, [3]))), 'q', 'a');
  });
});

describe('PLCopen LD body: errors name the element', () => {
  it('a dangling refLocalId', () => {
    expect(errorOf(ld(left(1), contact(2, 'a', [7]), coil(3, 'q', [2]), right(4, [3])))).toBe(
      't.xml line 6: localId 2 (contact) connects to refLocalId 7, which does not exist in P',
    );
  });

  it('a loop of connections', () => {
    expect(errorOf(ld(left(1), contact(2, 'a', [1, 3]), contact(3, 'b', [2]), coil(4, 'q', [3]), right(5, [4])))).toMatch(
      /^t\.xml line \d+: connections form a loop in P: localId (2 -> 3 -> 2|3 -> 2 -> 3)$/,
    );
  });

  it('an unknown element', () => {
    expect(errorOf(ld(left(1), '<relay localId="2"/>'))).toBe('t.xml line 6: unknown element <relay> in the LD body of P');
  });

  it('a localId used twice', () => {
    expect(errorOf(ld(left(1), contact(1, 'a', [1])))).toMatch(/localId 1 is used twice in P/);
  });

  it('a contact with no variable', () => {
    expect(errorOf(ld(left(1), '<contact localId="2">' + ins([1]) + '</contact>', coil(3, 'q', [2])))).toBe('t.xml line 6: <contact> localId 2 names no variable');
  });
});

describe('PLCopen project', () => {
  it('reads an ST body with lines counted from the file', () => {
    const text = project('<ST>\n<xhtml xmlns="http://www.w3.org/1999/xhtml">q := a &amp; b;\nr := a AND OR c;</xhtml></ST>');
    expect(errorOf(text)).toMatch(/^t\.xml line 6: in "a AND OR c": expected .* near 'OR'$/);
    const good = pouOf(project('<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">q := a &amp; NOT b;</xhtml></ST>'));
    expectFunction(good, 'q', 'a AND NOT b');
  });

  it('accepts the TC6 2.0 namespace', () => {
    const pou = pouOf(project('<ST><xhtml>q := c;</xhtml></ST>', { ns: 'http://www.plcopen.org/xml/tc6_0200' }));
    expectFunction(pou, 'q', 'c');
  });

  it('refuses another namespace and another root element', () => {
    expect(errorOf(project('<ST><xhtml>q := c;</xhtml></ST>', { ns: 'urn:other' }))).toMatch(/^t\.xml line 2: namespace 'urn:other' is not PLCopen TC6 2\.01 or 2\.0/);
    expect(errorOf('<plc/>')).toBe('t.xml line 1: root element is <plc>, not a PLCopen <project>');
  });

  it('names the line of malformed XML', () => {
    expect(errorOf('<project xmlns="http://www.plcopen.org/xml/tc6_0201">\n<types>\n</project>')).toBe(
      't.xml line 3: closing tag </project> does not match <types> opened on line 2',
    );
  });

  it('refuses a POU without a body', () => {
    expect(errorOf(project('').replace('<body></body>', ''))).toBe('t.xml line 3: POU P has no body');
  });

  it('a body in IL is reported as not read, every output unchecked', () => {
    const pou = pouOf(project('<IL><xhtml xmlns="http://www.w3.org/1999/xhtml">LD a</xhtml></IL>'));
    expect(pou.outputs.map((o) => [o.name, kinds(o)])).toEqual([['q', ['unsupported']], ['r', ['unsupported']]]);
  });

  it('knows the global variables of configurations and resources', () => {
    const globals = '<configuration name="C"><resource name="R"><globalVars><variable name="g"><type><INT/></type></variable></globalVars></resource></configuration>';
    const pou = pouOf(project('<ST><xhtml>q := g > 2;</xhtml></ST>', { globals }));
    expect(output(pou, 'q').cannotJudge.map((c) => c.kind)).toEqual(['non-bool']);
  });
});

describe('PLCopen project: constants, actions and transitions', () => {
  const st = (code: string): string => `<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">${code}</xhtml></ST>`;
  const withVars = (extra: string): string =>
    '<inputVars><variable name="a"><type><BOOL/></type></variable></inputVars><outputVars><variable name="q"><type><BOOL/></type></variable></outputVars>' + extra;

  it('a constant variable list and an initialised local never written are values', () => {
    const vars = withVars(
      '<localVars constant="true"><variable name="k"><type><BOOL/></type><initialValue><simpleValue value="FALSE"/></initialValue></variable></localVars>',
    );
    const pou = pouOf(project(st('q := a OR k;'), { vars }));
    expectFunction(pou, 'q', 'a');
    expect(pou.variables.find((v) => v.name === 'k')).toMatchObject({ constant: true, initial: 'FALSE' });
  });

  it('the actions of a POU with an ST body run where it calls them', () => {
    const text = project(st('q := a;\nInvert();'), { vars: withVars('') }).replace(
      '<body>',
      `<actions><action name="Invert"><body>${st('q := NOT q;')}</body></action></actions><body>`,
    );
    expectFunction(pouOf(text), 'q', 'NOT a');
  });

  it('a transition leaves every output unchecked, naming it', () => {
    const text = project(st('q := a;'), { vars: withVars('') }).replace(
      '<body>',
      `<transitions><transition name="Go"><body>${st('a')}</body></transition></transitions><body>`,
    );
    expect(output(pouOf(text), 'q').cannotJudge.map((c) => c.what)).toEqual(['transition Go (line 4) of P: sequential function chart elements are not read']);
  });

  it('an LD body with actions: what the actions may write leaves every output unchecked', () => {
    const text = ld(left(1), contact(2, 'a', [1]), coil(3, 'q', [2]), right(4, [3])).replace(
      '<body>',
      `<actions><action name="Clear"><body>${st('q := FALSE;')}</body></action></actions><body>`,
    );
    expect(output(pouOf(text), 'q').cannotJudge.map((c) => c.what)).toEqual(['action Clear (line 4) of P is not run with the ladder body']);
  });
});

describe('PLCopen hand-over read back (property)', () => {
  const cellAt = fc.constantFrom('0', '1', '1', '-');
  const spec = fc.integer({ min: 2, max: 5 }).chain((n) =>
    fc.array(fc.array(cellAt, { minLength: 1 << n, maxLength: 1 << n }), { minLength: 1, maxLength: 2 }).map((outs) => ({ n, outs })),
  );

  const tableOf = ({ n, outs }: { n: number; outs: string[][] }) => {
    const inputs = Array.from({ length: n }, (_, i) => `In ${i + 1}`);
    const rows = Array.from({ length: 1 << n }, (_, k) => {
      const bits = inputs.map((_, i) => String((k >> (n - 1 - i)) & 1)).join(' ');
      return `${bits} | ${outs.map((o) => o[k]).join(' ')}`;
    });
    const read = readSpecTables(specGrid({ inputs, outputs: outs.map((_, o) => `Out ${o + 1}`), rows }));
    return read.tables[0]!;
  };

  for (const body of ['LD', 'ST'] as const) {
    it(`an exported ${body} body of the AND/OR forms reads back to the same functions`, () => {
      fc.assert(
        fc.property(spec, (s) => {
          const table = tableOf(s);
          const analysis = analyseTable(table);
          const xml = exportPlcopen([analysis], { body, source: { workbook: 'random.xlsx' }, date: '2026-01-05' });
          const read = readPlcopen('random.xml', xml);
          if (!read.ok) throw new Error(read.error.message);
          const report = verifyImplementation([table], read.value);
          for (const [o, verdict] of report.outputs.entries()) {
            expect(verdict.status, JSON.stringify(verdict.reasons)).toBe('equal');
            const pou = read.value.pous[0]!;
            const back = output(pou, analysis.outputs[o]!.signal.identifier);
            const n = table.inputs.length;
            const order = pou.inputs.map((name) => table.inputs.findIndex((x) => x.identifier === name));
            const remapped = truthTableOver(back, order, n);
            expect(equals(remapped, truthTable(analysis.outputs[o]!.andOr.expr, n))).toBe(true);
          }
        }),
        { numRuns: 60 },
      );
    });
  }
});

/** The output's truth table with its inputs put in the spec's column order. */
function truthTableOver(o: ImplOutput, order: readonly number[], n: number): Uint32Array {
  const go = (e: NonNullable<ImplOutput['expr']>): NonNullable<ImplOutput['expr']> =>
    e.kind === 'var' ? { ...e, input: order[e.input]! } : e.kind === 'not' ? { kind: 'not', arg: go(e.arg) } : e.kind === 'const' ? e : { kind: e.kind, args: e.args.map(go) };
  return truthTable(go(o.expr!), n);
}
