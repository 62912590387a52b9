// Long and deeply nested programs: read without overflowing the stack (iterative where the
// input is legitimately long), refused with an error value and a line where a cap is right.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const AND_SPEC = 'input;input;output\nA;B;Y\n0;0;0\n0;1;0\n1;0;0\n1;1;1\n';

async function verify(name: string, text: string) {
  const dir = scratch();
  writeFileSync(join(dir, 'spec.csv'), AND_SPEC);
  writeFileSync(join(dir, name), text);
  return runCli('verify', join(dir, 'spec.csv'), '--impl', join(dir, name));
}

const N = 20_000;
const program = (decls: string, body: string): string =>
  `PROGRAM P\nVAR_INPUT A, B : BOOL; END_VAR\nVAR_OUTPUT Y : BOOL; END_VAR\n${decls}\n${body}\nEND_PROGRAM\n`;
const chainVars = `VAR\n${Array.from({ length: N }, (_, i) => `  x${i + 1} : BOOL;`).join('\n')}\nEND_VAR`;

describe('verify: long Structured Text', () => {
  it(`${N} chained assignments (x2 := x1; ...) are read and found equal`, async () => {
    const body = ['x1 := A;', ...Array.from({ length: N - 1 }, (_, i) => `x${i + 2} := x${i + 1};`), `Y := x${N} AND B;`].join('\n');
    const r = await verify('chain.st', program(chainVars, body));
    expect(r.code).toBe(0);
    expect(r.out).toContain(`EQUAL  Y [spec!C2] = P.Y (line ${2 * N + 6})`);
  });

  it(`${N} chained ANDs, one expression ${N} levels deep once substituted, are found equal`, async () => {
    const body = ['x1 := A;', ...Array.from({ length: N - 1 }, (_, i) => `x${i + 2} := x${i + 1} AND B;`), `Y := x${N};`].join('\n');
    const r = await verify('chain-and.st', program(chainVars, body));
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Y');
  });

  it('an ELSIF chain of 5,000 branches is merged without recursion', async () => {
    const branches = Array.from({ length: 5_000 }, (_, i) => `${i === 0 ? 'IF' : 'ELSIF'} NOT A AND B AND NOT B THEN Y := TRUE;`).join('\n');
    const r = await verify('elsif.st', program('', `${branches}\nELSE Y := A AND B;\nEND_IF;`));
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Y');
  });

  it('parentheses nested 1,000 deep are refused with the line, not a stack overflow', async () => {
    const r = await verify('deep.st', program('', `Y := A AND\n${'('.repeat(1000)}B${')'.repeat(1000)};`));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^error: deep\.st line 6: in ".*": the expression nests deeper than 100 levels of parentheses near '\('\n$/);
  });

  it('IF statements nested 101 deep are refused with the line of the first', async () => {
    const r = await verify('if.st', program('', 'IF A THEN '.repeat(101) + 'Y := B;' + ' END_IF;'.repeat(101)));
    expect(r.code).toBe(1);
    expect(r.err).toBe('error: if.st line 5: IF statements nest deeper than 100 levels\n');
  });
});

describe('verify: long ladder rungs and deep XML', () => {
  const project = (ld: string): string => `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="http://www.plcopen.org/xml/tc6_0201"><types><pous><pou name="P" pouType="program"><interface>
<inputVars><variable name="A"><type><BOOL/></type></variable><variable name="B"><type><BOOL/></type></variable></inputVars>
<outputVars><variable name="Y"><type><BOOL/></type></variable></outputVars></interface>
<body><LD>
${ld}
</LD></body></pou></pous></types></project>`;
  const into = (ref: number): string => `<connectionPointIn><connection refLocalId="${ref}"/></connectionPointIn>`;

  it('a rung of 5,000 contacts in series is read and found equal', async () => {
    const contacts = Array.from({ length: 5_000 }, (_, i) => `<contact localId="${i + 2}">${into(i + 1)}<connectionPointOut/><variable>${i % 2 ? 'B' : 'A'}</variable></contact>`);
    const ld = [`<leftPowerRail localId="1"><connectionPointOut/></leftPowerRail>`, ...contacts, `<coil localId="5002">${into(5001)}<connectionPointOut/><variable>Y</variable></coil>`];
    const r = await verify('rung.xml', project(ld.join('\n')));
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Y [spec!C2] = P.Y (line 5007)');
  });

  it('a loop of 5,000 connections is an error naming it, found without recursion', async () => {
    const contacts = Array.from({ length: 5_000 }, (_, i) => `<contact localId="${i + 2}">${into(i === 0 ? 5001 : i + 1)}<connectionPointOut/><variable>A</variable></contact>`);
    const r = await verify('loop.xml', project(contacts.join('\n')));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^error: loop\.xml line \d+: connections form a loop in P: localId /);
  });

  it('elements nested 300 deep are refused with the line', async () => {
    const r = await verify('deep.xml', project('<a>'.repeat(300) + '</a>'.repeat(300)));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^error: deep\.xml line 6: elements nest deeper than 256 levels/);
  });
});
