// Truth tables of expressions, computed 32 combinations at a time.
import { complement, emptySet, fullSet, inputSet, type BitSet } from '../bits.js';
import { foldExpr, type Expr } from './ast.js';

/**
 * The set of combinations of n inputs in which the expression is TRUE. Works on whole
 * packed words (each input's column from `inputSet`), so it costs one pass over 2^n / 32
 * words per operand; an AND/OR/XOR of many operands folds them into one accumulator.
 * A variable beyond the n inputs is a bug in the caller.
 */
export function truthTable(expr: Expr, n: number): BitSet {
  const columns = new Map<number, BitSet>();
  const column = (input: number): BitSet => {
    if (!Number.isInteger(input) || input < 0 || input >= n) {
      throw new Error(`bug: expression uses input ${input} of a function of ${n} inputs`);
    }
    let set = columns.get(input);
    if (!set) columns.set(input, (set = inputSet(n, input)));
    return set;
  };
  return foldExpr<BitSet>(expr, (e, values) => {
    switch (e.kind) {
      case 'const':
        return e.value ? fullSet(n) : emptySet(n);
      case 'var':
        return column(e.input);
      case 'not':
        return complement(values[0]!, n);
      default: {
        if (values.length === 0) return e.kind === 'and' ? fullSet(n) : emptySet(n);
        // A fresh accumulator: the operands' sets may be shared columns.
        const acc = values[0]!.slice();
        for (let i = 1; i < values.length; i++) {
          const v = values[i]!;
          if (e.kind === 'and') for (let w = 0; w < acc.length; w++) acc[w] = acc[w]! & v[w]!;
          else if (e.kind === 'or') for (let w = 0; w < acc.length; w++) acc[w] = acc[w]! | v[w]!;
          else for (let w = 0; w < acc.length; w++) acc[w] = acc[w]! ^ v[w]!;
        }
        return acc;
      }
    }
  });
}
