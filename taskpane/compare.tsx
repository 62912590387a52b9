// "Compare with another workbook…": the revision open in the pane (the new one) against a
// workbook file picked here (the old one), compared by behaviour in the engine's worker. Per
// output the kinds of change, "now permits" first and marked (the dangerous direction), the
// steps to retest, and the change record and new test record written as new sheets.
import { useState } from 'preact/hooks';
import type { BrowserFileHost, WorkbookHost } from '../src/hosts/index.js';
import type { Result } from '../src/logic/index.js';
import { readGrids, writeSheets, type CompareView, type WorkbookChoice } from '../src/workflow/index.js';
import { Outcome } from './check.js';
import { Cancelled, type Engine } from './engine.js';
import { SignalHeads } from './results.js';

type TableJson = CompareView['tables'][number];
type OutputJson = TableJson['outputs'][number];

/** Our words for the kinds, in the order shown: the dangerous direction first. */
const KINDS: readonly { key: 'nowPermits' | 'nowTrips' | 'dontCareChanged' | 'gapsOpened' | 'gapsClosed'; label: string }[] = [
  { key: 'nowPermits', label: 'now permits' },
  { key: 'nowTrips', label: 'now trips' },
  { key: 'dontCareChanged', label: "don't-care changed" },
  { key: 'gapsOpened', label: 'gaps opened' },
  { key: 'gapsClosed', label: 'gaps closed' },
];

/** Combinations as patterns, one column per input ('-' = any), headers sideways as in the results. */
function PatternTable({ inputs, patterns }: { inputs: readonly string[]; patterns: readonly string[] }) {
  return (
    <div class="scroll">
      <table class="combos">
        <SignalHeads signals={inputs.map((h) => ({ identifier: h, header: h }))} />
        <tbody>
          {patterns.map((p, r) => (
            <tr key={r}>
              {[...p].map((c, i) => (
                <td key={i}>{c}</td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function OutputChange({ inputs, output }: { inputs: readonly string[]; output: OutputJson }) {
  return (
    <div class="compare-output" data-output={output.name}>
      <h4>
        {output.name} {output.status !== 'compared' ? `(${output.status})` : output.changed ? '' : '(no change)'}
      </h4>
      {KINDS.map(({ key, label }) => {
        // The kinds are spread in from CHANGE_KINDS, so the JSON type does not name them.
        const set = (output as unknown as Record<string, { count: number; cubes: string[] } | null>)[key];
        if (!set || set.count === 0) return null;
        return (
          <div key={key} class={key === 'nowPermits' ? 'change-kind danger' : 'change-kind'} data-kind={label}>
            <h5>
              {key === 'nowPermits' ? '!! ' : ''}
              {label}: {set.count} combination{set.count === 1 ? '' : 's'}
            </h5>
            <PatternTable inputs={inputs} patterns={set.cubes} />
          </div>
        );
      })}
      {output.retest && output.retest.repeat.length > 0 && <p class="meta">retest: {output.retest.repeat.join(', ')}</p>}
    </div>
  );
}

export function CompareCard({
  host,
  open,
  engine,
  choice,
  newSource,
  where,
}: {
  host: WorkbookHost;
  open: (f: File) => Promise<Result<BrowserFileHost, { message: string }>>;
  engine: Engine;
  choice: WorkbookChoice;
  newSource: string;
  where: string;
}) {
  const [view, setView] = useState<CompareView>();
  const [busy, setBusy] = useState<string>();
  const [message, setMessage] = useState<string>();
  const [error, setError] = useState<string>();
  const compare = async (f: File) => {
    setError(undefined);
    setMessage(undefined);
    setView(undefined);
    setBusy(`Comparing with ${f.name}`);
    try {
      const opened = await open(f);
      if (!opened.ok) throw new Error(opened.error.message);
      const oldHost = opened.value;
      // The old revision is read on the same sheet where it has one, else all its sheets.
      const { range: _range, sheet, ...reading } = choice;
      const oldChoice: WorkbookChoice = sheet !== undefined && (await oldHost.listSheets()).includes(sheet) ? { ...reading, sheet } : reading;
      const oldGrids = await readGrids(oldHost, oldChoice, f.name);
      if (!oldGrids.ok) throw new Error(oldGrids.error.message);
      const newGrids = await readGrids(host, choice, newSource);
      if (!newGrids.ok) throw new Error(newGrids.error.message);
      const answer = await engine.compare({ old: oldGrids.value, new: newGrids.value, choice: reading, oldSource: f.name, newSource }, (_d, _t, what) => setBusy(`Comparing: ${what}`));
      if (!answer.ok) throw new Error(answer.error.message);
      setView(answer.value);
    } catch (e) {
      setError(e instanceof Cancelled ? 'Comparison stopped.' : (e as Error).message);
    } finally {
      setBusy(undefined);
    }
  };
  const write = async () => {
    setError(undefined);
    try {
      const reports = await writeSheets(host, view!.sheets);
      setMessage(`Wrote ${reports.map((r) => `sheet "${r.sheet}"`).join(' and ')} ${where}. No existing cell was changed.`);
    } catch (e) {
      setError((e as Error).message);
    }
  };
  return (
    <section class="card" aria-labelledby="compare-title">
      <h2 id="compare-title">Compare revisions</h2>
      <label class="file">
        Compare with another workbook… (the file picked is the old revision, {newSource} the new one)
        <input
          type="file"
          accept=".xlsx,.xlsm,.csv"
          data-compare="old"
          disabled={busy !== undefined}
          onChange={(e) => {
            const f = (e.currentTarget as HTMLInputElement).files?.[0];
            if (f) void compare(f);
          }}
        />
      </label>
      {busy && <p role="status">{busy}</p>}
      {view && (
        <>
          <p class={view.cleared ? 'proof ok' : 'proof bad'}>{view.cleared ? 'No behaviour changed.' : 'Behaviour changed, or the comparison is incomplete: see below.'}</p>
          {view.problems.map((p, i) => (
            <p key={i} class="meta">
              {p.sheet}!{p.cell}: {p.message}
            </p>
          ))}
          {view.tables.map((t, i) => (
            <div key={i} class="compare-table">
              <h3>
                {t.old.sheet}!{t.old.range} → {t.new.sheet}!{t.new.range}
              </h3>
              {t.outputs.map((o) => (
                <OutputChange key={o.identifier} inputs={t.inputs} output={o} />
              ))}
              {t.retest && (
                <p>
                  retest ({t.retest.source}): {t.retest.repeat.length === 0 ? 'none' : t.retest.repeat.map((r) => r.testId).join(', ')}
                  {t.retest.newSteps.length > 0 ? `; new steps: ${t.retest.newSteps.join(', ')}` : ''}
                </p>
              )}
            </div>
          ))}
          <div class="row">
            <button type="button" disabled={view.sheets.length === 0} onClick={() => void write()}>
              Write change record and retest record
            </button>
          </div>
        </>
      )}
      <Outcome message={message} error={error} />
    </section>
  );
}
