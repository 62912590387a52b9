// Truth tables of expressions, computed 32 combinations at a time.
import { complement, emptySet, fullSet, inputSet, intersect, symmetricDifference, union, type BitSet } from '../bits.js';
import type { Expr } from './ast.js';

/**
 * The set of combinations of n inputs in which the expression is TRUE. Works on whole
 * packed words (each input's column from `inputSet`), so it costs one pass over 2^n / 32
 * words per operator. A variable beyond the n inputs is a bug in the caller.
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
  const walk = (e: Expr): BitSet => {
    switch (e.kind) {
      case 'const':
        return e.value ? fullSet(n) : emptySet(n);
      case 'var':
        return column(e.input);
      case 'not':
        return complement(walk(e.arg), n);
      default: {
        if (e.args.length === 0) return e.kind === 'and' ? fullSet(n) : emptySet(n);
        const op = e.kind === 'and' ? intersect : e.kind === 'or' ? union : symmetricDifference;
        let acc = walk(e.args[0]!);
        for (let i = 1; i < e.args.length; i++) acc = op(acc, walk(e.args[i]!));
        return acc;
      }
    }
  };
  return walk(expr);
}
