// What the engine found in a spec table: signals, problems, and per output its forms with
// their proof, the inputs that do not matter, gaps, conflicts and don't-cares turned on. Either
// engine's outputs (up to 64 inputs) come as the same views; counts are exact (BigInt).
import { useEffect, useMemo, useRef, useState } from 'preact/hooks';
import { boundsWords, inputBit, type Signal } from '../src/logic/index.js';
import { ladderSvg, minimumWords, NO_XOR, type FormView, type OutputView, type XorView } from '../src/report/index.js';
import { describePattern, qualifiedAddress, type Problem, type RoleRule } from '../src/table/index.js';
import { verdictWords, type Permission, type TableView, type Verdict } from '../src/workflow/index.js';
import { copyText, download, safeFileName } from './files.js';

export type SelectCell = (sheet: string, cell: string) => void;

const ROLE_RULE: Readonly<Record<RoleRule, string>> = {
  'role-row': 'the role row above the headers (input / output)',
  'separator-column': 'the empty column between inputs and outputs',
  'user-choice': 'your choice of how many columns are inputs',
};

const plural = (n: number | bigint, one: string, many = `${one}s`) => `${n.toLocaleString('en')} ${BigInt(n) === 1n ? one : many}`;

/** A cell address that selects the cell in Excel when clicked (plain text where there is no live sheet). */
export function CellLink({ sheet, cell, selectCell, bare }: { sheet: string; cell: string; selectCell?: SelectCell | undefined; bare?: boolean }) {
  const full = qualifiedAddress(sheet, cell);
  // `bare`: the cell alone, where the sheet is named just above (narrow tables).
  const text = bare ? cell : full;
  if (!selectCell) return <code class="cell" title={full}>{text}</code>;
  return (
    <button type="button" class="link cell" title={`Select ${full} in Excel`} onClick={() => selectCell(sheet, cell)}>
      {text}
    </button>
  );
}

export function ProblemList({ problems, selectCell }: { problems: readonly Problem[]; selectCell?: SelectCell | undefined }) {
  if (problems.length === 0) return null;
  return (
    <ul class="problems" aria-label="Problems in the sheet">
      {problems.map((p, i) => (
        <li key={i} class={`problem ${p.severity}`}>
          <span class="severity">{p.severity}</span> <CellLink sheet={p.sheet} cell={p.cell} selectCell={selectCell} />
          <span class="message"> {p.message}</span>
        </li>
      ))}
    </ul>
  );
}

function CopyButton({ text, what }: { text: string; what: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  return (
    <button
      type="button"
      class="small"
      aria-label={`Copy the ${what}`}
      onClick={async () => {
        setState((await copyText(text)) ? 'copied' : 'failed');
        setTimeout(() => setState('idle'), 1500);
      }}
    >
      {state === 'copied' ? 'Copied' : state === 'failed' ? 'Copy failed' : 'Copy'}
    </button>
  );
}

function proofLine(form: Pick<FormView, 'combinations' | 'mismatchCount'>): string {
  return form.mismatchCount === 0n
    ? `proof: all ${plural(form.combinations, 'combination')} checked, every one agrees with the spec`
    : `proof FAILED: ${plural(form.mismatchCount, 'combination')} of ${form.combinations.toLocaleString('en')} differ from the spec`;
}

const BADGE: Readonly<Record<Verdict['kind'], string>> = { proven: 'good', heuristic: 'warn', differs: 'bad', 'not-analysed': 'bad' };

/** The workflow's words for a verdict, as a badge. */
function VerdictBadge({ verdict }: { verdict: Verdict }) {
  return <span class={`badge ${BADGE[verdict.kind]}`}>{verdictWords(verdict)}</span>;
}

/** One form: its Structured Text (or, too long to print, what it is instead), cost, and proof. */
function FormBlock({ title, form, meta, verdict }: { title: string; form: FormView; meta: string; verdict?: Verdict }) {
  const ok = form.mismatchCount === 0n;
  return (
    <div class="form" data-form={title}>
      <div class="form-head">
        <h4>{title}</h4>
        {verdict && <VerdictBadge verdict={verdict} />}
        {form.expr && <CopyButton text={form.text} what={title} />}
      </div>
      {form.expr ? <pre class="expr">{form.text}</pre> : <p class="expr not-printed">{form.text}</p>}
      <p class="meta">{meta}</p>
      <p class={ok ? 'proof ok' : 'proof bad'}>{proofLine(form)}</p>
    </div>
  );
}

/** One column head per signal, written sideways to fit a narrow pane, then any further titles. */
export function SignalHeads({ signals, extra }: { signals: readonly Pick<Signal, 'identifier' | 'header'>[]; extra?: readonly string[] | undefined }) {
  return (
    <thead>
      <tr>
        {signals.map((s) => (
          <th key={s.identifier} class="side" title={s.header}>
            <span>{s.identifier}</span>
          </th>
        ))}
        {extra?.map((t) => <th key={t}>{t}</th>)}
      </tr>
    </thead>
  );
}

/** Rows of input values, one column per input (headers written sideways to fit a narrow pane). */
export function CombinationTable({
  inputs,
  rows,
  extra,
  rowClass,
}: {
  inputs: readonly Signal[];
  /** Each a pattern over the inputs, leftmost first ("0110"). */
  rows: readonly string[];
  extra?: { titles: string[]; cells: (k: number) => (string | number)[] };
  /** A class for row r (e.g. to mark unsafe counterexamples). */
  rowClass?: (r: number) => string | undefined;
}) {
  return (
    <div class="scroll">
      <table class="combos">
        <SignalHeads signals={inputs} extra={extra?.titles} />
        <tbody>
          {rows.map((pattern, r) => (
            <tr key={r} class={rowClass?.(r)}>
              {inputs.map((_, i) => (
                <td key={i}>{pattern[i]}</td>
              ))}
              {extra?.cells(r).map((c, j) => <td key={`x${j}`} class="strong">{c}</td>)}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function LadderPicture({ output, inputs, handOver }: { output: OutputView; inputs: readonly Signal[]; handOver: Permission }) {
  const svg = useMemo(() => ladderSvg(output, inputs), [output, inputs]);
  const [url, setUrl] = useState<string>();
  useEffect(() => {
    // Shown as an image from a blob: URL, so the picture can run nothing inside the pane.
    const u = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
    setUrl(u);
    return () => URL.revokeObjectURL(u);
  }, [svg]);
  return (
    <details class="ladder">
      <summary>Ladder picture (AND/OR form)</summary>
      {url && (
        // As wide as the rung: a wide one scrolls sideways in the pane (focusable, so the keys scroll it too).
        <div class="scroll ladder-picture" tabIndex={0} role="region" aria-label={`Ladder picture of ${output.signal.identifier}, scrolls sideways`}>
          <img src={url} alt={`Ladder Diagram rung for ${output.signal.identifier}`} />
        </div>
      )}
      {handOver.allowed ? (
        <button type="button" class="small" onClick={() => download(`${safeFileName(output.signal.identifier)}-ladder.svg`, 'image/svg+xml', svg)}>
          Download picture (SVG)
        </button>
      ) : (
        <p class="meta">No download: {handOver.reason}.</p>
      )}
    </details>
  );
}

/** The output's commissioning test steps, as on its test record: the inputs to set and what to expect. */
function StepsView({ output, inputs }: { output: OutputView; inputs: readonly Signal[] }) {
  const steps = output.steps;
  return (
    <details class="steps-record">
      <summary>Test steps ({plural(steps.length, 'step')})</summary>
      <CombinationTable
        inputs={inputs}
        rows={steps.map((s) => s.pattern)}
        extra={{
          titles: ['Test ID', `Expected ${output.signal.identifier}`, 'Pass/Fail'],
          cells: (r) => [`T-${steps[r]!.pattern}`, steps[r]!.expected, ''],
        }}
      />
    </details>
  );
}

/**
 * Print this output alone (browser print): the other cards are hidden by the print rules in
 * styles.css, and the card's folded parts are opened for the print, then closed again.
 */
function PrintButton({ card }: { card: { current: HTMLElement | null } }) {
  const print = () => {
    const el = card.current;
    if (!el) return;
    const closed = [...el.querySelectorAll('details'), ...document.querySelectorAll<HTMLDetailsElement>('footer.caution details')].filter((d) => !d.open);
    for (const d of closed) d.open = true;
    el.classList.add('print-this');
    document.body.classList.add('print-one');
    const done = () => {
      window.removeEventListener('afterprint', done);
      el.classList.remove('print-this');
      document.body.classList.remove('print-one');
      for (const d of closed) d.open = false;
    };
    window.addEventListener('afterprint', done);
    window.print();
  };
  return (
    <button type="button" class="small secondary no-print" onClick={print}>
      Print this output
    </button>
  );
}

/** How many inputs the best-polarity XOR form takes complemented. */
function complemented(bestXor: XorView, n: number): number {
  let k = 0;
  for (let i = 0; i < n; i++) if (bestXor.polarity & inputBit(n, i)) k++;
  return k;
}

function OutputCard({
  output,
  verdict,
  table,
  handOver,
  selectCell,
}: {
  output: OutputView;
  verdict: Verdict;
  table: TableView;
  handOver: Permission;
  selectCell?: SelectCell | undefined;
}) {
  const inputs = table.inputs;
  const n = inputs.length;
  const { andOr, xor, bestXor } = output;
  const unused = output.unusedInputs.map((i) => inputs[i]!.identifier);
  const flipped = bestXor ? complemented(bestXor, n) : 0;
  const card = useRef<HTMLElement>(null);
  return (
    <section class="card output" aria-label={`Output ${output.signal.header}`} ref={card}>
      <div class="output-head">
        <h3>
          {output.signal.header} <code>{output.signal.identifier}</code>
        </h3>
        <PrintButton card={card} />
      </div>
      <p class="print-only meta">
        Spec table {qualifiedAddress(table.sheet, table.range)}: {verdictWords(verdict)}
      </p>
      <p class="meta">safe value {output.safe}; {plural(output.dontCareCount, "don't-care combination")}</p>
      <FormBlock
        title="AND/OR form"
        form={andOr}
        meta={`sum of products: ${plural(andOr.terms, 'product term')}, ${plural(andOr.literals, 'literal')}; ${minimumWords(andOr)}`}
        verdict={verdict}
      />
      {xor && bestXor ? (
        <>
          <FormBlock title="XOR form" form={xor} meta={`algebraic normal form: ${plural(xor.terms, 'term')}, degree ${output.degree}`} />
          <FormBlock
            title="Best-polarity XOR form"
            form={bestXor}
            meta={`${plural(bestXor.terms, 'term')}, ${flipped === 0 ? 'no input complemented' : `${plural(flipped, 'input')} complemented`}; ${bestXor.exhaustive ? 'every polarity tried' : 'not every polarity tried'}`}
          />
        </>
      ) : (
        <p class="meta">XOR forms: {NO_XOR}</p>
      )}
      <dl class="facts">
        <dt>Inputs that do not matter</dt>
        <dd>{unused.length === 0 ? 'none: every input matters' : unused.join(', ')}</dd>
        <dt>Gaps</dt>
        <dd>
          {output.gapCount.atMost === 0n ? (
            'none: every combination is covered by a row'
          ) : (
            <>
              {boundsWords(output.gapCount, 'combination')} no row covers; they take the safe value {output.safe}:
              <ul>
                {output.gaps.map((c, i) => (
                  <li key={i}>{describePattern(c, inputs)}</li>
                ))}
              </ul>
            </>
          )}
        </dd>
        <dt>Conflicts</dt>
        <dd>
          {output.conflicts.length === 0 ? (
            'none'
          ) : (
            <ul>
              {output.conflicts.map((c, i) => (
                <li key={i}>
                  rows <CellLink sheet={table.sheet} cell={c.rowCellsA} selectCell={selectCell} /> and{' '}
                  <CellLink sheet={table.sheet} cell={c.rowCellsB} selectCell={selectCell} /> ask for 1 and 0 on{' '}
                  {plural(c.combinations, 'combination')}, e.g. <code>{c.example}</code>; the safe value {output.safe} is used
                </li>
              ))}
            </ul>
          )}
        </dd>
        <dt>Permits also</dt>
        <dd>
          {andOr.permitsAlsoCount === 0n ? (
            "the AND/OR form turns on no don't-care combination"
          ) : (
            <>
              the AND/OR form turns on {plural(andOr.permitsAlsoCount, "don't-care combination")}
              {andOr.permitsAlsoCount > BigInt(andOr.permitsAlso.length) && ` (the first ${andOr.permitsAlso.length.toLocaleString('en')} below)`}:
              <CombinationTable inputs={inputs} rows={andOr.permitsAlso} />
            </>
          )}
        </dd>
      </dl>
      <LadderPicture output={output} inputs={inputs} handOver={handOver} />
      <StepsView output={output} inputs={inputs} />
    </section>
  );
}

export function SpecTableView({ table, handOver, selectCell }: { table: TableView; handOver: Permission; selectCell?: SelectCell | undefined }) {
  return (
    <div class="table-view">
      <section class="card">
        <h2>
          Spec table <CellLink sheet={table.sheet} cell={table.range} selectCell={selectCell} />
        </h2>
        <p class="table-verdict">
          Verdict: <VerdictBadge verdict={table.verdict} />
        </p>
        <p>
          {plural(table.inputs.length, 'input')}, {plural(table.outputs.length, 'output')}, {plural(table.rows, 'row')}. Inputs and
          outputs told apart by {ROLE_RULE[table.roleRule]}.
          {table.xReading === 'dont-care' && ' X cells were read as any / don\'t-care.'}
        </p>
        {!table.analysed && (
          <p class="verdict not-analysed" role="status">
            No form was derived or proven and nothing of this table is handed over: fix the cells below and read it again.
          </p>
        )}
        <ProblemList problems={table.problems} selectCell={selectCell} />
        <details>
          <summary>Signals and their Structured Text names</summary>
          <div class="scroll">
            <table class="signals">
              <thead>
                <tr>
                  <th>Signal</th>
                  <th>Role</th>
                  <th>Identifier</th>
                </tr>
              </thead>
              <tbody>
                {table.inputs.map((s) => (
                  <tr key={`i${s.identifier}`}>
                    <td>{s.header}</td>
                    <td>input</td>
                    <td>
                      <code>{s.identifier}</code>
                    </td>
                  </tr>
                ))}
                {table.outputs.map((o) => (
                  <tr key={`o${o.signal.identifier}`}>
                    <td>{o.signal.header}</td>
                    <td>output</td>
                    <td>
                      <code>{o.signal.identifier}</code>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </details>
      </section>
      {table.analysed?.map((o) => (
        <OutputCard
          key={o.signal.identifier}
          output={o}
          verdict={table.outputs.find((t) => t.signal.header === o.signal.header)!.verdict}
          table={table}
          handOver={handOver}
          selectCell={selectCell}
        />
      ))}
    </div>
  );
}
