// Small spec tables for the report tests, read the way a sheet is read and analysed by the
// engine (readSpecTables, then analyseTable).
import type { TableAnalysis } from '../../src/analysis/analysis-types.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import type { CellValue, Grid, SpecTable } from '../../src/table/types.js';

export interface TinySpec {
  readonly sheet?: string;
  readonly inputs: readonly string[];
  readonly outputs: readonly string[];
  /** "1 0 - | 1": input cells, a bar, output cells. */
  readonly rows: readonly string[];
}

/** The spec as a sheet would hold it: a role row, a header row, rows of 1/0/- from A1. */
export function specGrid(spec: TinySpec): Grid {
  const cell = (s: string): CellValue => (s === '1' ? 1 : s === '0' ? 0 : s);
  const cells: CellValue[][] = [
    [...spec.inputs.map(() => 'input'), ...spec.outputs.map(() => 'output')],
    [...spec.inputs, ...spec.outputs],
    ...spec.rows.map((r) => r.replace('|', ' ').trim().split(/\s+/).map(cell)),
  ];
  return { sheet: spec.sheet ?? 'Spec', origin: 'A1', cells };
}

export function tinyTable(spec: TinySpec): SpecTable {
  const read = readSpecTables(specGrid(spec));
  const table = read.tables[0];
  if (!table) throw new Error(`fixture is not a spec table: ${JSON.stringify(read.problems)}`);
  return table;
}

export function analysisOf(spec: TinySpec): TableAnalysis {
  return analyseTable(tinyTable(spec));
}

/** A guard-style table: two outputs, a don't-care, a gap (1 0 0). */
export const GUARD: TinySpec = {
  sheet: 'Guard logic',
  inputs: ['Guard closed', 'Two-hand OK', 'Mode (setup)'],
  outputs: ['Motor permit', 'Lamp'],
  rows: ['1 1 0 | 1 0', '0 - 0 | 0 1', '- - 1 | - 1', '1 1 1 | 1 1'],
};

/** Full specification of 2-out-of-3 voting. */
export const VOTE: TinySpec = {
  sheet: 'Vote',
  inputs: ['PS1', 'PS2', 'PS3'],
  outputs: ['Air OK'],
  rows: ['0 0 0 | 0', '0 0 1 | 0', '0 1 0 | 0', '0 1 1 | 1', '1 0 0 | 0', '1 0 1 | 1', '1 1 0 | 1', '1 1 1 | 1'],
};
