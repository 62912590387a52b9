// Entry of the Excel task pane (taskpane.html, loaded by Excel from the manifest).
import { render } from 'preact';
import { officeExcelHost, officeStart, openBrowserFile } from '../src/hosts/index.js';
import { App } from './app.js';
import { applyTheme } from './theme.js';

// The old revision to compare with is a file picked in the pane, parsed in a worker as on the page.
const startWorker = () => new Worker(new URL('./xlsx-worker.ts', import.meta.url));
const open = async (file: File) => openBrowserFile(file.name, new Uint8Array(await file.arrayBuffer()), { startWorker });

const root = document.getElementById('app')!;
void officeStart().then((start) => {
  applyTheme(start.theme);
  root.textContent = '';
  render(<App mode={start.inExcel ? { kind: 'excel', host: officeExcelHost(), remembered: start.remembered, open } : { kind: 'outside' }} />, root);
});
