// Symbolic execution of one POU's scan: every variable's current value as an expression over
// leaves (inputs, previous-scan values, and opaque values a truth table cannot judge). Both
// the ST and the LD readers drive it; at the end each assigned BOOL becomes an ImplOutput.
import { FALSE, TRUE, and, not, or, variable, type Expr } from '../logic/expr/ast.js';
import type { CannotJudge, CannotJudgeKind, ImplOutput, ImplPou, ImplVariable } from './types.js';

type Leaf =
  | { readonly kind: 'input'; readonly name: string }
  /** The variable's value from the previous scan; `kept` = an IF left it unassigned. */
  | { readonly kind: 'prev'; readonly name: string; readonly line: number; readonly kept: boolean }
  | { readonly kind: 'opaque'; readonly item: CannotJudge };

/** What a reader knows of a POU before its body is run. */
export type PouHeader = Pick<ImplPou, 'name' | 'kind' | 'language' | 'line' | 'variables'>;

const key = (name: string): string => name.toLowerCase();

function isConst(e: Expr, value: boolean): boolean {
  return e.kind === 'const' && e.value === value;
}

/** AND with constants folded (keeps printed forms and trees small). */
export function andFolded(...args: Expr[]): Expr {
  if (args.some((a) => isConst(a, false))) return FALSE;
  return and(...args.filter((a) => !isConst(a, true)));
}

export function orFolded(...args: Expr[]): Expr {
  if (args.some((a) => isConst(a, true))) return TRUE;
  return or(...args.filter((a) => !isConst(a, false)));
}

export function notFolded(a: Expr): Expr {
  if (a.kind === 'const') return a.value ? FALSE : TRUE;
  if (a.kind === 'not') return a.arg;
  return not(a);
}

const TRUE_TEXT = /^(TRUE|1|BOOL#(TRUE|1))$/i;

export class PouBuilder {
  private readonly leaves: Leaf[] = [];
  private readonly leafOf = new Map<string, number>();
  private env = new Map<string, Expr>();
  private readonly lastLine = new Map<string, number>();
  private readonly assignedOrder: string[] = [];
  private readonly items: CannotJudge[] = [];
  private readonly everyOutput: CannotJudge[] = [];
  private readonly notes: string[] = [];
  private readonly declared = new Map<string, ImplVariable>();
  private readonly undeclared = new Map<string, ImplVariable>();

  /**
   * `assigned`: every variable the POU assigns somewhere (lower case); reading one of them
   * before this scan assigns it gives its previous-scan value.
   */
  constructor(
    private readonly header: PouHeader,
    globals: readonly ImplVariable[],
    private readonly assigned: ReadonlySet<string>,
  ) {
    for (const v of globals) this.declared.set(key(v.name), v);
    for (const v of header.variables) this.declared.set(key(v.name), v);
  }

  get pou(): string {
    return this.header.name;
  }

  /** The declaration of a name, or one made up (and noted) for an undeclared name. */
  variable(name: string, line: number): ImplVariable {
    const k = key(name);
    const d = this.declared.get(k) ?? this.undeclared.get(k);
    if (d) return d;
    const made: ImplVariable = { name, section: 'undeclared', type: '', line };
    this.undeclared.set(k, made);
    this.notes.push(`${name} (line ${line}) is not declared in ${this.header.name}; taken as a BOOL`);
    return made;
  }

  isBool(name: string, line: number): boolean {
    const t = this.variable(name, line).type.toUpperCase();
    return t === '' || t === 'BOOL';
  }

  /** Record a construct that cannot be judged, without a value attached. */
  cannotJudge(kind: CannotJudgeKind, what: string, line: number): CannotJudge {
    const item: CannotJudge = { kind, pou: this.header.name, line, what };
    this.items.push(item);
    return item;
  }

  /** A value that cannot be judged (a timer's output, a comparison...). */
  opaque(kind: CannotJudgeKind, what: string, line: number): Expr {
    return this.leafFor(this.cannotJudge(kind, what, line), what);
  }

  /** A new opaque value that comes from an already recorded construct. */
  leafFor(item: CannotJudge, name: string): Expr {
    this.leaves.push({ kind: 'opaque', item });
    return variable(this.leaves.length - 1, name);
  }

  /** A construct (RETURN, jump) after which no output of the POU can be judged. */
  taintEveryOutput(kind: CannotJudgeKind, what: string, line: number): void {
    this.everyOutput.push(this.cannotJudge(kind, what, line));
  }

  note(text: string): void {
    this.notes.push(text);
  }

  read(name: string, line: number): Expr {
    const k = key(name);
    const now = this.env.get(k);
    if (now) return now;
    return this.before(name, line, false);
  }

  /** The value assigned so far in this scan, if any (no previous-scan leaf is made). */
  assignedValue(name: string): Expr | undefined {
    return this.env.get(key(name));
  }

  /** The value a variable has before this scan assigns it. */
  private before(name: string, line: number, kept: boolean): Expr {
    const k = key(name);
    const d = this.variable(name, line);
    const scanLocal = d.section === 'temp' || (this.header.kind === 'FUNCTION' && d.section !== 'input');
    if (scanLocal) return TRUE_TEXT.test(d.initial ?? '') ? TRUE : FALSE;
    const stateful = this.assigned.has(k) && d.section !== 'input';
    const leafKey = (stateful ? 'prev:' : 'in:') + k;
    let index = this.leafOf.get(leafKey);
    if (index === undefined) {
      this.leaves.push(stateful ? { kind: 'prev', name: d.name, line, kept } : { kind: 'input', name: d.name });
      index = this.leaves.length - 1;
      this.leafOf.set(leafKey, index);
    }
    return variable(index, d.name);
  }

  assign(name: string, value: Expr, line: number): void {
    const k = key(name);
    this.variable(name, line);
    if (!this.lastLine.has(k)) this.assignedOrder.push(k);
    this.lastLine.set(k, line);
    this.env.set(k, value);
  }

  /**
   * Run an IF / ELSIF / ELSE chain. `enter` starts a branch from the values before the IF (its
   * condition is read with them); `leave` closes it with its condition (null for ELSE). `end`
   * merges: value = (c1 AND v1) OR (NOT c1 AND c2 AND v2) ... and a branch that does not assign
   * a variable keeps the value it had before the IF.
   */
  beginIf(): IfChain {
    const before = new Map(this.env);
    const branches: { guard: Expr; env: Map<string, Expr> }[] = [];
    const notYet: Expr[] = [];
    let hasElse = false;
    return {
      enter: () => {
        this.env = new Map(before);
      },
      leave: (cond: Expr | null) => {
        branches.push({ guard: andFolded(...notYet, cond ?? TRUE), env: this.env });
        if (cond) notYet.push(notFolded(cond));
        else hasElse = true;
      },
      end: (line: number) => {
        if (!hasElse) branches.push({ guard: andFolded(...notYet), env: before });
        const changed = new Set<string>();
        for (const b of branches) for (const [k, v] of b.env) if (before.get(k) !== v) changed.add(k);
        this.env = new Map(before);
        for (const k of changed) {
          const name = this.variable(k, line).name;
          const prior = before.get(k) ?? this.before(name, line, true);
          const values = branches.map((b) => b.env.get(k) ?? prior);
          const value = values.every((v) => v === values[0])
            ? values[0]!
            : orFolded(...branches.map((b, i) => andFolded(b.guard, values[i]!)));
          this.env.set(k, value);
        }
      },
    };
  }

  finish(): ImplPou {
    const inputs: string[] = [];
    const inputIndex = new Map<number, number>();
    this.leaves.forEach((leaf, i) => {
      if (leaf.kind === 'input') {
        inputIndex.set(i, inputs.length);
        inputs.push(leaf.name);
      }
    });
    const outputs: ImplOutput[] = [];
    for (const k of this.assignedOrder) {
      const d = this.variable(k, 0);
      if (!this.isBool(d.name, 0)) continue;
      const value = this.env.get(k)!;
      const line = this.lastLine.get(k)!;
      const reasons = [...this.everyOutput];
      for (const i of leavesOf(value)) {
        const leaf = this.leaves[i]!;
        if (leaf.kind === 'opaque') reasons.push(leaf.item);
        else if (leaf.kind === 'prev') reasons.push(this.stateReason(d.name, leaf, line));
      }
      const size = expandedSize(value);
      if (size > MAX_EXPANDED) {
        const what = `${d.name} grows to about ${size.toExponential(1)} operations once intermediates are substituted, too many to evaluate`;
        reasons.push(this.cannotJudge('unsupported', what, line));
      }
      const unique = [...new Set(reasons)];
      outputs.push(
        unique.length > 0
          ? { name: d.name, section: d.section, line, cannotJudge: unique }
          : { name: d.name, section: d.section, line, expr: remap(value, inputIndex), cannotJudge: [] },
      );
    }
    return {
      name: this.header.name,
      kind: this.header.kind,
      language: this.header.language,
      line: this.header.line,
      variables: [...this.header.variables, ...this.undeclared.values()],
      inputs,
      outputs,
      cannotJudge: this.items,
      notes: this.notes,
    };
  }

  /** The reason an output that depends on a previous-scan value cannot be judged (recorded once). */
  private stateReason(output: string, leaf: Leaf & { kind: 'prev' }, line: number): CannotJudge {
    const self = key(leaf.name) === key(output);
    const what = self
      ? leaf.kept
        ? `${output} keeps its previous value when no branch of the IF at line ${leaf.line} assigns it (latch)`
        : `${output} feeds back into itself (seal-in / latch), read at line ${leaf.line}`
      : `${output} (line ${line}) uses ${leaf.name} from the previous scan (${leaf.kept ? 'kept by the IF' : 'read'} at line ${leaf.line}, before this scan assigns it)`;
    const existing = this.items.find((c) => c.what === what);
    return existing ?? this.cannotJudge(self ? 'seal-in' : 'previous-scan', what, self ? leaf.line : line);
  }
}

export interface IfChain {
  enter(): void;
  leave(cond: Expr | null): void;
  end(line: number): void;
}

/**
 * Substituted expressions share subtrees; evaluated as trees they may blow up (a variable
 * rewritten from itself twice per statement doubles each time). Beyond this they are reported.
 */
const MAX_EXPANDED = 2_000_000;

/** Node count of the expression written out as a tree (shared subtrees counted each time). */
function expandedSize(e: Expr): number {
  const memo = new Map<Expr, number>();
  const go = (x: Expr): number => {
    const known = memo.get(x);
    if (known !== undefined) return known;
    const n = x.kind === 'not' ? 1 + go(x.arg) : x.kind === 'const' || x.kind === 'var' ? 1 : x.args.reduce((sum, a) => sum + go(a), 1);
    memo.set(x, n);
    return n;
  };
  return go(e);
}

/** Leaf indices an expression uses (each shared subtree visited once). */
function leavesOf(e: Expr): number[] {
  const seen = new Set<Expr>();
  const out = new Set<number>();
  const walk = (x: Expr): void => {
    if (seen.has(x)) return;
    seen.add(x);
    if (x.kind === 'var') out.add(x.input);
    else if (x.kind === 'not') walk(x.arg);
    else if (x.kind !== 'const') x.args.forEach(walk);
  };
  walk(e);
  return [...out].sort((a, b) => a - b);
}

/** The same expression with leaf indices replaced by input indices; shared subtrees stay shared. */
function remap(e: Expr, index: ReadonlyMap<number, number>): Expr {
  const memo = new Map<Expr, Expr>();
  const go = (x: Expr): Expr => {
    const done = memo.get(x);
    if (done) return done;
    let r: Expr;
    if (x.kind === 'var') r = variable(index.get(x.input)!, x.name);
    else if (x.kind === 'not') r = not(go(x.arg));
    else if (x.kind === 'const') r = x;
    else r = { kind: x.kind, args: x.args.map(go) };
    memo.set(x, r);
    return r;
  };
  return go(e);
}
