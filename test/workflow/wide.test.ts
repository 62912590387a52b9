// Tables of more than 24 inputs through the workflow: verdicts from the symbolic proofs, and
// every host that takes at most 24 inputs says so instead of showing nothing.
import { describe, expect, it } from 'vitest';
import { readImplementation } from '../../src/impl/read.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import {
  allCleared,
  checkExpression,
  examine,
  handOverFiles,
  implementationWord,
  programCleared,
  sheetsToWrite,
  verdictWords,
  verifyProgram,
  workbookJson,
  workbookView,
  type Workbook,
} from '../../src/workflow/index.js';
import { gridOf, type Rows } from './workbooks.js';

const N = 40;
const causes = Array.from({ length: N }, (_, i) => `Cause ${i + 1}`);

/** An OR trip: each cause alone trips, all healthy runs; `extra` rows after those. */
function tripRows(extra: Rows = []): Rows {
  return [
    [...causes.map(() => 'input'), 'output'],
    [...causes, 'Trip'],
    ...causes.map((_, i) => [...causes.map((_, j) => (j === i ? 1 : '-')), 1]),
    [...causes.map(() => 0), 0],
    ...extra,
  ];
}

function examined(rows: Rows, budgetMs?: number): Workbook {
  const read = readSpecTables(gridOf('Trip', rows));
  return examine(read, { source: 'trip.xlsx', ...(budgetMs === undefined ? {} : { budgetMs }) });
}

describe('a 40-cause OR trip through the workflow', () => {
  const wb = examined(tripRows());
  const t = wb.tables[0]!;

  it('is proven minimum from the symbolic proof and its finished search', () => {
    expect(t.analysis!.wide!.outputs[0]!.andOr.proven).toBe(true);
    expect([verdictWords(t.verdict), ...t.outputs.map(verdictWords)]).toEqual(['proven minimum', 'proven minimum']);
    expect(allCleared(wb)).toBe(true);
  });

  it('hands nothing over, and says that the hand-over files take at most 24 inputs', () => {
    expect(wb.handOver).toEqual({ allowed: false, reason: expect.stringMatching(/^nothing is handed over: Trip!A1:AO43 has 40 inputs: .*Structured Text and PLCopen export, ladder and verify take at most 24 inputs$/) });
    const files = handOverFiles(wb, { kinds: ['st', 'steps'] });
    expect(files.ok).toBe(false);
  });

  it('writes no results sheet or test record for it; its problems say where its forms are', () => {
    expect(sheetsToWrite(wb)).toEqual([]);
    const info = t.problems.find((p) => p.code === 'symbolic-engine');
    expect(info?.message).toMatch(/the results sheet, test steps, Structured Text and PLCopen export and verify take at most 24 inputs/);
  });

  it("gives hosts its outputs' verdicts and the limit, and no bit-set forms to check live", () => {
    const view = workbookView(wb).tables[0]!;
    expect(view.outputs.map((o) => [o.signal.header, o.verdict.kind])).toEqual([['Trip', 'proven']]);
    expect(view.analysed).toBeUndefined();
    expect(view.limit).toMatch(/has 40 inputs/);
  });

  it('puts the verdict beside each output of the JSON document', () => {
    const doc = JSON.parse(JSON.stringify(workbookJson(wb)));
    expect(doc.tables[0].verdict).toEqual({ kind: 'proven', text: 'proven minimum' });
    expect(doc.tables[0].outputs[0]).toMatchObject({ name: 'Trip', terms: 40, verdict: { kind: 'proven' } });
  });

  it('answers a program and a typed expression with UNCHECKED and the reason', () => {
    const read = readImplementation('trip.st', 'FUNCTION_BLOCK T\nVAR_INPUT Cause_1 : BOOL; END_VAR\nVAR_OUTPUT Trip : BOOL; END_VAR\nTrip := Cause_1;\nEND_FUNCTION_BLOCK\n');
    if (!read.ok) throw new Error(read.error.message);
    const report = verifyProgram(wb, read.value);
    expect(report.outputs.map(implementationWord)).toEqual(['UNCHECKED']);
    expect(report.outputs[0]!.reasons[0]).toMatch(/has 40 inputs: .*verify take at most 24 inputs/);
    expect(programCleared(wb, report)).toBe(false);
    const typed = checkExpression(wb, 0, 0, 'Cause_1');
    expect(typed.ok).toBe(false);
  });
});

describe('a wide table whose AND/OR search does not finish', () => {
  // Causes that trip in pairs: with no time given the cover is not proven.
  const pairs = (k: number): Rows => [
    [...causes.map(() => 'input'), 'output'],
    [...causes, 'Trip'],
    ...Array.from({ length: k }, (_, i) => [...causes.map((_, j) => (j === i || j === (i * 7 + 3) % N ? 1 : '-')), 1]),
  ];

  it('is heuristic, never proven', () => {
    const wb = examined(pairs(8), 0);
    expect(wb.tables[0]!.analysis!.wide!.outputs[0]!.andOr.proven).toBe(false);
    expect(wb.tables[0]!.outputs.map((v) => v.kind)).toEqual(['heuristic']);
  });

  it('too large for the symbolic engine, its output is not analysed, with the error at its header cell', () => {
    const wb = examined(pairs(N), 0);
    const t = wb.tables[0]!;
    expect(t.analysis!.wide!.outputs).toEqual([]);
    expect(t.problems.find((p) => p.code === 'too-large')?.cell).toBe('AO2');
    expect([verdictWords(t.verdict), ...t.outputs.map(verdictWords)]).toEqual(Array(2).fill('not analysed: 1 error, the first at Trip!AO2'));
    expect(allCleared(wb)).toBe(false);
  });
});
