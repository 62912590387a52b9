// The pane's "Check a program file" with a mapping sheet, over the strict Office.js double: the
// cells of the sheet are read in the pane (readMappingSheet through the Excel host) and cross
// to the engine core with the program, as app.tsx sends them to the worker.
import { describe, expect, it } from 'vitest';
import { createExcelHost } from '../../src/hosts/excel-host.js';
import type { SeedCell } from '../hosts/excel-double.js';
import { ExcelDouble } from '../hosts/excel-double.js';
import { readGrids, readMappingSheet, type MappingSource } from '../../src/workflow/index.js';
import { EngineCore } from '../../taskpane/engine-core.js';

// Run permit = guard closed AND start, in the spec's words; the program uses plant tags.
const SPEC: SeedCell[][] = [
  ['input', 'input', 'output'],
  ['Guard closed', 'Start pressed', 'Run permit'],
  [1, 1, 1],
  [0, '-', 0],
  [1, 0, 0],
];

const PROGRAM = `PROGRAM Cell
VAR_INPUT I_Guard_A : BOOL; I_Start : BOOL; END_VAR
VAR_OUTPUT Q_Run : BOOL; END_VAR
Q_Run := I_Start;
END_PROGRAM
`;

const MAP: SeedCell[][] = [
  ['Spec signal', 'Program variable', 'Note'],
  ['Guard closed', 'I_Guard_A', 'guard A, channel 1'],
  ['Start pressed', 'I_Start', null],
  ['Run permit', 'Cell.Q_Run', null],
];

async function pane(map: SeedCell[][]) {
  const double = new ExcelDouble();
  double.addSheet('Cell', SPEC);
  double.addSheet('Map', map);
  const host = createExcelHost(double.run, double.supports);
  const core = new EngineCore();
  const choice = { sheet: 'Cell' };
  const grids = await readGrids(host, choice, 'the Excel workbook');
  if (!grids.ok) throw new Error(grids.error.message);
  const examined = core.answer(structuredClone({ kind: 'examine', grids: grids.value, choice, source: 'the Excel workbook' }));
  if (examined.kind !== 'examine' || !examined.value.ok) throw new Error('examine failed');
  const verify = (mappings: MappingSource[]) => {
    const a = core.answer(structuredClone({ kind: 'verify', fileName: 'cell.st', text: PROGRAM, mappings }));
    if (a.kind !== 'verify') throw new Error('not a verify answer');
    return a.value;
  };
  return { host, verify };
}

describe('the pane checks a program through a mapping sheet', () => {
  it('without a mapping the output whose name differs is not found', async () => {
    const { verify } = await pane(MAP);
    const answer = verify([]);
    expect(answer.ok && answer.value.report.outputs.map((o) => o.status)).toEqual(['not-found']);
  });

  it('with the mapping sheet the output is found and its unsafe combination counted and described', async () => {
    const { host, verify } = await pane(MAP);
    const answer = verify([await readMappingSheet(host, 'Map')]);
    if (!answer.ok) throw new Error(answer.error.message);
    const [o] = answer.value.report.outputs;
    expect(answer.value.report.mapping).toBe('sheet Map');
    expect([o!.status, o!.variable, o!.unsafeCount, o!.spuriousTripCount]).toEqual(['differs', 'Cell.Q_Run', 1, 0]);
    expect(o!.unsafeWhen?.sentence).toBe('unsafe exactly when Guard_closed = 0 AND Start_pressed = 1');
    expect(answer.value.report.unusedMapping).toEqual([]);
    // The check sheet names the mapping too.
    expect(answer.value.sheet.rows.map((r) => r.map((c) => c?.value))).toContainEqual(['Names mapped by', 'sheet Map']);
  });

  it('a problem in the mapping sheet is an error at its cell', async () => {
    const { host, verify } = await pane([...MAP.slice(0, 2), ['Start pressed', null]]);
    const answer = verify([await readMappingSheet(host, 'Map')]);
    expect(answer.ok ? 'checked' : answer.error.message).toBe("Map!B3: no program variable for spec signal 'Start pressed'");
  });

  it('a signal mapped by the file and by the sheet is an error naming both places', async () => {
    const { host, verify } = await pane(MAP);
    const file: MappingSource = { kind: 'file', fileName: 'map.csv', text: 'Run permit,Q_Run\n' };
    const answer = verify([file, await readMappingSheet(host, 'Map')]);
    expect(answer.ok ? 'checked' : answer.error.message).toBe("Map!A4: spec signal 'Run permit' is mapped twice (also at map.csv line 1)");
  });

  it('a mapping entry naming no program variable is listed with its cells: the signal\'s and the variable\'s', async () => {
    const { host, verify } = await pane([...MAP, ['Start pressed 2', 'I_Start_2']]);
    const answer = verify([await readMappingSheet(host, 'Map')]);
    if (!answer.ok) throw new Error(answer.error.message);
    expect(answer.value.report.unusedMapping).toEqual(["Map!A5: no spec table has a signal 'Start pressed 2'", "Map!B5: the program has no variable 'I_Start_2'"]);
  });
});
