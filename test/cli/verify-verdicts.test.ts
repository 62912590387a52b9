// `verify` says EQUAL only when everything that reaches an output was read and modelled.
// Each program below differs from the spec Y = A AND B (or is beyond what is read): none may
// come out EQUAL. Files are built here from a few lines; the command runs in-process.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, scratch } from './run-cli.js';

const AND_SPEC = 'input;input;output\nA;B;Y\n0;0;0\n0;1;0\n1;0;0\n1;1;1\n';

function files(impl: { name: string; text: string }, spec = AND_SPEC, map?: string): { spec: string; impl: string; map?: string } {
  const dir = scratch();
  const paths = { spec: join(dir, 'spec.csv'), impl: join(dir, impl.name), ...(map ? { map: join(dir, 'map.csv') } : {}) };
  writeFileSync(paths.spec, spec);
  writeFileSync(paths.impl, impl.text);
  if (map) writeFileSync(paths.map!, map);
  return paths;
}

async function verify(impl: { name: string; text: string }, ...options: string[]) {
  const f = files(impl);
  return runCli('verify', f.spec, '--impl', f.impl, ...options);
}

const st = (decls: string, body: string, extra = ''): { name: string; text: string } => ({
  name: 'p.st',
  text: `${extra}PROGRAM P\nVAR_INPUT B : BOOL; END_VAR\nVAR_OUTPUT Y : BOOL; END_VAR\n${decls}\n${body}\nEND_PROGRAM\n`,
});

const plcopen = (interfaceXml: string, body: string, actions = ''): { name: string; text: string } => ({
  name: 'p.xml',
  text: `<?xml version="1.0" encoding="UTF-8"?>
<project xmlns="http://www.plcopen.org/xml/tc6_0201"><types><pous><pou name="P" pouType="program">
<interface><inputVars><variable name="B"><type><BOOL/></type></variable></inputVars>
<outputVars><variable name="Y"><type><BOOL/></type></variable></outputVars>${interfaceXml}</interface>
${actions}<body>${body}</body></pou></pous></types></project>`,
});

const boolVar = (name: string, initial?: string): string =>
  `<variable name="${name}"><type><BOOL/></type>${initial ? `<initialValue><simpleValue value="${initial}"/></initialValue>` : ''}</variable>`;

describe('verify: constants and initialised variables are values, not inputs', () => {
  it('a CONSTANT named like the spec input A is its value: the program is Y = B, which differs', async () => {
    const r = await verify(st('VAR CONSTANT A : BOOL := TRUE; END_VAR', 'Y := A AND B;'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y [spec!C2] = P.Y (line 5)');
    expect(r.out).toContain('    0 1 |    0    1 | spec!A4:C4 (output cell spec!C4)');
    expect(r.out).toContain('Spec signals not matched to the program:\n  spec!A1:C6: input A');
  });

  it('a local with an initial value that is never written is that value: differs', async () => {
    const r = await verify(st('VAR A : BOOL := TRUE; END_VAR', 'Y := A AND B;'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y');
  });

  it('a constant in a PLCopen local variable list is its value: differs', async () => {
    const body = '<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">Y := A AND B;</xhtml></ST>';
    const r = await verify(plcopen(`<localVars constant="true">${boolVar('A', 'TRUE')}</localVars>`, body));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y');
  });

  it('a local read but never written and without an initial value is unchecked, with its line', async () => {
    const r = await verify(st('VAR A : BOOL; END_VAR', 'Y := A AND B;'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y');
    expect(r.out).toContain(
      'A (VAR, line 4) is read at line 5 but never written in P and is no input: it stays FALSE or is set from outside; declare it VAR_INPUT or map it to a spec input (P, line 5)',
    );
  });

  it('the same local is an input once a mapping names it for the spec input: equal', async () => {
    const f = files(st('VAR Tag_A : BOOL; END_VAR', 'Y := Tag_A AND B;'), AND_SPEC, 'A,Tag_A\n');
    const r = await runCli('verify', f.spec, '--impl', f.impl, '--map', f.map!);
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Y');
  });
});

describe('verify: what calls write back', () => {
  const clear = 'FUNCTION_BLOCK Clear\nVAR_IN_OUT IO : BOOL; END_VAR\nIO := FALSE;\nEND_FUNCTION_BLOCK\n';

  it('an instance whose VAR_IN_OUT is given Y writes Y back: unchecked, naming the parameter and line', async () => {
    const r = await verify(st('VAR A : BOOL := FALSE; Inst : Clear; END_VAR', 'Y := B AND B;\nInst(IO := Y);', clear));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y [spec!C2] = P.Y (line 10)');
    expect(r.out).toContain('VAR_IN_OUT IO of Inst (Clear) writes back into Y at line 10');
  });

  it('a function of unknown parameters given Y inside an expression may write Y back: unchecked', async () => {
    const r = await verify(st('VAR_INPUT A : BOOL; END_VAR VAR n : INT; END_VAR', 'Y := A AND B;\nn := Vendor_Fn(Y) + 1;'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y');
    expect(r.out).toContain('Vendor_Fn may write back into Y (its parameters are not known) at line 6');
  });
});

describe('verify: actions', () => {
  it('a call of an action (or anything) that is not in the file leaves every output unchecked', async () => {
    const r = await verify(st('VAR_INPUT A : BOOL; END_VAR', 'Y := A AND B;\nClearAll();'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y');
    expect(r.out).toContain('call of ClearAll at line 6: no instance, function or action of that name is read, so what it writes is not known');
  });

  it('an ST action called by the body is run there: its OR replaces the AND, which differs', async () => {
    const r = await verify(st('VAR_INPUT A : BOOL; END_VAR', 'Y := A AND B;\nWiden();\nACTION Widen:\n  Y := A OR B;\nEND_ACTION'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y [spec!C2] = P.Y (line 8)');
  });

  it('an ST action that is never called leaves what it writes unchecked', async () => {
    const r = await verify(st('VAR_INPUT A : BOOL; END_VAR', 'Y := A AND B;\nACTION Later:\n  Y := FALSE;\nEND_ACTION'));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y');
    expect(r.out).toContain('action Later (line 6) writes Y; it is not called in the body of P');
  });

  it('a PLCopen action with an ST body is read and run where the body calls it', async () => {
    const actions =
      '<actions><action name="Widen"><body><ST><xhtml xmlns="http://www.w3.org/1999/xhtml">Y := A OR B;</xhtml></ST></body></action></actions>';
    const body = '<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">Y := A AND B;\nWiden();</xhtml></ST>';
    const r = await verify(plcopenWithA(body, actions));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y');
  });

  it('a PLCopen action in a language not read leaves every output unchecked', async () => {
    const actions = '<actions><action name="Lad"><body><LD/></body></action></actions>';
    const r = await verify(plcopenWithA('<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">Y := A AND B;\nLad();</xhtml></ST>', actions));
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Y');
    expect(r.out).toContain('action Lad (line 5) of P: its LD body is not read, so what it writes is not known');
  });
});

function plcopenWithA(body: string, actions = ''): { name: string; text: string } {
  const p = plcopen('', body, actions);
  return { ...p, text: p.text.replace('<inputVars>', `<inputVars>${boolVar('A')}`) };
}

describe('verify: ST bodies in PLCopen XML are read in document order', () => {
  it('text around child elements of <xhtml> keeps its order: the last assignment (OR) counts', async () => {
    const body = '<ST><xhtml xmlns="http://www.w3.org/1999/xhtml">Y := A AND B;<span>Y := A AND B;</span>\nY := A OR B;</xhtml></ST>';
    const r = await verify(plcopenWithA(body));
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Y [spec!C2] = P.Y (line 6)');
  });
});

describe('verify: gaps are judged at the safe value', () => {
  const GAPS = 'input;input;output\nA;B;Q\n1;1;1\n0;0;0\n';
  const orProgram = { name: 'or.st', text: 'PROGRAM P\nVAR_INPUT A, B : BOOL; END_VAR\nVAR_OUTPUT Q : BOOL; END_VAR\nQ := A OR B;\nEND_PROGRAM\n' };

  it('a program ON in a gap differs there, and the counterexample says it is a gap', async () => {
    const f = files(orProgram, GAPS);
    const r = await runCli('verify', f.spec, '--impl', f.impl);
    expect(r.code).toBe(1);
    expect(r.out).toContain('DIFFERS  Q');
    expect(r.out).toContain('differs on 2 of 4 combinations (safe value 0): 2 unsafe combinations, 0 spurious trips');
    expect(r.out).toContain('  !! unsafe        0 1 |    0    1 | gap: no row covers it, safe value 0');
    expect(r.out).not.toContain('equal on all');
  });

  it('--gaps-free leaves gaps unjudged and says so: equal on the 2 specified combinations', async () => {
    const f = files(orProgram, GAPS);
    const r = await runCli('verify', f.spec, '--impl', f.impl, '--gaps-free');
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Q');
    expect(r.out).toContain('equal on the 2 specified combinations; 2 gap combinations not judged (--gaps-free)');
    expect(r.out).not.toContain('equal on all');
  });

  it('--gaps-free shows in the JSON document as gaps not judged', async () => {
    const f = files(orProgram, GAPS);
    const r = await runCli('verify', f.spec, '--impl', f.impl, '--gaps-free', '--json');
    const doc = JSON.parse(r.out) as { outputs: { status: string; gaps: { judged: boolean; unsafe: number } }[] };
    expect(doc.outputs[0]).toMatchObject({ status: 'equal', gaps: { judged: false, unsafe: 2 } });
  });
});

describe('verify: structure members, block outputs and the mapping', () => {
  const SYNC_SPEC = 'input;input;output\nSSOV1 closed;Sync fault;Valve permit\n0;0;0\n0;1;0\n1;0;1\n1;1;0\n';
  const syncProgram = {
    name: 'sync.st',
    text: `TYPE ST_IO : STRUCT
  bSSOV1Closed : BOOL;
  bSSOV2Closed : BOOL;
END_STRUCT; END_TYPE
VAR_GLOBAL io : ST_IO; END_VAR
PROGRAM Valves
VAR_EXTERNAL io : ST_IO; END_VAR
VAR_OUTPUT bValvePermit : BOOL; END_VAR
VAR tonSync : TON; bSyncFault : BOOL; END_VAR
tonSync(IN := io.bSSOV1Closed XOR io.bSSOV2Closed, PT := T#2s);
bSyncFault := tonSync.Q;
bValvePermit := io.bSSOV1Closed AND NOT bSyncFault;
END_PROGRAM
`,
  };
  const run = async (map: string, ...more: string[]) => {
    const f = files(syncProgram, SYNC_SPEC, map);
    return runCli('verify', f.spec, '--impl', f.impl, '--map', f.map!, ...more);
  };

  it('a structure member and a timer output mapped to spec inputs: equal, and the result says the timer output was taken by mapping', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,tonSync.Q\n');
    expect(r.code).toBe(0);
    expect(r.out).toContain('EQUAL  Valve permit [spec!C2] = Valves.bValvePermit (line 12)');
    expect(r.out).toContain('Valve permit: tonSync.Q taken as the spec input Sync fault, by mapping (map.csv line 3)');
    expect(r.out).not.toContain('has no variable');
  });

  it('the JSON says per output which program expressions were taken as spec inputs by mapping', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,tonSync.Q\n', '--json');
    const [out] = JSON.parse(r.out).outputs;
    expect(out.byMapping).toContain('tonSync.Q taken as the spec input Sync fault, by mapping (map.csv line 3)');
  });

  it('the JSON lists each mapping problem with its code and line', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,tonSync\n', '--json');
    expect(JSON.parse(r.out).mappingProblems).toEqual([expect.objectContaining({ code: 'mapping-not-bool', where: 'map.csv line 3' })]);
  });

  it('the timer output left unmapped: unchecked, saying it may be mapped, and the member is not reported missing', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain('UNCHECKED  Valve permit');
    expect(r.out).toContain(
      "tonSync.Q is a member of the timer tonSync (TON), read at line 11: its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one (Valves, line 11)",
    );
    expect(r.out).not.toContain('has no variable');
  });

  it('a mapping that names an unknown spec signal: one problem at its line, the outputs reading its variable unchecked', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync falt,tonSync.Q\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain('Mapping entries that cannot be used (the outputs they touch are UNCHECKED):\n  map.csv line 3: no spec table has a signal \'Sync falt\'\n');
    expect(r.out).toContain('UNCHECKED  Valve permit');
    expect(r.out).toContain("  the mapping cannot be used as written: map.csv line 3: no spec table has a signal 'Sync falt'");
  });

  it('a mapping that names an unknown program variable: one problem at its line, the outputs of the table unchecked', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,tonSnyc.Q\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain("Mapping entries that cannot be used (the outputs they touch are UNCHECKED):\n  map.csv line 3: the program has no variable, member or element 'tonSnyc.Q'\n");
    expect(r.out).toContain('UNCHECKED  Valve permit');
  });

  it('two spec signals mapped to one variable: one problem naming both lines, the outputs unchecked', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,io.bSSOV1Closed\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain(
      "Mapping entries that cannot be used (the outputs they touch are UNCHECKED):\n  map.csv line 3: spec signals 'SSOV1 closed' (map.csv line 2) and 'Sync fault' (map.csv line 3) are both mapped to io.bSSOV1Closed\n",
    );
    expect(r.out).toContain('UNCHECKED  Valve permit');
    expect(r.out).not.toContain('EQUAL');
  });

  it('a mapping to a variable that is not a BOOL: one problem naming its type and line, the outputs unchecked', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,tonSync\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain("Mapping entries that cannot be used (the outputs they touch are UNCHECKED):\n  map.csv line 3: 'tonSync' is TON in Valves (line 9), not BOOL\n");
    expect(r.out).toContain('UNCHECKED  Valve permit');
  });

  it('a spec input mapped to a variable the program assigns: one problem, the outputs unchecked', async () => {
    const r = await run('Valve permit,bValvePermit\nSSOV1 closed,io.bSSOV1Closed\nSync fault,bSyncFault\n');
    expect(r.code).toBe(1);
    expect(r.out).toContain(
      "map.csv line 3: 'bSyncFault' cannot stand for the spec input 'Sync fault': Valves assigns it (line 11), so it is no input; map what it is assigned from",
    );
    expect(r.out).toContain('UNCHECKED  Valve permit');
  });
});
