// The generated program as data. The generator keeps it, the printers write it as Structured
// Text or PLCopen XML, and the interpreter runs it: nothing here is ever parsed from text.

export type BExpr =
  | { readonly k: 'const'; readonly v: boolean }
  /** A variable of the POU the expression is in; `name` is spelt as printed (any case). */
  | { readonly k: 'ref'; readonly name: string }
  /** An output of a function block or timer instance: `Inst.Q`. */
  | { readonly k: 'member'; readonly inst: string; readonly field: string }
  /** A call of a FUNCTION of the program, arguments by position: `Fn1(a, b)`. */
  | { readonly k: 'fcall'; readonly fn: string; readonly args: readonly BExpr[] }
  | { readonly k: 'not'; readonly a: BExpr }
  | { readonly k: 'and' | 'or' | 'xor'; readonly args: readonly BExpr[] };

/** A call argument: a Boolean expression, or a literal the interpreter need not read (`T#500ms`). */
export type CallValue = BExpr | { readonly k: 'literal'; readonly text: string };

export type Stmt =
  | { readonly k: 'assign'; readonly target: string; readonly value: BExpr }
  | { readonly k: 'if'; readonly arms: readonly { readonly cond: BExpr; readonly body: readonly Stmt[] }[]; readonly otherwise?: readonly Stmt[] }
  /** CASE over an INT variable (the generator uses a constant). */
  | {
      readonly k: 'case';
      readonly selector: string;
      readonly arms: readonly { readonly labels: readonly number[]; readonly body: readonly Stmt[] }[];
      readonly otherwise?: readonly Stmt[];
    }
  /** `Inst(IN := e, IO := v, Q => w);` of a function block or timer instance. */
  | {
      readonly k: 'call';
      readonly inst: string;
      readonly inputs: readonly { readonly param: string; readonly value: CallValue }[];
      readonly inOuts: readonly { readonly param: string; readonly target: string }[];
      readonly outputs: readonly { readonly param: string; readonly target: string }[];
    }
  /** `Act();`: runs an ACTION of the same POU. */
  | { readonly k: 'action'; readonly name: string };

export type Section = 'VAR_INPUT' | 'VAR_OUTPUT' | 'VAR_IN_OUT' | 'VAR' | 'VAR_TEMP';

export interface Decl {
  readonly name: string;
  /** BOOL, INT, TON or the name of a FUNCTION_BLOCK of the program. */
  readonly type: string;
  /** Initial value as written: TRUE, FALSE, or an INT. */
  readonly init?: string;
}

export interface VarBlock {
  readonly section: Section;
  readonly constant?: boolean;
  readonly decls: readonly Decl[];
}

export interface Action {
  readonly name: string;
  readonly body: readonly Stmt[];
}

export interface Pou {
  /** A FUNCTION returns BOOL: the value its body assigns to its name. */
  readonly kind: 'PROGRAM' | 'FUNCTION_BLOCK' | 'FUNCTION';
  readonly name: string;
  readonly blocks: readonly VarBlock[];
  readonly actions: readonly Action[];
  readonly body: readonly Stmt[];
}

/**
 * What a program is built of, named so that a contradiction says which construct it rests on:
 * 'constant', 'init-local', 'constant-as-input' (a constant named like a spec input), 'locals',
 * 'temp', 'if', 'case', 'fb', 'in-out', 'action', 'last-wins', 'timer', 'seal-in', 'mutated',
 * 'xml', 'mixed-xhtml', 'off-rows' (written from the spec's 0 rows), 'case-varied'.
 */
export type Feature = string;

export interface Program {
  /** Functions and function blocks first, the PROGRAM last. */
  readonly pous: readonly Pou[];
  readonly format: 'st' | 'xml';
  /** PLCopen only: ST bodies as one text, or as text mixed with <p> and <br/> elements. */
  readonly xhtml: 'plain' | 'mixed';
  /** Seed of the split of body lines into <p>/<br/> pieces (mixed only). */
  readonly mixSeed: number;
  readonly features: readonly Feature[];
  /**
   * Spec inputs the PROGRAM reads as a structure member (`io.Jog`) or an array element
   * (`aIn[2]`) instead of a VAR_INPUT of their name: spec input -> path as printed. The
   * implementation check is then given a mapping of these pairs.
   */
  readonly inputPaths?: Readonly<Record<string, string>>;
  /** The structure type the members belong to (TYPE ... STRUCT of BOOL members). */
  readonly struct?: { readonly name: string; readonly members: readonly string[] };
}

export const TRUE_E: BExpr = { k: 'const', v: true };
export const FALSE_E: BExpr = { k: 'const', v: false };
export const ref = (name: string): BExpr => ({ k: 'ref', name });
export const notE = (a: BExpr): BExpr => ({ k: 'not', a });

/** AND/OR/XOR of the arguments; one argument stands alone, none gives the operator's identity. */
export function nary(k: 'and' | 'or' | 'xor', args: readonly BExpr[]): BExpr {
  if (args.length === 1) return args[0]!;
  if (args.length === 0) return k === 'and' ? TRUE_E : FALSE_E;
  return { k, args };
}

/** The PROGRAM of a program (the last POU). */
export function mainPou(p: Program): Pou {
  const main = p.pous[p.pous.length - 1];
  if (!main || main.kind !== 'PROGRAM') throw new Error('a generated program ends with its PROGRAM');
  return main;
}
