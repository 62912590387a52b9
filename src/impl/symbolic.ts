// Symbolic execution of one POU's scan: every variable's current value as an expression over
// leaves (inputs, previous-scan values, and opaque values a truth table cannot judge). Both
// the ST and the LD readers drive it; at the end each assigned BOOL becomes an ImplOutput.
import { and, FALSE, not, or, postOrder, TRUE, variable, type Expr } from '../logic/index.js';
import { kindWord } from './constructs.js';
import { mapVars } from './expr-dag.js';
import { LineError } from './line-error.js';
import { fixedPrefix, isElementary, isPath, parsePath, pathKey, resolvePath, type PathTypes, type Resolved } from './paths.js';
import type { CannotJudge, CannotJudgeKind, ImplOutput, ImplPou, ImplVariable, VarSection } from './types.js';

type Leaf =
  /** An input by its declaration (VAR_INPUT, a global, an input address...). */
  | { readonly kind: 'input'; readonly name: string }
  /** Read, never written, and no input by its declaration: an input only if a mapping says so. */
  | { readonly kind: 'undriven'; readonly name: string; readonly item: CannotJudge }
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
  return allOf(args);
}

export function orFolded(...args: Expr[]): Expr {
  return anyOf(args);
}

/** AND of a list of any length (no argument spreading: an IF may have thousands of branches). */
export function allOf(list: readonly Expr[]): Expr {
  if (list.some((a) => isConst(a, false))) return FALSE;
  const args = list.filter((a) => !isConst(a, true));
  return args.length <= 1 ? and(...args) : { kind: 'and', args };
}

export function anyOf(list: readonly Expr[]): Expr {
  if (list.some((a) => isConst(a, true))) return TRUE;
  const args = list.filter((a) => !isConst(a, false));
  return args.length <= 1 ? or(...args) : { kind: 'or', args };
}

export function notFolded(a: Expr): Expr {
  if (a.kind === 'const') return a.value ? FALSE : TRUE;
  if (a.kind === 'not') return a.arg;
  return not(a);
}

const TRUE_TEXT = /^(TRUE|1|BOOL#(TRUE|1))$/i;
const FALSE_TEXT = /^(FALSE|0|BOOL#(FALSE|0))$/i;

/** Sections whose variables come from outside the POU when it does not write them. */
const FROM_OUTSIDE: ReadonlySet<VarSection> = new Set(['input', 'in-out', 'global', 'external', 'undeclared']);

/** Reasons listed per output at most (the verdict needs one; a report more than this is noise). */
const MAX_REASONS = 20;
const NO_REASONS: readonly number[] = [];

export class PouBuilder {
  private readonly leaves: Leaf[] = [];
  private readonly leafOf = new Map<string, number>();
  private readonly env = new Map<string, Expr>();
  /** Per open IF branch: each variable it assigned, with its value before the branch. */
  private readonly journal: Map<string, Expr | undefined>[] = [];
  private readonly lastLine = new Map<string, number>();
  private readonly assignedOrder: string[] = [];
  private readonly items: CannotJudge[] = [];
  private readonly itemByWhat = new Map<string, CannotJudge>();
  private readonly everyOutput: CannotJudge[] = [];
  private readonly notes: string[] = [];
  private readonly declared = new Map<string, ImplVariable>();
  private readonly undeclared = new Map<string, ImplVariable>();
  private readonly initialValues = new Map<string, Expr>();
  /** Access paths resolved so far (lower-case key). */
  private readonly paths = new Map<string, ImplVariable>();
  /** Calls of each block instance so far: a member read after a call is a new value. */
  private readonly instanceCalls = new Map<string, number>();
  /** Paths written as a whole or with a variable index: what is under them is not known. */
  private readonly unknownUnder = new Map<string, CannotJudge>();

  /**
   * `assigned`: every variable the POU assigns somewhere (lower case); reading one of them
   * before this scan assigns it gives its previous-scan value.
   */
  constructor(
    private readonly header: PouHeader,
    globals: readonly ImplVariable[],
    private readonly assigned: ReadonlySet<string>,
    private readonly pathTypes?: PathTypes,
  ) {
    for (const v of globals) this.declared.set(key(v.name), v);
    for (const v of header.variables) {
      // VAR_EXTERNAL names a global: a constant's value is the global's.
      const global = v.section === 'external' ? this.declared.get(key(v.name)) : undefined;
      this.declared.set(key(v.name), global ? { ...v, ...(global.initial !== undefined ? { initial: global.initial } : {}), ...(global.constant ? { constant: true } : {}) } : v);
    }
  }

  get pou(): string {
    return this.header.name;
  }

  /** The declaration of a name, or one made up (and noted) for an undeclared name. */
  variable(name: string, line: number): ImplVariable {
    const k = key(name);
    const d = this.declared.get(k) ?? this.undeclared.get(k) ?? this.paths.get(pathKey(name));
    if (d) return d;
    if (isPath(name)) {
      const r = this.resolve(name, line);
      if (!r.ok) throw new Error(`bug: ${name} is used as a variable but does not resolve: ${r.why}`);
      return r.variable;
    }
    const made: ImplVariable = { name, section: 'undeclared', type: '', line };
    this.undeclared.set(k, made);
    this.notes.push(`${name} (line ${line}) is not declared in ${this.header.name}; taken as a BOOL`);
    return made;
  }

  /**
   * A plain name's declaration, or what an access path (`io.bX`, `aIn[3]`, `T1.Q`) stands for;
   * a path that resolves is remembered as a variable of its own.
   */
  resolve(name: string, line: number): Resolved {
    if (!isPath(name)) return { ok: true, variable: this.variable(name, line) };
    const k = pathKey(name);
    const known = this.paths.get(k);
    if (known) return { ok: true, variable: known };
    const parsed = parsePath(name);
    if (!parsed || !this.pathTypes) return { ok: false, kind: 'unsupported', why: `${name} at line ${line} is not read` };
    const r = resolvePath(this.variable(parsed.base, line), parsed, this.pathTypes, line);
    if (r.ok) this.paths.set(k, r.variable);
    return r;
  }

  /** A call of a block instance: its members read from here on are new values. */
  instanceCalled(instance: string): void {
    const k = pathKey(instance);
    this.instanceCalls.set(k, (this.instanceCalls.get(k) ?? 0) + 1);
  }

  /**
   * A write this scan cannot follow to its members (a whole structure, a variable index):
   * every path under `prefix` that the POU assigns, or has read, takes an unknown value, and
   * so does any path under it read later.
   */
  writeUnknownUnder(prefix: string, item: CannotJudge, line: number): void {
    const p = pathKey(prefix);
    const under = (k: string): boolean => k === p || k.startsWith(`${p}.`) || k.startsWith(`${p}[`);
    this.unknownUnder.set(p, item);
    const keys = new Set([...this.assigned, ...this.paths.keys()].filter((k) => under(k) && k !== p));
    for (const k of keys) {
      const r = this.resolve(k, line);
      if (r.ok && r.variable.type.toUpperCase() === 'BOOL' && !r.variable.source) this.assign(r.variable.name, this.leafFor(item, r.variable.name), line);
    }
  }

  /**
   * A write whose value is not known: a BOOL variable or path takes an opaque value (OR the one
   * it has, when `keep`: the write may not happen); a structure, an array, an instance or a path
   * with a variable index makes every path under it unknown from here on. True when more than
   * the one variable may have changed.
   */
  writeUnknown(target: string, line: number, item: (name: string) => CannotJudge, keep = false): boolean {
    const parsed = parsePath(target);
    if (!parsed) return false;
    const r = parsed.steps.some((x) => 'variableIndex' in x) ? undefined : this.resolve(target, line);
    if (r?.ok) {
      const v = r.variable;
      if (v.source) return false;
      if (v.type === '' || v.type.toUpperCase() === 'BOOL') {
        const value = this.leafFor(item(v.name), v.name);
        const now = keep ? this.assignedValue(v.name) : undefined;
        this.assign(v.name, now ? orFolded(now, value) : value, line);
        return false;
      }
      if (isElementary(v.type)) return false;
      this.writeUnknownUnder(v.name, item(v.name), line);
      return true;
    }
    // A path that does not resolve (a type not declared here): all of its base is unknown; a variable index: all of the array.
    this.writeUnknownUnder(r ? parsed.base : fixedPrefix(parsed), item(target), line);
    return true;
  }

  isBool(name: string, line: number): boolean {
    const t = this.variable(name, line).type.toUpperCase();
    return t === '' || t === 'BOOL';
  }

  /** Record a construct that cannot be judged, without a value attached. */
  cannotJudge(kind: CannotJudgeKind, what: string, line: number): CannotJudge {
    const item: CannotJudge = { kind, pou: this.header.name, line, what };
    this.items.push(item);
    this.itemByWhat.set(what, item);
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
  taintEveryOutput(kind: CannotJudgeKind, what: string, line: number): CannotJudge {
    const item = this.cannotJudge(kind, what, line);
    this.everyOutput.push(item);
    return item;
  }

  note(text: string): void {
    this.notes.push(text);
  }

  read(name: string, line: number): Expr {
    const k = pathKey(name);
    const now = this.env.get(k);
    if (now) return now;
    for (const [p, item] of this.unknownUnder) if (k.startsWith(`${p}.`) || k.startsWith(`${p}[`)) return this.leafFor(item, name);
    return this.before(name, line, false);
  }

  /** The value assigned so far in this scan, if any (no previous-scan leaf is made). */
  assignedValue(name: string): Expr | undefined {
    return this.env.get(pathKey(name));
  }

  /**
   * The value a variable has before this scan assigns it. A constant, a VAR_TEMP (and a
   * FUNCTION's own variables) and a variable the POU never writes that has an initial value
   * are that value. Otherwise: written somewhere in the POU = its previous-scan value; from
   * outside by its declaration = an input; else undriven.
   */
  private before(name: string, line: number, kept: boolean): Expr {
    const k = pathKey(name);
    const d = this.variable(name, line);
    if (d.source) return this.sourceValue(d, line);
    const scanLocal = d.section === 'temp' || (this.header.kind === 'FUNCTION' && !FROM_OUTSIDE.has(d.section));
    if (d.constant || scanLocal) return this.initialValue(d);
    const written = this.assigned.has(k);
    if (!written && d.initial !== undefined && !FROM_OUTSIDE.has(d.section)) return this.initialValue(d);
    const kind: Leaf['kind'] =
      written && d.section !== 'input' ? 'prev' : FROM_OUTSIDE.has(d.section) || /^%I/i.test(d.address ?? '') ? 'input' : 'undriven';
    const leafKey = `${kind}:${k}`;
    let index = this.leafOf.get(leafKey);
    if (index === undefined) {
      const where = `${d.section === 'output' ? 'VAR_OUTPUT' : 'VAR'}, line ${d.line}`;
      const what =
        `${d.name} (${where}) is read at line ${line} but never written in ${this.header.name} and is no input: ` +
        'it stays FALSE or is set from outside; declare it VAR_INPUT or map it to a spec input';
      this.leaves.push(
        kind === 'prev'
          ? { kind, name: d.name, line, kept }
          : kind === 'input'
            ? { kind, name: d.name }
            : { kind, name: d.name, item: this.cannotJudge('undriven', what, line) },
      );
      index = this.leaves.length - 1;
      this.leafOf.set(leafKey, index);
    }
    return variable(index, d.name);
  }

  /**
   * A member of a block instance: a named source, the same leaf until the instance is called
   * again (or, with `at`, one leaf per place: a block element of a diagram). An input only
   * when a mapping names it (as an undriven read).
   */
  sourceValue(d: ImplVariable, line: number, at?: string): Expr {
    const source = d.source!;
    const leafKey = `source:${pathKey(d.name)}#${at ?? this.instanceCalls.get(pathKey(source.instance)) ?? 0}`;
    let index = this.leafOf.get(leafKey);
    if (index === undefined) {
      const what =
        `${d.name} is a member of the ${kindWord(source.kind)} ${source.instance} (${source.type}), read at ${at ?? `line ${line}`}: ` +
        "its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one";
      this.leaves.push({ kind: 'undriven', name: d.name, item: this.cannotJudge(source.kind, what, line) });
      index = this.leaves.length - 1;
      this.leafOf.set(leafKey, index);
    }
    return variable(index, d.name);
  }

  /** A declared initial value (FALSE when none); one that is not a BOOL literal cannot be judged. */
  private initialValue(d: ImplVariable): Expr {
    if (d.section === 'external' && d.initial === undefined) {
      return this.opaque('unsupported', `${d.name} (line ${d.line}) is a constant declared outside this file: its value is not known`, d.line);
    }
    const text = (d.initial ?? 'FALSE').trim();
    if (TRUE_TEXT.test(text)) return TRUE;
    if (FALSE_TEXT.test(text)) return FALSE;
    const k = key(d.name);
    let value = this.initialValues.get(k);
    if (!value) {
      value = this.opaque('unsupported', `initial value '${text}' of ${d.name} (line ${d.line}) is not read`, d.line);
      this.initialValues.set(k, value);
    }
    return value;
  }

  assign(name: string, value: Expr, line: number): void {
    const k = pathKey(name);
    const d = this.variable(name, line);
    if (d.constant) throw new LineError(line, `${d.name} is a CONSTANT (line ${d.line}) and cannot be assigned`);
    if (!this.lastLine.has(k)) this.assignedOrder.push(k);
    this.lastLine.set(k, line);
    this.set(k, value);
  }

  /** Set a value, remembering in the open IF branch what it replaced. */
  private set(k: string, value: Expr): void {
    const open = this.journal[this.journal.length - 1];
    if (open && !open.has(k)) open.set(k, this.env.get(k));
    this.env.set(k, value);
  }

  /**
   * Run an IF / ELSIF / ELSE chain. `enter` starts a branch from the values before the IF (its
   * condition is read with them); `leave` closes it with its condition (null for ELSE). `end`
   * merges: branch i is taken when g_i = c_i AND NOT c_1 ... AND NOT c_(i-1); a variable that
   * branches S assign becomes OR over S of (g_i AND v_i), OR (no branch of S taken AND its
   * value before the IF). Work and size are in proportion to what the branches assign.
   */
  beginIf(): IfChain {
    const branches: { guard: Expr; changes: Map<string, Expr> }[] = [];
    let rest: Expr = TRUE;
    let hasElse = false;
    let open: Map<string, Expr | undefined> | undefined;
    return {
      enter: () => {
        open = new Map();
        this.journal.push(open);
      },
      leave: (cond: Expr | null) => {
        this.journal.pop();
        const changes = new Map<string, Expr>();
        for (const [k, old] of open!) {
          changes.set(k, this.env.get(k)!);
          if (old === undefined) this.env.delete(k);
          else this.env.set(k, old);
        }
        branches.push({ guard: andFolded(rest, cond ?? TRUE), changes });
        if (cond) rest = andFolded(rest, notFolded(cond));
        else hasElse = true;
      },
      end: (line: number) => {
        const changed = new Map<string, number[]>();
        branches.forEach((b, i) => {
          for (const k of b.changes.keys()) {
            const list = changed.get(k);
            if (list) list.push(i);
            else changed.set(k, [i]);
          }
        });
        for (const [k, taken] of changed) {
          const values = taken.map((i) => branches[i]!.changes.get(k)!);
          const all = hasElse && taken.length === branches.length;
          if (all && values.every((v) => v === values[0])) {
            this.set(k, values[0]!);
            continue;
          }
          const terms = taken.map((i, j) => andFolded(branches[i]!.guard, values[j]!));
          if (!all) {
            const prior = this.env.get(k) ?? this.before(this.variable(k, line).name, line, true);
            terms.push(allOf([...taken.map((i) => notFolded(branches[i]!.guard)), prior]));
          }
          this.set(k, anyOf(terms));
        }
      },
    };
  }

  finish(): ImplPou {
    const inputs: string[] = [];
    const undriven: { name: string; item: CannotJudge }[] = [];
    const inputIndex = new Map<number, number>();
    this.leaves.forEach((leaf, i) => {
      if (leaf.kind === 'input' || leaf.kind === 'undriven') {
        inputIndex.set(i, inputs.length);
        inputs.push(leaf.name);
        if (leaf.kind === 'undriven') undriven.push({ name: leaf.name, item: leaf.item });
      }
    });
    const remapped = new Map<Expr, Expr>();
    const reasonLeaves = new Map<Expr, readonly number[]>();
    const outputs: ImplOutput[] = [];
    for (const k of this.assignedOrder) {
      const d = this.variable(k, 0);
      if (!this.isBool(d.name, 0)) continue;
      const value = this.env.get(k)!;
      const line = this.lastLine.get(k)!;
      const reasons = [...this.everyOutput];
      for (const i of this.reasonsOf(value, reasonLeaves)) {
        const leaf = this.leaves[i]!;
        if (leaf.kind === 'opaque') reasons.push(leaf.item);
        else if (leaf.kind === 'prev') reasons.push(this.stateReason(d.name, leaf, line));
      }
      const unique = [...new Set(reasons)];
      outputs.push(
        unique.length > 0
          ? { name: d.name, section: d.section, line, cannotJudge: unique }
          : { name: d.name, section: d.section, line, expr: mapVars(value, (v) => variable(inputIndex.get(v.input)!, v.name), remapped), cannotJudge: [] },
      );
    }
    return {
      name: this.header.name,
      kind: this.header.kind,
      language: this.header.language,
      line: this.header.line,
      variables: [...this.header.variables, ...this.undeclared.values()],
      paths: [...this.paths.values()],
      inputs,
      undriven,
      outputs,
      cannotJudge: this.items,
      notes: this.notes,
    };
  }

  /**
   * The first MAX_REASONS leaves (by index) under `root` that make it unjudgeable: opaque and
   * previous-scan values. `memo` is shared by every output, so the POU is walked once.
   */
  private reasonsOf(root: Expr, memo: Map<Expr, readonly number[]>): readonly number[] {
    for (const x of postOrder([root], (e) => memo.has(e))) {
      if (x.kind === 'var') {
        const leaf = this.leaves[x.input]!;
        memo.set(x, leaf.kind === 'opaque' || leaf.kind === 'prev' ? [x.input] : NO_REASONS);
        continue;
      }
      const kids = x.kind === 'not' ? [x.arg] : x.kind === 'const' ? [] : x.args;
      const lists = [...new Set(kids.map((c) => memo.get(c)!).filter((l) => l.length > 0))];
      memo.set(x, lists.length === 0 ? NO_REASONS : lists.length === 1 ? lists[0]! : [...new Set(lists.flat())].sort((a, b) => a - b).slice(0, MAX_REASONS));
    }
    return memo.get(root)!;
  }

  /** The reason an output that depends on a previous-scan value cannot be judged (recorded once). */
  private stateReason(output: string, leaf: Leaf & { kind: 'prev' }, line: number): CannotJudge {
    const self = key(leaf.name) === key(output);
    const what = self
      ? leaf.kept
        ? `${output} keeps its previous value when no branch of the IF at line ${leaf.line} assigns it (latch)`
        : `${output} feeds back into itself (seal-in / latch), read at line ${leaf.line}`
      : `${output} (line ${line}) uses ${leaf.name} from the previous scan (${leaf.kept ? 'kept by the IF' : 'read'} at line ${leaf.line}, before this scan assigns it)`;
    return this.itemByWhat.get(what) ?? this.cannotJudge(self ? 'seal-in' : 'previous-scan', what, self ? leaf.line : line);
  }
}

export interface IfChain {
  enter(): void;
  leave(cond: Expr | null): void;
  end(line: number): void;
}
