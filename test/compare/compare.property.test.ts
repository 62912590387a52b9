// The reported change sets against a brute-force comparison of both tables, row by row, on
// every combination, for random tables and random edits (input columns reordered too).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CHANGE_KINDS, compareTables, type ChangeKind } from '../../src/compare/index.js';
import { combinationsOf, tinyTable, type TinySpec } from './fixtures.js';

type Value = 'on' | 'off' | 'dc' | 'gap' | 'conflict';

/** What a table asks of output j where the inputs are as given (by header), read row by row. */
function valueAt(spec: TinySpec, j: number, at: Record<string, number>): Value {
  const asked = new Set<string>();
  for (const row of spec.rows) {
    const cells = row.replace('|', ' ').trim().split(/\s+/);
    const covers = spec.inputs.every((h, i) => cells[i] === '-' || Number(cells[i]) === at[h]);
    if (covers) asked.add(cells[spec.inputs.length + j]!);
  }
  if (asked.has('1') && asked.has('0')) return 'conflict';
  return asked.has('1') ? 'on' : asked.has('0') ? 'off' : asked.has('-') ? 'dc' : 'gap';
}

/** Brute force, safe value 0: each kind's combinations of the new table's inputs. */
function bruteForce(before: TinySpec, after: TinySpec, j: number): Record<ChangeKind, number[]> {
  const n = after.inputs.length;
  const out = Object.fromEntries(CHANGE_KINDS.map((k) => [k, [] as number[]])) as Record<ChangeKind, number[]>;
  for (let k = 0; k < 2 ** n; k++) {
    const at = Object.fromEntries(after.inputs.map((h, i) => [h, (k >>> (n - 1 - i)) & 1]));
    const o = valueAt(before, j, at);
    const v = valueAt(after, j, at);
    const resolved = (x: Value): 0 | 1 | '-' => (x === 'on' ? 1 : x === 'dc' ? '-' : 0);
    if (resolved(o) === 0 && resolved(v) === 1) out.nowPermits.push(k);
    if (resolved(o) === 1 && resolved(v) === 0) out.nowTrips.push(k);
    if ((o === 'dc') !== (v === 'dc')) out.dontCareChanged.push(k);
    if (v === 'gap' && o !== 'gap') out.gapsOpened.push(k);
    if (o === 'gap' && v !== 'gap') out.gapsClosed.push(k);
    if (v === 'conflict' && o !== 'conflict') out.conflictsNew.push(k);
    if (o === 'conflict' && v !== 'conflict') out.conflictsGone.push(k);
  }
  return out;
}

const INPUTS = ['In A', 'In B', 'In C', 'In D'];

const table = fc.integer({ min: 2, max: 4 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    outputs: fc.integer({ min: 1, max: 2 }),
    rows: fc.array(fc.tuple(fc.array(fc.constantFrom('0', '1', '-'), { minLength: n, maxLength: n }), fc.array(fc.constantFrom('0', '1', '-'), { minLength: 2, maxLength: 2 })), { minLength: 1, maxLength: 8 }),
  }),
);

type Edit = { kind: 'flip-output' | 'flip-input' | 'delete' | 'add' | 'swap'; row: number; col: number; value: string };
const edit = fc.record({
  kind: fc.constantFrom('flip-output', 'flip-input', 'delete', 'add', 'swap'),
  row: fc.nat(),
  col: fc.nat(),
  value: fc.constantFrom('0', '1', '-'),
}) as fc.Arbitrary<Edit>;

function applyEdits(rows: string[][][], edits: readonly Edit[], n: number): string[][][] {
  let out = rows.map(([i, o]) => [[...i!], [...o!]]);
  for (const e of edits) {
    const r = e.row % Math.max(1, out.length);
    if (e.kind === 'delete' && out.length > 1) out = out.filter((_, k) => k !== r);
    else if (e.kind === 'add') out.push([Array.from({ length: n }, (_, k) => (k === e.col % n ? e.value : '-')), [e.value, e.value]]);
    else if (e.kind === 'swap' && out.length > 1) [out[0], out[r]] = [out[r]!, out[0]!];
    else if (e.kind === 'flip-input' && out[r]) out[r]![0]![e.col % n] = e.value;
    else if (e.kind === 'flip-output' && out[r]) out[r]![1]![e.col % 2] = e.value;
  }
  return out;
}

const spec = (inputs: readonly string[], outputs: number, rows: string[][][]): TinySpec => ({
  sheet: 'Random',
  inputs,
  outputs: ['Out Y', 'Out Z'].slice(0, outputs),
  rows: rows.map(([i, o]) => `${i!.join(' ')} | ${o!.slice(0, outputs).join(' ')}`),
});

describe('the change sets equal a brute-force comparison of both tables', () => {
  it('for random tables, random row edits and the input columns in another order', () => {
    fc.assert(
      fc.property(table, fc.array(edit, { maxLength: 5 }), fc.boolean(), ({ n, outputs, rows }, edits, reverse) => {
        const inputs = INPUTS.slice(0, n);
        const before = spec(inputs, outputs, rows);
        const edited = applyEdits(rows, edits, n);
        // The new revision may hold its input columns in reverse order: same signals, other columns.
        const after = reverse
          ? spec([...inputs].reverse(), outputs, edited.map(([i, o]) => [[...i!].reverse(), o!]))
          : spec(inputs, outputs, edited);
        const c = compareTables(tinyTable(before), tinyTable(after));
        c.outputs.forEach((o, j) => {
          const expected = bruteForce(before, after, j);
          for (const kind of CHANGE_KINDS) {
            expect(combinationsOf(n, o.change![kind]), `${o.name} ${kind}`).toEqual(expected[kind]);
            expect(o.change![kind].count).toBe(expected[kind].length);
          }
        });
        const anyChange = c.outputs.some((o) => ['nowPermits', 'nowTrips', 'dontCareChanged'].some((k) => bruteForce(before, after, c.outputs.indexOf(o))[k as ChangeKind].length > 0));
        expect(c.changed).toBe(anyChange);
      }),
      { numRuns: 150 },
    );
  });
});
