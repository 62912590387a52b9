// The hand-drawn FBD programs in fixtures/fbd/, each checked against the verdict derived by
// hand in its header comment.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readMappingCsv } from '../../src/impl/mapping.js';
import { readImplementation } from '../../src/impl/read.js';
import { verifyExitCode, verifyImplementation } from '../../src/impl/verify.js';
import { parseXml } from '../../src/impl/xml.js';
import { tinyTable } from '../report/fixtures.js';
import { schemaViolations } from '../report/plcopen-schema.js';
import { capperTables, fixtureText, implementation } from './capper.js';
import { statuses, verdict } from './verdicts.js';

const tables = capperTables();

/** A spec table over `inputs` whose outputs are the given functions of the input bits (leftmost input first). */
function specOf(inputs: readonly string[], outputs: Readonly<Record<string, (x: readonly number[]) => boolean>>) {
  const n = inputs.length;
  const rows = Array.from({ length: 1 << n }, (_, k) => {
    const x = inputs.map((_, i) => (k >> (n - 1 - i)) & 1);
    return `${x.join(' ')} | ${Object.values(outputs).map((f) => (f(x) ? 1 : 0)).join(' ')}`;
  });
  return tinyTable({ inputs, outputs: Object.keys(outputs), rows });
}

const fbd = (name: string) => implementation(`fbd/${name}`);

describe('FBD fixtures follow TC6 2.01', () => {
  const files = readdirSync(join(import.meta.dirname, 'fixtures', 'fbd')).filter((f) => f.endsWith('.xml'));

  it('there are at least six hand-drawn programs', () => {
    expect(files.length).toBeGreaterThanOrEqual(6);
  });

  for (const file of files) {
    it(`${file}: element order and required attributes as the schema's`, () => {
      const root = parseXml(fixtureText(`fbd/${file}`));
      if (!root.ok) throw new Error(root.error.message);
      expect(schemaViolations(root.value)).toEqual([]);
    });
  }
});

describe('the sample machine drawn in FBD', () => {
  it('the correct diagram is equal on every output, exit 0', () => {
    const report = verifyImplementation(tables, fbd('capper-cell-fbd.xml'));
    expect(report.outputs.map((o) => [o.output.identifier, o.status, o.variable, o.line])).toEqual([
      ['Spindle_run_permit', 'equal', 'CapperFBD.Spindle_run_permit', 191],
      ['Air_supply_OK', 'equal', 'CapperFBD.Air_supply_OK', 257],
      ['Chuck_air_release', 'equal', 'CapperFBD.Chuck_air_release', 332],
      ['Cap_feeder_enable', 'equal', 'CapperFBD.Cap_feeder_enable', 348],
      ['Head_lower_permit', 'equal', 'CapperFBD.Head_lower_permit', 366],
      ['Channel_discrepancy', 'equal', 'CapperFBD.Channel_discrepancy', 447],
    ]);
    expect(report.unmatchedSpec).toEqual([]);
    expect(report.unmatchedProgram).toEqual([]);
    expect(report.cannotJudge).toEqual([]);
    expect(verifyExitCode(report)).toBe(0);
  });

  it('the spindle permit keeps the jog-in-automatic rows as don\'t-cares, as the ST program does', () => {
    const v = verdict(verifyImplementation(tables, fbd('capper-cell-fbd.xml')), 'Spindle run permit');
    expect(v.dontCare).toEqual({ count: 8, implementationOn: 0 });
  });

  it('the AND drawn for the two-out-of-three vote differs at exactly the three two-switch rows', () => {
    const report = verifyImplementation(tables, fbd('capper-cell-fbd-wrong.xml'));
    const v = verdict(report, 'Air supply OK');
    expect(v.status).toBe('differs');
    expect(v.line).toBe(250);
    expect(v.mismatchCount).toBe(3);
    expect(v.counterexamples).toEqual([
      { combination: 3, inputs: [0, 1, 1], expected: 1, actual: 0, kind: 'spurious-trip', source: 'row', specRow: { cells: 'Spindle!A21:D21', outputCell: 'Spindle!D21' } },
      { combination: 5, inputs: [1, 0, 1], expected: 1, actual: 0, kind: 'spurious-trip', source: 'row', specRow: { cells: 'Spindle!A23:D23', outputCell: 'Spindle!D23' } },
      { combination: 6, inputs: [1, 1, 0], expected: 1, actual: 0, kind: 'spurious-trip', source: 'row', specRow: { cells: 'Spindle!A24:D24', outputCell: 'Spindle!D24' } },
    ]);
    expect(v.gaps.unsafe).toBe(0);
    expect(statuses(report)).toEqual({
      'Spindle run permit': 'equal',
      'Air supply OK': 'differs',
      'Chuck air release': 'equal',
      'Cap feeder enable': 'equal',
      'Head lower permit': 'equal',
      'Channel discrepancy alarm': 'equal',
    });
    expect(verifyExitCode(report)).toBe(1);
  });
});

describe('small hand-drawn diagrams', () => {
  it('negated input pins, a negated output pin and negated variables are each read as NOT', () => {
    const spec = specOf(['a', 'b', 'c'], { q: ([a, b]) => a === 1 || b === 0, r: ([, , c]) => c === 0, s: ([a]) => a === 1 });
    expect(statuses(verifyImplementation([spec], fbd('negated-pins.xml')))).toEqual({ q: 'equal', r: 'equal', s: 'equal' });
  });

  it('against a spec of a AND NOT b, the negated diagram differs at the four combinations of the header', () => {
    const spec = specOf(['a', 'b', 'c'], { q: ([a, b]) => a === 1 && b === 0 });
    const v = verdict(verifyImplementation([spec], fbd('negated-pins.xml')), 'q');
    expect(v.status).toBe('differs');
    expect(v.counterexamples.map((c) => [c.inputs.join(''), c.expected, c.actual])).toEqual([
      ['000', 0, 1],
      ['001', 0, 1],
      ['110', 0, 1],
      ['111', 0, 1],
    ]);
  });

  it('a three-input OR and a MOVE are equal to their spec', () => {
    const spec = specOf(['a', 'b', 'c', 'd'], { q: ([a, b, c]) => a + b + c > 0, m: ([, , , d]) => d === 1 });
    expect(statuses(verifyImplementation([spec], fbd('or3-move.xml')))).toEqual({ q: 'equal', m: 'equal' });
  });

  it('the third input of the OR is read: against a OR b it differs where c alone is on', () => {
    const spec = specOf(['a', 'b', 'c', 'd'], { q: ([a, b]) => a + b > 0 });
    const v = verdict(verifyImplementation([spec], fbd('or3-move.xml')), 'q');
    expect(v.counterexamples.map((c) => [c.inputs.join(''), c.expected, c.actual])).toEqual([
      ['0010', 0, 1],
      ['0011', 0, 1],
    ]);
  });

  it('a connector carries its value to its continuation, and the execution order puts t before q', () => {
    const spec = specOf(['a', 'b', 'c'], { q: ([a, b, c]) => a + b + c === 3, u: ([a, b]) => a + b < 2 });
    expect(statuses(verifyImplementation([spec], fbd('connectors.xml')))).toEqual({ q: 'equal', u: 'equal' });
  });

  it('in document order the same diagram reads t from the previous scan, and q is unchecked', () => {
    const text = fixtureText('fbd/connectors.xml').replace(/ executionOrderId="\d+"/g, '');
    const read = readImplementation('connectors.xml', text);
    if (!read.ok) throw new Error(read.error.message);
    const spec = specOf(['a', 'b', 'c'], { q: ([a, b, c]) => a + b + c === 3, u: ([a, b]) => a + b < 2 });
    const report = verifyImplementation([spec], read.value);
    expect(statuses(report)).toEqual({ q: 'unchecked', u: 'equal' });
    expect(verdict(report, 'q').cannotJudge.map((c) => c.kind)).toEqual(['previous-scan']);
  });

  it('a timer in the path leaves its output unchecked, naming its output T1.Q, the block and its line; the other output is still proved', () => {
    const spec = specOf(['start', 'guard'], { run: ([s, g]) => s + g === 2, lamp: ([, g]) => g === 0 });
    const report = verifyImplementation([spec], fbd('timer.xml'));
    expect(statuses(report)).toEqual({ run: 'unchecked', lamp: 'equal' });
    const what = "T1.Q is a member of the timer T1 (TON), read at block localId 3: its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one";
    expect(verdict(report, 'run').reasons).toEqual([`${what} (Delayed, line 45)`]);
    expect(verdict(report, 'run').cannotJudge).toEqual([{ kind: 'timer', pou: 'Delayed', line: 45, what }]);
  });

  it('a mapping stands the timer output T1.Q for a spec input: run is then equal, and the result says so', () => {
    const spec = specOf(['Delayed start', 'guard'], { run: ([s, g]) => s + g === 2 });
    const map = readMappingCsv('map.csv', 'Delayed start;T1.Q\n');
    if (!map.ok) throw new Error(map.error.message);
    const report = verifyImplementation([spec], fbd('timer.xml'), map.value);
    expect(statuses(report)).toEqual({ run: 'equal' });
    expect(report.unusedMapping).toEqual([]);
    expect(verdict(report, 'run').byMapping).toEqual(['T1.Q taken as the spec input Delayed start, by mapping (map.csv line 1)']);
  });

  it('two blocks feeding each other are refused, the loop named by its localIds', () => {
    const read = readImplementation('loop.xml', fixtureText('fbd/loop.xml'));
    expect(read.ok ? 'read' : read.error.message).toBe('loop.xml line 41: connections form a loop in Looped: localId 3 -> 4 -> 3');
  });
});
