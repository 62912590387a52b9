// The pane: pick where the spec table is, let the engine read and analyse it in its worker,
// show the results, check an implementation, and hand the logic over. The same component runs
// inside Excel (live workbook) and on the standalone page (a workbook file opened in the page).
import { useEffect, useRef, useState } from 'preact/hooks';
import type {
  BrowserFileHost,
  ExcelHost,
  NamedTable,
  RememberedValues,
  WorkbookHost,
  WriteReport,
} from '../src/hosts/index.js';
import { CAUTION_LINES, type SheetBlock } from '../src/report/index.js';
import { qualifiedAddress } from '../src/table/index.js';
import { readGrids, writeSheets, type HandOverKind, type WorkbookChoice, type WorkbookView } from '../src/workflow/index.js';
import { CompareCard } from './compare.js';
import { ExpressionCheck, FileCheck, Outcome, type WriteSheet } from './check.js';
import { Cancelled, Engine } from './engine.js';
import { download } from './files.js';
import { RecordCheck } from './records.js';
import { ProblemList, SpecTableView, type SelectCell } from './results.js';
import { SettingsCard } from './settings.js';
import { DEFAULT_SETTINGS, pageValues, settingsFrom, specOptions, type TableSettings } from './table-settings.js';

export type PaneMode =
  | { readonly kind: 'excel'; readonly host: ExcelHost; readonly remembered?: RememberedValues | undefined; readonly open: OpenFile }
  | { readonly kind: 'file'; readonly open: OpenFile }
  | { readonly kind: 'outside' };

/** A workbook file opened in the page (the page's own workbook, or the old revision to compare with). */
type OpenFile = (file: File) => Promise<{ ok: true; value: BrowserFileHost } | { ok: false; error: { message: string } }>;

type Busy = { what: string; done?: number; total?: number; cancellable: boolean };

/** Where to read (the reading options are added when it is read). */
interface Reading {
  readonly choice: Pick<WorkbookChoice, 'sheet' | 'range'>;
  readonly label: string;
}

/** What the settings of a reading are remembered under: the sheet, or the range of it read. */
const settingsKey = (r: Reading): string => (r.choice.range !== undefined ? qualifiedAddress(r.choice.sheet ?? '', r.choice.range) : (r.choice.sheet ?? ''));

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
    if (sel.cells <= 1) return { choice: { sheet: sel.sheet }, label: `sheet ${sel.sheet} (one cell was selected, so the whole sheet)` };
    return { choice: { sheet: sel.sheet, range: sel.range }, label: `selection ${qualifiedAddress(sel.sheet, sel.range)}` };
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
              read(async () => ({ choice: { sheet: t.sheet, range: t.range }, label: `table ${t.name}` }));
            }}
          >
            Read table
          </button>
        </div>
      )}
      <div class="row">
        <SheetSelect sheets={sheets} sheet={sheet} setSheet={setSheet} />
        <button type="button" disabled={busy || !sheet} onClick={() => read(async () => ({ choice: { sheet }, label: `sheet ${sheet}` }))}>
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
              <input type="text" value={range} placeholder="A3:H13 or table" size={12} onInput={(e) => setRange((e.currentTarget as HTMLInputElement).value)} />
            </label>
          </div>
          <button
            type="button"
            disabled={busy || !sheet}
            onClick={() => {
              const r = range.trim();
              read(async () => {
                // The range may name an Excel table of the workbook, which brings its own sheet.
                const at = r ? file.resolveRange(r) : undefined;
                if (at && !at.ok) throw new Error(at.error);
                const on = at?.value.sheet ?? sheet;
                return { choice: { sheet: on, ...(at ? { range: at.value.range } : {}) }, label: at ? `${qualifiedAddress(on, at.value.range)}` : `sheet ${sheet}` };
              });
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
  const notApplied = reports.flatMap((r) => (r.notApplied ?? []).map((what) => `sheet "${r.sheet}": ${what}`));
  const note = notApplied.length > 0 ? ` Not applied: ${notApplied.join('; ')}.` : '';
  return `Wrote ${reports.map((r) => `sheet "${r.sheet}" (${r.range}, ${r.cells} cells)`).join(' and ')} ${where}. No existing cell was changed.${note}`;
}

/** Where the pane writes new sheets: the workbook in Excel, the results workbook on the standalone page. */
function sheetTarget(mode: PaneMode, file: BrowserFileHost | undefined): { host: WorkbookHost; where: string } | undefined {
  if (mode.kind === 'excel') return { host: mode.host, where: 'to this workbook' };
  if (file) return { host: file, where: `to the results workbook of ${file.fileName} (Download results workbook saves it)` };
  return undefined;
}

function sheetWriter(mode: PaneMode, file: BrowserFileHost | undefined): WriteSheet | undefined {
  const target = sheetTarget(mode, file);
  return target && (async (block: SheetBlock) => wroteText(await writeSheets(target.host, [block]), target.where));
}

const HAND_OVER: readonly { kind: HandOverKind; label: string }[] = [
  { kind: 'st', label: 'Structured Text (.st)' },
  { kind: 'plcopen', label: 'PLCopen XML (.xml)' },
  { kind: 'steps', label: 'Test steps (.csv)' },
];

/**
 * The results sheets and the hand-over pack, as the workflow allows: the same sheets in Excel
 * and in the results workbook of the page, the files only when every table is cleared.
 */
function HandOver({ view, engine, mode, file }: { view: WorkbookView; engine: Engine; mode: PaneMode; file: BrowserFileHost | undefined }) {
  const [message, setMessage] = useState<string>();
  const [error, setError] = useState<string>();
  // The results sheets of this reading go into the page's results workbook once.
  const [queued, setQueued] = useState<WorkbookView>();
  const target = sheetTarget(mode, file);
  const guard = async (f: () => Promise<void>) => {
    setError(undefined);
    setMessage(undefined);
    try {
      await f();
    } catch (e) {
      setError(e instanceof Cancelled ? 'Stopped. Nothing was written.' : (e as Error).message);
    }
  };
  const writeResults = async (): Promise<WriteReport[]> => {
    const blocks = await engine.sheets();
    if (!blocks.ok) throw new Error(`No results written: ${blocks.error}.`);
    return writeSheets(target!.host, blocks.value);
  };
  const handOver = (kind: HandOverKind) =>
    guard(async () => {
      const files = await engine.handOver({ files: { kinds: [kind] } });
      if (!files.ok) throw new Error(`Nothing handed over: ${files.error}.`);
      for (const f of files.value) download(f.name, f.mime, f.text);
      setMessage(`Downloaded ${files.value.map((f) => f.name).join(', ')}.`);
    });
  return (
    <section class="card" aria-labelledby="handover-title">
      <h2 id="handover-title">Hand-over</h2>
      {mode.kind === 'excel' && target && (
        <div class="row">
          <button type="button" disabled={!view.resultsWrite.allowed} onClick={() => guard(async () => setMessage(wroteText(await writeResults(), target.where)))}>
            Write results and test records
          </button>
        </div>
      )}
      {file && (
        <div class="row">
          <button
            type="button"
            disabled={!view.resultsWrite.allowed}
            onClick={() =>
              guard(async () => {
                const added = queued === view ? [] : await writeResults();
                setQueued(view);
                const bytes = await file.resultsWorkbook();
                if (!bytes.ok) throw new Error(bytes.error.message);
                download(file.resultsFileName(), 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', bytes.value);
                setMessage(
                  `Downloaded ${file.resultsFileName()}: the sheets of ${file.fileName} followed by ${file.queuedSheets().map((s) => `"${s}"`).join(', ')}.` +
                    (added.length === 0 ? '' : ` Added ${added.length} sheet${added.length === 1 ? '' : 's'} this time.`),
                );
              })
            }
          >
            Download results workbook
          </button>
        </div>
      )}
      <div class="row wrap">
        {HAND_OVER.map(({ kind, label }) => (
          <button key={kind} type="button" class="secondary" disabled={!view.handOver.allowed} onClick={() => void handOver(kind)}>
            {label}
          </button>
        ))}
      </div>
      {view.handOver.allowed ? (
        <p class="meta">Ladder pictures are under each output. Every file carries the caution below.</p>
      ) : (
        <p class="meta" role="status">
          No hand-over: {view.handOver.reason}.
        </p>
      )}
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
  const [analysed, setAnalysed] = useState<WorkbookView>();
  const [current, setCurrent] = useState(0);
  const [settings, setSettings] = useState<TableSettings>(DEFAULT_SETTINGS);
  const store = useRef<RememberedValues | undefined>(undefined);
  if (!store.current) store.current = (mode.kind === 'excel' && mode.remembered) || pageValues();
  const remembered = store.current;

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

  const host: WorkbookHost | undefined = mode.kind === 'excel' ? mode.host : file;
  const sourceName = mode.kind === 'file' ? (file?.fileName ?? 'workbook') : 'the Excel workbook';

  /** The workflow: the cells are read here, where the workbook is; the worker examines them. */
  const analyse = async (r: Reading, s: TableSettings) => {
    if (!host) return;
    const choice: WorkbookChoice = { ...r.choice, ...specOptions(s, mode.kind === 'excel' ? 'pane' : 'page') };
    setBusy({ what: `Reading ${r.label}`, cancellable: false });
    try {
      const grids = await readGrids(host, choice, sourceName);
      if (!grids.ok) throw new Error(grids.error.message);
      setBusy({ what: `Analysing ${r.label}`, cancellable: true });
      const result = await engine.examine({ grids: grids.value, choice, source: sourceName }, (done, total, what) =>
        setBusy({ what: `Analysing ${r.label}: ${what}`, done, total, cancellable: true }),
      );
      if (!result.ok)
        throw new Error(result.error.code === 'unknown-safe-output' ? `Safe value of ${result.error.subject}: ${result.error.message}; see the settings below.` : result.error.message);
      setAnalysed(result.value);
      setCurrent(0);
    } catch (e) {
      setAnalysed(undefined);
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
        const s = settingsFrom(remembered.get(settingsKey(r)));
        setReading(r);
        setSettings(s);
        return analyse(r, s);
      })
      .catch((e: Error) => {
        setBusy(undefined);
        setError(e.message);
      });
  };

  /** A setting changed: remember it with the reading, and read again with it at once. */
  const change = (r: Reading, s: TableSettings) => {
    setSettings(s);
    setError(undefined);
    void remembered.set(settingsKey(r), s).catch((e: Error) => setError(e.message));
    void analyse(r, s);
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

  const tables = analysed?.tables ?? [];
  return (
    <div class="pane">
      <Header subtitle={mode.kind === 'excel' ? 'in Excel' : 'standalone page: no Excel, nothing leaves this computer'} />
      <main>
        {mode.kind === 'excel' ? (
          <ExcelSource host={mode.host} read={read} busy={busy !== undefined} />
        ) : (
          <FileSource file={file} open={open} read={read} busy={busy !== undefined} />
        )}
        {reading && (
          <SettingsCard
            key={settingsKey(reading)}
            label={reading.label}
            settings={settings}
            tables={tables}
            where={mode.kind === 'excel' ? 'with this workbook' : 'while this page stays open'}
            busy={busy !== undefined}
            change={(s) => change(reading, s)}
            again={() => void analyse(reading, settings)}
          />
        )}
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
                  {tables.map((t, i) => (
                    <option key={i} value={i}>
                      {qualifiedAddress(t.sheet, t.range)}: {t.outputs.map((o) => o.signal.identifier).join(', ')}
                    </option>
                  ))}
                </select>
              </label>
            )}
            {tables[current] && (
              <>
                <SpecTableView table={tables[current]} handOver={analysed.handOver} selectCell={selectCell} />
                {tables[current].analysed && <ExpressionCheck key={current} table={tables[current]} engine={engine} write={sheetWriter(mode, file)} />}
                <FileCheck engine={engine} write={sheetWriter(mode, file)} host={host} />
                <HandOver view={analysed} engine={engine} mode={mode} file={file} />
                {host && reading && (
                  <CompareCard
                    key={settingsKey(reading)}
                    host={host}
                    open={mode.open}
                    engine={engine}
                    choice={{ ...reading.choice, ...specOptions(settings, mode.kind === 'excel' ? 'pane' : 'page') }}
                    newSource={sourceName}
                    where={sheetTarget(mode, file)?.where ?? ''}
                  />
                )}
              </>
            )}
          </>
        )}
        {host && <RecordCheck host={host} engine={engine} selectCell={selectCell} source={mode.kind === 'file' ? (file?.fileName ?? 'the workbook') : 'this workbook'} />}
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
