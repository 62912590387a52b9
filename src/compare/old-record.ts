// The steps of a commissioning test record sheet (as testRecordSheet writes it), read back from
// a grid: which table it was made from, its revision stamp, and per step the test ID, the
// outputs it tests and what was recorded as the result. Only what the retest needs.
import { RECORD_TITLE } from '../report/test-steps.js';
import type { CellValue, Grid } from '../spec/types.js';

export interface RecordedStep {
  readonly step: number;
  readonly testId: string;
  /** Identifiers of the outputs the step was chosen for. */
  readonly outputs: readonly string[];
  /** What the Pass/Fail cell says (empty when not filled in). */
  readonly result: string;
}

export interface ReadRecord {
  readonly sheet: string;
  /** The table the record is of, as its title names it ("'Guard logic'!A1:E6"). */
  readonly table: string;
  readonly stamp: string;
  readonly steps: readonly RecordedStep[];
}

const text = (v: CellValue | undefined): string => (v === null || v === undefined ? '' : typeof v === 'object' ? '' : String(v).trim());

/** The record on this sheet, or undefined when the sheet holds none (no title, or no Test ID column). */
export function readRecordGrid(grid: Grid): ReadRecord | undefined {
  const rows = grid.cells;
  const titleRow = rows.findIndex((r) => text(r[0]).startsWith(`${RECORD_TITLE}: `));
  if (titleRow < 0) return undefined;
  const table = text(rows[titleRow]![0]).slice(RECORD_TITLE.length + 2);
  const stamp = text(rows.find((r) => text(r[0]) === 'Revision stamp')?.[1]);
  const head = rows.findIndex((r) => text(r[0]) === 'Step' && text(r[1]) === 'Test ID');
  if (head < 0) return undefined;
  const column = (title: string): number => rows[head]!.findIndex((c) => text(c) === title);
  const [idCol, outCol, resultCol] = [column('Test ID'), column('Output'), column('Pass/Fail')];
  const steps: RecordedStep[] = [];
  for (const r of rows.slice(head + 1)) {
    const testId = text(r[idCol]);
    if (!/^T-[01]+$/.test(testId)) break;
    steps.push({
      step: Number(text(r[0])) || steps.length + 1,
      testId,
      outputs: text(r[outCol]).split(',').map((s) => s.trim()).filter(Boolean),
      result: resultCol < 0 ? '' : text(r[resultCol]),
    });
  }
  return { sheet: grid.sheet, table, stamp, steps };
}
