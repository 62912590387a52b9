// Looking up verdicts in an implementation check report, shared by the verify tests.
import type { OutputVerdict, VerifyReport } from '../../src/impl/verify.js';

export function verdict(report: VerifyReport, header: string): OutputVerdict {
  const v = report.outputs.find((o) => o.output.header === header);
  if (!v) throw new Error(`no verdict for ${header}`);
  return v;
}

export const statuses = (report: VerifyReport): Record<string, string> => Object.fromEntries(report.outputs.map((o) => [o.output.header, o.status]));
