// What the engine worker answers, without the worker around it: the workflow's examine (read
// tables, analyse, verdicts), checks, sheets and hand-over files. It keeps the workbook it
// examined, so requests name tables by id; test records are judged on their own. Tests drive
// it with the requests the pane sends.
import { readImplementation } from '../src/impl/index.js';
import { fail, ok } from '../src/logic/index.js';
import { checkSheet } from '../src/report/index.js';
import {
  checkExpression,
  compareView,
  compareWorkbooks,
  examine,
  handOverFiles,
  judgeRecords,
  readMappings,
  readTables,
  sheetsToWrite,
  verifyProgram,
  workbookView,
  type Workbook,
} from '../src/workflow/index.js';
import type { EngineAnswer, EngineRequest } from './engine-protocol.js';

export type ProgressReport = (done: number, total: number, what: string) => void;

const NOTHING_READ = 'nothing has been read yet: read a spec table first';

export class EngineCore {
  private workbook: Workbook | undefined;

  answer(request: EngineRequest, progress: ProgressReport = () => {}): EngineAnswer {
    const workbook = this.workbook;
    switch (request.kind) {
      case 'examine': {
        this.workbook = undefined;
        const read = readTables(request.grids, request.choice);
        if (!read.ok) return { kind: 'examine', value: read };
        this.workbook = examine(read.value, {
          source: request.source,
          onProgress: ({ index, count, done, total, what }) => progress(index * total + done, count * total, `table ${index + 1} of ${count}: ${what}`),
        });
        return { kind: 'examine', value: ok(workbookView(this.workbook)) };
      }
      case 'check': {
        if (!workbook) return { kind: 'check', value: fail({ message: NOTHING_READ }) };
        const checked = checkExpression(workbook, request.table, request.output, request.text);
        if (!checked.ok) return { kind: 'check', value: checked };
        const table = workbook.tables[request.table]!.table;
        const sheet = checkSheet({ kind: 'expression', table, expression: request.text, verdict: checked.value });
        return { kind: 'check', value: ok({ check: checked.value, sheet }) };
      }
      case 'verify': {
        if (!workbook) return { kind: 'verify', value: fail({ message: NOTHING_READ }) };
        const program = readImplementation(request.fileName, request.text);
        if (!program.ok) return { kind: 'verify', value: program };
        const mapping = readMappings(request.mappings ?? []);
        if (!mapping.ok) return { kind: 'verify', value: mapping };
        const report = verifyProgram(workbook, program.value, mapping.value);
        return { kind: 'verify', value: ok({ report, sheet: checkSheet({ kind: 'program', report }) }) };
      }
      case 'sheets':
        if (!workbook) return { kind: 'sheets', value: fail(NOTHING_READ) };
        return { kind: 'sheets', value: workbook.resultsWrite.allowed ? ok(sheetsToWrite(workbook)) : fail(workbook.resultsWrite.reason) };
      case 'handOver':
        return { kind: 'handOver', value: workbook ? handOverFiles(workbook, request.files) : fail(NOTHING_READ) };
      case 'records':
        return { kind: 'records', value: judgeRecords(request.grids) };
      case 'compare': {
        const old = readTables(request.old, request.choice);
        if (!old.ok) return { kind: 'compare', value: old };
        const next = readTables(request.new, request.choice);
        if (!next.ok) return { kind: 'compare', value: next };
        const compared = compareWorkbooks(old.value, next.value, { oldSource: request.oldSource, newSource: request.newSource, onProgress: (what, done, total) => progress(done ?? 0, total ?? 0, what) });
        return { kind: 'compare', value: ok(compareView(compared)) };
      }
    }
  }
}
