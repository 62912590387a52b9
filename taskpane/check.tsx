// Implementation check: an expression typed or pasted by the user, or an .st / PLCopen .xml file
// (with a mapping file or sheet when names differ), checked against the spec on every input
// combination. Differences are split into unsafe ones (marked) and spurious trips, each with
// its count and a plain sentence; the ANF terms are a detail below.
import { useEffect, useState } from 'preact/hooks';
import type { EngineError, SideSentence, Signal } from '../src/logic/index.js';
import { verifyReportText, type SheetBlock } from '../src/report/index.js';
import type { Count, OutputVerdict } from '../src/impl/index.js';
import { implementationWord, readMappingSheet, type MappingSource, type TableView } from '../src/workflow/index.js';
import type { WorkbookHost } from '../src/hosts/index.js';
import type { Answers } from './engine-protocol.js';
import { Cancelled, type Engine } from './engine.js';
import { CombinationTable } from './results.js';

const count = (n: number | bigint) => n.toLocaleString('en');

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

/** A count with its unit, the unsafe one marked when there is any. */
function SideCounts({ unsafe, trips }: { unsafe: number | bigint; trips: number | bigint }) {
  return (
    <p class="side-counts">
      <span class={unsafe > 0 ? 'badge bad unsafe-count' : 'badge'}>
        {count(unsafe)} unsafe combination{Number(unsafe) === 1 ? '' : 's'}
      </span>{' '}
      <span class="badge spurious-count">
        {count(trips)} spurious trip{Number(trips) === 1 ? '' : 's'}
      </span>
    </p>
  );
}

/** The sentence of each side, unsafe first and marked. */
function SideSentences({ unsafe, trips }: { unsafe: SideSentence | undefined; trips: SideSentence | undefined }) {
  return (
    <>
      {unsafe && <p class="side unsafe">{unsafe.sentence}</p>}
      {trips && <p class="side spurious">{trips.sentence}</p>}
    </>
  );
}

const KIND_WORD = { unsafe: 'unsafe', 'spurious-trip': 'spurious trip' } as const;

/** Counterexamples as a table, one column per input, the kind beside; unsafe rows marked. */
function Counterexamples({ inputs, rows }: { inputs: readonly Signal[]; rows: OutputVerdict['counterexamples'] }) {
  return (
    <CombinationTable
      inputs={inputs}
      rows={rows.map((c) => c.inputs.join(''))}
      rowClass={(r) => (rows[r]!.kind === 'unsafe' ? 'unsafe' : undefined)}
      extra={{ titles: ['spec', 'yours', 'kind'], cells: (r) => [rows[r]!.expected, rows[r]!.actual, KIND_WORD[rows[r]!.kind]] }}
    />
  );
}

/** The ANF terms by which they differ: a detail under the sentences. */
function AnfDetail({ terms, total }: { terms: readonly string[]; total: Count }) {
  return (
    <details class="anf-detail">
      <summary>Detail: the XOR of {count(total)} ANF term{Number(total) === 1 ? '' : 's'} by which spec and program differ</summary>
      <code>{terms.join(' XOR ')}</code>
      {total > terms.length ? ' …' : ''}
    </details>
  );
}

/** A typed expression's verdict: the same fields as a program output's, at up to 64 inputs. */
function CheckResult({ result, table }: { result: OutputVerdict; table: TableView }) {
  if (result.status === 'equal') {
    return (
      <p class="verdict equal" role="status">
        Equal: the expression agrees with the spec on all {count(result.combinations)} combinations
        {result.dontCare.implementationOn > 0 ? ` (it turns on ${count(result.dontCare.implementationOn)} don't-care combinations)` : ''}.
      </p>
    );
  }
  if (result.status !== 'differs') {
    return (
      <p class="verdict unchecked" role="status">
        Not checked: {result.reasons.join('; ')}.
      </p>
    );
  }
  return (
    <div class="verdict differs" role="status">
      <p>
        Differs on {count(result.mismatchCount)} of {count(result.combinations)} combinations. Counterexamples
        {BigInt(result.counterexamples.length) < BigInt(result.mismatchCount) ? ` (the first of each kind)` : ''}, unsafe first:
      </p>
      <SideCounts unsafe={result.unsafeCount} trips={result.spuriousTripCount} />
      <SideSentences unsafe={result.unsafeWhen} trips={result.spuriousTripWhen} />
      <Counterexamples inputs={table.inputs} rows={result.counterexamples} />
      <AnfDetail terms={result.differenceMonomials} total={result.differenceMonomialCount} />
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
          label={checked.check.counterexamples.length > 0 ? 'Write counterexamples to a new sheet' : 'Write the verdict to a new sheet'}
          sheet={checked.sheet}
        />
      )}
    </section>
  );
}

/** What the user gave to map names: a mapping file, and/or a sheet of the workbook. */
interface MappingChoice {
  readonly file?: { readonly fileName: string; readonly text: string };
  readonly sheet?: string;
}

/** One output's verdict line, its counts and sentences. */
function OutputLine({ o }: { o: OutputVerdict }) {
  return (
    <li class={`verdict-line ${o.status}${o.unsafeCount > 0 ? ' has-unsafe' : ''}`} data-output={o.output.identifier}>
      <strong>{o.output.identifier}</strong>: {o.status === 'not-found' ? 'NOT FOUND' : implementationWord(o)}
      {o.status === 'differs' ? ` on ${count(o.mismatchCount)} of ${count(o.combinations)} combinations` : ''}
      {o.variable ? ` (${o.variable})` : ''}
      {(o.status === 'unchecked' || o.status === 'not-found') && o.reasons[0] ? `: ${o.reasons[0]}` : ''}
      {o.status === 'differs' && (
        <>
          <SideCounts unsafe={o.unsafeCount} trips={o.spuriousTripCount} />
          <SideSentences unsafe={o.unsafeWhen} trips={o.spuriousTripWhen} />
        </>
      )}
    </li>
  );
}

/**
 * An implementation file (.st or PLCopen .xml) checked against every table read (by the
 * worker, which keeps them). Names are matched by identifier, header or tag row, or by a
 * mapping file (spec signal, program variable: the CSV the command line's --map takes) and/or
 * a mapping sheet of the workbook (the same two columns); changing the mapping checks again.
 */
export function FileCheck({ engine, write, host }: { engine: Engine; write: WriteSheet | undefined; host: WorkbookHost | undefined }) {
  const [report, setReport] = useState<{ run: number; file: string; result: Answers['verify'] }>();
  const [program, setProgram] = useState<{ fileName: string; text: string }>();
  const [mapping, setMapping] = useState<MappingChoice>({});
  const [sheets, setSheets] = useState<string[]>([]);
  const [busy, setBusy] = useState(false);
  useEffect(() => void host?.listSheets().then(setSheets), [host]);
  const run = async (p: { fileName: string; text: string } | undefined, m: MappingChoice) => {
    if (!p) return;
    setBusy(true);
    const next = (report?.run ?? 0) + 1;
    try {
      const mappings: MappingSource[] = [];
      if (m.file) mappings.push({ kind: 'file', ...m.file });
      if (m.sheet && host) mappings.push(await readMappingSheet(host, m.sheet));
      const result = await engine.verify({ fileName: p.fileName, text: p.text, mappings });
      setReport({ run: next, file: p.fileName, result });
    } catch (err) {
      setReport({ run: next, file: p.fileName, result: { ok: false, error: { message: err instanceof Cancelled ? 'The check was stopped.' : (err as Error).message } } });
    } finally {
      setBusy(false);
    }
  };
  const pickProgram = async (e: Event) => {
    const file = (e.currentTarget as HTMLInputElement).files?.[0];
    if (!file) return;
    const p = { fileName: file.name, text: await file.text() };
    setProgram(p);
    await run(p, mapping);
  };
  const changeMapping = async (m: MappingChoice) => {
    setMapping(m);
    await run(program, m);
  };
  const pickMappingFile = async (e: Event) => {
    const file = (e.currentTarget as HTMLInputElement).files?.[0];
    const { file: _old, ...rest } = mapping;
    await changeMapping(file ? { ...rest, file: { fileName: file.name, text: await file.text() } } : rest);
  };
  const pickMappingSheet = (e: Event) => {
    const sheet = (e.currentTarget as HTMLSelectElement).value;
    const { sheet: _old, ...rest } = mapping;
    void changeMapping(sheet ? { ...rest, sheet } : rest);
  };
  const verified = report?.result.ok ? { run: report.run, ...report.result.value } : undefined;
  return (
    <section class="card" aria-labelledby="file-check-title">
      <h2 id="file-check-title">Check a program file</h2>
      <label class="file">
        Structured Text (.st) or PLCopen XML (.xml)
        <input type="file" accept=".st,.xml,.txt" onChange={pickProgram} disabled={busy} />
      </label>
      <fieldset class="mapping">
        <legend>Names that differ (optional)</legend>
        <p class="meta">
          Without a mapping, program variables match the spec's headers, identifiers or tag row. A mapping has two columns: spec signal,
          program variable (<code>Name</code>, <code>Pou.Name</code> or <code>%IX0.1</code>); a first row “spec signal, program variable” is a
          header.
        </p>
        <label class="file">
          Mapping file (.csv)
          <input type="file" accept=".csv,.txt" data-mapping onChange={pickMappingFile} disabled={busy} />
        </label>
        {host && (
          <label>
            Mapping sheet
            <select value={mapping.sheet ?? ''} onChange={pickMappingSheet} disabled={busy}>
              <option value="">none</option>
              {sheets.map((s) => (
                <option key={s} value={s}>
                  {s}
                </option>
              ))}
            </select>
          </label>
        )}
      </fieldset>
      {busy && <p role="status">Checking…</p>}
      {report && !report.result.ok && (
        <p class="error" role="alert">
          {report.result.error.message}
        </p>
      )}
      {verified && (
        <>
          {verified.report.mapping && <p class="meta">Names mapped by {verified.report.mapping}.</p>}
          <ul class="verdicts">
            {verified.report.outputs.map((o, i) => (
              <OutputLine key={i} o={o} />
            ))}
          </ul>
          {verified.report.unusedMapping.length > 0 && (
            <div class="mapping-unused" role="alert">
              <p>Mapping entries that cannot be used (the outputs they touch are UNCHECKED):</p>
              <ul>
                {verified.report.unusedMapping.map((u) => (
                  <li key={u}>{u}</li>
                ))}
              </ul>
            </div>
          )}
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
