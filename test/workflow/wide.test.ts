// Tables of more than 24 inputs through the workflow: verdicts from the symbolic proofs, the
// pane's views of their forms, sheets, hand-over, verify and typed expressions at up to 64 inputs.
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
import { CAUSES, gridOf, tripRows, type Rows } from './workbooks.js';

const N = CAUSES.length;

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

  it('hands over its Structured Text and its test steps, one ON step per cause and the OFF step', () => {
    expect(wb.handOver).toEqual({ allowed: true });
    const files = handOverFiles(wb, { kinds: ['st', 'steps'] });
    if (!files.ok) throw new Error(files.error);
    expect(files.value.map((f) => f.name)).toEqual(['interlocks.st', 'interlocks-test-steps.csv']);
    expect(files.value[0]!.text).toContain('Trip := Cause_1 OR Cause_2 OR Cause_3');
    expect(files.value[1]!.text).toContain('41 steps for 40 inputs');
  });

  it('writes its results sheet and test record; its problems say where its forms are, the pane among them', () => {
    expect(sheetsToWrite(wb).map((b) => b.name)).toEqual(['Trip results', 'Trip record']);
    const info = t.problems.find((p) => p.code === 'symbolic-engine');
    expect(info?.message).toMatch(/the results sheet and test record \(no live check: that takes at most 12 inputs\), the hand-over files and verify, and the pane's result cards and typed expression checks$/);
  });

  it("gives hosts its outputs' verdicts and forms: the plain XOR form counted, not printed, the best-polarity one printed", () => {
    const view = workbookView(wb).tables[0]!;
    expect(view.outputs.map((o) => [o.signal.header, o.verdict.kind])).toEqual([['Trip', 'proven']]);
    const [trip] = view.analysed!;
    expect([trip!.andOr.terms, trip!.andOr.literals, trip!.andOr.proven, trip!.andOr.mismatchCount, trip!.andOr.combinations]).toEqual([40n, 40, true, 0n, 2n ** 40n]);
    // OR of 40 CAUSES = XOR of every non-empty product of them: 2^40 - 1 terms.
    expect([trip!.xor!.terms, trip!.xor!.expr, trip!.xor!.text]).toEqual([2n ** 40n - 1n, null, '1099511627775 terms: not printed (more than 64)']);
    // = TRUE XOR (NOT Cause_1 AND ... AND NOT Cause_40), every input complemented.
    expect([trip!.bestXor!.terms, trip!.bestXor!.polarity, trip!.bestXor!.mismatchCount]).toEqual([2n, 2n ** 40n - 1n, 0n]);
    expect(trip!.steps).toHaveLength(41);
  });

  it('puts the verdict beside each output of the JSON document', () => {
    const doc = JSON.parse(JSON.stringify(workbookJson(wb)));
    expect(doc.tables[0].verdict).toEqual({ kind: 'proven', text: 'proven minimum' });
    expect(doc.tables[0].outputs[0]).toMatchObject({ name: 'Trip', terms: 40, verdict: { kind: 'proven' } });
  });

  it('checks a program symbolically: one cause for forty DIFFERS wherever another cause alone trips', () => {
    const read = readImplementation('trip.st', 'FUNCTION_BLOCK T\nVAR_INPUT Cause_1 : BOOL; END_VAR\nVAR_OUTPUT Trip : BOOL; END_VAR\nTrip := Cause_1;\nEND_FUNCTION_BLOCK\n');
    if (!read.ok) throw new Error(read.error.message);
    const report = verifyProgram(wb, read.value);
    expect(report.outputs.map(implementationWord)).toEqual(['DIFFERS']);
    // Cause_1 = 0 and some other cause 1: 2^39 - 1 combinations, the program off where the spec trips.
    expect(report.outputs[0]).toMatchObject({ mismatchCount: 2n ** 39n - 1n, combinations: 2n ** 40n });
    expect(report.outputs[0]!.counterexamples.every((c) => c.expected === 1 && c.actual === 0)).toBe(true);
    expect(programCleared(wb, report)).toBe(false);
  });

  it('checks a typed expression symbolically: the OR of every cause, in any order, is EQUAL on all 2^40 combinations', () => {
    const typed = checkExpression(wb, 0, 0, [...CAUSES].reverse().map((c) => c.replace(' ', '_')).join(' OR '));
    if (!typed.ok) throw new Error(typed.error.message);
    expect([implementationWord(typed.value), typed.value.combinations, typed.value.mismatchCount]).toEqual(['EQUAL', 2n ** 40n, 0n]);
  });

  it('a typed expression missing a cause DIFFERS where that cause alone trips: one spurious trip, counted exactly', () => {
    const typed = checkExpression(wb, 0, 0, CAUSES.slice(1).map((c) => c.replace(' ', '_')).join(' | '));
    if (!typed.ok) throw new Error(typed.error.message);
    const v = typed.value;
    expect([implementationWord(v), v.mismatchCount, v.unsafeCount, v.spuriousTripCount]).toEqual(['DIFFERS', 1n, 0n, 1n]);
    expect(v.counterexamples.map((c) => [c.inputs.join(''), c.expected, c.actual, c.kind])).toEqual([[`1${'0'.repeat(N - 1)}`, 1, 0, 'spurious-trip']]);
    expect(v.spuriousTripWhen?.sentence).toBe(`spurious trip exactly when ${CAUSES.map((c, i) => `${c.replace(' ', '_')} = ${i === 0 ? 1 : 0}`).join(' AND ')}`);
  });

  it('a typed expression wrong both ways gives each side its exact count and its unsafe combination first', () => {
    // ON when every cause is healthy (unsafe: the spec requires the safe value 0 there), OFF
    // when Cause_1 = 0 and Cause_2 = 1 whatever the other 38 (spurious trips: 2^38).
    const typed = checkExpression(wb, 0, 0, 'Cause_1 OR NOT Cause_2');
    if (!typed.ok) throw new Error(typed.error.message);
    const v = typed.value;
    expect([v.mismatchCount, v.unsafeCount, v.spuriousTripCount]).toEqual([2n ** 38n + 1n, 1n, 2n ** 38n]);
    expect(v.counterexamples[0]).toMatchObject({ kind: 'unsafe', expected: 0, actual: 1, inputs: CAUSES.map(() => 0) });
    expect(v.spuriousTripWhen?.sentence).toBe('spurious trip exactly when Cause_1 = 0 AND Cause_2 = 1');
  });

});

describe('a wide table whose AND/OR search does not finish', () => {
  // Causes that trip in pairs: with no time given the cover is not proven.
  const pairs = (k: number): Rows => [
    [...CAUSES.map(() => 'input'), 'output'],
    [...CAUSES, 'Trip'],
    ...Array.from({ length: k }, (_, i) => [...CAUSES.map((_, j) => (j === i || j === (i * 7 + 3) % N ? 1 : '-')), 1]),
  ];

  it('is heuristic, never proven', () => {
    const wb = examined(pairs(8), 0);
    expect(wb.tables[0]!.analysis!.wide!.outputs[0]!.andOr.proven).toBe(false);
    expect(wb.tables[0]!.outputs.map((v) => v.kind)).toEqual(['heuristic']);
  });

  it('says so with its proven lower bound in every hand-over file', () => {
    const wb = examined(pairs(8), 0);
    const { lowerBound } = wb.tables[0]!.analysis!.wide!.outputs[0]!.andOr;
    const files = handOverFiles(wb, { kinds: ['st', 'plcopen', 'steps', 'ladder'] });
    if (!files.ok) throw new Error(files.error);
    const bound = `heuristic (minimum not proven; proven lower bound ${lowerBound.terms} term`;
    for (const f of files.value.filter((x) => x.kind !== 'ladder')) expect(f.text, f.name).toContain(bound);
    const svg = files.value.find((x) => x.kind === 'ladder')!.text;
    const words = [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]).join(' ');
    expect(words).toContain(`(heuristic; proven lower bound ${lowerBound.terms} branch`);
  });

  it('too large for the symbolic engine, its output is not analysed, with the error at its header cell', () => {
    const wb = examined(pairs(N), 0);
    const t = wb.tables[0]!;
    expect(t.analysis!.wide!.outputs).toEqual([]);
    expect(t.problems.find((p) => p.code === 'too-large')?.cell).toBe('AO2');
    expect([verdictWords(t.verdict), ...t.outputs.map(verdictWords)]).toEqual(Array(2).fill('not analysed: 1 error, the first at Trip!AO2'));
    expect(allCleared(wb)).toBe(false);
  });

  it('too large for the symbolic engine, a typed expression for it is UNCHECKED with the reason, never EQUAL', () => {
    const typed = checkExpression(examined(pairs(N), 0), 0, 0, 'Cause_1');
    if (!typed.ok) throw new Error(typed.error.message);
    expect(implementationWord(typed.value)).toBe('UNCHECKED');
    expect(typed.value.reasons).toEqual([expect.stringMatching(/^the check is too large to compare symbolically over 40 inputs/)]);
  });
});
