// A commissioning test record read back once filled in: each step passed, failed or not run,
// every cell we cannot read a problem at its address, and whether the table in the workbook is
// still the revision the record was made from. Nothing here writes: the record stays as it is.
import {
  cellAddress,
  gridCell,
  gridOrigin,
  gridWidth,
  type CellValue,
  type Grid,
  type Problem,
  type ProblemCode,
  type SpecOptions,
  type SpecTable,
} from '../table/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import { revisionStamp, parseSettingsLine } from './revision.js';
import { RECORD_TITLE, recordSteps, type Expected } from './test-steps.js';

export type StepResult = 'passed' | 'failed' | 'not run';

export interface RecordStep {
  readonly step: number;
  readonly testId: string;
  /** Per output, as the record states it. */
  readonly expected: readonly Expected[];
  readonly result: StepResult;
  /** Sheet address of the step's Pass/Fail cell. */
  readonly cell: string;
}

export interface FilledRecord {
  /** The record's own sheet. */
  readonly sheet: string;
  /** The table it was made from, and how it was read. */
  readonly table: { readonly sheet: string; readonly range: string };
  readonly stamp: string;
  readonly settings: SpecOptions;
  readonly outputs: readonly string[];
  readonly steps: readonly RecordStep[];
  readonly problems: readonly Problem[];
}

export interface RecordVerdict {
  readonly record: FilledRecord;
  /** The table in the workbook has the record's revision stamp. */
  readonly current: boolean;
  /** Why it is stale, in words; undefined when current. */
  readonly stale?: string;
  readonly passed: number;
  readonly failed: number;
  readonly notRun: number;
  /** The record's problems and those found comparing it with the table: missing or added steps. */
  readonly problems: readonly Problem[];
  /** Every step passed, the record is current and no problem is an error. */
  readonly ok: boolean;
}

const PASS = new Set(['pass', 'p', 'ok', 'passed']);
const FAIL = new Set(['fail', 'f', 'nok', 'failed', 'not ok']);

/** The record on this sheet; undefined when the sheet holds no record of ours. */
export function readTestRecord(grid: Grid): FilledRecord | undefined {
  const origin = gridOrigin(grid);
  if (!origin) return undefined;
  const width = gridWidth(grid);
  const text = (r: number, c: number): string => cellText(gridCell(grid, r, c));
  const address = (r: number, c: number): string => cellAddress(origin.row + r, origin.col + c);
  if (!text(0, 0).startsWith(`${RECORD_TITLE}:`)) return undefined;
  const problems: Problem[] = [];
  const problem = (severity: Problem['severity'], code: ProblemCode, cell: string, message: string): void => {
    problems.push({ severity, code, sheet: grid.sheet, cell, message });
  };
  const facts = new Map<string, { value: string; cell: string }>();
  let header = -1;
  for (let r = 1; r < grid.cells.length; r++) {
    if (text(r, 0) === 'Step' && text(r, 1) === 'Test ID') {
      header = r;
      break;
    }
    if (text(r, 0) !== '') facts.set(text(r, 0), { value: text(r, 1), cell: address(r, 1) });
  }
  const source = facts.get('Source')?.value ?? '';
  const table = parseQualified(source.slice(source.lastIndexOf(', ') + 1).trim());
  const stamp = facts.get('Revision stamp')?.value ?? '';
  const settings = parseSettingsLine(facts.get('Settings')?.value ?? '');
  if (header < 0 || !table || !/^sha256:[0-9a-f]{64}$/.test(stamp) || !settings) {
    const what = header < 0 ? 'the Step / Test ID heading row' : !table ? 'the Source line' : !settings ? 'the Settings line' : 'the revision stamp';
    problem('error', 'record-damaged', address(0, 0), `this test record has lost ${what}: it cannot be checked; make a new record from the table`);
    return { sheet: grid.sheet, table: table ?? { sheet: '', range: '' }, stamp, settings: settings ?? {}, outputs: [], steps: [], problems };
  }
  const columns = Array.from({ length: width }, (_, c) => text(header, c));
  const expectedCols = columns.flatMap((t, c) => (t.startsWith('Expected ') ? [c] : []));
  const actualCols = columns.flatMap((t, c) => (t.startsWith('Actual ') ? [c] : []));
  const resultCol = columns.indexOf('Pass/Fail');
  const outputs = expectedCols.map((c) => columns[c]!.slice('Expected '.length));
  const steps: RecordStep[] = [];
  for (let r = header + 1; r < grid.cells.length; r++) {
    const stepText = text(r, 0);
    const testId = text(r, 1);
    if (stepText === '' && testId === '') {
      if (Array.from({ length: width }, (_, c) => text(r, c)).some((t) => t !== ''))
        problem('error', 'record-added-step', address(r, 0), 'a row without a step number or test ID: steps are not added by hand; make a new record from the table');
      continue;
    }
    const step = Number(stepText);
    if (!Number.isInteger(step) || step < 1 || !/^T-[01]+$/.test(testId)) {
      problem('error', 'record-added-step', address(r, 0), `"${stepText} ${testId}" is not a step of ours (a number and a test ID such as T-101): steps are not added by hand`);
      continue;
    }
    const resultText = resultCol < 0 ? '' : text(r, resultCol);
    const said = resultText.toLowerCase();
    let result: StepResult = 'not run';
    if (PASS.has(said)) result = 'passed';
    else if (FAIL.has(said)) result = 'failed';
    else if (said !== '') {
      problem('error', 'record-bad-result', address(r, resultCol), `"${resultText}" is not a result: write Pass or Fail (P/F, OK/NOK also read)`);
      result = 'not run';
    }
    const expected = expectedCols.map((c): Expected => {
      const t = text(r, c);
      return t === '1' ? 1 : t === '0' ? 0 : '-';
    });
    if (result === 'passed')
      actualCols.forEach((c, j) => {
        const actual = truthText(text(r, c));
        const want = expected[j];
        if (actual !== undefined && want !== '-' && actual !== want)
          problem('error', 'record-actual-differs', address(r, c), `step ${step} is marked Pass, but ${outputs[j]} was ${actual} where ${want} is expected`);
      });
    steps.push({ step, testId, expected, result, cell: address(r, Math.max(0, resultCol)) });
  }
  return { sheet: grid.sheet, table, stamp, settings, outputs, steps, problems };
}

/** The record judged against the table as it is now in the workbook (undefined: not found there). */
export function judgeRecord(record: FilledRecord, now: { table: SpecTable; analysis: TableAnalysis } | undefined): RecordVerdict {
  const problems = [...record.problems];
  const counts = { passed: 0, failed: 0, notRun: 0 };
  for (const s of record.steps) {
    if (s.result === 'passed') counts.passed++;
    else if (s.result === 'failed') counts.failed++;
    else counts.notRun++;
  }
  let stale: string | undefined;
  if (!now) stale = `the table ${record.table.sheet}!${record.table.range} is no longer in the workbook`;
  else if (revisionStamp(now.table) !== record.stamp) stale = `the table ${record.table.sheet}!${record.table.range} has changed since the record was made (revision stamp ${revisionStamp(now.table).slice(0, 19)}..., the record's ${record.stamp.slice(0, 19)}...)`;
  if (now && stale === undefined) {
    const wanted = recordSteps(now.analysis).rows;
    const have = new Set(record.steps.map((s) => s.testId));
    const known = new Set(wanted.map((w) => w.testId));
    for (const w of wanted)
      if (!have.has(w.testId)) problems.push({ severity: 'error', code: 'record-missing-step', sheet: record.sheet, cell: 'A1', message: `step ${w.step} (${w.testId}) is missing from the record` });
    for (const s of record.steps)
      if (!known.has(s.testId)) problems.push({ severity: 'error', code: 'record-added-step', sheet: record.sheet, cell: s.cell, message: `step ${s.step} (${s.testId}) is not a step of this table: steps are not added by hand` });
  }
  const errors = problems.some((p) => p.severity === 'error');
  const ok = stale === undefined && !errors && counts.failed === 0 && counts.notRun === 0 && record.steps.length > 0;
  return { record, current: stale === undefined, ...(stale !== undefined ? { stale } : {}), ...counts, problems, ok };
}

function cellText(v: CellValue): string {
  if (v === null) return '';
  if (typeof v === 'string') return v.trim();
  if (typeof v === 'number' || typeof v === 'boolean') return String(typeof v === 'boolean' ? (v ? 1 : 0) : v);
  return 'error' in v ? v.error : String(v.date);
}

/** What an engineer writes for an output's state: 1/0, TRUE/FALSE, ON/OFF. */
function truthText(t: string): 0 | 1 | undefined {
  const s = t.toLowerCase();
  if (['1', 'true', 'on'].includes(s)) return 1;
  if (['0', 'false', 'off'].includes(s)) return 0;
  return undefined;
}

/** "'It''s'!A1:B2" or "Sheet!A1:B2" -> sheet and range (the inverse of qualifiedAddress). */
export function parseQualified(text: string): { sheet: string; range: string } | undefined {
  const quoted = /^'((?:[^']|'')+)'!([A-Z]+\d+(?::[A-Z]+\d+)?)$/.exec(text);
  if (quoted) return { sheet: quoted[1]!.replace(/''/g, "'"), range: quoted[2]! };
  const plain = /^([^'!]+)!([A-Z]+\d+(?::[A-Z]+\d+)?)$/.exec(text);
  return plain ? { sheet: plain[1]!, range: plain[2]! } : undefined;
}
