// The engine's Web Worker: reading spec tables, deriving and proving forms, implementation
// checks. The pane stays responsive; Cancel terminates this worker and starts a new one.
import { parseExpression } from '../src/logic/expr/parse.js';
import { checkImplementation } from '../src/logic/implcheck.js';
import { readImplementation } from '../src/impl/read.js';
import { verifyImplementation } from '../src/impl/verify.js';
import { analyseTable } from '../src/spec/analyse.js';
import { readSpecTables } from '../src/spec/read-tables.js';
import type { EngineAnswer, EngineMessage, EngineRequest } from './engine-protocol.js';

const post = (message: EngineMessage): void => self.postMessage(message);

function answer(id: number, request: EngineRequest): EngineAnswer {
  switch (request.kind) {
    case 'analyse': {
      const read = readSpecTables(request.grid, request.options);
      const count = read.tables.length;
      const analyses = read.tables.map((table, t) =>
        analyseTable(table, {
          onProgress: (done, total, what) => post({ id, kind: 'progress', done: t * total + done, total: count * total, what: `table ${t + 1} of ${count}: ${what}` }),
        }),
      );
      return { analyses, problems: read.problems };
    }
    case 'check': {
      const parsed = parseExpression(request.text, request.table.inputs);
      if (!parsed.ok) return parsed;
      return { ok: true, value: checkImplementation(parsed.value, request.table.outputs[request.output]!.built.fn) };
    }
    case 'verify': {
      const impl = readImplementation(request.fileName, request.text);
      if (!impl.ok) return impl;
      return { ok: true, value: verifyImplementation(request.tables, impl.value) };
    }
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
