// The plain meaning of an expression at one combination, by walking it one value at a time:
// the reference that property tests hold the bit-set evaluators and checks against.
import type { Expr } from '../../../src/logic/expr/ast.js';

/** Whether `e` is true at combination `k` of `n` inputs (the leftmost input is the most significant bit; BigInt past 32 inputs). */
export function valueAt(e: Expr, n: number, k: number | bigint): boolean {
  switch (e.kind) {
    case 'const':
      return e.value;
    case 'var':
      return typeof k === 'bigint' ? ((k >> BigInt(n - 1 - e.input)) & 1n) === 1n : ((k >>> (n - 1 - e.input)) & 1) === 1;
    case 'not':
      return !valueAt(e.arg, n, k);
    case 'and':
      return e.args.every((x) => valueAt(x, n, k));
    case 'or':
      return e.args.some((x) => valueAt(x, n, k));
    case 'xor':
      return e.args.filter((x) => valueAt(x, n, k)).length % 2 === 1;
  }
}
