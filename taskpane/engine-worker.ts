// The engine's Web Worker: the workflow's examine (read tables, analyse, verdicts), checks,
// sheets and hand-over files. It keeps the workbook it examined, so requests name tables by id.
// The pane stays responsive; Cancel terminates this worker and starts a new one.
import { readImplementation } from '../src/impl/read.js';
import { fail, ok } from '../src/logic/result.js';
import { checkSheet } from '../src/report/check-sheet.js';
import { checkExpression, examine, handOverFiles, readTables, sheetsToWrite, verifyProgram, workbookView, type Workbook } from '../src/workflow/index.js';
import type { EngineAnswer, EngineMessage, EngineRequest } from './engine-protocol.js';

const post = (message: EngineMessage): void => self.postMessage(message);

let workbook: Workbook | undefined;
const NOTHING_READ = 'nothing has been read yet: read a spec table first';

function answer(id: number, request: EngineRequest): EngineAnswer {
  switch (request.kind) {
    case 'examine': {
      workbook = undefined;
      const read = readTables(request.grids, request.choice);
      if (!read.ok) return { kind: 'examine', value: read };
      workbook = examine(read.value, {
        source: request.source,
        onProgress: ({ index, count, done, total, what }) =>
          post({ id, kind: 'progress', done: index * total + done, total: count * total, what: `table ${index + 1} of ${count}: ${what}` }),
      });
      return { kind: 'examine', value: ok(workbookView(workbook)) };
    }
    case 'check': {
      if (!workbook) return { kind: 'check', value: fail({ message: NOTHING_READ }) };
      const checked = checkExpression(workbook, request.table, request.output, request.text);
      if (!checked.ok) return { kind: 'check', value: checked };
      const table = workbook.tables[request.table]!.table;
      const sheet = checkSheet({ kind: 'expression', table, output: request.output, expression: request.text, check: checked.value });
      return { kind: 'check', value: ok({ check: checked.value, sheet }) };
    }
    case 'verify': {
      if (!workbook) return { kind: 'verify', value: fail({ message: NOTHING_READ }) };
      const program = readImplementation(request.fileName, request.text);
      if (!program.ok) return { kind: 'verify', value: program };
      const report = verifyProgram(workbook, program.value);
      return { kind: 'verify', value: ok({ report, sheet: checkSheet({ kind: 'program', report }) }) };
    }
    case 'sheets': {
      if (!workbook) return { kind: 'sheets', value: fail(NOTHING_READ) };
      return { kind: 'sheets', value: workbook.resultsWrite.allowed ? ok(sheetsToWrite(workbook)) : fail(workbook.resultsWrite.reason) };
    }
    case 'handOver':
      return { kind: 'handOver', value: workbook ? handOverFiles(workbook, request.files) : fail(NOTHING_READ) };
  }
}

self.onmessage = (event: MessageEvent<{ id: number; request: EngineRequest }>) => {
  const { id, request } = event.data;
  try {
    post({ id, kind: 'answer', answer: answer(id, request) });
  } catch (e) {
    // An exception here is a bug in the engine: say so rather than hang.
    post({ id, kind: 'failed', message: `bug in the engine: ${e instanceof Error ? e.message : String(e)}` });
  }
};
