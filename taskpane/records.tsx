// "Check a filled-in test record": every record sheet of the workbook (in Excel the workbook
// open, on the page the file opened) judged by the workflow against its table as it is now —
// the same judgement as the command line's `record`. The cells are read here; the worker
// re-reads and analyses the tables.
import { useState } from 'preact/hooks';
import type { WorkbookHost } from '../src/hosts/index.js';
import { readRecordGrids, type RecordVerdict } from '../src/workflow/index.js';
import { Outcome } from './check.js';
import { Cancelled, type Engine } from './engine.js';
import { CellLink, ProblemList, type SelectCell } from './results.js';

const RESULT_CLASS = { passed: 'good', failed: 'bad', 'not run': 'warn' } as const;

function RecordView({ verdict: v, selectCell }: { verdict: RecordVerdict; selectCell?: SelectCell | undefined }) {
  const r = v.record;
  return (
    <article class="record" aria-label={`Test record ${r.sheet}`}>
      <h3>
        Record <CellLink sheet={r.sheet} cell="A1" selectCell={selectCell} /> of the table{' '}
        {r.table.sheet ? <CellLink sheet={r.table.sheet} cell={r.table.range} selectCell={selectCell} /> : 'it no longer names'}
      </h3>
      <p class="record-state">
        {v.current ? <span class="badge good">current</span> : <span class="badge bad">stale</span>}{' '}
        {v.current ? 'the table still has the revision stamp of the record' : v.stale}
      </p>
      <p class="record-counts">
        {v.passed} passed, {v.failed} failed, {v.notRun} not run, of {r.steps.length} steps
      </p>
      {r.steps.length > 0 && (
        <div class="scroll">
          <table class="steps">
            <thead>
              <tr>
                <th>Step</th>
                <th>Test ID</th>
                <th>Result</th>
              </tr>
            </thead>
            <tbody>
              {r.steps.map((s) => (
                <tr key={s.step}>
                  <td>{s.step}</td>
                  <td>
                    <code>{s.testId}</code>
                  </td>
                  <td>
                    <span class={`badge ${RESULT_CLASS[s.result]}`}>{s.result}</span> <CellLink sheet={r.sheet} cell={s.cell} selectCell={selectCell} bare />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <ProblemList problems={v.problems} selectCell={selectCell} />
      <p class={v.ok ? 'record-ok good' : 'record-ok bad'}>{v.ok ? 'Every step passed on the current revision.' : !v.current ? 'Stale: retest with a new record made from the table as it is now.' : 'Not complete: see above.'}</p>
    </article>
  );
}

export function RecordCheck({ host, engine, selectCell, source }: { host: WorkbookHost; engine: Engine; selectCell?: SelectCell | undefined; source: string }) {
  const [verdicts, setVerdicts] = useState<RecordVerdict[]>();
  const [state, setState] = useState<string>();
  const [error, setError] = useState<string>();
  const run = async () => {
    setError(undefined);
    setVerdicts(undefined);
    try {
      setState(`Reading the sheets of ${source}`);
      const grids = await readRecordGrids(host);
      setState(`Checking ${grids.records.length} record${grids.records.length === 1 ? '' : 's'} against the tables`);
      setVerdicts(await engine.records({ grids }));
    } catch (e) {
      setError(e instanceof Cancelled ? 'Stopped. Nothing was changed.' : (e as Error).message);
    } finally {
      setState(undefined);
    }
  };
  return (
    <section class="card records" aria-labelledby="records-title">
      <h2 id="records-title">Test records</h2>
      <p class="meta">Reads every commissioning test record in {source} and checks it against its table as the workbook has it now. Nothing is written.</p>
      <button type="button" class="secondary" disabled={state !== undefined} onClick={() => void run()}>
        Check a filled-in test record
      </button>
      {state && (
        <p class="meta" role="status">
          {state}
        </p>
      )}
      <Outcome message={undefined} error={error} />
      {verdicts && verdicts.length === 0 && (
        <p class="meta" role="status">
          No commissioning test record found in {source} (a sheet whose first cell reads “Commissioning test record: …”).
        </p>
      )}
      {verdicts?.map((v) => (
        <RecordView key={v.record.sheet} verdict={v} selectCell={selectCell} />
      ))}
    </section>
  );
}
