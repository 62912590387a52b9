// verify's symbolic path (tables of more than 24 inputs) against its bit-set path on the same
// small tables and programs (fast-check): same verdicts, counts, counterexamples, gaps and
// ANF difference, with and without --gaps-free. Counts of the symbolic path are BigInt.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { and, not, or, variable, xor, type Expr } from '../../src/logic/expr/ast.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import { LISTED } from '../../src/logic/proof.js';
import { readImplementation } from '../../src/impl/read.js';
import { verifyImplementation, type OutputVerdict } from '../../src/impl/verify.js';
import { wideSpecOf } from '../../src/analysis/analyse-wide.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { gridOf } from '../workflow/workbooks.js';

const exprOf = (n: number): fc.Arbitrary<Expr> =>
  fc.letrec<{ e: Expr }>((tie) => ({
    e: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      fc.integer({ min: 0, max: n - 1 }).map((i) => variable(i, `In_${i + 1}`)),
      tie('e').map((a) => not(a)),
      fc.tuple(tie('e'), tie('e')).map(([a, b]) => and(a, b)),
      fc.tuple(tie('e'), tie('e')).map(([a, b]) => or(a, b)),
      fc.tuple(tie('e'), tie('e')).map(([a, b]) => xor(a, b)),
    ),
  })).e;

const cases = fc.integer({ min: 2, max: 7 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    rows: fc.array(fc.tuple(fc.array(fc.constantFrom<string | number>(1, 0, '-', '-'), { minLength: n, maxLength: n }), fc.constantFrom<string | number>(1, 0, '-')), {
      minLength: 1,
      maxLength: 6,
    }),
    safe: fc.constantFrom('0', '1'),
    program: exprOf(n),
    gapsFree: fc.boolean(),
  }),
);

/** The fields both paths fill, counts as BigInt. */
function judged(v: OutputVerdict) {
  const b = (k: number | bigint): bigint => BigInt(k);
  return {
    status: v.status,
    combinations: b(v.combinations),
    mismatchCount: b(v.mismatchCount),
    counterexamples: v.counterexamples.map((c) => ({ ...c, combination: b(c.combination) })),
    // Past LISTED the paths list different monomials first (degree order; the ZDD's order): the count says it all.
    differenceMonomials: BigInt(v.differenceMonomialCount) <= BigInt(LISTED) ? [...v.differenceMonomials].sort() : [],
    differenceMonomialCount: b(v.differenceMonomialCount),
    dontCare: { count: b(v.dontCare.count), implementationOn: b(v.dontCare.implementationOn) },
    gaps: { ...v.gaps, count: b(v.gaps.count), implementationOn: b(v.gaps.implementationOn), unsafe: b(v.gaps.unsafe), unsafeExamples: v.gaps.unsafeExamples.map(b) },
    conflicted: b(v.conflicted),
  };
}

describe('verify of a wide table (symbolic path)', () => {
  it('gives what the bit-set path gives on the same table and program', () => {
    fc.assert(
      fc.property(cases, ({ n, rows, safe, program, gapsFree }) => {
        const inputs = Array.from({ length: n }, (_, i) => `In_${i + 1}`);
        const grid = gridOf('T', [[...inputs.map(() => 'input'), 'output'], [...inputs, 'Y'], ...rows.map(([cells, out]) => [...cells, out])]);
        const [table] = readSpecTables(grid, { safeValues: { Y: safe === '1' ? 1 : 0 } }).tables;
        if (!table) return;
        const st = `FUNCTION_BLOCK P\nVAR_INPUT ${inputs.join(', ')} : BOOL; END_VAR\nVAR_OUTPUT Y : BOOL; END_VAR\nY := ${printSt(program)};\nEND_FUNCTION_BLOCK\n`;
        const impl = readImplementation('p.st', st);
        if (!impl.ok) throw new Error(impl.error.message);
        const narrow = verifyImplementation([table], impl.value, undefined, { gapsFree });
        const wide = verifyImplementation([{ ...table, wide: wideSpecOf(table) }], impl.value, undefined, { gapsFree });
        expect(typeof wide.outputs[0]!.combinations).toBe('bigint');
        expect(judged(wide.outputs[0]!)).toEqual(judged(narrow.outputs[0]!));
      }),
      { numRuns: 200 },
    );
  });
});
