// Implemented PLC logic as read back from a file: per POU, the Boolean expression each
// assigned variable ends a scan with, and what a truth table cannot judge.
import type { Expr } from '../logic/index.js';

/** Why an output cannot be checked against a truth table. */
export type CannotJudgeKind =
  /** The variable's new value depends on its own previous value (latch, self-holding rung). */
  | 'seal-in'
  /** Reads another variable before this scan assigns it (its value from the previous scan). */
  | 'previous-scan'
  | 'timer'
  | 'counter'
  /** Rising/falling edge detection (R_TRIG, F_TRIG, edge contacts). */
  | 'edge'
  /** Set/reset storage (S=/R=, set/reset coils, SR/RS blocks). */
  | 'set-reset'
  | 'function-call'
  | 'function-block'
  /** Comparisons, arithmetic or other non-BOOL values. */
  | 'non-bool'
  /** CASE, loops, RETURN, jumps: the flow itself is not a Boolean function. */
  | 'control-flow'
  /** Array elements, structure members, bodies in languages not read. */
  | 'unsupported'
  /**
   * A variable read but never written in the POU that is no input (VAR, VAR_OUTPUT without an
   * initial value): its value comes from outside the POU or stays FALSE. A mapping that names
   * it for a spec input makes it an input.
   */
  | 'undriven';

/** One construct a truth table cannot judge, where it is. */
export interface CannotJudge {
  readonly kind: CannotJudgeKind;
  readonly pou: string;
  /** 1-based line in the file. */
  readonly line: number;
  /** What it is, in words: "timer T_Clamp (TON)". */
  readonly what: string;
}

export type VarSection = 'input' | 'output' | 'in-out' | 'local' | 'temp' | 'external' | 'global' | 'undeclared';

export interface ImplVariable {
  readonly name: string;
  readonly section: VarSection;
  /** Declared type as written ("BOOL", "TON", "INT"); "" when undeclared. */
  readonly type: string;
  /** Initial value as written after `:=`, if any. */
  readonly initial?: string;
  /** Direct address after AT (`%IX0.1`): an input address makes the variable an input. */
  readonly address?: string;
  /** Declared CONSTANT: its initial value (FALSE when none) is all it ever is. */
  readonly constant?: boolean;
  readonly line: number;
  /**
   * A member of a function block instance (`tonSync.Q`): its value comes from the block's
   * own state, not from this scan's inputs. The instance path and its block type.
   */
  readonly source?: { readonly kind: CannotJudgeKind; readonly instance: string; readonly type: string };
}

/**
 * A type declared with TYPE: a structure (TYPE name : STRUCT ... END_STRUCT, members with
 * section 'local'), or a name for another type (`alias`: `ARRAY [1..4] OF BOOL`, an enumeration...).
 */
export interface StructType {
  readonly name: string;
  readonly line: number;
  readonly members: readonly ImplVariable[];
  readonly alias?: string;
}

/**
 * A FUNCTION of the file as it is inlined where it is called: its result over its VAR_INPUTs,
 * or why it cannot be (state, globals, VAR_IN_OUT, recursion, something not understood).
 */
export type InlineFunction =
  | { readonly ok: true; readonly name: string; readonly params: readonly ImplVariable[]; readonly inputs: readonly string[]; readonly result: Expr }
  | { readonly ok: false; readonly name: string; readonly why: string };

export interface ImplOutput {
  /** The assigned variable, as declared. */
  readonly name: string;
  readonly section: VarSection;
  /** Line of its last assignment (or coil). */
  readonly line: number;
  /**
   * Its value at the end of a scan over the POU's `inputs` (a var's `input` indexes them).
   * Absent when it cannot be judged.
   */
  readonly expr?: Expr;
  /** Why it cannot be judged; empty when `expr` is present. */
  readonly cannotJudge: readonly CannotJudge[];
}

export type PouKind = 'PROGRAM' | 'FUNCTION_BLOCK' | 'FUNCTION';

export interface ImplPou {
  readonly name: string;
  readonly kind: PouKind;
  readonly language: 'ST' | 'LD' | 'FBD' | 'IL' | 'SFC';
  readonly line: number;
  readonly variables: readonly ImplVariable[];
  /** Access paths the body reads or writes (`io.bClosed`, `aIn[3]`, `tonSync.Q`), as resolved. */
  readonly paths: readonly ImplVariable[];
  /** Variables read before the scan assigns them: the inputs of its outputs' expressions. */
  readonly inputs: readonly string[];
  /**
   * Those of `inputs` that are not inputs by their declaration (`undriven` reads): an output
   * that uses one is unchecked unless a mapping names it for a spec input.
   */
  readonly undriven: readonly { readonly name: string; readonly item: CannotJudge }[];
  readonly outputs: readonly ImplOutput[];
  /** Every construct found that a truth table cannot judge, whether or not an output uses it. */
  readonly cannotJudge: readonly CannotJudge[];
  /** Things worth knowing that are not faults: undeclared names taken as BOOL, and so on. */
  readonly notes: readonly string[];
}

export interface ImplProgram {
  readonly file: string;
  readonly format: 'st' | 'plcopen';
  readonly pous: readonly ImplPou[];
  /** The project's structure types and blocks, to resolve a path the mapping names that no body touches. */
  readonly types?: Pick<ReadContext, 'types' | 'blockTypes' | 'pouVariables'>;
}

/** What a POU body is read against: its file and what the rest of the project declares. */
export interface ReadContext {
  readonly file: string;
  readonly globals: readonly ImplVariable[];
  /** Names of function block types the project defines (upper case). */
  readonly blockTypes: ReadonlySet<string>;
  /** Declarations of the project's own POUs (upper-case name): which parameters write back. */
  readonly pouVariables: ReadonlyMap<string, readonly ImplVariable[]>;
  /** Structure types of the project (upper-case name). */
  readonly types: ReadonlyMap<string, StructType>;
  /** A FUNCTION of the project by upper-case name, read for inlining; undefined for any other name. */
  readonly functionNamed: (name: string) => InlineFunction | undefined;
}
