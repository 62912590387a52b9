// The change record: what a management-of-change review signs. Both revision stamps, per output
// what changed (now permits first), the retest, and fields for the people who sign it.
import {
  CAUTION_LINES,
  plural,
  printSetup,
  sheetName,
  TOOL_NAME,
  TOOL_VERSION,
  type BlockCell,
  type SheetBlock,
} from '../report/index.js';
import { qualifiedAddress } from '../table/index.js';
import { CHANGE_KINDS } from './change-json.js';
import { kindTitle } from './change-text.js';
import type { OutputComparison, TableComparison } from './compare.js';
import type { Retest } from './retest.js';
import { cubeToPattern } from '../logic/index.js';

type Row = (BlockCell | null)[];

export const SIGN_FIELDS = ['Originator', 'Reason for the change', 'Reviewer', 'Approver', 'Date'] as const;

export interface ChangeSheetOptions {
  readonly oldSource?: string;
  readonly newSource?: string;
}

const label = (value: string): BlockCell => ({ value, style: 'label' });
const heading = (value: string): BlockCell => ({ value, style: 'heading' });

function outputSummary(o: OutputComparison): string {
  if (o.status !== 'compared') return o.status === 'not-compared' ? 'not compared: see the problems' : `${o.status} in the new revision`;
  if (!o.changed) return 'behaviour identical on every combination';
  const kinds = CHANGE_KINDS.slice(0, 3).filter((k) => o.change![k].count > 0);
  return `CHANGED: ${kinds.map((k) => `${kindTitle(k, o.safe.new!).replace(/ \(.*$/, '').toLowerCase()} ${plural(o.change![k].count, 'combination')}`).join(', ')}`;
}

export function changeRecordSheet(c: TableComparison, retest?: Retest, options: ChangeSheetOptions = {}): SheetBlock {
  const n = c.joint.n;
  const oldWhere = qualifiedAddress(c.old.table.sheet, c.old.table.range);
  const newWhere = qualifiedAddress(c.new.table.sheet, c.new.table.range);
  const src = (s: string | undefined, where: string): string => (s ? `${s}, ${where}` : where);
  const rows: Row[] = [
    [{ value: `Change record: ${newWhere}`, style: 'title' }],
    ...CAUTION_LINES.map((line): Row => [{ value: line, style: 'caution' }]),
    [],
    [label('Old revision'), { value: src(options.oldSource, oldWhere) }, { value: c.oldStamp, style: 'code' }],
    [label('New revision'), { value: src(options.newSource, newWhere) }, { value: c.newStamp, style: 'code' }],
    [label('Tool'), { value: `${TOOL_NAME} ${TOOL_VERSION}` }],
    [label('Verdict'), { value: c.changed ? 'Behaviour CHANGED' : 'Behaviour identical on every combination (cells may differ)', style: 'status' }],
    [],
    [heading('Output'), heading('Summary'), heading('AND/OR form before'), heading('AND/OR form after')],
    ...c.outputs.map((o): Row => [{ value: o.name }, { value: outputSummary(o) }, { value: o.before?.text ?? '', style: 'code' }, { value: o.after?.text ?? '', style: 'code' }]),
  ];
  for (const o of c.outputs.filter((o) => o.change !== undefined && o.changed)) {
    rows.push([], [heading(`${o.name}: combinations changed`)], [heading('Change'), heading('Count'), ...c.inputs.map((s) => heading(s.header))]);
    for (const kind of CHANGE_KINDS) {
      const set = o.change![kind];
      for (const cube of set.cubes) rows.push([{ value: kindTitle(kind, o.safe.new!) }, { value: set.count, style: 'number' }, ...[...cubeToPattern(n, cube)].map((v): BlockCell => ({ value: v, style: 'code' }))]);
    }
  }
  if (c.problems.length > 0 || (retest?.problems.length ?? 0) > 0) {
    rows.push([], [heading('Problems')], [heading('Severity'), heading('Cell'), heading('Message')]);
    for (const p of [...c.problems, ...(retest?.problems ?? [])]) rows.push([{ value: p.severity }, { value: qualifiedAddress(p.sheet, p.cell) }, { value: p.message }]);
  }
  if (retest) {
    rows.push([], [heading(`Retest (old steps from ${retest.source === 'record' ? 'the filled-in record' : "the old table's selection"})`)]);
    rows.push([heading('Old step'), heading('Test ID'), heading('Verdict'), heading('Why')]);
    for (const e of retest.repeat) rows.push([{ value: e.step, style: 'number' }, { value: e.testId, style: 'code' }, { value: 'repeat' }, { value: e.reasons.join('; ') }]);
    for (const e of retest.dropped) rows.push([{ value: e.step, style: 'number' }, { value: e.testId, style: 'code' }, { value: 'no longer applies' }, { value: e.reasons.join('; ') }]);
    for (const e of retest.stillValid) rows.push([{ value: e.step, style: 'number' }, { value: e.testId, style: 'code' }, { value: 'still valid' }, null]);
    const fresh = retest.newRecord.filter((s) => s.status === 'new');
    rows.push([label('New steps'), { value: fresh.length === 0 ? 'none' : fresh.map((s) => s.testId).join(', ') }]);
  }
  rows.push([], [heading('Sign-off')]);
  for (const field of SIGN_FIELDS) rows.push([label(field), { value: null, style: 'input' }]);
  return {
    name: sheetName(c.new.table.sheet, ' change'),
    rows,
    columnWidths: [34, 44, 40, 40, ...c.inputs.map(() => 12)],
    print: printSetup(`Change record of ${newWhere}, ${c.newStamp.slice(0, 19)}`),
  };
}
