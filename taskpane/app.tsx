// The pane: pick where the spec table is, let the engine read and analyse it in its worker,
// show the results, check an implementation, and hand the logic over. The same component runs
// inside Excel (live workbook) and on the standalone page (a workbook file opened in the page).
import { useEffect, useRef, useState } from 'preact/hooks';
import type { BrowserFileHost } from '../src/hosts/browser-file-host.js';
import type { ExcelHost, NamedTable } from '../src/hosts/excel-host.js';
import type { WorkbookHost, WriteReport } from '../src/hosts/workbook-host.js';
import { CAUTION_LINES } from '../src/report/caution.js';
import { exportPlcopen } from '../src/report/plcopen-export.js';
import { resultsSheet } from '../src/report/results-sheet.js';
import type { SheetBlock } from '../src/report/sheet-block.js';
import { exportSt } from '../src/report/st-export.js';
import { stepsCsv, testRecordSheet } from '../src/report/test-steps.js';
import { qualifiedAddress } from '../src/spec/grid.js';
import type { Grid, SpecOptions } from '../src/spec/types.js';
import { ExpressionCheck, FileCheck, Outcome, type WriteSheet } from './check.js';
import type { Analysed } from './engine-protocol.js';
import { Cancelled, Engine } from './engine.js';
import { download, safeFileName } from './files.js';
import { ProblemList, TableView, type SelectCell } from './results.js';

export type PaneMode =
  | { readonly kind: 'excel'; readonly host: ExcelHost }
  | { readonly kind: 'file'; readonly open: (file: File) => Promise<{ ok: true; value: BrowserFileHost } | { ok: false; error: { message: string } }> }
  | { readonly kind: 'outside' };

type Busy = { what: string; done?: number; total?: number; cancellable: boolean };

interface Reading {
  readonly grid: Grid;
  readonly range?: string;
  readonly label: string;
}

function useEngine(): Engine {
  const engine = useRef<Engine | undefined>(undefined);
  if (!engine.current) engine.current = new Engine(() => new Worker(new URL('./engine-worker.ts', import.meta.url)));
  return engine.current;
}

function Caution() {
  return (
    <footer class="caution" aria-label="Caution">
      <details>
        <summary>{CAUTION_LINES[0]}</summary>
        <p>{CAUTION_LINES.slice(1).join(' ')}</p>
      </details>
    </footer>
  );
}

function Outside() {
  return (
    <section class="card" role="status">
      <h2>Running outside Excel</h2>
      <p>
        This pane works inside Excel: open it with the <strong>Interlock Algebra</strong> button on the Home tab after sideloading the
        add-in. To work on a workbook file without Excel, use the <a href="standalone.html">standalone page</a>.
      </p>
    </section>
  );
}

/** The host's sheets, and the one picked (the first to begin with). */
function useSheets(host: WorkbookHost | undefined) {
  const [sheets, setSheets] = useState<string[]>([]);
  const [sheet, setSheet] = useState('');
  useEffect(() => {
    void host?.listSheets().then((s) => {
      setSheets(s);
      setSheet(s[0] ?? '');
    });
  }, [host]);
  return { sheets, sheet, setSheet };
}

function SheetSelect({ sheets, sheet, setSheet }: { sheets: string[]; sheet: string; setSheet: (s: string) => void }) {
  return (
    <label>
      Sheet
      <select value={sheet} onChange={(e) => setSheet((e.currentTarget as HTMLSelectElement).value)}>
        {sheets.map((s) => (
          <option key={s}>{s}</option>
        ))}
      </select>
    </label>
  );
}

function ExcelSource({ host, read, busy }: { host: ExcelHost; read: (r: () => Promise<Reading>) => void; busy: boolean }) {
  const { sheets, sheet, setSheet } = useSheets(host);
  const [tables, setTables] = useState<NamedTable[]>([]);
  const [table, setTable] = useState(0);
  useEffect(() => void host.listTables().then(setTables), [host]);
  const selection = async (): Promise<Reading> => {
    const sel = await host.selection();
    if (sel.cells <= 1) {
      return { grid: await host.readGrid(sel.sheet), label: `sheet ${sel.sheet} (one cell was selected, so the whole sheet)` };
    }
    return { grid: await host.readGrid(sel.sheet, sel.range), label: `selection ${qualifiedAddress(sel.sheet, sel.range)}` };
  };
  return (
    <section class="card" aria-labelledby="source-title">
      <h2 id="source-title">Spec table</h2>
      <div class="row">
        <button type="button" disabled={busy} onClick={() => read(selection)}>
          Read the selection
        </button>
      </div>
      {tables.length > 0 && (
        <div class="row">
          <label>
            Excel table
            <select value={table} onChange={(e) => setTable(Number((e.currentTarget as HTMLSelectElement).value))}>
              {tables.map((t, i) => (
                <option key={t.name} value={i}>
                  {t.name} ({qualifiedAddress(t.sheet, t.range)})
                </option>
              ))}
            </select>
          </label>
          <button
            type="button"
            disabled={busy}
            onClick={() => {
              const t = tables[table]!;
              read(async () => ({ grid: await host.readGrid(t.sheet, t.range), label: `table ${t.name}` }));
            }}
          >
            Read table
          </button>
        </div>
      )}
      <div class="row">
        <SheetSelect sheets={sheets} sheet={sheet} setSheet={setSheet} />
        <button type="button" disabled={busy || !sheet} onClick={() => read(async () => ({ grid: await host.readGrid(sheet), label: `sheet ${sheet}` }))}>
          Read whole sheet
        </button>
      </div>
    </section>
  );
}

function FileSource({
  file,
  open,
  read,
  busy,
}: {
  file: BrowserFileHost | undefined;
  open: (f: File) => void;
  read: (r: () => Promise<Reading>) => void;
  busy: boolean;
}) {
  const { sheets, sheet, setSheet } = useSheets(file);
  const [range, setRange] = useState('');
  const [over, setOver] = useState(false);
  const drop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    const f = e.dataTransfer?.files[0];
    if (f) open(f);
  };
  return (
    <section class="card" aria-labelledby="source-title">
      <h2 id="source-title">Workbook</h2>
      <div
        class={over ? 'drop over' : 'drop'}
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={drop}
      >
        <label class="file">
          Open a workbook (.xlsx) or CSV file, or drop it here
          <input
            type="file"
            accept=".xlsx,.xlsm,.csv"
            disabled={busy}
            onChange={(e) => {
              const f = (e.currentTarget as HTMLInputElement).files?.[0];
              if (f) open(f);
            }}
          />
        </label>
      </div>
      {file && (
        <>
          <p class="meta">
            Opened <strong>{file.fileName}</strong>. It stays on this computer and is never changed.
          </p>
          <div class="row">
            <SheetSelect sheets={sheets} sheet={sheet} setSheet={setSheet} />
            <label>
              Range (optional)
              <input type="text" value={range} placeholder="A3:H13" size={9} onInput={(e) => setRange((e.currentTarget as HTMLInputElement).value)} />
            </label>
          </div>
          <button
            type="button"
            disabled={busy || !sheet}
            onClick={() => {
              const r = range.trim();
              read(async () => ({ grid: await file.readGrid(sheet), label: r ? `${qualifiedAddress(sheet, r)}` : `sheet ${sheet}`, ...(r ? { range: r } : {}) }));
            }}
          >
            Find and analyse spec tables
          </button>
        </>
      )}
    </section>
  );
}

/** What was written and where, as the pane reports it. */
function wroteText(reports: WriteReport[], where: string): string {
  return `Wrote ${reports.map((r) => `sheet "${r.sheet}" (${r.range}, ${r.cells} cells)`).join(' and ')} ${where}. No existing cell was changed.`;
}

/** Writes a new sheet where the pane writes: the workbook in Excel, the results workbook on the standalone page. */
function sheetWriter(mode: PaneMode, file: BrowserFileHost | undefined): WriteSheet | undefined {
  if (mode.kind === 'excel') return async (block: SheetBlock) => wroteText([await mode.host.writeSheet(block)], 'to this workbook');
  if (file) {
    return async (block: SheetBlock) =>
      wroteText([await file.writeSheet(block)], `to the results workbook of ${file.fileName} (Download results workbook saves it)`);
  }
  return undefined;
}

function HandOver({
  analysed,
  current,
  sourceName,
  mode,
  file,
}: {
  analysed: Analysed;
  current: number;
  sourceName: string;
  mode: PaneMode;
  file: BrowserFileHost | undefined;
}) {
  const [message, setMessage] = useState<string>();
  const [error, setError] = useState<string>();
  const [written, setWritten] = useState<Set<number>>(new Set());
  const analysis = analysed.analyses[current]!;
  const base = safeFileName(`${analysis.table.sheet}-${analysis.table.range}`);
  const source = { workbook: sourceName };
  const say = (reports: WriteReport[], where: string) => setMessage(wroteText(reports, where));
  const guard = async (f: () => Promise<void>) => {
    setError(undefined);
    setMessage(undefined);
    try {
      await f();
    } catch (e) {
      setError((e as Error).message);
    }
  };
  return (
    <section class="card" aria-labelledby="handover-title">
      <h2 id="handover-title">Hand-over</h2>
      {mode.kind === 'excel' && (
        <div class="row">
          <button
            type="button"
            onClick={() =>
              guard(async () => say([await mode.host.writeSheet(resultsSheet(analysis, { source: sourceName }))], 'to this workbook'))
            }
          >
            Write results sheet
          </button>
          <button type="button" onClick={() => guard(async () => say([await mode.host.writeSheet(testRecordSheet(analysis))], 'to this workbook'))}>
            Write test steps sheet
          </button>
        </div>
      )}
      {file && (
        <div class="row">
          <button
            type="button"
            onClick={() =>
              guard(async () => {
                const reports: WriteReport[] = [];
                const done = new Set(written);
                for (const [i, a] of analysed.analyses.entries()) {
                  if (done.has(i)) continue;
                  reports.push(await file.writeSheet(resultsSheet(a, { source: sourceName })));
                  done.add(i);
                }
                setWritten(done);
                const bytes = await file.resultsWorkbook();
                if (!bytes.ok) throw new Error(bytes.error.message);
                download(file.resultsFileName(), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', bytes.value);
                setMessage(
                  `Downloaded ${file.resultsFileName()}: the sheets of ${file.fileName} followed by ${file.queuedSheets().map((s) => `"${s}"`).join(', ')}.` +
                    (reports.length === 0 ? '' : ` Added ${reports.length} results sheet${reports.length === 1 ? '' : 's'} this time.`),
                );
              })
            }
          >
            Download results workbook
          </button>
        </div>
      )}
      <div class="row wrap">
        <button type="button" class="secondary" onClick={() => download('interlocks.st', 'text/plain', exportSt(analysed.analyses, { source }))}>
          Structured Text (.st)
        </button>
        <button
          type="button"
          class="secondary"
          onClick={() => download('interlocks-plcopen.xml', 'application/xml', exportPlcopen(analysed.analyses, { source }))}
        >
          PLCopen XML (.xml)
        </button>
        <button type="button" class="secondary" onClick={() => download(`${base}-test-steps.csv`, 'text/csv', stepsCsv(analysis))}>
          Test steps (.csv)
        </button>
      </div>
      <p class="meta">Ladder pictures are under each output. Every file carries the caution below.</p>
      <Outcome message={message} error={error} />
    </section>
  );
}

export function App({ mode }: { mode: PaneMode }) {
  const engine = useEngine();
  const [busy, setBusy] = useState<Busy>();
  const [error, setError] = useState<string>();
  const [file, setFile] = useState<BrowserFileHost>();
  const [reading, setReading] = useState<Reading>();
  const [analysed, setAnalysed] = useState<Analysed>();
  const [current, setCurrent] = useState(0);
  const [xAsDontCare, setX] = useState(false);

  if (mode.kind === 'outside') {
    return (
      <div class="pane">
        <Header subtitle="Excel add-in" />
        <main>
          <Outside />
        </main>
        <Caution />
      </div>
    );
  }

  const selectCell: SelectCell | undefined =
    mode.kind === 'excel' ? (sheet, cell) => void mode.host.selectCell(sheet, cell).catch((e: Error) => setError(e.message)) : undefined;

  const analyse = async (r: Reading) => {
    const options: SpecOptions = { xReading: xAsDontCare ? 'dont-care' : 'none', ...(r.range ? { range: r.range } : {}) };
    setBusy({ what: `Analysing ${r.label}`, cancellable: true });
    try {
      const result = await engine.analyse({ kind: 'analyse', grid: r.grid, options }, (done, total, what) =>
        setBusy({ what: `Analysing ${r.label}: ${what}`, done, total, cancellable: true }),
      );
      setAnalysed(result);
      setCurrent(0);
    } catch (e) {
      setError(e instanceof Cancelled ? 'Analysis stopped. Nothing was changed.' : (e as Error).message);
    } finally {
      setBusy(undefined);
    }
  };

  const read = (get: () => Promise<Reading>) => {
    setError(undefined);
    setAnalysed(undefined);
    setBusy({ what: 'Reading cells', cancellable: false });
    get()
      .then((r) => {
        setReading(r);
        return analyse(r);
      })
      .catch((e: Error) => {
        setBusy(undefined);
        setError(e.message);
      });
  };

  const open = (f: File) => {
    if (mode.kind !== 'file') return;
    setError(undefined);
    setAnalysed(undefined);
    setBusy({ what: `Opening ${f.name}`, cancellable: false });
    void mode
      .open(f)
      .then((r) => (r.ok ? setFile(r.value) : setError(r.error.message)))
      .finally(() => setBusy(undefined));
  };

  const tables = analysed?.analyses ?? [];
  const sourceName = mode.kind === 'file' ? (file?.fileName ?? 'workbook') : 'the Excel workbook';
  return (
    <div class="pane">
      <Header subtitle={mode.kind === 'excel' ? 'in Excel' : 'standalone page: no Excel, nothing leaves this computer'} />
      <main>
        {mode.kind === 'excel' ? (
          <ExcelSource host={mode.host} read={read} busy={busy !== undefined} />
        ) : (
          <FileSource file={file} open={open} read={read} busy={busy !== undefined} />
        )}
        <details class="options">
          <summary>Reading options</summary>
          <label class="check">
            <input type="checkbox" checked={xAsDontCare} onChange={(e) => setX((e.currentTarget as HTMLInputElement).checked)} />
            Read X cells as any / don't-care (otherwise an X is reported as a problem)
          </label>
          {reading && (
            <button type="button" class="secondary" disabled={busy !== undefined} onClick={() => void analyse(reading)}>
              Analyse {reading.label} again
            </button>
          )}
        </details>
        {busy && (
          <section class="card busy" role="status" aria-live="polite">
            <p>{busy.what}</p>
            <progress {...(busy.total ? { value: busy.done ?? 0, max: busy.total } : {})} />
            {busy.cancellable && (
              <button type="button" class="secondary" onClick={() => engine.cancel()}>
                Cancel
              </button>
            )}
          </section>
        )}
        {error && (
          <p class="error" role="alert">
            {error}
          </p>
        )}
        {analysed && (
          <>
            <ProblemList problems={analysed.problems} selectCell={selectCell} />
            {tables.length === 0 && <p class="meta">No spec table to analyse: see the problems above.</p>}
            {tables.length > 1 && (
              <label class="pick">
                Spec table
                <select value={current} onChange={(e) => setCurrent(Number((e.currentTarget as HTMLSelectElement).value))}>
                  {tables.map((a, i) => (
                    <option key={i} value={i}>
                      {qualifiedAddress(a.table.sheet, a.table.range)}: {a.outputs.map((o) => o.signal.identifier).join(', ')}
                    </option>
                  ))}
                </select>
              </label>
            )}
            {tables[current] && (
              <>
                <TableView analysis={tables[current]} selectCell={selectCell} />
                <ExpressionCheck key={current} analysis={tables[current]} engine={engine} write={sheetWriter(mode, file)} />
                {mode.kind === 'file' && <FileCheck analyses={tables} engine={engine} write={sheetWriter(mode, file)} />}
                <HandOver analysed={analysed} current={current} sourceName={sourceName} mode={mode} file={file} />
              </>
            )}
          </>
        )}
      </main>
      <Caution />
    </div>
  );
}

function Header({ subtitle }: { subtitle: string }) {
  return (
    <header class="top">
      <h1>Interlock Algebra</h1>
      <p class="meta">{subtitle}</p>
    </header>
  );
}
