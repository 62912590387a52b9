// Reduced ordered decision diagrams over up to 64 inputs: BDDs for functions, ZDDs for sets
// of monomials (the algebraic normal form). Written here rather than taken from npm: what the
// engine needs (a unique table, an operation cache, counts in BigInt, paths as cubes, the
// Davio expansion into a ZDD) is small, and no maintained package covers the ZDD half.
//
// Variable order: input 0 (the leftmost column) is the top variable, then the table's column
// order. Node 0 is FALSE (as a ZDD: the empty set), node 1 is TRUE (the set holding only the
// empty monomial, i.e. the constant TRUE). A node is a triple (input, lo, hi); read as a BDD it
// is "if input then hi else lo", read as a ZDD it is lo ∪ {m ∪ {input} : m ∈ hi}. BDD nodes
// never have lo = hi and ZDD nodes never have hi = 0, so one unique table serves both.
// No garbage collection: a diagram lives as long as its analysis.
import { now } from './deadline.js';
import { inputBit, type WideCombination, type WideCube } from './wide-cube.js';

export type Node = number;
export const FALSE: Node = 0;
export const TRUE: Node = 1;

/**
 * A manager ran past its node budget or its time: the functions are too large for the
 * symbolic engine (a random-looking sum of many cubes can need exponentially many nodes in
 * any order). Thrown inside the engine, caught where a table is read or analysed.
 */
export class DdTooLarge extends Error {
  constructor(readonly why: string) {
    super(why);
  }
}

/** Default node budget: 4 million nodes, about 100 MB with the tables. */
export const DEFAULT_NODE_LIMIT = 4_000_000;

/** Default time for one manager's work (ms). */
export const DEFAULT_DD_TIME_MS = 5_000;

const AND = 1;
const OR = 2;
const XOR = 3;
const CACHE_BITS = 18;

export class Dd {
  private vars: Int32Array;
  private los: Int32Array;
  private his: Int32Array;
  private size = 2;
  private table: Int32Array;
  private tableMask: number;
  private readonly cacheOp = new Int32Array(1 << CACHE_BITS);
  private readonly cacheA = new Int32Array(1 << CACHE_BITS);
  private readonly cacheB = new Int32Array(1 << CACHE_BITS);
  private readonly cacheR = new Int32Array(1 << CACHE_BITS);
  private readonly countMemo = new Map<Node, bigint>();
  private readonly anfMemo = new Map<Node, Node>();
  private readonly zCountMemo = new Map<Node, bigint>();

  private readonly deadline: number;

  constructor(
    readonly n: number,
    private nodeLimit = DEFAULT_NODE_LIMIT,
    readonly timeMs = DEFAULT_DD_TIME_MS,
  ) {
    this.deadline = now() + timeMs;
    if (!Number.isInteger(n) || n < 1 || n > 64) throw new Error(`bug: ${n} inputs for a decision diagram`);
    const capacity = 1 << 14;
    this.vars = new Int32Array(capacity);
    this.los = new Int32Array(capacity);
    this.his = new Int32Array(capacity);
    this.vars[0] = this.vars[1] = n;
    this.table = new Int32Array(capacity * 2);
    this.tableMask = capacity * 2 - 1;
  }

  /** Raise the node budget (a first phase may be held to less, to give up early). */
  allowNodes(limit: number): void {
    this.nodeLimit = Math.max(this.nodeLimit, limit);
  }

  /** Nodes made so far (terminals included). */
  get nodes(): number {
    return this.size;
  }

  /** The input a node tests; n for the terminals. */
  level(f: Node): number {
    return this.vars[f]!;
  }

  lo(f: Node): Node {
    return this.los[f]!;
  }

  hi(f: Node): Node {
    return this.his[f]!;
  }

  /** The node (v, lo, hi), shared: the unique table. */
  private node(v: number, lo: Node, hi: Node): Node {
    let h = (Math.imul(v + 1, 0x9e3779b1) ^ Math.imul(lo, 0x85ebca77) ^ Math.imul(hi, 0xc2b2ae3d)) & this.tableMask;
    for (;;) {
      const id = this.table[h]!;
      if (id === 0) break;
      if (this.vars[id] === v && this.los[id] === lo && this.his[id] === hi) return id;
      h = (h + 1) & this.tableMask;
    }
    if (this.size >= this.nodeLimit) throw new DdTooLarge(`the decision diagrams passed ${this.nodeLimit.toLocaleString('en-US')} nodes`);
    if ((this.size & 0xffff) === 0 && now() > this.deadline) throw new DdTooLarge(`the decision diagrams took more than ${this.timeMs / 1000} s`);
    if (this.size === this.vars.length) this.grow();
    const id = this.size++;
    this.vars[id] = v;
    this.los[id] = lo;
    this.his[id] = hi;
    if (this.size * 2 > this.tableMask) this.rehash();
    else this.table[h] = id;
    return id;
  }

  private grow(): void {
    const capacity = this.vars.length * 2;
    const copy = (a: Int32Array): Int32Array => {
      const b = new Int32Array(capacity);
      b.set(a);
      return b;
    };
    this.vars = copy(this.vars);
    this.los = copy(this.los);
    this.his = copy(this.his);
  }

  private rehash(): void {
    this.table = new Int32Array((this.tableMask + 1) * 2);
    this.tableMask = this.table.length - 1;
    for (let id = 2; id < this.size; id++) {
      let h = (Math.imul(this.vars[id]! + 1, 0x9e3779b1) ^ Math.imul(this.los[id]!, 0x85ebca77) ^ Math.imul(this.his[id]!, 0xc2b2ae3d)) & this.tableMask;
      while (this.table[h] !== 0) h = (h + 1) & this.tableMask;
      this.table[h] = id;
    }
  }

  /** BDD node: "if input v then hi else lo". */
  mk(v: number, lo: Node, hi: Node): Node {
    return lo === hi ? lo : this.node(v, lo, hi);
  }

  /** ZDD node: lo ∪ (v × hi). */
  mkZ(v: number, lo: Node, hi: Node): Node {
    return hi === FALSE ? lo : this.node(v, lo, hi);
  }

  // ---- BDD operations ----------------------------------------------------------------------

  variable(input: number): Node {
    return this.mk(input, FALSE, TRUE);
  }

  and(a: Node, b: Node): Node {
    return this.apply(AND, a, b);
  }

  or(a: Node, b: Node): Node {
    return this.apply(OR, a, b);
  }

  xor(a: Node, b: Node): Node {
    return this.apply(XOR, a, b);
  }

  not(a: Node): Node {
    return this.apply(XOR, a, TRUE);
  }

  /** a AND NOT b. */
  minus(a: Node, b: Node): Node {
    return this.and(a, this.not(b));
  }

  private apply(op: number, a: Node, b: Node): Node {
    if (op === AND) {
      if (a === FALSE || b === FALSE) return FALSE;
      if (a === TRUE || a === b) return b;
      if (b === TRUE) return a;
    } else if (op === OR) {
      if (a === TRUE || b === TRUE) return TRUE;
      if (a === FALSE || a === b) return b;
      if (b === FALSE) return a;
    } else {
      if (a === b) return FALSE;
      if (a === FALSE) return b;
      if (b === FALSE) return a;
    }
    if (a > b) [a, b] = [b, a];
    const slot = (Math.imul(a, 0x9e3779b1) ^ Math.imul(b, 0x85ebca77) ^ op) & ((1 << CACHE_BITS) - 1);
    if (this.cacheOp[slot] === op && this.cacheA[slot] === a && this.cacheB[slot] === b) return this.cacheR[slot]!;
    const va = this.vars[a]!;
    const vb = this.vars[b]!;
    const v = Math.min(va, vb);
    const a0 = va === v ? this.los[a]! : a;
    const a1 = va === v ? this.his[a]! : a;
    const b0 = vb === v ? this.los[b]! : b;
    const b1 = vb === v ? this.his[b]! : b;
    const r = this.mk(v, this.apply(op, a0, b0), this.apply(op, a1, b1));
    this.cacheOp[slot] = op;
    this.cacheA[slot] = a;
    this.cacheB[slot] = b;
    this.cacheR[slot] = r;
    return r;
  }

  orAll(fs: readonly Node[]): Node {
    return this.pairwise(OR, fs);
  }

  /** XOR of many (a long XOR form: a chain grows one large diagram term by term). */
  xorAll(fs: readonly Node[]): Node {
    return this.pairwise(XOR, fs);
  }

  /** Pairwise, so that the intermediate diagrams stay balanced. */
  private pairwise(op: number, fs: readonly Node[]): Node {
    let layer = [...fs];
    if (layer.length === 0) return FALSE;
    while (layer.length > 1) {
      const next: Node[] = [];
      for (let i = 0; i < layer.length; i += 2) next.push(i + 1 < layer.length ? this.apply(op, layer[i]!, layer[i + 1]!) : layer[i]!);
      layer = next;
    }
    return layer[0]!;
  }

  /** The product term (or spec row) of a cube. */
  cube(c: WideCube): Node {
    let f = TRUE;
    for (let i = this.n - 1; i >= 0; i--) {
      const bit = inputBit(this.n, i);
      if (c.mask & bit) f = c.bits & bit ? this.mk(i, FALSE, f) : this.mk(i, f, FALSE);
    }
    return f;
  }

  /** How many of the 2^n combinations the function is TRUE on. */
  satCount(f: Node): bigint {
    return this.below(f) << BigInt(this.vars[f]!);
  }

  /** Satisfying assignments of the inputs from level(f) down. */
  private below(f: Node): bigint {
    if (f < 2) return BigInt(f);
    const known = this.countMemo.get(f);
    if (known !== undefined) return known;
    const v = this.vars[f]!;
    const lo = this.los[f]!;
    const hi = this.his[f]!;
    const k = (this.below(lo) << BigInt(this.vars[lo]! - v - 1)) + (this.below(hi) << BigInt(this.vars[hi]! - v - 1));
    this.countMemo.set(f, k);
    return k;
  }

  /**
   * The paths to TRUE as disjoint cubes (an input not tested on a path is free), lo branch
   * first, at most `limit` of them; `complete` says whether that was all.
   */
  pathCubes(f: Node, limit = Infinity): { cubes: WideCube[]; complete: boolean } {
    const cubes: WideCube[] = [];
    let complete = true;
    const walk = (g: Node, mask: bigint, bits: bigint): void => {
      if (g === FALSE || !complete) return;
      if (g === TRUE) {
        if (cubes.length >= limit) complete = false;
        else cubes.push({ mask, bits });
        return;
      }
      const bit = inputBit(this.n, this.vars[g]!);
      walk(this.los[g]!, mask | bit, bits);
      walk(this.his[g]!, mask | bit, bits | bit);
    };
    walk(f, 0n, 0n);
    return { cubes, complete };
  }

  /** The first `limit` combinations the function is TRUE on, in increasing order. */
  minterms(f: Node, limit: number): WideCombination[] {
    const out: WideCombination[] = [];
    const walk = (g: Node, level: number, k: bigint): void => {
      if (g === FALSE || out.length >= limit) return;
      if (level === this.n) {
        out.push(k);
        return;
      }
      const bit = inputBit(this.n, level);
      if (this.vars[g]! > level) {
        walk(g, level + 1, k);
        walk(g, level + 1, k | bit);
      } else {
        walk(this.los[g]!, level + 1, k);
        walk(this.his[g]!, level + 1, k | bit);
      }
    };
    walk(f, 0, 0n);
    return out;
  }

  /** The cube lies wholly inside the function. */
  implies(c: WideCube, f: Node): boolean {
    return this.underCube(c, f, true);
  }

  /** The cube and the function share a combination. */
  meets(c: WideCube, f: Node): boolean {
    return this.underCube(c, f, false);
  }

  /** Inside the cube, f is TRUE everywhere (`all`) or somewhere (not `all`). */
  private underCube(c: WideCube, f: Node, all: boolean): boolean {
    const memo = new Map<Node, boolean>();
    const walk = (g: Node): boolean => {
      if (g < 2) return g === TRUE;
      const known = memo.get(g);
      if (known !== undefined) return known;
      const bit = inputBit(this.n, this.vars[g]!);
      let r: boolean;
      if (c.mask & bit) r = walk(c.bits & bit ? this.his[g]! : this.los[g]!);
      else r = all ? walk(this.los[g]!) && walk(this.his[g]!) : walk(this.los[g]!) || walk(this.his[g]!);
      memo.set(g, r);
      return r;
    };
    return walk(f);
  }

  /** f with the inputs in `polarity` (Combination positions) complemented: x -> f(x XOR p). */
  flip(f: Node, polarity: bigint): Node {
    const memo = new Map<Node, Node>();
    const walk = (g: Node): Node => {
      if (g < 2) return g;
      const known = memo.get(g);
      if (known !== undefined) return known;
      const v = this.vars[g]!;
      const lo = walk(this.los[g]!);
      const hi = walk(this.his[g]!);
      const r = polarity & inputBit(this.n, v) ? this.mk(v, hi, lo) : this.mk(v, lo, hi);
      memo.set(g, r);
      return r;
    };
    return walk(f);
  }

  /** The inputs the diagram tests (Combination positions); for a BDD, the inputs f depends on. */
  support(f: Node): bigint {
    const seen = new Set<Node>();
    let mask = 0n;
    const walk = (g: Node): void => {
      if (g < 2 || seen.has(g)) return;
      seen.add(g);
      mask |= inputBit(this.n, this.vars[g]!);
      walk(this.los[g]!);
      walk(this.his[g]!);
    };
    walk(f);
    return mask;
  }

  evaluate(f: Node, k: WideCombination): boolean {
    let g = f;
    while (g >= 2) g = k & inputBit(this.n, this.vars[g]!) ? this.his[g]! : this.los[g]!;
    return g === TRUE;
  }

  // ---- the algebraic normal form as a ZDD ------------------------------------------------------

  /**
   * The monomials of f's algebraic normal form, by the positive Davio expansion
   * f = f0 XOR x·(f0 XOR f1), one ZDD node per BDD node reached.
   */
  anf(f: Node): Node {
    if (f < 2) return f;
    const known = this.anfMemo.get(f);
    if (known !== undefined) return known;
    const lo = this.los[f]!;
    const z = this.mkZ(this.vars[f]!, this.anf(lo), this.anf(this.xor(lo, this.his[f]!)));
    this.anfMemo.set(f, z);
    return z;
  }

  /** How many monomials a ZDD holds. */
  zCount(z: Node): bigint {
    if (z < 2) return BigInt(z);
    const known = this.zCountMemo.get(z);
    if (known !== undefined) return known;
    const k = this.zCount(this.los[z]!) + this.zCount(this.his[z]!);
    this.zCountMemo.set(z, k);
    return k;
  }

  /** Largest monomial of a ZDD (0 for the constants). */
  zDegree(z: Node): number {
    const memo = new Map<Node, number>();
    const walk = (g: Node): number => {
      if (g < 2) return g === TRUE ? 0 : -Infinity;
      const known = memo.get(g);
      if (known !== undefined) return known;
      const d = Math.max(walk(this.los[g]!), walk(this.his[g]!) + 1);
      memo.set(g, d);
      return d;
    };
    return Math.max(0, walk(z));
  }

  /** Up to `limit` monomials of a ZDD, as masks in Combination positions. */
  zMembers(z: Node, limit: number): bigint[] {
    const out: bigint[] = [];
    const walk = (g: Node, m: bigint): void => {
      if (g === FALSE || out.length >= limit) return;
      if (g === TRUE) {
        out.push(m);
        return;
      }
      walk(this.los[g]!, m);
      walk(this.his[g]!, m | inputBit(this.n, this.vars[g]!));
    };
    walk(z, 0n);
    return out;
  }

  /** Literals over all monomials of a ZDD that fall on the inputs in `mask`. */
  zLiteralsIn(z: Node, mask: bigint): bigint {
    const memo = new Map<Node, bigint>();
    const walk = (g: Node): bigint => {
      if (g < 2) return 0n;
      const known = memo.get(g);
      if (known !== undefined) return known;
      const hi = this.his[g]!;
      const own = mask & inputBit(this.n, this.vars[g]!) ? this.zCount(hi) : 0n;
      const k = walk(this.los[g]!) + walk(hi) + own;
      memo.set(g, k);
      return k;
    };
    return walk(z);
  }

  /** The function whose algebraic normal form is the ZDD: the inverse of `anf`. */
  zToBdd(z: Node): Node {
    const memo = new Map<Node, Node>();
    const walk = (g: Node): Node => {
      if (g < 2) return g;
      const known = memo.get(g);
      if (known !== undefined) return known;
      const lo = walk(this.los[g]!);
      const r = this.mk(this.vars[g]!, lo, this.xor(lo, walk(this.his[g]!)));
      memo.set(g, r);
      return r;
    };
    return walk(z);
  }
}
