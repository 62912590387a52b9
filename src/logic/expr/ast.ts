// Expressions over input signals: what the parser builds, the printers print and the
// evaluator turns into a truth table.

export type Expr =
  | { readonly kind: 'const'; readonly value: boolean }
  /** `input` is the index of the input signal (0 = leftmost column); `name` is how it is printed. */
  | { readonly kind: 'var'; readonly input: number; readonly name: string }
  | { readonly kind: 'not'; readonly arg: Expr }
  | { readonly kind: 'and' | 'or' | 'xor'; readonly args: readonly Expr[] };

export type GroupKind = 'and' | 'or' | 'xor';

export const TRUE: Expr = { kind: 'const', value: true };
export const FALSE: Expr = { kind: 'const', value: false };

export function variable(input: number, name: string): Expr {
  return { kind: 'var', input, name };
}

export function not(arg: Expr): Expr {
  return { kind: 'not', arg };
}

/**
 * An AND, OR or XOR of any number of operands, taken as an array: a sum of products of
 * 100,000 terms is one node, built without spreading the terms into a call's arguments.
 */
export function group(kind: GroupKind, args: readonly Expr[]): Expr {
  if (args.length === 1) return args[0]!;
  if (args.length === 0) return kind === 'and' ? TRUE : FALSE;
  return { kind, args };
}

export function and(...args: Expr[]): Expr {
  return group('and', args);
}

export function or(...args: Expr[]): Expr {
  return group('or', args);
}

export function xor(...args: Expr[]): Expr {
  return group('xor', args);
}

/** The operands of a node: none for a constant or a name. */
export function operands(e: Expr): readonly Expr[] {
  return e.kind === 'not' ? [e.arg] : e.kind === 'const' || e.kind === 'var' ? [] : e.args;
}

/**
 * Bottom-up value of an expression: `combine(e, values of its operands)`, children first.
 * An explicit stack instead of recursion, so that an expression nested a million levels deep
 * (a long chain of statements read back from a PLC program) cannot overflow the call stack.
 */
export function foldExpr<T>(expr: Expr, combine: (e: Expr, values: readonly T[]) => T): T {
  interface Frame {
    readonly e: Expr;
    readonly args: readonly Expr[];
    readonly values: T[];
  }
  const frame = (e: Expr): Frame => ({ e, args: operands(e), values: [] });
  const stack: Frame[] = [frame(expr)];
  for (;;) {
    const top = stack[stack.length - 1]!;
    if (top.values.length < top.args.length) {
      stack.push(frame(top.args[top.values.length]!));
      continue;
    }
    const value = combine(top.e, top.values);
    stack.pop();
    if (stack.length === 0) return value;
    stack[stack.length - 1]!.values.push(value);
  }
}
