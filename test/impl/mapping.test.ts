import { describe, expect, it } from 'vitest';
import { readMappingCsv, readMappingGrid } from '../../src/impl/mapping.js';

function pairsOf(text: string): [string, string, string][] {
  const r = readMappingCsv('map.csv', text);
  if (!r.ok) throw new Error(r.error.message);
  return r.value.pairs.map((p) => [p.spec, p.program, p.where]);
}

function csvError(text: string): string {
  const r = readMappingCsv('map.csv', text);
  if (r.ok) throw new Error('expected a failure');
  return r.error.message;
}

describe('name mapping', () => {
  it('reads two comma-separated columns, each pair with its line', () => {
    expect(pairsOf('Guard A closed,I_GuardA_Closed\nJog pressed,Main.I_Jog\n')).toEqual([
      ['Guard A closed', 'I_GuardA_Closed', 'map.csv line 1'],
      ['Jog pressed', 'Main.I_Jog', 'map.csv line 2'],
    ]);
  });

  it('skips a header row, blank rows and a byte-order mark; takes semicolons as Excel writes them', () => {
    expect(pairsOf('\uFEFFSpec signal;Program variable\r\n\r\nE-stop healthy;I_EStop_OK;the comment column is ignored\r\n')).toEqual([
      ['E-stop healthy', 'I_EStop_OK', 'map.csv line 3'],
    ]);
  });

  it('reads quoted fields with separators and doubled quotes inside', () => {
    expect(pairsOf('"Guard, door ""A""",I_A\n')).toEqual([['Guard, door "A"', 'I_A', 'map.csv line 1']]);
  });

  it('accepts direct addresses as program variables', () => {
    expect(pairsOf('Jog pressed\t%IX0.3\n')).toEqual([['Jog pressed', '%IX0.3', 'map.csv line 1']]);
  });

  it('accepts members, elements and instance outputs as program variables, spaces around their punctuation dropped', () => {
    expect(pairsOf('A,io.bClosed\nB,aIn[ 3 ]\nC,Main.tonSync.Q\nD,"g[1, 2].b"\n').map(([, program]) => program)).toEqual([
      'io.bClosed',
      'aIn[3]',
      'Main.tonSync.Q',
      'g[1,2].b',
    ]);
  });

  it('refuses an element with an index that is not an integer', () => {
    expect(csvError('A,aIn[i]\n')).toBe(
      "map.csv line 1: 'aIn[i]' is not a program variable name (Name, Pou.Name, a member io.bClosed, an element aIn[3] or %IX0.1)",
    );
  });

  it('refuses a row with no program variable, naming its line', () => {
    expect(csvError('Guard A closed,I_A\nGuard B closed,\n')).toBe("map.csv line 2: no program variable for spec signal 'Guard B closed'");
  });

  it('refuses a program variable that is not a name', () => {
    expect(csvError('Guard A closed,I A\n')).toBe(
      "map.csv line 1: 'I A' is not a program variable name (Name, Pou.Name, a member io.bClosed, an element aIn[3] or %IX0.1)",
    );
  });

  it('refuses a spec signal mapped twice (case-insensitively)', () => {
    expect(csvError('Guard A closed,I_A\nguard a closed,I_B\n')).toBe("map.csv line 2: spec signal 'guard a closed' is mapped twice (also at map.csv line 1)");
  });

  it('refuses an unclosed quote and an empty mapping', () => {
    expect(csvError('"Guard A,I_A\n')).toBe('map.csv line 1: a quoted field is not closed');
    expect(csvError('spec signal,program variable\n')).toBe('map.csv: the mapping holds no pairs');
  });

  it('reads a mapping from a sheet grid, naming cells', () => {
    const r = readMappingGrid({ sheet: 'Tag map', origin: 'B2', cells: [['Spec signal', 'Tag'], ['Guard A closed', 'I_A'], ['Jog pressed', null]] });
    expect(r.ok ? null : r.error.message).toBe("'Tag map'!C4: no program variable for spec signal 'Jog pressed'");
    const good = readMappingGrid({ sheet: 'Map', origin: 'A1', cells: [['Guard A closed', 'I_A']] });
    expect(good.ok && good.value.pairs).toEqual([{ spec: 'Guard A closed', program: 'I_A', where: 'Map!A1', programWhere: 'Map!B1' }]);
  });
});
