// The pane's path to its engine in a test: cells read through the Excel host over the strict
// Office.js double, examined by the engine core behind a worker stand-in that clones every
// message both ways as a real worker does.
import { render } from 'preact';
import { afterEach } from 'vitest';
import { createExcelHost } from '../../src/hosts/excel-host.js';
import { readGrids, type TableView, type WorkbookView } from '../../src/workflow/index.js';
import { EngineCore } from '../../taskpane/engine-core.js';
import { Engine } from '../../taskpane/engine.js';
import type { EngineMessage, EngineRequest } from '../../taskpane/engine-protocol.js';
import { ExcelDouble, type SeedCell } from '../hosts/excel-double.js';

/** The engine's worker, in this thread: each message structured-cloned both ways, answered later. */
function workerStandIn(): Worker {
  const core = new EngineCore();
  const worker = {
    onmessage: null as ((e: MessageEvent<EngineMessage>) => void) | null,
    onerror: null,
    postMessage(data: { id: number; request: EngineRequest }) {
      const { id, request } = structuredClone(data);
      setTimeout(() => worker.onmessage?.({ data: structuredClone({ id, kind: 'answer', answer: core.answer(request) }) } as MessageEvent<EngineMessage>));
    },
    terminate() {},
  };
  return worker as unknown as Worker;
}

/** One sheet in Excel, read and examined as the pane does: the engine, the view, its first table. */
export async function paneOn(sheet: string, cells: readonly (readonly SeedCell[])[]): Promise<{ engine: Engine; view: WorkbookView; table: TableView }> {
  const double = new ExcelDouble();
  double.addSheet(sheet, cells);
  const host = createExcelHost(double.run, double.supports);
  const choice = { sheet };
  const grids = await readGrids(host, choice, 'the Excel workbook');
  if (!grids.ok) throw new Error(grids.error.message);
  const engine = new Engine(workerStandIn);
  const examined = await engine.examine({ grids: grids.value, choice, source: 'the Excel workbook' });
  if (!examined.ok) throw new Error(examined.error.message);
  return { engine, view: examined.value, table: examined.value.tables[0]! };
}

let root: HTMLElement | undefined;

/** A fresh element in the document to render into; emptied and removed after each test. */
export function mount(): HTMLElement {
  root = document.createElement('div');
  document.body.append(root);
  return root;
}

afterEach(() => {
  if (root) render(null, root);
  root?.remove();
  root = undefined;
});

/** A form of an output card by its title. */
export const form = (card: Element, title: string): Element => card.querySelector(`.form[data-form="${title}"]`)!;
