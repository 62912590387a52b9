// How a table is read, set where the user works: the number of input columns (when no role row
// or separator column decides), the safe value of each output, the X reading and the don't-care
// policy. Remembered per reading target (the sheet, selection, Excel table or range read): with
// the workbook in Excel (its document settings), while the page stays open on the standalone
// page. The labels are the words src/table/settings.ts quotes in problems: keep them together.
import { useState } from 'preact/hooks';
import type { DontCarePolicy } from '../src/table/index.js';
import type { TableView } from '../src/workflow/index.js';
import { DEFAULT_SETTINGS, type TableSettings } from './table-settings.js';

/**
 * The settings card of the table(s) read. Each change is remembered and read again at once.
 * `tables` gives the outputs whose safe value can be set (those read so far).
 */
export function SettingsCard({
  label,
  settings,
  tables,
  where,
  busy,
  change,
  again,
}: {
  label: string;
  settings: TableSettings;
  tables: readonly TableView[];
  where: string;
  busy: boolean;
  change: (s: TableSettings) => void;
  /** Read again with the settings as they are (after the user changed the cells). */
  again: () => void;
}) {
  const [count, setCount] = useState(settings.inputCount === undefined ? '' : String(settings.inputCount));
  const outputs = tables.flatMap((t) => t.outputs);
  const applyCount = () => {
    const n = count.trim() === '' ? undefined : Number(count);
    if (n !== undefined && !(Number.isInteger(n) && n >= 1)) return;
    if (n === settings.inputCount) return;
    const { inputCount: _old, ...rest } = settings;
    change(n === undefined ? rest : { ...rest, inputCount: n });
  };
  return (
    <section class="card settings" aria-labelledby="settings-title">
      <h2 id="settings-title">Settings for {label}</h2>
      <form
        class="inputs-count"
        onSubmit={(e) => {
          e.preventDefault();
          applyCount();
        }}
      >
        <label>
          Inputs: the first N columns
          <input
            type="number"
            min={1}
            step={1}
            inputMode="numeric"
            value={count}
            placeholder="from the table"
            disabled={busy}
            onInput={(e) => setCount((e.currentTarget as HTMLInputElement).value)}
            onChange={applyCount}
          />
        </label>
        <button type="submit" class="secondary small" disabled={busy}>
          Apply
        </button>
      </form>
      <p class="meta">Leave it empty when a role row (input / output) or an empty column between inputs and outputs decides.</p>
      {outputs.length > 0 && (
        <fieldset class="safe-values">
          <legend>Safe value per output</legend>
          {outputs.map((o) => (
            <label key={o.signal.identifier}>
              Safe value of {o.signal.identifier}
              <select
                value={String(o.safe)}
                disabled={busy}
                onChange={(e) => change({ ...settings, safeValues: { ...settings.safeValues, [o.signal.identifier]: Number((e.currentTarget as HTMLSelectElement).value) as 0 | 1 } })}
              >
                <option value="0">0</option>
                <option value="1">1</option>
              </select>
            </label>
          ))}
        </fieldset>
      )}
      <label class="check">
        <input
          type="checkbox"
          checked={settings.xMeansDontCare}
          disabled={busy}
          onChange={(e) => change({ ...settings, xMeansDontCare: (e.currentTarget as HTMLInputElement).checked })}
        />
        X means don't-care
      </label>
      <label>
        Don't-cares
        <select value={settings.dontCares} disabled={busy} onChange={(e) => change({ ...settings, dontCares: (e.currentTarget as HTMLSelectElement).value as DontCarePolicy })}>
          <option value="minimal">minimal</option>
          <option value="safe">safe value</option>
        </select>
      </label>
      <p class="meta">
        {settings.dontCares === 'minimal' ? "Minimal: a don't-care is ON where that makes the AND/OR form smaller (each one is reported)." : "Safe value: every don't-care takes the output's safe value."}
      </p>
      <div class="row">
        <button type="button" class="secondary" disabled={busy} onClick={again}>
          Analyse {label} again
        </button>
        <button
          type="button"
          class="secondary small"
          disabled={busy}
          onClick={() => {
            setCount('');
            change(DEFAULT_SETTINGS);
          }}
        >
          Back to the defaults
        </button>
      </div>
      <p class="meta">Remembered {where}.</p>
    </section>
  );
}
