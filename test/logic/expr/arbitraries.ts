// Random expressions and spec tables for property tests of the expression modules and
// everything that proves forms against specs.
import fc from 'fast-check';
import { union, type BitSet } from '../../../src/logic/bits.js';
import { buildFunction, type BoolFunction, type TableRow } from '../../../src/logic/boolfn.js';
import { cube } from '../../../src/logic/cube.js';
import type { Expr } from '../../../src/logic/expr/ast.js';
import type { Signal } from '../../../src/logic/signals.js';

/** Signals named a, b, c, ... (identifier) with headers "Sig a", "Sig b", ... */
export function letterSignals(n: number): Signal[] {
  return Array.from({ length: n }, (_, i) => {
    const letter = String.fromCharCode(97 + i);
    return { header: `Sig ${letter}`, identifier: letter };
  });
}

/** Expressions over n inputs named by `signals`, up to a few levels deep. */
export function exprArb(signals: readonly Signal[]): fc.Arbitrary<Expr> {
  const { tree } = fc.letrec<{ tree: Expr }>((tie) => ({
    tree: fc.oneof(
      { maxDepth: 4, depthIdentifier: 'expr' },
      fc.integer({ min: 0, max: signals.length - 1 }).map((i): Expr => ({ kind: 'var', input: i, name: signals[i]!.identifier })),
      fc.boolean().map((value): Expr => ({ kind: 'const', value })),
      tie('tree').map((arg): Expr => ({ kind: 'not', arg })),
      fc
        .tuple(fc.constantFrom('and' as const, 'or' as const, 'xor' as const), fc.array(tie('tree'), { minLength: 2, maxLength: 4 }))
        .map(([kind, args]): Expr => ({ kind, args })),
    ),
  }));
  return tree;
}

export interface RandomSpec {
  readonly n: number;
  readonly rows: TableRow[];
  readonly safe: 0 | 1;
  readonly fn: BoolFunction;
}

/**
 * Spec tables of n inputs (n from the range): rows as cubes with '-' (more dashes the larger
 * n, so that few rows still cover much), each asking for 1, 0 or don't-care.
 */
export function specArb(minN: number, maxN: number, maxRows = 12): fc.Arbitrary<RandomSpec> {
  return fc
    .integer({ min: minN, max: maxN })
    .chain((n) => {
      const dashChance = n <= 6 ? 0.3 : 1 - 4 / n;
      const rowArb = fc
        .tuple(
          fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: n, maxLength: n }),
          fc.nat({ max: (1 << n) - 1 }),
          fc.constantFrom<0 | 1 | '-'>(1, 1, 0, 0, '-'),
        )
        .map(([chances, bits, value]): TableRow => {
          let mask = 0;
          chances.forEach((p, i) => {
            if (p >= dashChance) mask |= 1 << (n - 1 - i);
          });
          return { cube: cube(mask, bits), value };
        });
      return fc.tuple(fc.constant(n), fc.array(rowArb, { minLength: 1, maxLength: maxRows }), fc.constantFrom<0 | 1>(0, 0, 1));
    })
    .map(([n, rows, safe]) => makeSpec(n, rows, safe));
}

export function makeSpec(n: number, rows: TableRow[], safe: 0 | 1 = 0): RandomSpec {
  const built = buildFunction(n, rows, safe);
  if (!built.ok) throw new Error(built.error.message);
  return { n, rows, safe, fn: built.value.fn };
}

/** The values an XOR form takes: don't-cares at the output's safe value (DEVELOPERS.md). */
export function xorValues(s: RandomSpec): BitSet {
  return s.safe === 0 ? s.fn.on : union(s.fn.on, s.fn.dc);
}
