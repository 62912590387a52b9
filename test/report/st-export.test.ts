import { describe, expect, it } from 'vitest';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { isValidIdentifier } from '../../src/logic/identifiers.js';
import { prove } from '../../src/logic/proof.js';
import type { TableAnalysis } from '../../src/analysis/analysis-types.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import { exportSt, type FormChoice } from '../../src/report/st-export.js';
import { analysisOf, GUARD, VOTE } from './fixtures.js';

const source = { workbook: 'capper-cell.xlsx' };

/** Each POU of the text: its kind, name, declared inputs and outputs, and assignments. */
function readBack(st: string) {
  const pous = [...st.matchAll(/^(FUNCTION_BLOCK|PROGRAM) (\S+)\n([\s\S]*?)^END_\1$/gm)];
  return pous.map((m) => {
    const section = (name: string) => {
      const block = new RegExp(`^${name}\\n([\\s\\S]*?)^END_VAR$`, 'm').exec(m[3]!)?.[1] ?? '';
      return [...block.matchAll(/^\s+(\S+) : BOOL;$/gm)].map((d) => d[1]!);
    };
    const body = m[3]!.slice(m[3]!.lastIndexOf('END_VAR') + 'END_VAR'.length);
    const assignments = [...body.matchAll(/(\S+) := ([^;]*);/g)].map((a) => ({ target: a[1]!, text: a[2]!.replace(/\s+/g, ' ') }));
    return { kind: m[1]!, name: m[2]!, inputs: section('VAR_INPUT'), outputs: section('VAR_OUTPUT'), assignments };
  });
}

/** Parse every assignment back and prove it equal to the spec of its output. */
function provedBack(st: string, analyses: readonly TableAnalysis[]): number[] {
  return readBack(st).flatMap((pou, t) => {
    const a = analyses[t]!;
    return pou.assignments.map((asg, j) => {
      const parsed = parseExpression(asg.text, a.inputs);
      if (!parsed.ok) throw new Error(`${asg.text}: ${parsed.error.message}`);
      return prove(a.table.outputs[j]!.built.fn, truthTable(parsed.value, a.inputs.length)).mismatchCount;
    });
  });
}

describe('Structured Text export', () => {
  const guard = analysisOf(GUARD);
  const vote = analysisOf(VOTE);

  it('writes one FUNCTION_BLOCK per table, named from its sheet, with BOOL inputs and outputs by identifier', () => {
    const st = exportSt([guard, vote], { source, date: '2026-03-04' });
    const pous = readBack(st);
    expect(pous.map((p) => [p.kind, p.name])).toEqual([
      ['FUNCTION_BLOCK', 'Guard_logic'],
      ['FUNCTION_BLOCK', 'Vote'],
    ]);
    expect(pous[0]!.inputs).toEqual(['Guard_closed', 'Two_hand_OK', 'Mode_setup']);
    expect(pous[0]!.outputs).toEqual(['Motor_permit', 'Lamp']);
    expect(pous[1]!.assignments).toEqual([{ target: 'Air_OK', text: '(PS1 AND PS2) OR (PS1 AND PS3) OR (PS2 AND PS3)' }]);
  });

  it('writes a PROGRAM when asked', () => {
    const st = exportSt([vote], { source, kind: 'PROGRAM' });
    expect(readBack(st).map((p) => p.kind)).toEqual(['PROGRAM']);
    expect(st).toContain('END_PROGRAM');
  });

  for (const form of ['andOr', 'xor', 'bestXor'] as FormChoice[]) {
    it(`every ${form} assignment parses back and proves equal to the spec`, () => {
      const st = exportSt([guard, vote], { source, form });
      expect(provedBack(st, [guard, vote])).toEqual([0, 0, 0]);
    });
  }

  it('the header names source, sheet, range, date, signal map and proof, in comments only', () => {
    const st = exportSt([guard], { source, date: '2026-03-04' });
    const beforeCode = st.slice(0, st.indexOf('FUNCTION_BLOCK'));
    for (const line of beforeCode.split('\n').filter((l) => l !== '')) expect(line).toMatch(/^\(\* .* \*\)$/);
    expect(beforeCode).toContain('Source workbook: capper-cell.xlsx');
    expect(beforeCode).toContain("sheet 'Guard logic', range A1:E6");
    expect(beforeCode).toContain('Written: 2026-03-04');
    expect(beforeCode).toContain('input  Two-hand OK -> Two_hand_OK');
    expect(beforeCode).toContain('Motor_permit: AND/OR form (1 term, 2 literals, proven minimum): equal to the spec on all 8 combinations');
    expect(beforeCode).toContain('1 unspecified combination take the safe value 0');
  });

  it('carries the caution, line by line', () => {
    const st = exportSt([vote], { source });
    for (const line of CAUTION_LINES) expect(st).toContain(`(* ${line} *)`);
  });

  it('a header or sheet name holding comment brackets cannot end a comment early', () => {
    const tricky = analysisOf({ ...VOTE, sheet: 'Sheet (*1*)', inputs: ['A *) x', '(* B', 'C'], outputs: ['Y*)'] });
    const st = exportSt([tricky], { source: { workbook: 'odd *) name.xlsx' } });
    for (const line of st.split('\n').filter((l) => l.startsWith('(*'))) {
      expect(line.slice(2, -2)).not.toMatch(/\(\*|\*\)/);
    }
    expect(provedBack(st, [tricky])).toEqual([0]);
  });

  it('a long form is broken into lines that still parse to the same function', () => {
    const n = 8;
    const inputs = Array.from({ length: n }, (_, i) => `Long input signal ${i + 1}`);
    const rows = Array.from({ length: 2 ** n }, (_, k) => {
      const bits = k.toString(2).padStart(n, '0').split('');
      const parity = bits.filter((b) => b === '1').length % 2;
      return `${bits.join(' ')} | ${parity}`;
    });
    const parity = analysisOf({ sheet: 'Parity', inputs, outputs: ['Odd'], rows });
    const st = exportSt([parity], { source });
    expect(Math.max(...st.split('\n').map((l) => l.length))).toBeLessThanOrEqual(110);
    expect(provedBack(st, [parity])).toEqual([0]);
  });

  it('block names are valid identifiers, unique, and never the name of one of their signals', () => {
    const clash = analysisOf({ ...VOTE, sheet: 'PS1' });
    const st = exportSt([clash, analysisOf({ ...GUARD, sheet: 'PS1' })], { source });
    const names = readBack(st).map((p) => p.name);
    expect(names.every(isValidIdentifier)).toBe(true);
    expect(new Set(names.map((x) => x.toLowerCase())).size).toBe(2);
    expect(names.map((x) => x.toLowerCase())).not.toContain('ps1');
  });
});

