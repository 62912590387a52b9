// Two revisions compared through the workflow, as every host does it: the engine core answers
// the pane's compare request with what compareWorkbooks decides, and the verdict clears only
// when no behaviour changed.
import { describe, expect, it } from 'vitest';
import { compareView, compareWorkbooks, readGrids, readTables, type GridsRead } from '../../src/workflow/index.js';
import { EngineCore } from '../../taskpane/engine-core.js';
import { GOOD, RowsHost, type TestWorkbook } from './workbooks.js';

/** GOOD with Cell row 3 (guard open) now permitting the motor: the dangerous direction. */
const PERMITS: TestWorkbook = { ...GOOD, file: 'permits.xlsx', sheets: { ...GOOD.sheets, Cell: GOOD.sheets.Cell!.map((r, i) => (i === 3 ? [0, '-', '-', 1] : r)) } };

async function grids(book: TestWorkbook): Promise<GridsRead> {
  const read = await readGrids(new RowsHost(book), { sheet: 'Cell' }, book.file);
  if (!read.ok) throw new Error(read.error.message);
  return read.value;
}

async function compared(oldBook: TestWorkbook, newBook: TestWorkbook) {
  const [o, n] = [readTables(await grids(oldBook), {}), readTables(await grids(newBook), {})];
  if (!o.ok || !n.ok) throw new Error('not read');
  return compareWorkbooks(o.value, n.value, { oldSource: oldBook.file, newSource: newBook.file });
}

describe('compareWorkbooks', () => {
  it('clears two revisions that behave the same, and still gives the change record and the retest record', async () => {
    const c = await compared(GOOD, GOOD);
    expect(c.cleared).toBe(true);
    expect(c.sheets.length).toBe(2);
  });

  it('does not clear a revision that now permits, and names the combination over the joint inputs', async () => {
    const c = await compared(GOOD, PERMITS);
    expect(c.cleared).toBe(false);
    const out = compareView(c).tables[0]!.outputs[0]! as unknown as { nowPermits: { cubes: string[] } };
    expect(out.nowPermits.cubes).toEqual(['0--']);
  });

  it("is what the engine core answers to the pane's compare request (plain data through structured clone)", async () => {
    const request = structuredClone({ kind: 'compare' as const, old: await grids(GOOD), new: await grids(PERMITS), choice: {}, oldSource: GOOD.file, newSource: PERMITS.file });
    const answer = new EngineCore().answer(request);
    if (answer.kind !== 'compare' || !answer.value.ok) throw new Error('no compare answer');
    expect(structuredClone(answer.value.value)).toEqual(compareView(await compared(GOOD, PERMITS)));
  });
});
