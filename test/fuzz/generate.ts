// Random programs for a random spec table, in the styles PLC programmers write. Most are
// written from the spec's own rows (so they should be equal), some are then mutated, some use
// constructs a truth table cannot judge. The interpreter, not the generator, says what each
// program computes: the generator only keeps track of what it used (features).
import { FALSE_E, TRUE_E, nary, notE, ref, type Action, type BExpr, type Decl, type Feature, type Pou, type Program, type Stmt, type VarBlock } from './ast.js';
import { Prng } from './prng.js';
import { generateSpec, type GenSpec } from './spec.js';

export interface FuzzCase {
  readonly seed: number;
  readonly spec: GenSpec;
  readonly program: Program;
}

const low = (s: string): string => s.toLowerCase();

/** Replace each reference by what `f` gives (constants and members stay). */
export function mapRefs(e: BExpr, f: (name: string) => BExpr): BExpr {
  switch (e.k) {
    case 'ref':
      return f(e.name);
    case 'not':
      return notE(mapRefs(e.a, f));
    case 'fcall':
      return { ...e, args: e.args.map((a) => mapRefs(a, f)) };
    case 'and':
    case 'or':
    case 'xor':
      return { k: e.k, args: e.args.map((a) => mapRefs(a, f)) };
    default:
      return e;
  }
}

export function refsOf(e: BExpr, into: Set<string> = new Set()): Set<string> {
  if (e.k === 'ref') into.add(e.name);
  else if (e.k === 'not') refsOf(e.a, into);
  else if (e.k === 'and' || e.k === 'or' || e.k === 'xor' || e.k === 'fcall') e.args.forEach((a) => refsOf(a, into));
  return into;
}

type Style = 'plain' | 'locals' | 'if' | 'case' | 'fb' | 'in-out' | 'action' | 'last-wins' | 'seal-in' | 'timer';

const STYLES: readonly [Style, number][] = [
  ['plain', 3],
  ['locals', 2],
  ['if', 3],
  ['case', 1],
  ['fb', 2],
  ['in-out', 2],
  ['action', 2],
  ['last-wins', 2],
  ['seal-in', 0.6],
  ['timer', 0.6],
];

function weighted<T>(rng: Prng, items: readonly [T, number][]): T {
  const total = items.reduce((s, [, w]) => s + w, 0);
  let r = rng.next() * total;
  for (const [item, w] of items) if ((r -= w) < 0) return item;
  return items[items.length - 1]![0];
}

/** Builds the PROGRAM (and its function blocks) for one spec. */
class Builder {
  readonly features = new Set<Feature>();
  private readonly consts: Decl[] = [];
  private readonly locals: Decl[] = [];
  private readonly temps: Decl[] = [];
  private readonly actions: Action[] = [];
  private readonly fbs: Pou[] = [];
  private readonly tail: Stmt[] = [];
  private serial = 0;
  /** Share of references spelt in another case (most programs keep the declared spelling). */
  private readonly caseVaried: number;

  constructor(
    private readonly rng: Prng,
    private readonly spec: GenSpec,
  ) {
    this.caseVaried = rng.chance(0.15) ? 0.15 : 0;
  }

  private fresh(prefix: string): string {
    return `${prefix}${++this.serial}`;
  }

  /** A spec input as the program spells it (ST names are not case-sensitive). */
  input(i: number): BExpr {
    const name = this.spec.inputs[i]!;
    if (!this.rng.chance(this.caseVaried)) return ref(name);
    this.features.add('case-varied');
    return ref(this.rng.chance(0.5) ? name.toLowerCase() : name.toUpperCase());
  }

  private term(cells: readonly string[]): BExpr {
    const lits = cells.flatMap((c, i) => (c === '-' ? [] : [c === '1' ? this.input(i) : notE(this.input(i))]));
    return nary('and', lits);
  }

  /** The output written from the spec: OR of its 1 rows, or NOT of the OR of its 0 rows. */
  fromRows(o: number): BExpr {
    const ones = this.spec.rows.filter((r) => r.outputs[o] === '1');
    const zeros = this.spec.rows.filter((r) => r.outputs[o] === '0');
    const fromZeros = this.spec.safe[o] === 1 ? !this.rng.chance(0.25) : this.rng.chance(0.25);
    if (fromZeros) {
      this.features.add('from-0-rows');
      return notE(nary('or', zeros.map((r) => this.term(r.inputs))));
    }
    return nary('or', ones.map((r) => this.term(r.inputs)));
  }

  randomExpr(depth: number): BExpr {
    const n = this.spec.inputs.length;
    if (depth <= 0 || this.rng.chance(0.3)) {
      const leaf = this.input(this.rng.int(0, n - 1));
      return this.rng.chance(0.3) ? notE(leaf) : leaf;
    }
    const k = this.rng.pick(['and', 'or', 'or', 'and', 'xor'] as const);
    return { k, args: Array.from({ length: this.rng.int(2, 3) }, () => this.randomExpr(depth - 1)) };
  }

  /** Sometimes AND a constant TRUE or OR a constant FALSE onto a value: the same function. */
  private decorated(f: BExpr): BExpr {
    if (!this.rng.chance(0.25)) return f;
    const on = this.rng.chance(0.5);
    const name = this.constant(on);
    return on ? nary('and', [f, ref(name)]) : nary('or', [f, ref(name)]);
  }

  /** A named TRUE/FALSE that nothing writes: a VAR CONSTANT or an initialised local. */
  private constant(value: boolean): string {
    const name = this.fresh(value ? 'K_on' : 'K_off');
    const decl: Decl = { name, type: 'BOOL', init: value ? 'TRUE' : 'FALSE' };
    if (this.rng.chance(0.5)) {
      this.consts.push(decl);
      this.features.add('constant');
    } else {
      this.locals.push(decl);
      this.features.add('init-local');
    }
    return name;
  }

  /** Statements that leave `f` in `y`, in one style. */
  emit(y: string, f: BExpr, out: Stmt[], allowed: readonly [Style, number][] = STYLES): void {
    const style = weighted(this.rng, allowed);
    const v = this.decorated(f);
    const compound = (v.k === 'and' || v.k === 'or' || v.k === 'xor') && v.args.length >= 2;
    switch (style) {
      case 'plain':
        out.push({ k: 'assign', target: y, value: v });
        return;
      case 'locals': {
        this.features.add('locals');
        if (!compound) {
          const t = this.local();
          out.push({ k: 'assign', target: t, value: v.k === 'not' ? v.a : v }, { k: 'assign', target: y, value: v.k === 'not' ? notE(ref(t)) : ref(t) });
          return;
        }
        const args = (v as { args: readonly BExpr[] }).args;
        const cut = this.rng.int(1, args.length - 1);
        const t1 = this.local();
        const t2 = this.local();
        const op = v.k as 'and' | 'or' | 'xor';
        out.push(
          { k: 'assign', target: t1, value: nary(op, args.slice(0, cut)) },
          { k: 'assign', target: t2, value: nary(op, args.slice(cut)) },
          { k: 'assign', target: y, value: { k: op, args: [ref(t1), ref(t2)] } },
        );
        return;
      }
      case 'if': {
        this.features.add('if');
        const how = this.rng.int(0, 3);
        if (how === 0 && v.k === 'or') {
          out.push({ k: 'if', arms: v.args.map((t) => ({ cond: t, body: [{ k: 'assign', target: y, value: TRUE_E }] })), otherwise: [{ k: 'assign', target: y, value: FALSE_E }] });
        } else if (how === 1) {
          this.features.add('last-wins');
          out.push({ k: 'assign', target: y, value: FALSE_E }, { k: 'if', arms: [{ cond: v, body: [{ k: 'assign', target: y, value: TRUE_E }] }] });
        } else if (how === 2) {
          const x = this.spec.inputs[this.rng.int(0, this.spec.inputs.length - 1)]!;
          const at = (b: boolean): BExpr => mapRefs(v, (name) => (low(name) === low(x) ? { k: 'const', v: b } : ref(name)));
          out.push({ k: 'if', arms: [{ cond: ref(x), body: [{ k: 'assign', target: y, value: at(true) }] }], otherwise: [{ k: 'assign', target: y, value: at(false) }] });
        } else {
          out.push({ k: 'if', arms: [{ cond: notE(v), body: [{ k: 'assign', target: y, value: FALSE_E }] }], otherwise: [{ k: 'assign', target: y, value: TRUE_E }] });
        }
        return;
      }
      case 'case': {
        this.features.add('case');
        const sel = this.fresh('Sel');
        const chosen = this.rng.int(1, 3);
        this.consts.push({ name: sel, type: 'INT', init: String(chosen) });
        const other = chosen === 3 ? 1 : chosen + 1;
        const arms = [
          { labels: [chosen], body: [{ k: 'assign' as const, target: y, value: v }] },
          { labels: [other], body: [{ k: 'assign' as const, target: y, value: this.randomExpr(2) }] },
        ];
        out.push({ k: 'case', selector: sel, arms: this.rng.chance(0.5) ? arms : [arms[1]!, arms[0]!], otherwise: [{ k: 'assign', target: y, value: this.randomExpr(1) }] });
        return;
      }
      case 'fb': {
        this.features.add('fb');
        const { inst, params, bodies } = this.block(v);
        const fb = this.fbs[this.fbs.length - 1]!;
        this.fbs[this.fbs.length - 1] = { ...fb, blocks: [...fb.blocks, { section: 'VAR_OUTPUT', decls: [{ name: 'Q', type: 'BOOL' }] }], body: [{ k: 'assign', target: 'Q', value: bodies[0]! }] };
        if (this.rng.chance(0.5)) {
          out.push({ k: 'call', inst, inputs: params, inOuts: [], outputs: [] }, { k: 'assign', target: y, value: { k: 'member', inst, field: 'Q' } });
        } else {
          out.push({ k: 'call', inst, inputs: params, inOuts: [], outputs: [{ param: 'Q', target: y }] });
        }
        return;
      }
      case 'in-out': {
        this.features.add('in-out');
        const { before, inside, op } = this.split(v);
        const { inst, params, bodies } = this.block(inside);
        const fb = this.fbs[this.fbs.length - 1]!;
        const write: BExpr = op ? { k: op, args: [ref('IO'), bodies[0]!] } : bodies[0]!;
        this.fbs[this.fbs.length - 1] = { ...fb, blocks: [...fb.blocks, { section: 'VAR_IN_OUT', decls: [{ name: 'IO', type: 'BOOL' }] }], body: [{ k: 'assign', target: 'IO', value: write }] };
        out.push({ k: 'assign', target: y, value: before }, { k: 'call', inst, inputs: params, inOuts: [{ param: 'IO', target: y }], outputs: [] });
        return;
      }
      case 'action': {
        this.features.add('action');
        const name = this.fresh('Calc');
        const body: Stmt[] = [];
        this.emit(y, v, body, STYLES.filter(([s]) => s === 'plain' || s === 'locals' || s === 'if' || s === 'last-wins'));
        this.actions.push({ name, body });
        if (this.rng.chance(0.5)) {
          this.features.add('last-wins');
          out.push({ k: 'assign', target: y, value: FALSE_E });
        }
        out.push({ k: 'action', name });
        return;
      }
      case 'last-wins':
        this.features.add('last-wins');
        out.push({ k: 'assign', target: y, value: this.rng.chance(0.5) ? notE(v) : this.randomExpr(2) });
        this.tail.push({ k: 'assign', target: y, value: v });
        return;
      case 'seal-in': {
        this.features.add('seal-in');
        const hold = this.input(this.rng.int(0, this.spec.inputs.length - 1));
        if (this.rng.chance(0.5)) out.push({ k: 'assign', target: y, value: nary('or', [v, nary('and', [ref(y), hold])]) });
        else out.push({ k: 'if', arms: [{ cond: v, body: [{ k: 'assign', target: y, value: TRUE_E }] }, { cond: notE(hold), body: [{ k: 'assign', target: y, value: FALSE_E }] }] });
        return;
      }
      case 'timer': {
        this.features.add('timer');
        const t = this.fresh('Delay');
        this.locals.push({ name: t, type: 'TON' });
        out.push({ k: 'call', inst: t, inputs: [{ param: 'IN', value: this.randomExpr(1) }, { param: 'PT', value: { k: 'literal', text: 'T#500ms' } }], inOuts: [], outputs: [] });
        const q: BExpr = { k: 'member', inst: t, field: 'Q' };
        out.push({ k: 'assign', target: y, value: this.rng.chance(0.5) ? nary('and', [v, q]) : nary('or', [v, q]) });
        return;
      }
    }
  }

  private local(): string {
    const name = this.fresh('Tmp');
    if (this.rng.chance(0.3)) {
      this.temps.push({ name, type: 'BOOL' });
      this.features.add('temp');
    } else this.locals.push({ name, type: 'BOOL' });
    return name;
  }

  /**
   * A new function block type with one VAR_INPUT per program variable the expressions read,
   * and an instance of it: the expressions rewritten over the block's inputs, and the call's
   * parameters.
   */
  private block(...es: BExpr[]): { inst: string; params: { param: string; value: BExpr }[]; bodies: BExpr[] } {
    const type = this.fresh('FbPart');
    const inst = type.replace('FbPart', 'Part');
    const read = new Set<string>();
    es.forEach((e) => refsOf(e, read));
    const names = [...new Map([...read].map((n) => [low(n), n])).values()];
    const param = new Map(names.map((n, i) => [low(n), `IN${i + 1}`]));
    const bodies = es.map((e) => mapRefs(e, (n) => ref(param.get(low(n))!)));
    this.locals.push({ name: inst, type });
    const inputs: VarBlock[] = names.length > 0 ? [{ section: 'VAR_INPUT', decls: names.map((_, i) => ({ name: `IN${i + 1}`, type: 'BOOL' })) }] : [];
    this.fbs.push({ kind: 'FUNCTION_BLOCK', name: type, blocks: inputs, actions: [], body: [] });
    return { inst, params: names.map((n, i) => ({ param: `IN${i + 1}`, value: ref(n) })), bodies };
  }

  /** `f` as a part computed before a call and a part an in-out parameter combines onto it. */
  private split(f: BExpr): { before: BExpr; inside: BExpr; op?: 'and' | 'or' | 'xor' } {
    if ((f.k === 'and' || f.k === 'or' || f.k === 'xor') && f.args.length >= 2) {
      const cut = this.rng.int(1, f.args.length - 1);
      return { before: nary(f.k, f.args.slice(0, cut)), inside: nary(f.k, f.args.slice(cut)), op: f.k };
    }
    return { before: this.randomExpr(1), inside: f };
  }

  /**
   * Two outputs through one block: `y0 := part; Inst(IN1 := a, IO := y0); y1 := Inst.Q;`,
   * the block writing its in-out from the rest of y0 and its output Q from y1.
   */
  emitPair(y0: string, f0: BExpr, y1: string, f1: BExpr, out: Stmt[]): void {
    this.features.add('in-out').add('fb');
    const { before, inside, op } = this.split(f0);
    const { inst, params, bodies } = this.block(inside, f1);
    const fb = this.fbs[this.fbs.length - 1]!;
    const io: BExpr = op ? { k: op, args: [ref('IO'), bodies[0]!] } : bodies[0]!;
    this.fbs[this.fbs.length - 1] = {
      ...fb,
      blocks: [...fb.blocks, { section: 'VAR_OUTPUT', decls: [{ name: 'Q', type: 'BOOL' }] }, { section: 'VAR_IN_OUT', decls: [{ name: 'IO', type: 'BOOL' }] }],
      body: [{ k: 'assign', target: 'IO', value: io }, { k: 'assign', target: 'Q', value: bodies[1]! }],
    };
    out.push(
      { k: 'assign', target: y0, value: before },
      { k: 'call', inst, inputs: params, inOuts: [{ param: 'IO', target: y0 }], outputs: [] },
      { k: 'assign', target: y1, value: { k: 'member', inst, field: 'Q' } },
    );
  }

  finish(body: Stmt[]): Pou[] {
    const blocks: VarBlock[] = [
      { section: 'VAR_INPUT', decls: this.spec.inputs.map((name) => ({ name, type: 'BOOL' })) },
      { section: 'VAR_OUTPUT', decls: this.spec.outputs.map((name) => ({ name, type: 'BOOL' })) },
    ];
    if (this.consts.length > 0) blocks.push({ section: 'VAR', constant: true, decls: this.consts });
    if (this.locals.length > 0) blocks.push({ section: 'VAR', decls: this.locals });
    if (this.temps.length > 0) blocks.push({ section: 'VAR_TEMP', decls: this.temps });
    return [...this.fbs, { kind: 'PROGRAM', name: 'FuzzMain', blocks, actions: this.actions, body: [...body, ...this.tail] }];
  }
}

/** Declare one spec input the program reads as a constant (or an initialised local) instead. */
function inputAsConstant(rng: Prng, pous: Pou[], features: Set<Feature>): Pou[] {
  const main = pous[pous.length - 1]!;
  const inputs = main.blocks.find((b) => b.section === 'VAR_INPUT')!;
  const read = new Set<string>();
  eachExpr([main], (e) => (refsOf(e, read), e));
  const candidates = inputs.decls.filter((d) => [...read].some((r) => low(r) === low(d.name)));
  if (candidates.length === 0) return pous;
  const victim = rng.pick(candidates);
  const constant = rng.chance(0.6);
  features.add(constant ? 'constant-as-input' : 'init-local-as-input');
  const decl: Decl = { name: victim.name, type: 'BOOL', init: rng.chance(0.5) ? 'TRUE' : 'FALSE' };
  const blocks: VarBlock[] = main.blocks.map((b) => (b === inputs ? { ...b, decls: b.decls.filter((d) => d !== victim) } : b));
  blocks.push({ section: 'VAR', ...(constant ? { constant: true } : {}), decls: [decl] });
  return [...pous.slice(0, -1), { ...main, blocks: blocks.filter((b) => b.decls.length > 0) }];
}

/** Change one expression somewhere in the program (a literal, an operator, an operand). */
export function mutate(rng: Prng, pous: readonly Pou[]): Pou[] {
  let total = 0;
  const countIn = (e: BExpr): void => {
    total++;
    if (e.k === 'not') countIn(e.a);
    else if (e.k === 'and' || e.k === 'or' || e.k === 'xor') e.args.forEach(countIn);
  };
  eachExpr(pous, (e) => (countIn(e), e));
  if (total === 0) return [...pous];
  let target = rng.int(0, total - 1);
  const change = (e: BExpr): BExpr => {
    const r = rng.int(0, 3);
    if (e.k === 'and' || e.k === 'or' || e.k === 'xor') {
      if (r === 0 && e.args.length > 2) return { k: e.k, args: e.args.slice(1) };
      return { k: e.k === 'and' ? 'or' : e.k === 'or' ? 'xor' : 'and', args: e.args };
    }
    if (e.k === 'const') return { k: 'const', v: !e.v };
    return r < 2 ? notE(e) : e.k === 'not' ? e.a : notE(e);
  };
  const go = (e: BExpr): BExpr => {
    if (target-- === 0) return change(e);
    if (e.k === 'not') return notE(go(e.a));
    if (e.k === 'and' || e.k === 'or' || e.k === 'xor') return { k: e.k, args: e.args.map(go) };
    return e;
  };
  return eachExpr(pous, go);
}

/** Rebuild the POUs with every top-level expression passed through `f`, in a fixed order. */
export function eachExpr(pous: readonly Pou[], f: (e: BExpr) => BExpr): Pou[] {
  const stmts = (list: readonly Stmt[]): Stmt[] =>
    list.map((s): Stmt => {
      switch (s.k) {
        case 'assign':
          return { ...s, value: f(s.value) };
        case 'if':
          return { ...s, arms: s.arms.map((a) => ({ cond: f(a.cond), body: stmts(a.body) })), ...(s.otherwise ? { otherwise: stmts(s.otherwise) } : {}) };
        case 'case':
          return { ...s, arms: s.arms.map((a) => ({ labels: a.labels, body: stmts(a.body) })), ...(s.otherwise ? { otherwise: stmts(s.otherwise) } : {}) };
        case 'call':
          return { ...s, inputs: s.inputs.map((a) => ({ param: a.param, value: a.value.k === 'literal' ? a.value : f(a.value) })) };
        case 'action':
          return s;
      }
    });
  return pous.map((p) => ({ ...p, body: stmts(p.body), actions: p.actions.map((a) => ({ name: a.name, body: stmts(a.body) })) }));
}

/** One spec table and one program for it, all from one seed. */
export function generateCase(seed: number): FuzzCase {
  const rng = new Prng(seed);
  const spec = generateSpec(rng);
  const b = new Builder(rng, spec);
  const random = rng.chance(0.1);
  if (random) b.features.add('random');
  const body: Stmt[] = [];
  const targets = spec.outputs.map((y, o) => ({ y, f: random ? b.randomExpr(3) : b.fromRows(o) }));
  for (let o = 0; o < targets.length; o++) {
    const [t, next] = [targets[o]!, targets[o + 1]];
    if (next && rng.chance(0.15)) {
      b.emitPair(t.y, t.f, next.y, next.f, body);
      o++;
    } else b.emit(t.y, t.f, body);
  }
  let pous = b.finish(body);
  if (rng.chance(0.12)) pous = inputAsConstant(rng, pous, b.features);
  if (rng.chance(0.3)) {
    pous = mutate(rng, pous);
    b.features.add('mutated');
  }
  const xml = rng.chance(0.35);
  const mixed = xml && rng.chance(0.5);
  if (xml) b.features.add('xml');
  if (mixed) b.features.add('mixed-xhtml');
  const mixSeed = rng.seed();
  // Its own generator, so that the cases of a seed stay what they were before this style.
  const paths = new Prng(seed ^ 0x2545f491);
  const read: { pous: Pou[]; extra?: Pick<Program, 'inputPaths' | 'struct'> } = paths.chance(0.25) ? inputsAsPaths(paths, pous, b.features) : { pous };
  if (paths.chance(0.2)) read.pous = asFunctions(paths, read.pous, b.features);
  const program: Program = { pous: read.pous, format: xml ? 'xml' : 'st', xhtml: mixed ? 'mixed' : 'plain', mixSeed, features: [...b.features].sort(), ...read.extra };
  return { seed, spec, program };
}

/**
 * Some spec inputs read by the PROGRAM as members of a structure `io` or elements of an array
 * `aIn` (both VAR_INPUT) instead of plain VAR_INPUTs; the check maps them to the spec inputs.
 */
/**
 * Some top-level assignments of the PROGRAM written as a call of a FUNCTION of the program
 * (`y := Fn1(a, b);`, the function `Fn1 := X1 AND NOT X2;` over its VAR_INPUTs).
 */
function asFunctions(rng: Prng, pous: Pou[], features: Set<Feature>): Pou[] {
  const main = pous[pous.length - 1]!;
  const fns: Pou[] = [];
  const body = main.body.map((s): Stmt => {
    if (s.k !== 'assign' || !rng.chance(0.5)) return s;
    const names = [...new Map([...refsOf(s.value)].map((n) => [low(n), n])).values()];
    if (names.length === 0) return s;
    const fn = `Fn${fns.length + 1}`;
    const param = new Map(names.map((n, i) => [low(n), `X${i + 1}`]));
    fns.push({
      kind: 'FUNCTION',
      name: fn,
      blocks: [{ section: 'VAR_INPUT', decls: names.map((_, i) => ({ name: `X${i + 1}`, type: 'BOOL' })) }],
      actions: [],
      body: [{ k: 'assign', target: fn, value: mapRefs(s.value, (n) => ref(param.get(low(n))!)) }],
    });
    return { ...s, value: { k: 'fcall', fn, args: names.map((n) => ref(n)) } };
  });
  if (fns.length === 0) return pous;
  features.add('function');
  return [...fns, ...pous.slice(0, -1), { ...main, body }];
}

function inputsAsPaths(rng: Prng, pous: Pou[], features: Set<Feature>): { pous: Pou[]; extra?: Pick<Program, 'inputPaths' | 'struct'> } {
  const main = pous[pous.length - 1]!;
  const inputs = main.blocks.find((b) => b.section === 'VAR_INPUT');
  if (!inputs) return { pous };
  const members: string[] = [];
  const elements: string[] = [];
  for (const d of inputs.decls) {
    const r = rng.next();
    if (r < 0.4) members.push(d.name);
    else if (r < 0.8) elements.push(d.name);
  }
  if (members.length + elements.length === 0) return { pous };
  if (members.length > 0) features.add('member-input');
  if (elements.length > 0) features.add('element-input');
  const offset = rng.int(0, 2);
  const pathOf = (name: string): string | undefined => {
    const m = members.find((x) => low(x) === low(name));
    if (m !== undefined) return `io.${name}`;
    const e = elements.findIndex((x) => low(x) === low(name));
    return e >= 0 ? `aIn[${e + offset}]` : undefined;
  };
  const kept = inputs.decls.filter((d) => pathOf(d.name) === undefined);
  const declared: Decl[] = [
    ...kept,
    ...(members.length > 0 ? [{ name: 'io', type: 'ST_FuzzIn' }] : []),
    ...(elements.length > 0 ? [{ name: 'aIn', type: `ARRAY [${offset}..${offset + elements.length - 1}] OF BOOL` }] : []),
  ];
  const blocks = main.blocks.map((b) => (b === inputs ? { ...b, decls: declared } : b));
  const [rewritten] = eachExpr([{ ...main, blocks }], (e) => mapRefs(e, (name) => ref(pathOf(name) ?? name)));
  const inputPaths = Object.fromEntries([...members, ...elements].map((name) => [name, pathOf(name)!]));
  return { pous: [...pous.slice(0, -1), rewritten!], extra: { inputPaths, ...(members.length > 0 ? { struct: { name: 'ST_FuzzIn', members } } : {}) } };
}
