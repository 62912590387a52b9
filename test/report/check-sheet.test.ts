import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { and, FALSE, not, or, variable, type Expr } from '../../src/logic/expr/ast.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { printSt } from '../../src/logic/expr/print-st.js';
import { checkImplementation } from '../../src/logic/implcheck.js';
import { verifyExpression, verifyImplementation } from '../../src/impl/verify.js';
import { CAUTION_LINES } from '../../src/report/caution.js';
import { checkSheet } from '../../src/report/check-sheet.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';
import type { SpecTable } from '../../src/table/types.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { capperTables, implementation } from '../impl/capper.js';
import { gridOf, tripRows } from '../workflow/workbooks.js';
import { GUARD, tinyTable, VOTE } from './fixtures.js';

const values = (block: SheetBlock) => block.rows.map((r) => r.map((c) => c?.value ?? null));
const rowsOf = (block: SheetBlock, first: string) => values(block).filter((r) => r[0] === first);

function expressionSheet(table: SpecTable, output: number, expression: string): SheetBlock {
  const parsed = parseExpression(expression, table.inputs);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return checkSheet({ kind: 'expression', table, expression, verdict: verifyExpression(table, output, parsed.value) });
}

/** The counterexample rows: from the column titles ('Expected (spec)' among them) to the next label. */
function counterexampleRows(block: SheetBlock, from = 0): (string | number | boolean | null)[][] {
  const all = values(block);
  const titles = all.findIndex((r, i) => i >= from && r.includes('Expected (spec)'));
  const out = [];
  for (let i = titles + 1; i < all.length && typeof all[i]![0] === 'number'; i++) out.push(all[i]!);
  return out;
}

describe('implementation check sheet', () => {
  const guard = tinyTable(GUARD);
  const stateful = verifyImplementation(capperTables().slice(0, 3), implementation('capper-cell-stateful.st'));
  const wrong = verifyImplementation(capperTables(), implementation('capper-cell-wrong.st'));

  it('opens with a title, then the caution line by line, for an expression and for a program', () => {
    for (const block of [expressionSheet(guard, 0, 'Guard_closed'), checkSheet({ kind: 'program', report: wrong })]) {
      expect(block.rows[0]![0]!.style).toBe('title');
      expect(block.rows.slice(1, 1 + CAUTION_LINES.length).map((r) => [r[0]!.value, r[0]!.style])).toEqual(CAUTION_LINES.map((l) => [l, 'caution']));
    }
  });

  it('names what was checked and the spec table, under a sheet name of at most 31 characters', () => {
    const block = expressionSheet(guard, 0, 'Two_hand_OK OR Guard_closed');
    expect(block.name).toBe('Guard logic check');
    expect(rowsOf(block, 'Checked')).toEqual([['Checked', 'an expression for output Motor permit']]);
    expect(rowsOf(block, 'Expression')).toEqual([['Expression', 'Two_hand_OK OR Guard_closed']]);
    expect(rowsOf(block, 'Spec table')).toEqual([['Spec table', "'Guard logic'!A1:E6"]]);
    const long = tinyTable({ ...GUARD, sheet: 'A very long sheet name for guards' });
    expect(expressionSheet(long, 0, 'Guard_closed').name.length).toBeLessThanOrEqual(31);
  });

  it('a differing expression lists every counterexample with its inputs, expected, actual and the spec row it contradicts, and the count', () => {
    const block = expressionSheet(guard, 0, 'Two_hand_OK OR Guard_closed');
    expect(rowsOf(block, 'Verdict')).toEqual([['Verdict', 'DIFFERS', 'differs on 2 of 8 combinations']]);
    expect(rowsOf(block, 'Counterexamples')).toEqual([['Counterexamples', 'all 2, unsafe first']]);
    const titles = values(block).find((r) => r.includes('Expected (spec)'));
    expect(titles).toEqual(['Guard closed', 'Two-hand OK', 'Mode (setup)', 'Expected (spec)', 'Actual (implementation)', 'Kind', 'Spec row it contradicts']);
    expect(counterexampleRows(block)).toEqual([
      [0, 1, 0, 0, 1, 'unsafe', "'Guard logic'!A4:E4 (output cell 'Guard logic'!D4)"],
      [1, 0, 0, 0, 1, 'unsafe', 'gap (no row covers it): safe value 0'],
    ]);
  });

  it('every counterexample of a check becomes one row, with the count beside (any implementation of the vote)', () => {
    const vote = tinyTable(VOTE);
    const inputs = vote.inputs.map((s, i) => variable(i, s.identifier));
    const minterm = (k: number): Expr => and(...inputs.map((v, i) => ((k >>> (2 - i)) & 1 ? v : not(v))));
    fc.assert(
      fc.property(fc.uniqueArray(fc.integer({ min: 0, max: 7 })), (on) => {
        const expr = on.length === 0 ? FALSE : or(...on.map(minterm));
        const block = checkSheet({ kind: 'expression', table: vote, expression: printSt(expr), verdict: verifyExpression(vote, 0, expr) });
        // The engine's own check of the expression, beside the sheet's rows.
        const check = checkImplementation(expr, vote.outputs[0]!.built.fn);
        const rows = counterexampleRows(block).map((r) => r.slice(0, 5));
        expect(rows).toEqual(check.counterexamples.map((c) => [...c.inputs, c.expected, c.actual]));
        expect(rowsOf(block, 'Verdict')[0]![2]).toBe(check.equal ? 'equal on all 8 combinations' : `differs on ${check.mismatchCount} of 8 combinations`);
      }),
    );
  });

  it('an equal expression writes the verdict and no counterexamples', () => {
    const block = expressionSheet(tinyTable(VOTE), 0, 'PS1 AND PS2 OR PS1 AND PS3 OR PS2 AND PS3');
    expect(rowsOf(block, 'Verdict')).toEqual([['Verdict', 'EQUAL', 'equal on all 8 combinations']]);
    expect(rowsOf(block, 'Counterexamples')).toEqual([]);
    expect(rowsOf(block, 'Detail: XOR of')).toEqual([]);
    expect(rowsOf(block, 'Unsafe combinations')).toEqual([]);
  });

  it("notes the don't-cares the expression turns on and the gaps it is checked against", () => {
    const block = expressionSheet(guard, 0, 'Two_hand_OK OR Guard_closed');
    expect(rowsOf(block, "Don't-care")).toEqual([["Don't-care", '3 combinations; the expression turns 2 of them ON (not counted as differences)']]);
    expect(rowsOf(block, 'Gaps')).toEqual([['Gaps', '1 combination no row covers; they take the safe value 0 and are checked against it']]);
  });

  it('prints the ANF monomials by which an expression differs as Structured Text product terms', () => {
    // Spec with its don't-cares at the expression's values: Guard·Two ⊕ Guard·Mode ⊕ Two·Mode;
    // expression Guard ⊕ Two ⊕ Guard·Two. Their XOR is Guard ⊕ Two ⊕ Guard·Mode ⊕ Two·Mode.
    const block = expressionSheet(guard, 0, 'Two_hand_OK OR Guard_closed');
    const all = values(block);
    const at = all.findIndex((r) => r[0] === 'Detail: XOR of');
    expect(all[at]).toEqual(['Detail: XOR of', '4 ANF monomials by which spec and implementation differ']);
    expect(all.slice(at + 1, at + 5)).toEqual([
      [null, 'Guard_closed'],
      [null, 'Two_hand_OK'],
      [null, 'Guard_closed AND Mode_setup'],
      [null, 'Two_hand_OK AND Mode_setup'],
    ]);
  });

  it('an expression checked at 40 inputs writes its exact counts and its counterexamples as 40 input cells', () => {
    const trip = readSpecTables(gridOf('Trip', tripRows())).tables[0]!;
    const block = expressionSheet(trip, 0, 'Cause_1 OR NOT Cause_2');
    // ON with every cause healthy (1 unsafe, against the last row, 43); OFF when Cause_1 = 0 and Cause_2 = 1 (2^38 spurious trips).
    expect(rowsOf(block, 'Verdict')).toEqual([['Verdict', 'DIFFERS', 'differs on 274877906945 of 1099511627776 combinations']]);
    expect(rowsOf(block, 'Unsafe combinations')[0]!.slice(0, 2)).toEqual(['Unsafe combinations', 1]);
    expect(rowsOf(block, 'Spurious trips')[0]!.slice(0, 2)).toEqual(['Spurious trips', 2 ** 38]);
    expect(counterexampleRows(block)[0]).toEqual([...Array(40).fill(0), 0, 1, 'unsafe', "Trip!A43:AO43 (output cell Trip!AO43)"]);
  });

  it('a program report writes each output\'s verdict and implementing variable, and the tally', () => {
    const block = checkSheet({ kind: 'program', report: wrong });
    expect(block.name).toBe('capper-cell-wrong check');
    expect(rowsOf(block, 'Verdict').map((r) => r[1])).toEqual(wrong.outputs.map((o) => (o.status === 'equal' ? 'EQUAL' : 'DIFFERS')));
    expect(rowsOf(block, 'Implementation')).toContainEqual(['Implementation', 'CapperCell.Head_lower_permit (line 49)']);
    expect(rowsOf(block, 'Result')).toEqual([['Result', '5 equal, 1 differ, 0 unchecked, 0 not found of 6 outputs']]);
  });

  it('a program report writes the counterexamples with the spec row cells they contradict, and the difference monomial', () => {
    const block = checkSheet({ kind: 'program', report: wrong });
    const head = values(block).findIndex((r) => r[0] === 'Output Head lower permit (Head_lower_permit)');
    expect(counterexampleRows(block, head)).toEqual([
      [1, 1, 0, 1, 1, 0, 1, 'unsafe', "'Chuck and feeder'!B30:J30 (output cell 'Chuck and feeder'!J30)"],
      [1, 1, 1, 1, 1, 0, 1, 'unsafe', "'Chuck and feeder'!B34:J34 (output cell 'Chuck and feeder'!J34)"],
    ]);
    expect(values(block)).toContainEqual([null, 'Cap_in_chuck AND Bottle_in_position AND Torque_reached AND Air_pressure_OK']);
  });

  it('a program report gives both counts per output and in all, the sentence of each side, and marks the unsafe ones', () => {
    const block = checkSheet({ kind: 'program', report: wrong });
    expect(rowsOf(block, 'Unsafe combinations')).toEqual([['Unsafe combinations', 2, 'the spec requires the safe value 0, the implementation gives 1']]);
    expect(rowsOf(block, 'Spurious trips')).toEqual([['Spurious trips', 0, 'the spec requires 1, the implementation holds the safe value 0']]);
    expect(rowsOf(block, 'Unsafe when')).toEqual([['Unsafe when', 'unsafe exactly when Cap_in_chuck = 1 AND Bottle_in_position = 1 AND Torque_reached = 1 AND Air_pressure_OK = 1']]);
    expect(rowsOf(block, 'Differences')).toEqual([['Differences', '2 unsafe combinations, 0 spurious trips in all']]);
    const styled = block.rows.flat().filter((c) => c?.style === 'unsafe').map((c) => c!.value);
    expect(styled).toEqual(['2 unsafe combinations, 0 spurious trips in all', 2, rowsOf(block, 'Unsafe when')[0]![1], 'unsafe', 'unsafe']);
  });

  it('a program report writes why each unchecked output was not checked, and what a truth table cannot judge', () => {
    const block = checkSheet({ kind: 'program', report: stateful });
    expect(rowsOf(block, 'Verdict').map((r) => r[1])).toEqual(['UNCHECKED', 'UNCHECKED', 'UNCHECKED', 'UNCHECKED', 'EQUAL']);
    const why = rowsOf(block, 'Why unchecked').map((r) => r[1]);
    expect(why).toContain('Spindle_run_permit feeds back into itself (seal-in / latch), read at line 22 (CapperStateful, line 22)');
    expect(why).toContain(
      "AirDebounce.Q is a member of the timer AirDebounce (TON), read at line 26: its value comes from the block's own state, not from this scan's inputs; map it to a spec input to take it as one (CapperStateful, line 26)",
    );
    expect(values(block)).toContainEqual(['What a truth table cannot judge (combinational logic only)']);
    expect(values(block)).toContainEqual(['CapperStateful line 22: seal-in: Spindle_run_permit feeds back into itself (seal-in / latch), read at line 22']);
  });
});
