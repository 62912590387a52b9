// Assertions on a POU read back, shared by the PLCopen reader tests.
import { expect } from 'vitest';
import { equals } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import type { CannotJudgeKind, ImplOutput, ImplPou } from '../../src/impl/types.js';

export function output(pou: ImplPou, name: string): ImplOutput {
  const o = pou.outputs.find((x) => x.name === name);
  if (!o) throw new Error(`no output ${name}`);
  return o;
}

/** The output is judged and its function equals the expected expression, over the POU's inputs. */
export function expectFunction(pou: ImplPou, name: string, expected: string): void {
  const o = output(pou, name);
  expect(o.cannotJudge).toEqual([]);
  const want = parseExpression(expected, pou.inputs.map((n) => ({ header: n, identifier: n })));
  if (!want.ok) throw new Error(want.error.message);
  const n = Math.max(1, pou.inputs.length);
  expect(equals(truthTable(o.expr!, n), truthTable(want.value, n)), `${printSt(o.expr!)} vs ${expected}`).toBe(true);
}

export const kinds = (o: ImplOutput): CannotJudgeKind[] => o.cannotJudge.map((c) => c.kind);
