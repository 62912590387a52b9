// An independent concrete interpreter of generated programs (it reads the AST, never text, and
// imports nothing from src/impl). One scan of the PROGRAM per input combination.
//
// What the scan starts from: the PROGRAM's inputs from the combination; variables that nothing
// ever writes (constants, initialised locals left alone) at their initial values; VAR_TEMP at
// its initial value on every call. Everything that some statement writes (outputs, locals,
// instance variables) and a timer's elapsed time are state: their value at the start of a scan
// is whatever earlier scans left. The interpreter tries every such value that the scan reads
// before writing, and calls an output's value known only when all of them agree.
import { mainPou, type BExpr, type CallValue, type Pou, type Program, type Stmt } from './ast.js';
import { inputValues, specValue, type GenSpec } from './spec.js';

export type Value = boolean | number;
/** An output's value after the scan: known, or depending on state from earlier scans. */
export type Outcome = 0 | 1 | 'state';

const low = (s: string): string => s.toLowerCase();

class NeedBit extends Error {
  constructor(readonly path: string) {
    super(`state ${path}`);
  }
}

/** Too many state bits read in one scan to try them all. */
export class TooManyStates extends Error {}

interface Frame {
  readonly pou: Pou;
  readonly path: string;
  /** VAR_IN_OUT parameters: the caller's location each one stands for. */
  readonly refs: ReadonlyMap<string, string>;
}

type DeclInfo = { section: string; constant: boolean; type: string; init?: string };
const declTables = new WeakMap<Pou, Map<string, DeclInfo>>();

function declOf(pou: Pou, name: string): DeclInfo | undefined {
  let table = declTables.get(pou);
  if (!table) {
    table = new Map();
    for (const b of pou.blocks) {
      for (const d of b.decls) {
        if (!table.has(low(d.name))) table.set(low(d.name), { section: b.section, constant: b.constant === true, type: d.type, ...(d.init !== undefined ? { init: d.init } : {}) });
      }
    }
    declTables.set(pou, table);
  }
  return table.get(low(name));
}

function initialValue(type: string, init: string | undefined): Value {
  if (type.toUpperCase() === 'INT') return init === undefined ? 0 : Number(init);
  return init !== undefined && /^(TRUE|1|BOOL#TRUE|BOOL#1)$/i.test(init);
}

function walk(stmts: readonly Stmt[], visit: (s: Stmt) => void): void {
  for (const s of stmts) {
    visit(s);
    if (s.k === 'if') {
      s.arms.forEach((a) => walk(a.body, visit));
      if (s.otherwise) walk(s.otherwise, visit);
    } else if (s.k === 'case') {
      s.arms.forEach((a) => walk(a.body, visit));
      if (s.otherwise) walk(s.otherwise, visit);
    }
  }
}

const writtenTables = new WeakMap<Program, Map<string, Set<string>>>();

/** Names (lower case) of a POU's variables that some statement of the program may write. */
function writtenNames(program: Program): Map<string, Set<string>> {
  const known = writtenTables.get(program);
  if (known) return known;
  const out = new Map<string, Set<string>>(program.pous.map((p) => [low(p.name), new Set<string>()]));
  for (const pou of program.pous) {
    const own = out.get(low(pou.name))!;
    const stmts = [...pou.body, ...pou.actions.flatMap((a) => a.body)];
    walk(stmts, (s) => {
      if (s.k === 'assign') own.add(low(s.target));
      if (s.k === 'call') {
        s.inOuts.forEach((x) => own.add(low(x.target)));
        s.outputs.forEach((x) => own.add(low(x.target)));
        const type = declOf(pou, s.inst)?.type ?? '';
        const callee = out.get(low(type));
        s.inputs.forEach((x) => callee?.add(low(x.param)));
      }
    });
  }
  writtenTables.set(program, out);
  return out;
}

class Scan {
  private readonly store = new Map<string, Value>();
  private steps = 0;

  constructor(
    private readonly program: Program,
    private readonly written: Map<string, Set<string>>,
    /** Values of state bits chosen so far; a bit not in it stops the scan with NeedBit. */
    private readonly state: ReadonlyMap<string, boolean>,
  ) {}

  run(inputs: ReadonlyMap<string, boolean>, names: readonly string[]): Map<string, Value> {
    const main = mainPou(this.program);
    const frame: Frame = { pou: main, path: low(main.name), refs: new Map() };
    for (const [name, v] of inputs) this.store.set(`${frame.path}.${low(name)}`, v);
    this.enter(frame);
    this.exec(frame, main.body);
    return new Map(names.map((name) => [low(name), this.read(frame, name)]));
  }

  /** VAR_TEMP starts from its initial value on every call. */
  private enter(frame: Frame): void {
    for (const b of frame.pou.blocks) {
      if (b.section === 'VAR_TEMP') for (const d of b.decls) this.store.set(this.where(frame, d.name), initialValue(d.type, d.init));
    }
  }

  private where(frame: Frame, name: string): string {
    return frame.refs.get(low(name)) ?? `${frame.path}.${low(name)}`;
  }

  /** The POU and variable a location belongs to, to find its declaration. */
  private ownerOf(path: string): { pou: Pou | undefined; name: string; type: string } {
    const parts = path.split('.');
    const name = parts[parts.length - 1]!;
    let pou: Pou | undefined = mainPou(this.program);
    for (const inst of parts.slice(1, -1)) {
      const type: string = pou ? (declOf(pou, inst)?.type ?? '') : '';
      pou = this.program.pous.find((p) => low(p.name) === low(type));
    }
    return { pou, name, type: pou ? (declOf(pou, name)?.type ?? 'BOOL') : 'BOOL' };
  }

  private readPath(path: string): Value {
    const now = this.store.get(path);
    if (now !== undefined) return now;
    const { pou, name, type } = this.ownerOf(path);
    const d = pou ? declOf(pou, name) : undefined;
    const everWritten = !pou || this.written.get(low(pou.name))!.has(name);
    if (d && !d.constant && everWritten) return this.stateBit(path);
    if (!d && !pou) return this.stateBit(path); // a timer's member
    return initialValue(type, d?.init);
  }

  private stateBit(path: string): boolean {
    const v = this.state.get(path);
    if (v === undefined) throw new NeedBit(path);
    return v;
  }

  private read(frame: Frame, name: string): Value {
    return this.readPath(this.where(frame, name));
  }

  private bool(frame: Frame, e: BExpr): boolean {
    switch (e.k) {
      case 'const':
        return e.v;
      case 'ref':
        return this.read(frame, e.name) === true;
      case 'member':
        return this.readPath(`${this.where(frame, e.inst)}.${low(e.field)}`) === true;
      case 'fcall':
        return this.callFunction(frame, e);
      case 'not':
        return !this.bool(frame, e.a);
      case 'and':
        return e.args.map((a) => this.bool(frame, a)).every(Boolean);
      case 'or':
        return e.args.map((a) => this.bool(frame, a)).some(Boolean);
      case 'xor':
        return e.args.map((a) => this.bool(frame, a)).filter(Boolean).length % 2 === 1;
    }
  }

  private exec(frame: Frame, stmts: readonly Stmt[]): void {
    for (const s of stmts) {
      if (++this.steps > 100_000) throw new Error('interpreter: runaway program');
      switch (s.k) {
        case 'assign':
          this.store.set(this.where(frame, s.target), this.bool(frame, s.value));
          break;
        case 'if': {
          const arm = s.arms.find((a) => this.bool(frame, a.cond));
          this.exec(frame, arm ? arm.body : (s.otherwise ?? []));
          break;
        }
        case 'case': {
          const sel = this.read(frame, s.selector);
          const arm = s.arms.find((a) => a.labels.includes(Number(sel)));
          this.exec(frame, arm ? arm.body : (s.otherwise ?? []));
          break;
        }
        case 'action': {
          const action = frame.pou.actions.find((a) => low(a.name) === low(s.name));
          if (!action) throw new Error(`interpreter: no action ${s.name}`);
          this.exec(frame, action.body);
          break;
        }
        case 'call':
          this.call(frame, s);
          break;
      }
    }
  }

  /** A FUNCTION: its inputs set from the arguments, its body run in a frame of its own, its result read. */
  private callFunction(frame: Frame, e: Extract<BExpr, { k: 'fcall' }>): boolean {
    const fn = this.program.pous.find((p) => p.kind === 'FUNCTION' && low(p.name) === low(e.fn));
    if (!fn) throw new Error(`interpreter: no function ${e.fn}`);
    const params = fn.blocks.filter((b) => b.section === 'VAR_INPUT').flatMap((b) => b.decls);
    const args = e.args.map((a) => this.bool(frame, a));
    const inner: Frame = { pou: fn, path: `${low(fn.name)}#${++this.steps}`, refs: new Map() };
    params.forEach((p, i) => this.store.set(`${inner.path}.${low(p.name)}`, args[i] ?? false));
    this.enter(inner);
    this.exec(inner, fn.body);
    const result = this.store.get(`${inner.path}.${low(fn.name)}`);
    if (result === undefined) throw new Error(`interpreter: ${fn.name} assigns no result`);
    return result === true;
  }

  private value(frame: Frame, v: CallValue): Value | undefined {
    return v.k === 'literal' ? undefined : this.bool(frame, v);
  }

  private call(frame: Frame, s: Extract<Stmt, { k: 'call' }>): void {
    const instPath = this.where(frame, s.inst);
    const type = declOf(frame.pou, s.inst)?.type ?? '';
    // Arguments are evaluated in the caller before the block runs.
    const args = s.inputs.map((a) => [low(a.param), this.value(frame, a.value)] as const);
    if (type.toUpperCase() === 'TON') {
      const input = args.find(([p]) => p === 'in')?.[1];
      if (input !== undefined) this.store.set(`${instPath}.in`, input);
      const inNow = this.readPath(`${instPath}.in`) === true;
      // Q: IN has been TRUE for PT; how long it has been TRUE is state.
      this.store.set(`${instPath}.q`, inNow && this.stateBit(`${instPath}#elapsed`));
      return;
    }
    const fb = this.program.pous.find((p) => low(p.name) === low(type));
    if (!fb) throw new Error(`interpreter: ${s.inst} is not an instance of a known block`);
    for (const [p, v] of args) if (v !== undefined) this.store.set(`${instPath}.${p}`, v);
    const refs = new Map(s.inOuts.map((x) => [low(x.param), this.where(frame, x.target)]));
    const inner: Frame = { pou: fb, path: instPath, refs };
    this.enter(inner);
    this.exec(inner, fb.body);
    for (const o of s.outputs) this.store.set(this.where(frame, o.target), this.readPath(`${instPath}.${low(o.param)}`));
  }
}

/** Most state bits one combination may read before the program is set aside. */
const MAX_RUNS = 1024;

/** The end value of the PROGRAM's variables `names` on one input combination. */
export function scanOutcomes(program: Program, inputs: ReadonlyMap<string, boolean>, names: readonly string[]): Map<string, Outcome> {
  const written = writtenNames(program);
  const seen = new Map<string, Set<boolean>>();
  let runs = 0;
  const explore = (state: Map<string, boolean>): void => {
    if (++runs > MAX_RUNS) throw new TooManyStates(`more than ${MAX_RUNS} states to try`);
    let result: Map<string, Value>;
    try {
      result = new Scan(program, written, state).run(inputs, names);
    } catch (e) {
      if (!(e instanceof NeedBit)) throw e;
      explore(new Map(state).set(e.path, false));
      explore(new Map(state).set(e.path, true));
      return;
    }
    for (const [name, v] of result) {
      const set = seen.get(name) ?? new Set<boolean>();
      set.add(v === true);
      seen.set(name, set);
    }
  };
  explore(new Map());
  return new Map([...seen].map(([name, set]) => [name, set.size === 2 ? 'state' : set.has(true) ? 1 : 0]));
}

/** Per spec output: the program's outcome on every combination (the output found by name). */
export function outcomeTable(program: Program, spec: GenSpec): Outcome[][] {
  const n = spec.inputs.length;
  const main = mainPou(program);
  const inputNames = main.blocks.filter((b) => b.section === 'VAR_INPUT').flatMap((b) => b.decls.map((d) => d.name));
  const table: Outcome[][] = spec.outputs.map(() => []);
  for (let k = 0; k < 2 ** n; k++) {
    const values = inputValues(n, k);
    const inputs = new Map<string, boolean>();
    for (const name of inputNames) {
      const i = spec.inputs.findIndex((s) => low(s) === low(name));
      inputs.set(name, i >= 0 ? values[i]! : false);
    }
    // Spec inputs read as a member or element: that location holds the input's value.
    for (const [input, path] of Object.entries(program.inputPaths ?? {})) inputs.set(path, values[spec.inputs.indexOf(input)]!);
    const out = scanOutcomes(program, inputs, spec.outputs);
    spec.outputs.forEach((o, j) => table[j]!.push(out.get(low(o)) ?? 0));
  }
  return table;
}

export interface Expected {
  /** equal: every care combination agrees; differs: some known value disagrees; state: no known disagreement, but some care combination depends on state. */
  readonly verdict: 'equal' | 'differs' | 'state';
  /** Combinations where the known value disagrees with the spec (gaps at the safe value). */
  readonly mismatches: ReadonlyMap<number, { expected: 0 | 1; actual: 0 | 1 }>;
  readonly outcomes: readonly Outcome[];
}

export function expectedVerdicts(program: Program, spec: GenSpec): Expected[] {
  const table = outcomeTable(program, spec);
  return spec.outputs.map((_, o) => {
    const mismatches = new Map<number, { expected: 0 | 1; actual: 0 | 1 }>();
    let unknown = false;
    table[o]!.forEach((got, k) => {
      const want = specValue(spec, o, k);
      if (want === '-') return;
      if (got === 'state') unknown = true;
      else if (got !== want) mismatches.set(k, { expected: want, actual: got });
    });
    return { verdict: mismatches.size > 0 ? 'differs' : unknown ? 'state' : 'equal', mismatches, outcomes: table[o]! };
  });
}
