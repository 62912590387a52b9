// Implementation check: logic already written (parsed to an expression) against the spec.
import { anfDifference, type Monomial } from './anf.js';
import { complement, count, emptySet, fullSet, inputSet, intersect, symmetricDifference, union, type BitSet, type Combination } from './bits.js';
import type { BoolFunction, SafeValue } from './boolfn.js';
import { differenceSides, listedSides, sideForm, type CounterexampleKind, type SideForm, type SideFormOptions } from './difference.js';
import type { Expr } from './expr/ast.js';
import { LISTED, inputValues, prove } from './proof.js';

export interface Counterexample {
  readonly combination: Combination;
  /** Input values, leftmost input first. */
  readonly inputs: (0 | 1)[];
  /** What the spec asks for. */
  readonly expected: 0 | 1;
  /** What the implementation gives. */
  readonly actual: 0 | 1;
  /** Unsafe: the spec requires the safe value here; spurious trip: it requires the other value. */
  readonly kind: CounterexampleKind;
}

export interface ImplCheck {
  /** The implementation agrees with the spec on every specified combination. */
  readonly equal: boolean;
  /** 2^n: every combination was checked. */
  readonly combinations: number;
  readonly mismatchCount: number;
  /** Of the disagreements (all 2^n judged), how many are unsafe and how many spurious trips. */
  readonly unsafeCount: number;
  readonly spuriousTripCount: number;
  /** The first LISTED unsafe disagreements, then the first LISTED spurious trips, each in increasing order of combination. */
  readonly counterexamples: Counterexample[];
  /** Minimal AND/OR forms of the unsafe set and of the spurious-trip set: the plain sentences. */
  readonly unsafeWhen: SideForm;
  readonly spuriousTripWhen: SideForm;
  /**
   * The first LISTED monomials of the ANF of (spec XOR implementation), where the spec's
   * don't-cares take the implementation's value: so only real disagreements show. Their XOR
   * is exactly the correction that turns the implementation into the spec.
   */
  readonly differenceMonomials: Monomial[];
  readonly differenceMonomialCount: number;
  /** Don't-care combinations the implementation turns ON. */
  readonly dontCareOn: number;
  /** The implementation's truth table. */
  readonly values: BitSet;
}

export interface CheckOptions extends SideFormOptions {
  /** The output's safe value (default 0): which side of a disagreement is unsafe. */
  readonly safe?: SafeValue;
}

/** Check an implementation (an expression over fn's inputs) against the spec fn. */
export function checkImplementation(expr: Expr, fn: BoolFunction, options: CheckOptions = {}): ImplCheck {
  const safe = options.safe ?? 0;
  const impl = sharedTruthTable(expr, fn.n);
  const proof = prove(fn, impl);
  const sides = differenceSides(fn, impl, safe);
  const counterexamples = listedSides(sides, LISTED).map(({ combination: k, kind }) => {
    const expected: 0 | 1 = kind === 'unsafe' ? safe : ((1 - safe) as 0 | 1);
    return { combination: k, inputs: inputValues(fn.n, k), expected, actual: (1 - expected) as 0 | 1, kind };
  });
  // Don't-cares take the implementation's value, so they never count as a difference.
  const completed = union(fn.on, intersect(impl, fn.dc));
  const difference = proof.mismatchCount === 0 ? [] : anfDifference(completed, impl, fn.n);
  return {
    equal: proof.mismatchCount === 0,
    combinations: proof.combinations,
    mismatchCount: proof.mismatchCount,
    unsafeCount: count(sides.unsafe),
    spuriousTripCount: count(sides.spuriousTrip),
    counterexamples,
    unsafeWhen: sideForm(fn.n, sides.unsafe, fn.dc, options),
    spuriousTripWhen: sideForm(fn.n, sides.spuriousTrip, fn.dc, options),
    differenceMonomials: difference.slice(0, LISTED),
    differenceMonomialCount: difference.length,
    dontCareOn: proof.permitsAlsoCount,
    values: impl,
  };
}

const operands = (e: Expr): readonly Expr[] => (e.kind === 'not' ? [e.arg] : e.kind === 'const' || e.kind === 'var' ? [] : e.args);

/**
 * Every distinct node reachable from the roots, each after its operands (post-order), without
 * recursion: programs read back share subtrees (an intermediate used twice) and chain them as
 * deep as the program is long. Nodes for which `done` holds are left out, and so is what lies
 * only below them (a walk continued over several roots).
 */
export function postOrder(roots: readonly Expr[], done: (e: Expr) => boolean = () => false): Expr[] {
  const out: Expr[] = [];
  const state = new Map<Expr, 1 | 2>();
  const stack: Expr[] = roots.filter((r) => !done(r)).reverse();
  while (stack.length > 0) {
    const x = stack[stack.length - 1]!;
    const seen = state.get(x);
    if (seen === 2) {
      stack.pop();
    } else if (seen === 1) {
      stack.pop();
      state.set(x, 2);
      out.push(x);
    } else {
      state.set(x, 1);
      const kids = operands(x);
      for (let i = kids.length - 1; i >= 0; i--) if (!state.has(kids[i]!) && !done(kids[i]!)) stack.push(kids[i]!);
    }
  }
  return out;
}

/**
 * The truth table of an expression whose subtrees may be shared and deeply chained: each
 * distinct node is evaluated once, in post-order, and its bit set dropped once its last user
 * is done. Costs (distinct nodes) x 2^n / 32 words.
 */
export function sharedTruthTable(expr: Expr, n: number): BitSet {
  const order = postOrder([expr]);
  const users = new Map<Expr, number>();
  for (const x of order) for (const k of operands(x)) users.set(k, (users.get(k) ?? 0) + 1);
  const values = new Map<Expr, BitSet>();
  const columns = new Map<number, BitSet>();
  const take = (k: Expr): BitSet => {
    const v = values.get(k)!;
    const left = users.get(k)! - 1;
    users.set(k, left);
    if (left === 0) values.delete(k);
    return v;
  };
  for (const x of order) {
    let v: BitSet;
    if (x.kind === 'const') v = x.value ? fullSet(n) : emptySet(n);
    else if (x.kind === 'var') {
      if (!Number.isInteger(x.input) || x.input < 0 || x.input >= n) throw new Error(`bug: expression uses input ${x.input} of a function of ${n} inputs`);
      v = columns.get(x.input) ?? inputSet(n, x.input);
      columns.set(x.input, v);
    } else if (x.kind === 'not') v = complement(take(x.arg), n);
    else if (x.args.length === 0) v = x.kind === 'and' ? fullSet(n) : emptySet(n);
    else {
      const op = x.kind === 'and' ? intersect : x.kind === 'or' ? union : symmetricDifference;
      v = take(x.args[0]!);
      for (let i = 1; i < x.args.length; i++) v = op(v, take(x.args[i]!));
    }
    values.set(x, v);
  }
  return values.get(expr)!;
}
