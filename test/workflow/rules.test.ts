// The workflow's rules as specifications: what a table with an error shows (nothing proven),
// what may be handed over and written, and that implementation checks follow the same verdicts.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { readImplementation } from '../../src/impl/read.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import type { OutputAnalysis } from '../../src/analysis/analysis-types.js';
import type { Problem } from '../../src/table/types.js';
import {
  checkExpression,
  examine,
  examineTable,
  handOverFiles,
  implementationWord,
  programCleared,
  readGrids,
  readTables,
  sheetsToWrite,
  verdictWords,
  verifyProgram,
  workbookView,
  type Verdict,
  type Workbook,
  type WorkbookChoice,
} from '../../src/workflow/index.js';
import { ERROR_CELL, GOOD, gridOf, NOTES, RowsHost, WORDS_OUTPUT, type TestWorkbook } from './workbooks.js';

async function run(book: TestWorkbook, choice: WorkbookChoice = {}): Promise<Workbook> {
  const grids = await readGrids(new RowsHost(book), choice, book.file);
  if (!grids.ok) throw new Error(grids.error.message);
  const read = readTables(grids.value, choice);
  if (!read.ok) throw new Error(read.error.message);
  return examine(read.value, { source: book.file });
}

const words = (wb: Workbook) => wb.tables.map((t) => [verdictWords(t.verdict), ...t.outputs.map(verdictWords)]);

describe('a table with an error is not analysed', () => {
  it('says how many errors and where the first is, for the table and each output', async () => {
    const wb = await run(ERROR_CELL);
    expect(words(wb)[0]).toEqual(Array(2).fill('not analysed: 1 error, the first at Cell!B4'));
    expect(wb.tables[0]!.analysis).toBeUndefined();
  });

  it('a Notes column beside the outputs is an annotation: the table is analysed and proven', async () => {
    const wb = await run(NOTES);
    expect(new Set(words(wb)[0])).toEqual(new Set(['proven minimum']));
    expect(wb.tables[0]!.analysis!.outputs.map((o) => o.signal.header)).toEqual(['Motor permit']);
  });

  it('words in an output column make every row an error: no FALSE is proven for it', async () => {
    const wb = await run(WORDS_OUTPUT);
    const t = wb.tables[0]!;
    expect(t.analysis).toBeUndefined();
    expect(t.outputs.map((o) => o.kind)).toEqual(['not-analysed', 'not-analysed']);
    expect(verdictWords(t.verdict)).toBe('not analysed: 1 error, the first at Cell!E3:E5');
    // The view a host shows carries no form to badge or prove.
    expect(workbookView(wb).tables[0]!.analysed).toBeUndefined();
  });

  it('a reading problem the host found inside the table stops it like an error of its own', async () => {
    const grid = { ...gridOf('Cell', GOOD.sheets.Cell!), readProblems: [{ severity: 'error', code: 'formula-cell', sheet: 'Cell', cell: 'C4', message: 'a formula' } satisfies Problem] };
    const host = new RowsHost(GOOD);
    host.readGrid = async () => grid;
    const grids = await readGrids(host, { sheet: 'Cell' }, GOOD.file);
    const read = grids.ok ? readTables(grids.value, {}) : undefined;
    const wb = examine(read!.ok ? read!.value : { tables: [], problems: [] }, { source: GOOD.file });
    expect(verdictWords(wb.tables[0]!.verdict)).toBe('not analysed: 1 error, the first at Cell!C4');
  });

  it('a clean table beside it is still analysed and proven', async () => {
    const wb = await run(ERROR_CELL);
    expect(words(wb)[1]).toEqual(['proven minimum', 'proven minimum']);
  });
});

describe('hand-over', () => {
  it('is allowed when every table is cleared, and every file carries the caution', async () => {
    const wb = await run(GOOD);
    expect(wb.handOver).toEqual({ allowed: true });
    const files = handOverFiles(wb, { kinds: ['st', 'plcopen', 'steps', 'ladder'] });
    expect(files.ok && files.value.map((f) => f.name)).toEqual([
      'interlocks.st',
      'interlocks-plcopen.xml',
      'interlocks-test-steps.csv',
      'Cell-Motor_permit.svg',
      'Vote-Air_OK.svg',
    ]);
    for (const f of files.ok ? files.value : []) expect(f.text, f.name).toContain(CAUTION_LINES[0]!.slice(0, 30));
  });

  it('is refused, with the table and its first error, when one table has an error', async () => {
    const wb = await run(ERROR_CELL);
    const files = handOverFiles(wb, { kinds: ['st'] });
    expect(files).toEqual({ ok: false, error: 'nothing is handed over until every table is cleared: Cell!A1:D5 is not analysed: 1 error, the first at Cell!B4' });
  });

  it('is refused when no table was found, and so is a results write', async () => {
    const wb = await run({ name: 'empty', file: 'empty.xlsx', sheets: { Notes: [['just a note']] } });
    expect(wb.handOver.allowed).toBe(false);
    expect(wb.resultsWrite.allowed).toBe(false);
    expect(sheetsToWrite(wb)).toEqual([]);
  });

  it('is refused for an error outside any table', async () => {
    const wb = await run(GOOD);
    const stray: Problem = { severity: 'error', code: 'bad-cell', sheet: 'Other', cell: 'A1', message: 'x' };
    const again = examine({ tables: wb.tables.map((t) => t.table), problems: [stray] }, { source: GOOD.file });
    expect(again.handOver).toEqual({ allowed: false, reason: 'nothing is handed over until every table is cleared: 1 error outside the tables, the first at Other!A1' });
  });
});

describe('the sheets to write', () => {
  it('are a results sheet, its live check and a test record per cleared table', async () => {
    expect(sheetsToWrite(await run(GOOD)).map((b) => b.name)).toEqual(['Cell results', 'Cell live check', 'Cell record', 'Vote results', 'Vote live check', 'Vote record']);
  });

  it('are a not-analysed results sheet, without forms or steps, for a table with errors', async () => {
    const blocks = sheetsToWrite(await run(ERROR_CELL));
    expect(blocks.map((b) => b.name)).toEqual(['Cell results', 'Vote results', 'Vote live check', 'Vote record']);
    const text = blocks[0]!.rows.flatMap((r) => r.map((c) => String(c?.value ?? '')));
    expect(text.some((v) => v.startsWith('not analysed: 1 error, the first at Cell!B4'))).toBe(true);
    expect(text.some((v) => /proven minimum|heuristic|combinations checked|:=/.test(v))).toBe(false);
    expect(text).toContain(CAUTION_LINES[0]);
  });
});

describe('verdict words', () => {
  /** The Cell table of the good workbook examined with its outputs' analyses changed by `change`. */
  const examinedWith = async (change: (o: OutputAnalysis) => OutputAnalysis[]) => {
    const { table, analysis } = (await run(GOOD)).tables[0]!;
    const outputs = change(analysis!.outputs[0]!);
    return examineTable({ ...table, outputs: outputs.map(() => table.outputs[0]!) }, 0, () => ({ ...analysis!, outputs }));
  };

  it('heuristic when the AND/OR form was not proven minimal', async () => {
    const t = await examinedWith((o) => [{ ...o, andOr: { ...o.andOr, proven: false } }]);
    expect(verdictWords(t.verdict)).toBe('heuristic (not proven minimal)');
  });

  it('DIFFERS when any form disagrees with the spec', async () => {
    const t = await examinedWith((o) => [{ ...o, xor: { ...o.xor, proof: { ...o.xor.proof, mismatchCount: 2 } } }]);
    expect(verdictWords(t.verdict)).toBe('DIFFERS from the spec at 2 combinations: do not use it');
  });

  it('a table is proven only when every output is, and never stronger than its weakest output (property)', async () => {
    const { analysis } = (await run(GOOD)).tables[0]!;
    const o = analysis!.outputs[0]!;
    const kinds: Record<Verdict['kind'], OutputAnalysis | undefined> = {
      proven: o,
      heuristic: { ...o, andOr: { ...o.andOr, proven: false } },
      differs: { ...o, andOr: { ...o.andOr, proof: { ...o.andOr.proof, mismatchCount: 1 } } },
      'not-analysed': undefined,
    };
    const rank = ['proven', 'heuristic', 'differs'] as const;
    await fc.assert(
      fc.asyncProperty(fc.array(fc.constantFrom(...rank), { minLength: 1, maxLength: 5 }), async (picked) => {
        const t = await examinedWith(() => picked.map((k) => kinds[k]!));
        expect(t.outputs.map((v) => v.kind)).toEqual(picked);
        expect(t.verdict.kind).toBe(rank[Math.max(...picked.map((k) => rank.indexOf(k)))]);
      }),
      { numRuns: 40 },
    );
  });
});

describe('implementation checks follow the verdicts', () => {
  const program = (text: string) => {
    const p = readImplementation('cell.st', text);
    if (!p.ok) throw new Error(p.error.message);
    return p.value;
  };
  const ST = `FUNCTION_BLOCK Cell
VAR_INPUT Guard_closed : BOOL; E_stop_healthy : BOOL; Jog : BOOL; END_VAR
VAR_OUTPUT Motor_permit : BOOL; END_VAR
Motor_permit := Guard_closed AND E_stop_healthy;
END_FUNCTION_BLOCK
`;

  it('a program equal to a clean table is EQUAL', async () => {
    const wb = await run(GOOD, { sheet: 'Cell' });
    const report = verifyProgram(wb, program(ST));
    expect(report.outputs.map(implementationWord)).toEqual(['EQUAL']);
    expect(programCleared(wb, report)).toBe(true);
  });

  it('the same program against the table with an error is UNCHECKED, with the reason', async () => {
    const wb = await run(ERROR_CELL, { sheet: 'Cell' });
    const report = verifyProgram(wb, program(ST));
    expect(report.outputs.map(implementationWord)).toEqual(['UNCHECKED']);
    expect(report.outputs[0]!.reasons[0]).toBe('the spec table is not analysed: 1 error, the first at Cell!B4');
    expect(programCleared(wb, report)).toBe(false);
  });

  it('a typed expression is refused for a table that was not analysed', async () => {
    const wb = await run(ERROR_CELL, { sheet: 'Cell' });
    expect(checkExpression(wb, 0, 0, 'Guard_closed AND E_stop_healthy')).toEqual({
      ok: false,
      error: { message: 'not checked: the spec table is not analysed: 1 error, the first at Cell!B4' },
    });
    const good = await run(GOOD, { sheet: 'Cell' });
    const checked = checkExpression(good, 0, 0, 'Guard_closed AND E_stop_healthy');
    expect(checked.ok && checked.value.status).toBe('equal');
  });
});

describe('reading as the user chose', () => {
  it('a sheet that does not exist is refused with the sheets there are', async () => {
    const grids = await readGrids(new RowsHost(GOOD), { sheet: 'Capper' }, 'good.xlsx');
    expect(grids).toEqual({ ok: false, error: { code: 'no-sheet', subject: 'Capper', message: 'good.xlsx: no sheet named "Capper" (sheets: Cell, Vote)' } });
  });

  it('a safe value for an output no table has is refused', async () => {
    const grids = await readGrids(new RowsHost(GOOD), {}, 'good.xlsx');
    const read = grids.ok ? readTables(grids.value, { safeValues: { Brake: 1 } }) : undefined;
    expect(read?.ok === false && read.error.code).toBe('unknown-safe-output');
  });

  it('a sheet the host cannot read is a warning when every sheet is read', async () => {
    const host = new RowsHost(GOOD);
    const readGrid = host.readGrid.bind(host);
    host.readGrid = async (sheet, range) => (sheet === 'Vote' ? Promise.reject(new Error('too large')) : readGrid(sheet, range));
    const grids = await readGrids(host, {}, 'good.xlsx');
    expect(grids.ok && grids.value.problems.map((p) => [p.code, p.sheet, p.message])).toEqual([['sheet-not-read', 'Vote', 'not read: too large']]);
  });
});
