// Entry of the Excel task pane (taskpane.html, loaded by Excel from the manifest).
import { render } from 'preact';
import { officeExcelHost } from '../src/hosts/excel-host.js';
import { officeStart } from '../src/hosts/excel-office.js';
import { App } from './app.js';

const root = document.getElementById('app')!;
void officeStart().then((start) => {
  if (start.theme) {
    // Follow the Office theme where Excel reports one (CSSOM, allowed by the page's policy).
    document.documentElement.style.setProperty('--bg', start.theme.background);
    document.documentElement.style.setProperty('--fg', start.theme.foreground);
  }
  root.textContent = '';
  render(<App mode={start.inExcel ? { kind: 'excel', host: officeExcelHost() } : { kind: 'outside' }} />, root);
});
