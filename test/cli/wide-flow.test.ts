// Tables of 40 and 64 inputs through the whole command line, as a table of 8 inputs goes:
// results workbook (results sheet and test record, no live check), the hand-over pack (ST,
// PLCopen XML with ST and LD bodies, ladder pictures, steps), and verify of what was exported
// (EQUAL) and of a program with one wrong literal (DIFFERS, the count exact).
import { readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import XLSX from 'xlsx';
import { beforeAll, describe, expect, it } from 'vitest';
import { parseXml } from '../../src/impl/xml.js';
import type { CellValue } from '../../src/table/types.js';
import { andPermitTable, orTripTable } from '../../bench/wide.bench.js';
import { runCli, scratch } from './run-cli.js';

const csvOf = (rows: readonly (readonly CellValue[])[]): string => rows.map((r) => r.join(',')).join('\n') + '\n';

const names = (n: number, stem: string): string[] => Array.from({ length: n }, (_, i) => `${stem}${i + 1}`);

/**
 * A 64-input table of cubes: Run = In1·In2·In64 + NOT In1·In33 (invented). Rows: the two ON
 * cubes and two OFF cubes; In1 = 1, In2 = 1, In64 = 0 is a gap (2^61 combinations, safe value 0).
 */
function cubeTable64(): CellValue[][] {
  const inputs = names(64, 'In');
  const row = (set: Record<number, 0 | 1>, out: 0 | 1): CellValue[] => [...inputs.map((_, i) => set[i + 1] ?? '-'), out];
  return [
    [...inputs.map(() => 'input'), 'output'],
    [...inputs, 'Run'],
    row({ 1: 1, 2: 1, 64: 1 }, 1),
    row({ 1: 0, 33: 1 }, 1),
    row({ 1: 1, 2: 0 }, 0),
    row({ 1: 0, 33: 0 }, 0),
  ];
}

/** A program block of the spec's signals with one assignment. */
function program(inputs: readonly string[], output: string, expression: string): string {
  return [
    'FUNCTION_BLOCK Hand_written',
    'VAR_INPUT',
    ...inputs.map((s) => `  ${s} : BOOL;`),
    'END_VAR',
    `VAR_OUTPUT ${output} : BOOL; END_VAR`,
    `${output} := ${expression};`,
    'END_FUNCTION_BLOCK',
    '',
  ].join('\n');
}

interface Shape {
  readonly name: string;
  readonly rows: CellValue[][];
  readonly n: number;
  readonly output: string;
  /** A hand-written program with one wrong literal, the exact number of combinations where it differs, and how many of them are unsafe (safe value 0: the program ON where the spec requires OFF). */
  readonly wrong: { readonly text: string; readonly count: string; readonly unsafe: string };
}

const causes = names(40, 'Cause_');
const conds = names(40, 'Cond_');
const ins = names(64, 'In');
const SHAPES: Shape[] = [
  {
    name: 'the OR of 40 causes',
    rows: orTripTable(40),
    n: 40,
    output: 'Trip',
    // NOT Cause_40 for Cause_40: wrong at all causes 0 (trips: ON where OFF is required, unsafe)
    // and at Cause_40 alone (does not trip: a spurious trip by the safe-value rule).
    wrong: { text: program(causes, 'Trip', [...causes.slice(0, 39), 'NOT Cause_40'].join(' OR ')), count: '2', unsafe: '1' },
  },
  {
    name: 'the AND of 40 conditions',
    rows: andPermitTable(40),
    n: 40,
    output: 'Permit',
    // NOT Cond_17: wrong at all conditions 1 (OFF where ON is required: spurious trip) and at
    // all but Cond_17 (ON where OFF is required: unsafe).
    wrong: { text: program(conds, 'Permit', conds.map((c) => (c === 'Cond_17' ? 'NOT Cond_17' : c)).join(' AND ')), count: '2', unsafe: '1' },
  },
  {
    name: 'a 64-input cube table',
    rows: cubeTable64(),
    n: 64,
    output: 'Run',
    // NOT In33 for In33: wrong on every combination with In1 = 0, half of all 2^64; unsafe
    // (program ON, spec OFF) where also In33 = 0, a quarter of all.
    wrong: { text: program(ins, 'Run', '(In1 AND In2 AND In64) OR (NOT In1 AND NOT In33)'), count: String(2n ** 63n), unsafe: String(2n ** 62n) },
  },
];

describe.each(SHAPES)('$name through the command line', (shape) => {
  const dir = scratch();
  const stem = `wide${shape.n}-${shape.output}`;
  const file = join(dir, `${stem}.csv`);
  const at = (f: string): string => join(dir, f);
  beforeAll(async () => {
    writeFileSync(file, csvOf(shape.rows));
    const exported = await runCli('export', file, '--st', at('out.st'), '--plcopen', at('out.xml'), '--svg', at('svg'), '--steps', at('steps.csv'));
    expect(exported.code, exported.err).toBe(0);
    expect((await runCli('export', file, '--ld', '--plcopen', at('ld.xml'))).code).toBe(0);
  });

  it('writes a results workbook with its results sheet and test record, the live check left out', async () => {
    const run = await runCli('analyze', file, '-o', at('out.xlsx'));
    expect(run.code, run.err).toBe(0);
    const book = XLSX.read(readFileSync(at('out.xlsx')));
    expect(book.SheetNames).toEqual([stem, `${stem} results`, `${stem} record`]);
    const cells = (sheet: string): unknown[][] => XLSX.utils.sheet_to_json(book.Sheets[sheet]!, { header: 1, raw: true });
    const results = cells(`${stem} results`).flat().map(String);
    expect(results.some((c) => c.startsWith(`Live check left out: ${shape.n} inputs give ${2n ** BigInt(shape.n)} combinations`))).toBe(true);
    expect(results).toContain(`${2n ** BigInt(shape.n)} combinations checked, 0 mismatches`);
    const record = cells(`${stem} record`);
    const steps = record.filter((r) => typeof r[1] === 'string' && r[1].startsWith('T-'));
    expect(steps.length).toBeGreaterThan(0);
    for (const r of steps) expect(r[1]).toMatch(new RegExp(`^T-[01]{${shape.n}}$`));
    const note = record.flat().map(String).find((c) => c.includes('the unique-cause selection of each AND/OR form'));
    expect(note).toMatch(new RegExp(`^${steps.length} steps for ${shape.n} inputs`));
    // The record command reads the record back against the table: current, every step still to run.
    const judged = await runCli('record', at('out.xlsx'), '--json');
    const [r] = JSON.parse(judged.out).records;
    expect(r).toMatchObject({ current: true, passed: 0, failed: 0, notRun: steps.length, problems: [] });
  });

  it('writes Structured Text and PLCopen XML that verify reads back EQUAL to the table', async () => {
    for (const impl of ['out.st', 'out.xml', 'ld.xml']) {
      const run = await runCli('verify', file, '--impl', at(impl));
      expect(run.out, impl).toContain(`EQUAL  ${shape.output}`);
      expect(run.out).toContain(`equal on all ${2n ** BigInt(shape.n)} combinations`);
      expect(run.code, impl).toBe(0);
    }
  });

  it('writes a ladder picture that is well-formed SVG with the form in its title', () => {
    const [svg] = readdirSync(at('svg'));
    const text = readFileSync(join(at('svg'), svg!), 'utf8');
    const parsed = parseXml(text);
    expect(parsed.ok).toBe(true);
    expect(text).toMatch(new RegExp(`<title>${shape.output} \\(${shape.output}\\) := `));
    const words = [...text.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].map((m) => m[1]).join(' ');
    expect(words).toContain('(proven minimum).');
  });

  it('writes the test steps CSV with the same steps as the record, one per test that matters', () => {
    const lines = readFileSync(at('steps.csv'), 'utf8').split('\r\n').filter((l) => /^\d+,T-/.test(l));
    expect(lines.length).toBeGreaterThan(0);
    expect(lines.length).toBeLessThanOrEqual(3 * shape.n + 1);
  });

  it('finds a hand-written program with one wrong literal DIFFERS, with the exact count', async () => {
    writeFileSync(at('wrong.st'), shape.wrong.text);
    const run = await runCli('verify', file, '--impl', at('wrong.st'), '--json');
    expect(run.code).toBe(1);
    const [out] = JSON.parse(run.out).outputs;
    expect(out).toMatchObject({ status: 'differs', mismatchCount: shape.n === 64 ? shape.wrong.count : Number(shape.wrong.count) });
    expect(out.combinations).toBe(shape.n === 64 ? String(2n ** 64n) : 2 ** shape.n);
    const spurious = String(BigInt(shape.wrong.count) - BigInt(shape.wrong.unsafe));
    expect([String(out.unsafeCount), String(out.spuriousTripCount)]).toEqual([shape.wrong.unsafe, spurious]);
    expect(out.unsafeWhen.sentence).toMatch(/^unsafe exactly when /);
    for (const c of out.counterexamples) {
      expect(c.inputs).toHaveLength(shape.n);
      expect(c.expected).not.toBe(c.actual);
      expect(c.kind).toBe(c.actual === 1 ? 'unsafe' : 'spurious-trip');
    }
    const kinds = out.counterexamples.map((c: { kind: string }) => c.kind);
    expect(kinds).toEqual([...kinds].sort((a, b) => (a === 'unsafe' ? 0 : 1) - (b === 'unsafe' ? 0 : 1)));
    const text = await runCli('verify', file, '--impl', at('wrong.st'));
    expect(text.out).toContain(`differs on ${shape.wrong.count} of ${2n ** BigInt(shape.n)} combinations`);
  });
});

describe('a table of more than 64 inputs', () => {
  it('is one error at the header row, nothing analysed', async () => {
    const inputs = names(65, 'In');
    const file = join(scratch(), 'wide65.csv');
    writeFileSync(file, csvOf([[...inputs.map(() => 'input'), 'output'], [...inputs, 'Y'], [...inputs.map(() => 1), 1]]));
    const run = await runCli('analyze', file, '--json');
    expect(run.code).toBe(1);
    const doc = JSON.parse(run.out);
    expect(doc.tables).toEqual([]);
    const errors = doc.problems.filter((p: { severity: string }) => p.severity === 'error');
    expect(errors).toEqual([expect.objectContaining({ cell: 'A2:BM2', message: expect.stringMatching(/65 inputs: at most 64/) })]);
  });
});
