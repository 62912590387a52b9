// Entry of the Excel task pane (taskpane.html, loaded by Excel from the manifest).
import { render } from 'preact';
import { officeExcelHost } from '../src/hosts/excel-host.js';
import { officeStart } from '../src/hosts/excel-office.js';
import { App } from './app.js';
import { applyTheme } from './theme.js';

const root = document.getElementById('app')!;
void officeStart().then((start) => {
  applyTheme(start.theme);
  root.textContent = '';
  render(<App mode={start.inExcel ? { kind: 'excel', host: officeExcelHost(), remembered: start.remembered } : { kind: 'outside' }} />, root);
});
