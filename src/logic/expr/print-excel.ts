// Expressions as Excel formulas over cell references (DESIGN.md section 3).
import { fail, ok, type Result } from '../result.js';
import { foldExpr, type Expr } from './ast.js';

/**
 * Excel's limits. Formula contents 8,192 characters, 64 nested levels of functions and 255
 * arguments per function: Microsoft support, "Excel specifications and limits" (from memory).
 * XOR takes 1 to 254 conditions: Microsoft support, "XOR function" page (looked up).
 */
export const EXCEL_MAX_FORMULA_CHARS = 8192;
export const EXCEL_MAX_NESTING = 64;
const MAX_ARGS = { AND: 255, OR: 255, XOR: 254 } as const;

export interface ExcelOptions {
  /** For a formula stored in an .xlsx file: XOR is written `_xlfn.XOR`, as the file format asks. */
  readonly file?: boolean;
}

/**
 * The formula text (without the leading '=') of an expression, with AND(), OR(), NOT(),
 * XOR() over the cells `refOf(input)`.
 *
 * Each reference is coerced as `(--A5=1)`: Excel compares logical values and numbers as
 * different types (`TRUE=1` is FALSE there) and AND/OR ignore text cells, so the double
 * negation first turns a number, a logical value or a numeric text ("1") into 1 or 0; a
 * blank cell is 0, and any other text gives #VALUE! rather than a silent answer.
 *
 * Argument lists longer than Excel allows are split into nested calls of the same function
 * (all three are associative). Fails when the formula would still exceed Excel's limits.
 */
export function printExcel(expr: Expr, refOf: (input: number) => string, options: ExcelOptions = {}): Result<string> {
  // Depth first, text only when it fits: no formula text is built for an expression nested
  // thousands deep (each level would copy the text below it).
  const depth = nestingOf(expr);
  if (depth > EXCEL_MAX_NESTING) {
    return fail({
      message: `the Excel formula would nest ${depth} functions deep, more than Excel's ${EXCEL_MAX_NESTING} levels`,
    });
  }
  const text = build(expr, refOf, options.file ? '_xlfn.XOR' : 'XOR');
  // Count the '=' too: Excel's limit is on the whole formula as entered.
  const length = text.length + 1;
  if (length > EXCEL_MAX_FORMULA_CHARS) {
    return fail({
      message: `the Excel formula would be ${length} characters long, more than Excel's ${EXCEL_MAX_FORMULA_CHARS}`,
    });
  }
  return ok(text);
}

/** Function calls on the deepest path of the formula, long argument lists split as `build` splits them. */
function nestingOf(expr: Expr): number {
  return foldExpr<number>(expr, (e, depths) => {
    if (e.kind === 'const' || e.kind === 'var') return 0;
    if (e.kind === 'not') return depths[0]! + 1;
    if (depths.length === 0) return 0;
    return split(depths, MAX_ARGS[FUNCTION[e.kind]], (group) => {
      let deepest = 0;
      for (const d of group) deepest = Math.max(deepest, d);
      return deepest + 1;
    });
  });
}

const FUNCTION = { and: 'AND', or: 'OR', xor: 'XOR' } as const;

/** The text, bottom-up (an explicit stack: no recursion on deep expressions). */
function build(expr: Expr, refOf: (input: number) => string, xorName: string): string {
  return foldExpr<string>(expr, (e, args) => {
    switch (e.kind) {
      case 'const':
        return e.value ? 'TRUE' : 'FALSE';
      case 'var':
        return `(--${refOf(e.input)}=1)`;
      case 'not':
        return `NOT(${args[0]!})`;
      default: {
        if (args.length === 0) return e.kind === 'and' ? 'TRUE' : 'FALSE';
        const fn = FUNCTION[e.kind];
        const name = fn === 'XOR' ? xorName : fn;
        return split(args, MAX_ARGS[fn], (group) => `${name}(${group.join(',')})`);
      }
    }
  });
}

/**
 * One call over the arguments, or calls of calls when there are more than one call may take
 * (all three functions are associative). One argument needs no call.
 */
function split<T>(args: readonly T[], maxArgs: number, callOf: (group: readonly T[]) => T): T {
  const single = (group: readonly T[]): T => (group.length === 1 ? group[0]! : callOf(group));
  let level = args;
  while (level.length > maxArgs) {
    const grouped: T[] = [];
    for (let i = 0; i < level.length; i += maxArgs) grouped.push(single(level.slice(i, i + maxArgs)));
    level = grouped;
  }
  return single(level);
}
