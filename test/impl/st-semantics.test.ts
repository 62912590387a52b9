// A verdict is never stronger than what was read: whenever the reader judges an output (gives
// it an expression), that expression must equal what one scan of the program computes, for
// every input combination and every value the program's memory may hold from before. Random
// programs (assignments, nested IF / ELSIF / ELSE, constants, initialised and plain locals)
// are run here by a direct interpreter and compared.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { printSt } from '../../src/logic/expr/print-st.js';
import { variable, type Expr } from '../../src/logic/expr/ast.js';
import { varsOf } from '../../src/impl/expr-dag.js';
import { readStFile } from '../../src/impl/st-reader.js';

/** a, b: VAR_INPUT; k: CONSTANT TRUE; i: VAR := TRUE never written; t, u: VAR; q, r: VAR_OUTPUT. */
const NAMES = ['a', 'b', 'k', 'i', 't', 'u', 'q', 'r'] as const;
const WRITABLE = ['t', 'u', 'q', 'r'] as const;
const INPUTS = ['a', 'b'];
const MEMORY = ['t', 'u', 'q', 'r'];

type Stmt = { kind: 'set'; target: string; value: Expr } | { kind: 'if'; branches: { cond: Expr | null; body: Stmt[] }[] };

const exprAt = (depth: number): fc.Arbitrary<Expr> =>
  depth === 0
    ? fc.oneof(fc.integer({ min: 0, max: NAMES.length - 1 }).map((i) => variable(i, NAMES[i]!)), fc.boolean().map((v) => ({ kind: 'const' as const, value: v })))
    : fc.oneof(
        exprAt(0),
        exprAt(depth - 1).map((e) => ({ kind: 'not' as const, arg: e })),
        fc.tuple(fc.constantFrom('and' as const, 'or' as const, 'xor' as const), exprAt(depth - 1), exprAt(depth - 1)).map(([kind, x, y]) => ({ kind, args: [x, y] })),
      );

const stmtsAt = (depth: number): fc.Arbitrary<Stmt[]> => {
  const set = fc.record({ kind: fc.constant('set' as const), target: fc.constantFrom(...WRITABLE), value: exprAt(2) });
  if (depth === 0) return fc.array(set, { minLength: 1, maxLength: 3 });
  const branch = fc.record({ cond: exprAt(1), body: stmtsAt(depth - 1) });
  const ifs = fc
    .tuple(fc.array(branch, { minLength: 1, maxLength: 3 }), fc.option(stmtsAt(depth - 1), { nil: undefined }))
    .map(([bs, otherwise]) => ({ kind: 'if' as const, branches: otherwise ? [...bs, { cond: null, body: otherwise }] : bs }));
  return fc.array(fc.oneof(set, ifs), { minLength: 1, maxLength: 4 });
};

function print(stmts: readonly Stmt[]): string {
  return stmts
    .map((s) =>
      s.kind === 'set'
        ? `${s.target} := ${printSt(s.value)};`
        : s.branches.map((b, i) => (b.cond === null ? `ELSE\n${print(b.body)}` : `${i === 0 ? 'IF' : 'ELSIF'} ${printSt(b.cond)} THEN\n${print(b.body)}`)).join('\n') + '\nEND_IF;',
    )
    .join('\n');
}

function evaluate(e: Expr, env: Map<string, boolean>): boolean {
  switch (e.kind) {
    case 'const':
      return e.value;
    case 'var':
      return env.get(e.name)!;
    case 'not':
      return !evaluate(e.arg, env);
    default: {
      const vs = e.args.map((a) => evaluate(a, env));
      return e.kind === 'and' ? vs.every(Boolean) : e.kind === 'or' ? vs.some(Boolean) : vs.reduce((x, y) => x !== y, false);
    }
  }
}

function run(stmts: readonly Stmt[], env: Map<string, boolean>): void {
  for (const s of stmts) {
    if (s.kind === 'set') env.set(s.target, evaluate(s.value, env));
    else {
      const taken = s.branches.find((b) => b.cond === null || evaluate(b.cond, env));
      if (taken) run(taken.body, env);
    }
  }
}

describe('Structured Text reader: judged outputs match a direct run of the scan', () => {
  it('for random programs, every input combination and every previous state', () => {
    fc.assert(
      fc.property(stmtsAt(2), (stmts) => {
        const text = `PROGRAM P
VAR_INPUT a, b : BOOL; END_VAR
VAR_OUTPUT q, r : BOOL; END_VAR
VAR CONSTANT k : BOOL := TRUE; END_VAR
VAR i : BOOL := TRUE; t, u : BOOL; END_VAR
${print(stmts)}
END_PROGRAM`;
        const read = readStFile('random.st', text);
        if (!read.ok) throw new Error(read.error.message);
        const pou = read.value.pous[0]!;
        for (const out of pou.outputs) {
          // Judged: an expression that uses no undriven read (verify leaves those unchecked).
          const undriven = new Set(pou.undriven.map((u) => u.name));
          if (!out.expr || varsOf(out.expr).some((j) => undriven.has(pou.inputs[j]!))) continue;
          expect(varsOf(out.expr).map((j) => pou.inputs[j]!).every((n) => INPUTS.includes(n)), text).toBe(true);
          for (let k = 0; k < 1 << (INPUTS.length + MEMORY.length); k++) {
            const env = new Map<string, boolean>([['k', true], ['i', true]]);
            [...INPUTS, ...MEMORY].forEach((n, j) => env.set(n, ((k >> j) & 1) === 1));
            // The reader's variables carry the program's names.
            const claimed = evaluate(out.expr, env);
            run(stmts, env);
            expect(claimed, `${out.name}\n${text}`).toBe(env.get(out.name));
          }
        }
      }),
      { numRuns: 400 },
    );
  });
});
