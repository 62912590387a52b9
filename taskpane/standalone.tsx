// Entry of the standalone page (standalone.html): the same pane over a workbook file opened in
// the browser. It does not load office.js.
import { render } from 'preact';
import { openBrowserFile } from '../src/hosts/index.js';
import { App } from './app.js';
import { applyTheme } from './theme.js';

const startWorker = () => new Worker(new URL('./xlsx-worker.ts', import.meta.url));

applyTheme();
const root = document.getElementById('app')!;
root.textContent = '';
render(
  <App mode={{ kind: 'file', open: async (file) => openBrowserFile(file.name, new Uint8Array(await file.arrayBuffer()), { startWorker }) }} />,
  root,
);
