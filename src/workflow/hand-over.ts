// The hand-over pack: built only when the workbook's verdicts allow it, otherwise refused with
// the reason. Files are named here so that every host offers the same names.
import { appendAll, fail, ok, type Result } from '../logic/index.js';
import { exportPlcopen, exportSt, ladderSvg, outputViews, stepsCsv, type FormChoice } from '../report/index.js';
import type { TableAnalysis } from '../analysis/index.js';
import type { Workbook } from './examine.js';

export type HandOverKind = 'st' | 'plcopen' | 'steps' | 'ladder';

export interface HandOverRequest {
  readonly kinds: readonly HandOverKind[];
  /** The form written to ST and PLCopen ST bodies (default AND/OR); LD bodies are always AND/OR. */
  readonly form?: FormChoice;
  /** PLCopen body language (default ST). */
  readonly body?: 'ST' | 'LD';
}

export interface HandOverFile {
  readonly kind: HandOverKind;
  /** A file name without folder: "interlocks.st", "Spindle-Spindle_run_permit.svg". */
  readonly name: string;
  readonly mime: string;
  readonly text: string;
}

export function handOverFiles(wb: Workbook, request: HandOverRequest): Result<HandOverFile[], string> {
  if (!wb.handOver.allowed) return fail(wb.handOver.reason);
  // Allowed means every table was analysed.
  const analyses = wb.tables.map((t) => t.analysis!);
  const source = { workbook: wb.source };
  const form = request.form ?? 'andOr';
  const files: HandOverFile[] = [];
  for (const kind of request.kinds) {
    if (kind === 'st') files.push({ kind, name: 'interlocks.st', mime: 'text/plain', text: exportSt(analyses, { form, source }) });
    if (kind === 'plcopen')
      files.push({ kind, name: 'interlocks-plcopen.xml', mime: 'application/xml', text: exportPlcopen(analyses, { form, body: request.body ?? 'ST', source }) });
    // Several tables: one CSV, their step lists one after another.
    if (kind === 'steps') files.push({ kind, name: 'interlocks-test-steps.csv', mime: 'text/csv', text: analyses.map((a) => stepsCsv(a, { source: wb.source })).join('\r\n') });
    if (kind === 'ladder') appendAll(files, ladderFiles(analyses));
  }
  return ok(files);
}

/** SVG file names from sheet and output identifier, safe on any file system, unique together. */
function ladderFiles(analyses: readonly TableAnalysis[]): HandOverFile[] {
  const used = new Set<string>();
  return analyses.flatMap((a) =>
    outputViews(a).map((o) => {
      const stem = `${a.table.sheet}-${o.signal.identifier}`.replace(/[^A-Za-z0-9_-]+/g, '_');
      let name = stem;
      for (let i = 2; used.has(name.toLowerCase()); i++) name = `${stem}-${i}`;
      used.add(name.toLowerCase());
      return { kind: 'ladder' as const, name: `${name}.svg`, mime: 'image/svg+xml', text: ladderSvg(o, a.inputs) };
    }),
  );
}
