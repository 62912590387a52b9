// What the hand-over pack writes, the implementation check (src/impl) reads back and finds
// equal to the spec: Structured Text files, and PLCopen XML with ST and with LD bodies.
import { describe, expect, it } from 'vitest';
import { readImplementation } from '../../src/impl/read.js';
import { verifyExitCode, verifyImplementation } from '../../src/impl/verify.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { exportPlcopen } from '../../src/report/plcopen-export.js';
import { exportSt, type FormChoice } from '../../src/report/st-export.js';
import { SAMPLE_WORKBOOKS, sheetCells } from '../../scripts/make-samples.js';

const capper = SAMPLE_WORKBOOKS[0]!;
const tables = capper.sheets.flatMap((sheet) => readSpecTables({ sheet: sheet.name, origin: 'A1', cells: sheetCells(sheet) }).tables);
const analyses = tables.map((t) => analyseTable(t));
const source = { workbook: capper.file };

function verified(file: string, text: string) {
  const impl = readImplementation(file, text);
  if (!impl.ok) throw new Error(impl.error.message);
  return verifyImplementation(tables, impl.value);
}

describe(`hand-over of ${capper.file} read back by the implementation check`, () => {
  for (const form of ['andOr', 'xor', 'bestXor'] as FormChoice[]) {
    it(`the Structured Text file (${form}) is equal to the spec on every output`, () => {
      const report = verified('capper.st', exportSt(analyses, { source, form }));
      expect(report.outputs.map((o) => o.status)).toEqual(analyses.flatMap((a) => a.outputs.map(() => 'equal')));
      expect(verifyExitCode(report)).toBe(0);
    });
  }

  for (const body of ['ST', 'LD'] as const) {
    it(`PLCopen XML with ${body} bodies is equal to the spec on every output`, () => {
      const report = verified('capper.xml', exportPlcopen(analyses, { source, body }));
      expect(report.outputs.map((o) => o.status)).toEqual(analyses.flatMap((a) => a.outputs.map(() => 'equal')));
      expect(report.unmatchedProgram).toEqual([]);
      expect(verifyExitCode(report)).toBe(0);
    });
  }
});
