// Expressions as Excel formulas over cell references (DESIGN.md section 3).
import { fail, ok, type Result } from '../result.js';
import type { Expr } from './ast.js';

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

interface Piece {
  readonly text: string;
  /** Function calls on the deepest path through this piece. */
  readonly depth: number;
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
  const xorName = options.file ? '_xlfn.XOR' : 'XOR';
  const piece = build(expr, refOf, xorName);
  if (piece.depth > EXCEL_MAX_NESTING) {
    return fail({
      message: `the Excel formula would nest ${piece.depth} functions deep, more than Excel's ${EXCEL_MAX_NESTING} levels`,
    });
  }
  // Count the '=' too: Excel's limit is on the whole formula as entered.
  const length = piece.text.length + 1;
  if (length > EXCEL_MAX_FORMULA_CHARS) {
    return fail({
      message: `the Excel formula would be ${length} characters long, more than Excel's ${EXCEL_MAX_FORMULA_CHARS}`,
    });
  }
  return ok(piece.text);
}

function build(e: Expr, refOf: (input: number) => string, xorName: string): Piece {
  switch (e.kind) {
    case 'const':
      return { text: e.value ? 'TRUE' : 'FALSE', depth: 0 };
    case 'var':
      return { text: `(--${refOf(e.input)}=1)`, depth: 0 };
    case 'not': {
      const arg = build(e.arg, refOf, xorName);
      return { text: `NOT(${arg.text})`, depth: arg.depth + 1 };
    }
    default: {
      if (e.args.length === 0) return { text: e.kind === 'and' ? 'TRUE' : 'FALSE', depth: 0 };
      if (e.args.length === 1) return build(e.args[0]!, refOf, xorName);
      const fn = e.kind === 'and' ? 'AND' : e.kind === 'or' ? 'OR' : 'XOR';
      const name = fn === 'XOR' ? xorName : fn;
      return call(name, MAX_ARGS[fn], e.args.map((a) => build(a, refOf, xorName)));
    }
  }
}

/** One call, or calls of calls when there are more arguments than one call may take. */
function call(name: string, maxArgs: number, args: readonly Piece[]): Piece {
  let level = args;
  while (level.length > maxArgs) {
    const grouped: Piece[] = [];
    for (let i = 0; i < level.length; i += maxArgs) grouped.push(single(name, level.slice(i, i + maxArgs)));
    level = grouped;
  }
  return single(name, level);
}

function single(name: string, args: readonly Piece[]): Piece {
  if (args.length === 1) return args[0]!;
  let depth = 0;
  for (const a of args) depth = Math.max(depth, a.depth);
  return { text: `${name}(${args.map((a) => a.text).join(',')})`, depth: depth + 1 };
}
