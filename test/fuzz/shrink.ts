// Greedy shrinking of a failing case: drop rows, outputs, unused inputs, statements, branches,
// declarations and POUs, simplify expressions and the file format, as long as the case still
// fails the same way. What is left is the smallest program that shows the contradiction.
import { FALSE_E, TRUE_E, type BExpr, type Pou, type Program, type Stmt } from './ast.js';
import type { FuzzCase } from './generate.js';
import { refsOf } from './generate.js';

const low = (s: string): string => s.toLowerCase();

/** Every name a program mentions (references, targets, instances, selectors, types, actions). */
function mentioned(pous: readonly Pou[]): Set<string> {
  const names = new Set<string>();
  const e = (x: BExpr): void => {
    refsOf(x).forEach((n) => names.add(low(n)));
    const members = (y: BExpr): void => {
      if (y.k === 'member') names.add(low(y.inst));
      else if (y.k === 'fcall') (names.add(low(y.fn)), y.args.forEach(members));
      else if (y.k === 'not') members(y.a);
      else if (y.k === 'and' || y.k === 'or' || y.k === 'xor') y.args.forEach(members);
    };
    members(x);
  };
  const stmts = (list: readonly Stmt[]): void => {
    for (const s of list) {
      if (s.k === 'assign') (names.add(low(s.target)), e(s.value));
      else if (s.k === 'if') s.arms.forEach((a) => (e(a.cond), stmts(a.body)));
      else if (s.k === 'case') (names.add(low(s.selector)), s.arms.forEach((a) => stmts(a.body)));
      else if (s.k === 'call') {
        names.add(low(s.inst));
        // The block's parameters a call names stay declared in the block.
        [...s.inputs, ...s.inOuts, ...s.outputs].forEach((a) => names.add(low(a.param)));
        s.inputs.forEach((a) => a.value.k !== 'literal' && e(a.value));
        s.inOuts.forEach((a) => names.add(low(a.target)));
        s.outputs.forEach((a) => names.add(low(a.target)));
      } else names.add(low(s.name));
      if ((s.k === 'if' || s.k === 'case') && s.otherwise) stmts(s.otherwise);
    }
  };
  for (const p of pous) {
    stmts(p.body);
    p.actions.forEach((a) => stmts(a.body));
    p.blocks.forEach((b) => b.decls.forEach((d) => names.add(low(d.type))));
  }
  return names;
}

/** Smaller versions of a list of statements: one statement dropped, or one replaced by a smaller one. */
function* smallerStmts(list: readonly Stmt[]): Generator<Stmt[]> {
  for (let i = 0; i < list.length; i++) yield [...list.slice(0, i), ...list.slice(i + 1)];
  for (let i = 0; i < list.length; i++) {
    const s = list[i]!;
    const put = (replacement: readonly Stmt[]): Stmt[] => [...list.slice(0, i), ...replacement, ...list.slice(i + 1)];
    if (s.k === 'if' || s.k === 'case') {
      for (const arm of s.arms) yield put(arm.body);
      if (s.otherwise) yield put(s.otherwise);
    }
    if (s.k === 'if') {
      if (s.arms.length > 1) for (let a = 0; a < s.arms.length; a++) yield put([{ ...s, arms: s.arms.filter((_, j) => j !== a) }]);
      if (s.otherwise) yield put([{ k: 'if', arms: s.arms }]);
      for (let a = 0; a < s.arms.length; a++) {
        for (const cond of smallerExprs(s.arms[a]!.cond)) yield put([{ ...s, arms: s.arms.map((x, j) => (j === a ? { ...x, cond } : x)) }]);
        for (const body of smallerStmts(s.arms[a]!.body)) yield put([{ ...s, arms: s.arms.map((x, j) => (j === a ? { ...x, body } : x)) }]);
      }
      if (s.otherwise) for (const otherwise of smallerStmts(s.otherwise)) yield put([{ ...s, otherwise }]);
    }
    if (s.k === 'case') {
      for (let a = 0; a < s.arms.length; a++) for (const body of smallerStmts(s.arms[a]!.body)) yield put([{ ...s, arms: s.arms.map((x, j) => (j === a ? { ...x, body } : x)) }]);
      if (s.otherwise) for (const otherwise of smallerStmts(s.otherwise)) yield put([{ ...s, otherwise }]);
    }
    if (s.k === 'assign') for (const value of smallerExprs(s.value)) yield put([{ ...s, value }]);
    if (s.k === 'call') {
      for (let a = 0; a < s.inputs.length; a++) {
        const v = s.inputs[a]!.value;
        if (v.k === 'literal') continue;
        for (const value of smallerExprs(v)) yield put([{ ...s, inputs: s.inputs.map((x, j) => (j === a ? { ...x, value } : x)) }]);
      }
      for (let a = 0; a < s.outputs.length; a++) yield put([{ ...s, outputs: s.outputs.filter((_, j) => j !== a) }]);
      for (let a = 0; a < s.inputs.length; a++) yield put([{ ...s, inputs: s.inputs.filter((_, j) => j !== a) }]);
    }
  }
}

function* smallerExprs(e: BExpr): Generator<BExpr> {
  if (e.k !== 'const') {
    yield FALSE_E;
    yield TRUE_E;
  }
  if (e.k === 'not') {
    yield e.a;
    for (const a of smallerExprs(e.a)) yield { k: 'not', a };
  }
  if (e.k === 'and' || e.k === 'or' || e.k === 'xor') {
    yield* e.args;
    if (e.args.length > 2) for (let i = 0; i < e.args.length; i++) yield { k: e.k, args: e.args.filter((_, j) => j !== i) };
    for (let i = 0; i < e.args.length; i++) for (const a of smallerExprs(e.args[i]!)) yield { k: e.k, args: e.args.map((x, j) => (j === i ? a : x)) };
  }
}

function* smallerPrograms(p: Program): Generator<Program> {
  if (p.xhtml === 'mixed') yield { ...p, xhtml: 'plain' };
  if (p.format === 'xml') yield { ...p, format: 'st', xhtml: 'plain' };
  const used = mentioned(p.pous);
  const main = p.pous.length - 1;
  for (let i = 0; i < main; i++) if (!used.has(low(p.pous[i]!.name))) yield { ...p, pous: p.pous.filter((_, j) => j !== i) };
  for (let i = 0; i < p.pous.length; i++) {
    const pou = p.pous[i]!;
    const with_ = (q: Pou): Program => ({ ...p, pous: p.pous.map((x, j) => (j === i ? q : x)) });
    for (const a of pou.actions) if (!used.has(low(a.name))) yield with_({ ...pou, actions: pou.actions.filter((x) => x !== a) });
    for (const body of smallerStmts(pou.body)) yield with_({ ...pou, body });
    for (let a = 0; a < pou.actions.length; a++) {
      for (const body of smallerStmts(pou.actions[a]!.body)) yield with_({ ...pou, actions: pou.actions.map((x, j) => (j === a ? { ...x, body } : x)) });
    }
    // Declarations nothing mentions (a PROGRAM's inputs stay: the spec names them).
    for (let b = 0; b < pou.blocks.length; b++) {
      const block = pou.blocks[b]!;
      if (i === main && block.section === 'VAR_INPUT') continue;
      for (const d of block.decls) {
        if (used.has(low(d.name))) continue;
        const decls = block.decls.filter((x) => x !== d);
        yield with_({ ...pou, blocks: decls.length > 0 ? pou.blocks.map((x, j) => (j === b ? { ...x, decls } : x)) : pou.blocks.filter((_, j) => j !== b) });
      }
    }
  }
}

function* smallerCases(c: FuzzCase): Generator<FuzzCase> {
  const { spec, program } = c;
  for (let r = 0; r < spec.rows.length && spec.rows.length > 1; r++) yield { ...c, spec: { ...spec, rows: spec.rows.filter((_, j) => j !== r) } };
  if (spec.outputs.length > 1) {
    for (let o = 0; o < spec.outputs.length; o++) {
      const keep = (_: unknown, j: number): boolean => j !== o;
      yield { ...c, spec: { ...spec, outputs: spec.outputs.filter(keep), safe: spec.safe.filter(keep), rows: spec.rows.map((r) => ({ ...r, outputs: r.outputs.filter(keep) })) } };
    }
  }
  const used = mentioned(program.pous);
  if (spec.inputs.length > 1) {
    for (let i = 0; i < spec.inputs.length; i++) {
      const name = low(spec.inputs[i]!);
      if (used.has(name)) continue;
      const keep = (_: unknown, j: number): boolean => j !== i;
      const rows = spec.rows.filter((r) => r.inputs[i] !== '1').map((r) => ({ ...r, inputs: r.inputs.filter(keep) }));
      if (rows.length === 0) continue;
      const pous = program.pous.map((p, j) =>
        j < program.pous.length - 1 ? p : { ...p, blocks: p.blocks.map((b) => (b.section === 'VAR_INPUT' ? { ...b, decls: b.decls.filter((d) => low(d.name) !== name) } : b)).filter((b) => b.decls.length > 0) },
      );
      yield { ...c, spec: { ...spec, inputs: spec.inputs.filter(keep), rows }, program: { ...program, pous } };
    }
  }
  for (let r = 0; r < spec.rows.length; r++) {
    for (let i = 0; i < spec.rows[r]!.outputs.length; i++) {
      if (spec.rows[r]!.outputs[i] === '-') continue;
      yield { ...c, spec: { ...spec, rows: spec.rows.map((row, j) => (j === r ? { ...row, outputs: row.outputs.map((x, k) => (k === i ? '-' : x)) } : row)) } };
    }
  }
  if (spec.cells === 'booleans') yield { ...c, spec: { ...spec, cells: 'numbers' } };
  for (const p of smallerPrograms(program)) yield { ...c, program: p };
}

/** The smallest case found for which `fails` still holds (at most `budget` tries). */
export function shrink(c: FuzzCase, fails: (c: FuzzCase) => boolean, budget = 4000): FuzzCase {
  let best = c;
  let tries = 0;
  for (let progress = true; progress && tries < budget; ) {
    progress = false;
    for (const candidate of smallerCases(best)) {
      if (++tries > budget) break;
      let failing = false;
      try {
        failing = fails(candidate);
      } catch {
        failing = false; // a candidate the generator would never make (a conflict, a dangling name)
      }
      if (failing) {
        best = candidate;
        progress = true;
        break;
      }
    }
  }
  return best;
}
