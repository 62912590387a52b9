// Every printed form, read back by the parser, proves equal to its spec on the care set.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { anfOf } from '../../src/logic/anf.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { anfToExpr, sopToExpr } from '../../src/logic/expr/forms.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import type { Expr } from '../../src/logic/expr/ast.js';
import { toIdentifiers } from '../../src/logic/identifiers.js';
import { bestPolarity } from '../../src/logic/polarity.js';
import { prove } from '../../src/logic/proof.js';
import type { Signal } from '../../src/logic/signals.js';
import { minimiseSop } from '../../src/logic/sop.js';
import { specArb, xorValues } from './expr/arbitraries.js';

const header = fc.oneof(
  fc.string({ minLength: 1, maxLength: 20 }),
  fc.constantFrom('Guard A closed', 'E-stop healthy', 'Tür zu', 'Step', 'Mode', 'mode'),
);

function signalsFor(headers: string[]): Signal[] {
  return toIdentifiers(headers).map((identifier, i) => ({ header: headers[i]!, identifier }));
}

/** Mismatches on the care set after printing and parsing back. */
function mismatchesAfterRoundTrip(form: Expr, signals: Signal[], fn: Parameters<typeof prove>[0]): number {
  const back = parseExpression(printSt(form), signals);
  if (!back.ok) throw new Error(`${printSt(form)}: ${back.error.message}`);
  return prove(fn, truthTable(back.value, fn.n)).mismatchCount;
}

describe('printed forms read back', () => {
  it('the AND/OR, XOR and best-polarity XOR forms parse back and prove equal to the spec (fast-check)', () => {
    fc.assert(
      fc.property(
        specArb(1, 8).chain((s) => fc.tuple(fc.constant(s), fc.array(header, { minLength: s.n, maxLength: s.n }))),
        ([s, headers]) => {
          const signals = signalsFor(headers);
          const values = xorValues(s);
          const best = bestPolarity(values, s.n);
          expect(mismatchesAfterRoundTrip(sopToExpr(minimiseSop(s.fn).cubes, signals), signals, s.fn)).toBe(0);
          expect(mismatchesAfterRoundTrip(anfToExpr(anfOf(values, s.n), signals), signals, s.fn)).toBe(0);
          expect(mismatchesAfterRoundTrip(anfToExpr(best.monomials, signals, best.polarity), signals, s.fn)).toBe(0);
        },
      ),
      { numRuns: 200 },
    );
  });
});
