// The engine's Web Worker: EngineCore behind messages. The pane stays responsive; Cancel
// terminates this worker and starts a new one.
import { EngineCore } from './engine-core.js';
import type { EngineMessage, EngineRequest } from './engine-protocol.js';

const post = (message: EngineMessage): void => self.postMessage(message);
const core = new EngineCore();

self.onmessage = (event: MessageEvent<{ id: number; request: EngineRequest }>) => {
  const { id, request } = event.data;
  try {
    post({ id, kind: 'answer', answer: core.answer(request, (done, total, what) => post({ id, kind: 'progress', done, total, what })) });
  } catch (e) {
    // An exception here is a bug in the engine: say so rather than hang.
    post({ id, kind: 'failed', message: `bug in the engine: ${e instanceof Error ? e.message : String(e)}` });
  }
};
