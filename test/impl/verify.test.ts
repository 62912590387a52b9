import { describe, expect, it } from 'vitest';
import { readMappingCsv, type NameMapping } from '../../src/impl/mapping.js';
import { readImplementation } from '../../src/impl/read.js';
import { verifyExitCode, verifyImplementation } from '../../src/impl/verify.js';
import { verifyReportJson, verifyReportText } from '../../src/report/verify-report.js';
import { CAUTION, CAUTION_LINES } from '../../src/report/caution.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { SpecTable } from '../../src/table/types.js';
import type { ImplProgram } from '../../src/impl/types.js';
import { specGrid } from '../report/fixtures.js';
import { capperTables, fixtureText, implementation } from './capper.js';
import { statuses, verdict } from './verdicts.js';

const tables = capperTables();

function mapping(name: string): NameMapping {
  const r = readMappingCsv(name, fixtureText(name));
  if (!r.ok) throw new Error(r.error.message);
  return r.value;
}

describe('implementation check of the sample machine: Structured Text', () => {
  it('the correct program is equal on every output, exit 0', () => {
    const report = verifyImplementation(tables, implementation('capper-cell.st'));
    expect(new Set(report.outputs.map((o) => o.status))).toEqual(new Set(['equal']));
    expect(report.outputs.map((o) => [o.output.identifier, o.variable, o.combinations])).toEqual([
      ['Spindle_run_permit', 'CapperCell.Spindle_run_permit', 128],
      ['Air_supply_OK', 'CapperCell.Air_supply_OK', 8],
      ['Chuck_air_release', 'CapperCell.Chuck_air_release', 32],
      ['Cap_feeder_enable', 'CapperCell.Cap_feeder_enable', 32],
      ['Head_lower_permit', 'CapperCell.Head_lower_permit', 32],
      ['Channel_discrepancy', 'CapperCell.Channel_discrepancy', 64],
    ]);
    expect(report.unmatchedSpec).toEqual([]);
    expect(report.unmatchedProgram).toEqual([]);
    expect(verifyExitCode(report)).toBe(0);
  });

  it('the spindle permit leaves its jog-in-automatic rows to the don\'t-care report', () => {
    const v = verdict(verifyImplementation(tables, implementation('capper-cell.st')), 'Spindle run permit');
    expect(v.dontCare).toEqual({ count: 8, implementationOn: 0 });
    expect(v.gaps.count).toBe(0);
  });

  it('the wrong rung differs on exactly the combinations where the torque is reached', () => {
    const report = verifyImplementation(tables, implementation('capper-cell-wrong.st'));
    const v = verdict(report, 'Head lower permit');
    expect(v.status).toBe('differs');
    expect(v.line).toBe(49);
    expect(v.mismatchCount).toBe(2);
    expect(v.counterexamples).toEqual([
      { combination: 27, inputs: [1, 1, 0, 1, 1], expected: 0, actual: 1, kind: 'unsafe', source: 'row', specRow: { cells: "'Chuck and feeder'!B30:J30", outputCell: "'Chuck and feeder'!J30" } },
      { combination: 31, inputs: [1, 1, 1, 1, 1], expected: 0, actual: 1, kind: 'unsafe', source: 'row', specRow: { cells: "'Chuck and feeder'!B34:J34", outputCell: "'Chuck and feeder'!J34" } },
    ]);
    expect(v.differenceMonomials).toEqual(['Cap_in_chuck AND Bottle_in_position AND Torque_reached AND Air_pressure_OK']);
    expect(report.outputs.filter((o) => o.status !== 'equal').map((o) => o.output.header)).toEqual(['Head lower permit']);
    expect(verifyExitCode(report)).toBe(1);
  });
});

describe('implementation check of the sample machine: PLCopen XML', () => {
  it('the ST body (TC6 2.0) is equal where it implements the spec; the spindle outputs are not found', () => {
    const report = verifyImplementation(tables, implementation('capper-cell-st.xml'));
    expect(statuses(report)).toEqual({
      'Spindle run permit': 'not-found',
      'Air supply OK': 'not-found',
      'Chuck air release': 'equal',
      'Cap feeder enable': 'equal',
      'Head lower permit': 'equal',
      'Channel discrepancy alarm': 'equal',
    });
    expect(verdict(report, 'Spindle run permit').reasons).toEqual([
      'no POU assigns a variable named Spindle_run_permit or "Spindle run permit"; map it in a mapping table',
    ]);
    expect(report.unmatchedSpec).toContain('Spindle!A3:H13: input Jog pressed');
    expect(verifyExitCode(report)).toBe(1);
  });

  it('the wrong ST body forgets the chuck: four counterexamples, all with a cap in the chuck', () => {
    const v = verdict(verifyImplementation(tables.slice(2, 3), implementation('capper-cell-st-wrong.xml')), 'Cap feeder enable');
    expect(v.status).toBe('differs');
    expect(v.variable).toBe('ChuckFeeder.Cap_feeder_enable');
    expect(v.counterexamples.map((c) => [c.inputs.join(''), c.expected, c.actual, c.specRow?.outputCell])).toEqual([
      ['10001', 0, 1, "'Chuck and feeder'!I20"],
      ['10011', 0, 1, "'Chuck and feeder'!I22"],
      ['11001', 0, 1, "'Chuck and feeder'!I28"],
      ['11011', 0, 1, "'Chuck and feeder'!I30"],
    ]);
    expect(v.differenceMonomials).toEqual(['Cap_in_chuck AND Air_pressure_OK', 'Cap_in_chuck AND Head_down AND Air_pressure_OK']);
  });

  it('the LD body with plant tags is equal through the mapping table', () => {
    const report = verifyImplementation(tables.slice(0, 2), implementation('capper-cell-ld.xml'), mapping('capper-cell-ld-map.csv'));
    expect(statuses(report)).toEqual({ 'Spindle run permit': 'equal', 'Air supply OK': 'equal' });
    expect(verdict(report, 'Spindle run permit').variable).toBe('SpindleLD.Q_Spindle_Permit');
    expect(report.unmatchedSpec).toEqual([]);
    expect(report.unusedMapping).toEqual([]);
    expect(verifyExitCode(report)).toBe(0);
  });

  it('without the mapping table nothing is matched by guesswork', () => {
    const report = verifyImplementation(tables.slice(0, 2), implementation('capper-cell-ld.xml'));
    expect(statuses(report)).toEqual({ 'Spindle run permit': 'not-found', 'Air supply OK': 'not-found' });
    expect(report.unmatchedProgram).toContain('SpindleLD.I_GuardA_Closed (input)');
    expect(report.unmatchedProgram).toContain('SpindleLD.Q_Spindle_Permit (output, line 120)');
  });

  it('the wrong LD rung lacks a branch: one counterexample and its spec row', () => {
    const report = verifyImplementation(tables.slice(0, 2), implementation('capper-cell-ld-wrong.xml'), mapping('capper-cell-ld-map.csv'));
    const v = verdict(report, 'Air supply OK');
    expect(v.status).toBe('differs');
    expect(v.counterexamples).toEqual([
      { combination: 3, inputs: [0, 1, 1], expected: 1, actual: 0, kind: 'spurious-trip', source: 'row', specRow: { cells: 'Spindle!A21:D21', outputCell: 'Spindle!D21' } },
    ]);
    expect(v.differenceMonomials).toEqual(['Pressure_switch_2 AND Pressure_switch_3', 'Pressure_switch_1 AND Pressure_switch_2 AND Pressure_switch_3']);
    expect(verdict(report, 'Spindle run permit').status).toBe('equal');
  });
});

describe('implementation check: what cannot be judged, and open combinations', () => {
  const report = verifyImplementation(tables.slice(0, 3), implementation('capper-cell-stateful.st'));

  it('the seal-in, timer, set/reset and edge leave their outputs unchecked with the reason and line', () => {
    const reasons = (h: string): string[] => verdict(report, h).cannotJudge.map((c) => `${c.kind} @${c.line}: ${c.what}`);
    expect(statuses(report)).toEqual({
      'Spindle run permit': 'unchecked',
      'Air supply OK': 'unchecked',
      'Chuck air release': 'unchecked',
      'Cap feeder enable': 'unchecked',
      'Head lower permit': 'equal',
    });
    expect(reasons('Spindle run permit')).toEqual(['seal-in @22: Spindle_run_permit feeds back into itself (seal-in / latch), read at line 22']);
    const fromState = "its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one";
    expect(reasons('Air supply OK')).toEqual([`timer @26: AirDebounce.Q is a member of the timer AirDebounce (TON), read at line 26: ${fromState}`]);
    expect(reasons('Chuck air release')).toEqual([
      'set-reset @28: S= on Chuck_air_release at line 28',
      'set-reset @29: R= on Chuck_air_release at line 29',
    ]);
    expect(reasons('Cap feeder enable')).toEqual([`edge @32: HeadUp.Q is a member of the edge detection HeadUp (F_TRIG), read at line 32: ${fromState}`]);
    expect(verifyExitCode(report)).toBe(1);
  });

  it('lists every construct of the program, used or not, with its POU and line', () => {
    expect(report.cannotJudge.map((c) => `${c.pou}:${c.line} ${c.kind}`)).toEqual([
      'CapperStateful:24 timer',
      'CapperStateful:26 timer',
      'CapperStateful:28 set-reset',
      'CapperStateful:29 set-reset',
      'CapperStateful:31 edge',
      'CapperStateful:32 edge',
      'CapperStateful:22 seal-in',
    ]);
  });

  // Row "1 0 0" is a gap (safe value 0); "- - 1" is a don't-care for Motor permit.
  const gapTable = (): SpecTable =>
    readSpecTables(
      specGrid({ inputs: ['Guard closed', 'Two-hand OK', 'Mode (setup)'], outputs: ['Motor permit'], rows: ['1 1 0 | 1', '0 - 0 | 0', '- - 1 | -'] }),
    ).tables[0]!;
  const guardOnly = (): ImplProgram => {
    const impl = readImplementation('m.st', 'PROGRAM M\nMotor_permit := Guard_closed;\nEND_PROGRAM');
    if (!impl.ok) throw new Error(impl.error.message);
    return impl.value;
  };

  it('a program ON in a gap differs there: the gap is judged at the safe value and labelled', () => {
    const v = verifyImplementation([gapTable()], guardOnly()).outputs[0]!;
    expect(v.status).toBe('differs');
    expect(v.mismatchCount).toBe(1);
    expect(v.counterexamples).toEqual([{ combination: 4, inputs: [1, 0, 0], expected: 0, actual: 1, kind: 'unsafe', source: 'gap' }]);
    expect(v.gaps).toEqual({ count: 1, implementationOn: 1, safe: 0, unsafe: 1, unsafeExamples: [4], judged: true });
    expect(v.dontCare).toEqual({ count: 4, implementationOn: 2 });
  });

  it('with gapsFree the gap is reported, not judged; don\'t-cares are never differences', () => {
    const v = verifyImplementation([gapTable()], guardOnly(), undefined, { gapsFree: true }).outputs[0]!;
    expect(v.status).toBe('equal');
    expect(v.mismatchCount).toBe(0);
    expect(v.gaps).toEqual({ count: 1, implementationOn: 1, safe: 0, unsafe: 1, unsafeExamples: [4], judged: false });
    expect(v.dontCare).toEqual({ count: 4, implementationOn: 2 });
  });

  it('an output assigned in two POUs is not checked until the mapping names one', () => {
    const table = readSpecTables(specGrid({ inputs: ['a'], outputs: ['q'], rows: ['0 | 0', '1 | 1'] })).tables[0]!;
    const text = 'PROGRAM A q := a; END_PROGRAM\nPROGRAM B q := NOT a; END_PROGRAM';
    const impl = readImplementation('two.st', text);
    if (!impl.ok) throw new Error(impl.error.message);
    expect(verifyImplementation([table], impl.value).outputs[0]!.reasons).toEqual([
      'assigned in more than one place: A.q (line 1), B.q (line 2); name one as Pou.Variable in a mapping table',
    ]);
    const map = readMappingCsv('m.csv', 'q,A.q\n');
    if (!map.ok) throw new Error(map.error.message);
    expect(verifyImplementation([table], impl.value, map.value).outputs[0]!.status).toBe('equal');
  });

  it('an output whose program uses an input the spec does not have is unchecked, saying which', () => {
    const table = readSpecTables(specGrid({ inputs: ['a'], outputs: ['q'], rows: ['0 | 0', '1 | 1'] })).tables[0]!;
    const impl = readImplementation('x.st', 'PROGRAM A q := a AND Bypass; END_PROGRAM');
    if (!impl.ok) throw new Error(impl.error.message);
    expect(verifyImplementation([table], impl.value).outputs[0]!.reasons).toEqual([
      'q uses Bypass, which matches no input of the spec table (map it in a mapping table)',
    ]);
  });

  it('mapping entries that name nothing are listed, and the output they name is unchecked', () => {
    const map = readMappingCsv('m.csv', 'Ghost signal,I_Ghost\nAir supply OK,Q_Nowhere\n');
    if (!map.ok) throw new Error(map.error.message);
    const r = verifyImplementation(tables.slice(1, 2), implementation('capper-cell.st'), map.value);
    expect(r.unusedMapping).toEqual([
      "m.csv line 1: no spec table has a signal 'Ghost signal'",
      "m.csv line 1: the program has no variable 'I_Ghost'",
      "m.csv line 2: the program has no variable 'Q_Nowhere'",
    ]);
    expect(r.outputs[0]!.status).toBe('unchecked');
    expect(r.outputs[0]!.reasons).toEqual([
      "the mapping cannot be used as written: m.csv line 2: the program has no variable 'Q_Nowhere'",
      'the mapping (m.csv line 2) names Q_Nowhere, which no POU assigns',
    ]);
  });
});

describe('implementation check reports', () => {
  it('the text report starts with the caution and shows the counterexample row and the result line', () => {
    const text = verifyReportText(verifyImplementation(tables, implementation('capper-cell-wrong.st')));
    expect(text.startsWith(CAUTION_LINES.join('\n'))).toBe(true);
    expect(text).toContain("DIFFERS  Head lower permit ['Chuck and feeder'!J2] = CapperCell.Head_lower_permit (line 49)");
    expect(text).toContain("|    0    1 | 'Chuck and feeder'!B30:J30 (output cell 'Chuck and feeder'!J30)");
    expect(text).toContain('Result: 5 equal, 1 differ, 0 unchecked, 0 not found of 6 outputs; 2 unsafe combinations, 0 spurious trips in all.');
  });

  it('the text report lists what cannot be judged', () => {
    const text = verifyReportText(verifyImplementation(tables.slice(0, 3), implementation('capper-cell-stateful.st')));
    expect(text).toContain('What a truth table cannot judge (combinational logic only):');
    expect(text).toContain('CapperStateful line 22: seal-in: Spindle_run_permit feeds back into itself (seal-in / latch), read at line 22');
  });

  it('the JSON report is plain data with the caution, the verdicts and the exit meaning', () => {
    const json = verifyReportJson(verifyImplementation(tables, implementation('capper-cell-wrong.st'))) as Record<string, unknown>;
    expect(JSON.parse(JSON.stringify(json))).toEqual(json);
    expect(json['caution']).toBe(CAUTION);
    expect(json['allEqual']).toBe(false);
    const outputs = json['outputs'] as { name: string; status: string; mismatchCount: number }[];
    expect(outputs.find((o) => o.name === 'Head lower permit')).toMatchObject({ status: 'differs', mismatchCount: 2 });
  });
});
