// `npm run bench -- cli`: a 16-input spec table written out in full (65,536 rows) as .xlsx and
// as .csv, through the command line's analyze path in-process, stage by stage, beside a
// baseline measured in the same run: SheetJS reading the same file in the main thread.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { main } from '../src/cli/main.js';
import { openFile } from '../src/hosts/file-host.js';
import { sheetFromCells } from '../src/hosts/xlsx-write.js';
import { analyseTable } from '../src/spec/analyse.js';
import { readSpecTables } from '../src/spec/read-tables.js';
import type { CellValue } from '../src/spec/types.js';

const N = 16;
/** The machine running the bench may be shared: a generous parse limit keeps the figures coming. */
const LIMIT_S = 600;

/** Two outputs of interlock shape: a permit of ANDs with one OR, and a 3-input parity. */
function rows(): CellValue[][] {
  const inputs = Array.from({ length: N }, (_, i) => `Input ${i + 1}`);
  const out: CellValue[][] = [[...inputs.map(() => 'input'), 'output', 'output'], [...inputs, 'Permit', 'Parity alarm']];
  for (let k = 0; k < 1 << N; k++) {
    const x = (i: number): number => (k >> (N - 1 - i)) & 1;
    const permit = x(0) & x(1) & (x(2) | x(3)) & (1 - x(4)) & x(5);
    const parity = x(6) ^ x(7) ^ x(8);
    out.push([...Array.from({ length: N }, (_, i) => x(i)), permit, parity]);
  }
  return out;
}

async function time<T>(work: () => Promise<T> | T): Promise<[T, number]> {
  const t0 = performance.now();
  const value = await work();
  return [value, performance.now() - t0];
}

const ms = (t: number): string => `${t.toFixed(0).padStart(7)} ms`;

export async function run(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'cli-bench-'));
  try {
    const cells = rows();
    const book = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(book, sheetFromCells(cells), 'Big table');
    const xlsx = join(dir, 'big.xlsx');
    const csv = join(dir, 'big.csv');
    writeFileSync(xlsx, XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer);
    writeFileSync(csv, cells.map((r) => r.join(';')).join('\r\n') + '\r\n');
    console.log(`table: ${N} inputs, 2 outputs, ${cells.length - 2} rows; .xlsx ${readFileSync(xlsx).length} bytes, .csv ${readFileSync(csv).length} bytes`);

    for (const file of [xlsx, csv]) {
      const [, baseline] = await time(() =>
        file.endsWith('.xlsx') ? XLSX.read(readFileSync(file)) : readFileSync(file, 'utf8').split('\n').map((l) => l.split(';')),
      );
      const [host, read] = await time(() => openFile(file, { timeLimitMs: LIMIT_S * 1000 }));
      if (!host.ok) throw new Error(host.error.message);
      const grid = await host.value.readGrid((await host.value.listSheets())[0]!);
      const [spec, specMs] = await time(() => readSpecTables(grid));
      const [, analysisMs] = await time(() => spec.tables.map((t) => analyseTable(t)));
      const [code, wholeMs] = await time(() => main(['analyze', file, '--json', '--time-limit', String(LIMIT_S)], { out: () => undefined, err: () => undefined }));
      const xl = file.endsWith('.xlsx');
      const line = (label: string, t: number): void => console.log(`  ${label.padEnd(46)}${ms(t)}`);
      console.log(`\n${xl ? '.xlsx' : '.csv'} (exit ${code})`);
      line(`baseline: ${xl ? 'SheetJS read in the main thread' : 'read + split lines'}`, baseline);
      line(`read/parse (${xl ? 'isolated worker, dense' : 'our CSV reader'})`, read);
      line('spec tables', specMs);
      line('analysis (forms and proofs)', analysisMs);
      line('whole analyze --json, in-process', wholeMs);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
