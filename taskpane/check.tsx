// Implementation check: an expression typed or pasted by the user, or an .st / PLCopen .xml file
// (standalone page), checked against the spec on every input combination.
import { useState } from 'preact/hooks';
import type { EngineError, ImplCheck, Monomial } from '../src/logic/index.js';
import { verifyReportText, type SheetBlock } from '../src/report/index.js';
import { printMonomial } from '../src/impl/index.js';
import { implementationWord, type TableView } from '../src/workflow/index.js';
import type { Answers } from './engine-protocol.js';
import { Cancelled, type Engine } from './engine.js';
import { CombinationTable } from './results.js';

const count = (n: number) => n.toLocaleString('en');

/** Writes a new sheet and answers what it wrote and where (from app.tsx: Excel, or the results workbook). */
export type WriteSheet = (block: SheetBlock) => Promise<string>;

/** The button that writes a check to a new sheet, once per check (a new check gives a new button). */
function WriteCheckSheet({ write, sheet, label }: { write: WriteSheet; sheet: SheetBlock; label: string }) {
  const [message, setMessage] = useState<string>();
  const [error, setError] = useState<string>();
  const [busy, setBusy] = useState(false);
  const run = async () => {
    setBusy(true);
    setError(undefined);
    try {
      setMessage(await write(sheet));
    } catch (e) {
      setError((e as Error).message);
    } finally {
      setBusy(false);
    }
  };
  return (
    <>
      <div class="row">
        <button type="button" class="secondary" disabled={busy || message !== undefined} onClick={() => void run()}>
          {busy ? 'Writing…' : label}
        </button>
      </div>
      <Outcome message={message} error={error} />
    </>
  );
}

/** What a write did, or why it failed, announced to screen readers. */
export function Outcome({ message, error }: { message: string | undefined; error: string | undefined }) {
  return (
    <>
      {message && (
        <p class="done" role="status">
          {message}
        </p>
      )}
      {error && (
        <p class="error" role="alert">
          {error}
        </p>
      )}
    </>
  );
}

function ParseError({ error, text }: { error: EngineError; text: string }) {
  return (
    <div class="error" role="alert">
      <p>{error.message}</p>
      {error.position !== undefined && (
        <pre class="caret">
          {text}
          {'\n'}
          {' '.repeat(error.position)}^
        </pre>
      )}
    </div>
  );
}

function CheckResult({ result, table }: { result: ImplCheck; table: TableView }) {
  const inputs = table.inputs;
  if (result.equal) {
    return (
      <p class="verdict equal" role="status">
        Equal: the expression agrees with the spec on all {count(result.combinations)} combinations
        {result.dontCareOn > 0 ? ` (it turns on ${count(result.dontCareOn)} don't-care combinations)` : ''}.
      </p>
    );
  }
  const monos = result.differenceMonomials.map((m: Monomial) => printMonomial(m, inputs));
  return (
    <div class="verdict differs" role="status">
      <p>
        Differs on {count(result.mismatchCount)} of {count(result.combinations)} combinations. Counterexamples
        {result.counterexamples.length < result.mismatchCount ? ` (first ${result.counterexamples.length})` : ''}:
      </p>
      <CombinationTable
        inputs={inputs}
        rows={result.counterexamples.map((c) => c.combination)}
        extra={{ titles: ['spec', 'yours'], cells: (r) => [result.counterexamples[r]!.expected, result.counterexamples[r]!.actual] }}
      />
      <p class="meta">
        The difference is the XOR of {count(result.differenceMonomialCount)} term{result.differenceMonomialCount === 1 ? '' : 's'}:{' '}
        <code>{monos.join(' XOR ')}</code>
        {result.differenceMonomialCount > monos.length ? ' …' : ''}
      </p>
    </div>
  );
}

export function ExpressionCheck({ table, engine, write }: { table: TableView; engine: Engine; write: WriteSheet | undefined }) {
  const [output, setOutput] = useState(0);
  const [text, setText] = useState('');
  const [answer, setAnswer] = useState<{ run: number; text: string; result: Answers['check'] }>();
  const [busy, setBusy] = useState(false);
  const [failure, setFailure] = useState<string>();
  const run = async (e: Event) => {
    e.preventDefault();
    setBusy(true);
    setFailure(undefined);
    try {
      const result = await engine.check({ table: table.id, output, text });
      setAnswer({ run: (answer?.run ?? 0) + 1, text, result });
    } catch (err) {
      setFailure(err instanceof Cancelled ? 'The check was stopped.' : String((err as Error).message));
    } finally {
      setBusy(false);
    }
  };
  const checked = answer?.result.ok ? answer.result.value : undefined;
  return (
    <section class="card" aria-labelledby="check-title">
      <h2 id="check-title">Implementation check</h2>
      <p class="meta">
        Paste the logic as it is programmed (Structured Text, or shorthand such as <code>a &amp; !b | c</code>); names are the headers or
        their identifiers.
      </p>
      <form onSubmit={run}>
        <label>
          Output
          <select value={output} onChange={(e) => setOutput(Number((e.currentTarget as HTMLSelectElement).value))}>
            {table.outputs.map((o, i) => (
              <option key={i} value={i}>
                {o.signal.identifier}
              </option>
            ))}
          </select>
        </label>
        <label>
          Expression
          <textarea rows={3} value={text} spellcheck={false} onInput={(e) => setText((e.currentTarget as HTMLTextAreaElement).value)} />
        </label>
        <button type="submit" disabled={busy || text.trim() === ''}>
          {busy ? 'Checking…' : 'Check against the spec'}
        </button>
      </form>
      {failure && <p class="error">{failure}</p>}
      {answer && (answer.result.ok ? <CheckResult result={answer.result.value.check} table={table} /> : <ParseError error={answer.result.error} text={answer.text} />)}
      {write && answer && checked && (
        <WriteCheckSheet
          key={answer.run}
          write={write}
          label={checked.check.equal ? 'Write the verdict to a new sheet' : 'Write counterexamples to a new sheet'}
          sheet={checked.sheet}
        />
      )}
    </section>
  );
}

/** An implementation file (.st or PLCopen .xml) checked against every table read (by the worker, which keeps them). */
export function FileCheck({ engine, write }: { engine: Engine; write: WriteSheet | undefined }) {
  const [report, setReport] = useState<{ run: number; file: string; result: Answers['verify'] }>();
  const [busy, setBusy] = useState(false);
  const pick = async (e: Event) => {
    const file = (e.currentTarget as HTMLInputElement).files?.[0];
    if (!file) return;
    setBusy(true);
    const run = (report?.run ?? 0) + 1;
    try {
      const result = await engine.verify({ fileName: file.name, text: await file.text() });
      setReport({ run, file: file.name, result });
    } catch (err) {
      setReport({ run, file: file.name, result: { ok: false, error: { message: (err as Error).message } } });
    } finally {
      setBusy(false);
    }
  };
  const verified = report?.result.ok ? { run: report.run, ...report.result.value } : undefined;
  return (
    <section class="card" aria-labelledby="file-check-title">
      <h2 id="file-check-title">Check a program file</h2>
      <label class="file">
        Structured Text (.st) or PLCopen XML (.xml)
        <input type="file" accept=".st,.xml,.txt" onChange={pick} disabled={busy} />
      </label>
      {busy && <p role="status">Checking…</p>}
      {report && !report.result.ok && <p class="error">{report.result.error.message}</p>}
      {verified && (
        <>
          <ul class="verdicts">
            {verified.report.outputs.map((o, i) => (
              <li key={i} class={`verdict-line ${o.status}`}>
                <strong>{o.output.identifier}</strong>: {implementationWord(o)}
                {o.status === 'differs' ? ` on ${count(o.mismatchCount)} of ${count(o.combinations)} combinations` : ''}
                {o.variable ? ` (${o.variable})` : ''}
                {o.status === 'unchecked' && o.reasons[0] ? `: ${o.reasons[0]}` : ''}
              </li>
            ))}
          </ul>
          {write && (
            <WriteCheckSheet
              key={verified.run}
              write={write}
              label={verified.report.outputs.some((o) => o.counterexamples.length > 0) ? 'Write counterexamples to a new sheet' : 'Write the verdicts to a new sheet'}
              sheet={verified.sheet}
            />
          )}
          <details>
            <summary>Full report</summary>
            <pre class="report">{verifyReportText(verified.report)}</pre>
          </details>
        </>
      )}
    </section>
  );
}
