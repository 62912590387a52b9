// The results sheet of a spec table that was not analysed because it has errors: which table,
// why nothing was derived, each problem at its cell, and the signals read. No form, no proof,
// no test step: nothing here can be mistaken for a cleared result.
import { qualifiedAddress, type SpecTable } from '../table/index.js';
import { CAUTION_LINES } from './caution.js';
import { code, heading, label } from './results-sheet.js';
import type { BlockCell, SheetBlock } from './sheet-block.js';
import { sheetName } from './test-steps.js';

export function notAnalysedSheet(table: SpecTable, verdict: string, options: { source?: string } = {}): SheetBlock {
  const rows: (BlockCell | null)[][] = [];
  rows.push([{ value: `Interlock Algebra results: ${qualifiedAddress(table.sheet, table.range)}`, style: 'title' }]);
  if (options.source) rows.push([label('Source'), { value: options.source }]);
  for (const line of CAUTION_LINES) rows.push([{ value: line, style: 'caution' }]);
  rows.push([]);
  rows.push([label('Verdict'), { value: `${verdict}. No form was derived or proven and nothing is handed over: fix the cells below and read the table again.` }]);
  rows.push([]);
  rows.push([heading('Spec problems')], [heading('Severity'), heading('Cell'), heading('Message')]);
  for (const p of table.problems) rows.push([{ value: p.severity }, { value: qualifiedAddress(p.sheet, p.cell) }, { value: p.message }]);
  rows.push([]);
  rows.push([heading('Signals')], [heading('Header'), heading('Identifier'), heading('Role')]);
  for (const s of table.inputs) rows.push([{ value: s.header }, code(s.identifier), { value: 'input' }]);
  for (const o of table.outputs) rows.push([{ value: o.signal.header }, code(o.signal.identifier), { value: `output, safe value ${o.safe}` }]);
  return { name: sheetName(table.sheet, ' results'), rows, columnWidths: [30, 48, 60] };
}
