// Expressions over input signals: what the parser builds, the printers print and the
// evaluator turns into a truth table.

export type Expr =
  | { readonly kind: 'const'; readonly value: boolean }
  /** `input` is the index of the input signal (0 = leftmost column); `name` is how it is printed. */
  | { readonly kind: 'var'; readonly input: number; readonly name: string }
  | { readonly kind: 'not'; readonly arg: Expr }
  | { readonly kind: 'and' | 'or' | 'xor'; readonly args: readonly Expr[] };

export const TRUE: Expr = { kind: 'const', value: true };
export const FALSE: Expr = { kind: 'const', value: false };

export function variable(input: number, name: string): Expr {
  return { kind: 'var', input, name };
}

export function not(arg: Expr): Expr {
  return { kind: 'not', arg };
}

export function and(...args: Expr[]): Expr {
  return args.length === 0 ? TRUE : args.length === 1 ? args[0]! : { kind: 'and', args };
}

export function or(...args: Expr[]): Expr {
  return args.length === 0 ? FALSE : args.length === 1 ? args[0]! : { kind: 'or', args };
}

export function xor(...args: Expr[]): Expr {
  return args.length === 0 ? FALSE : args.length === 1 ? args[0]! : { kind: 'xor', args };
}
