// `analyze` on the sample workbooks: the forms a controls engineer works out by hand from
// each table, checked against the JSON document, the report, the exit status and -o.
import { execFile } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { promisify } from 'node:util';
import XLSX from 'xlsx';
import { beforeAll, describe, expect, it } from 'vitest';
import { has } from '../../src/logic/bits.js';
import { parseExpression } from '../../src/logic/expr/parse.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import type { OutputJson, TableJson } from '../../src/report/analysis-json.js';
import { capperCell, type SampleTable } from '../../sample-workbooks/source/capper-cell.js';
import { BROKEN, CAPPER, CSV, runCli, scratch, type Run } from './run-cli.js';

interface Doc {
  tables: TableJson[];
  problems: { severity: string; sheet: string; cell: string; message: string }[];
}

const sourceTables: SampleTable[] = capperCell.sheets.flatMap((s) => s.tables);

/** What the source rows ask of output j at combination k: 1, 0, '-' or undefined (no row). */
function asked(table: SampleTable, j: number, k: number): '1' | '0' | '-' | undefined {
  const n = table.inputs.length;
  const values = new Set<string>();
  for (const row of table.rows) {
    const [left, right] = row.split('|');
    const pattern = left!.trim().split(/\s+/);
    const covers = pattern.every((ch, i) => ch === '-' || Number(ch) === ((k >> (n - 1 - i)) & 1));
    if (covers) values.add(right!.trim().split(/\s+/)[j]!);
  }
  if (values.has('1') && values.has('0')) throw new Error('the sample source has a conflict');
  return values.has('1') ? '1' : values.has('0') ? '0' : values.has('-') ? '-' : undefined;
}

function output(doc: Doc, sheet: string, name: string): OutputJson {
  const o = doc.tables.filter((t) => t.sheet === sheet).flatMap((t) => t.outputs).find((x) => x.name === name);
  if (!o) throw new Error(`no output ${name} on ${sheet}`);
  return o;
}

describe('analyze --json on the capper cell workbook', () => {
  let run: Run;
  let doc: Doc;
  beforeAll(async () => {
    run = await runCli('analyze', CAPPER, '--json');
    doc = JSON.parse(run.out) as Doc;
  });

  it('exits 0 and prints nothing but the JSON document on stdout', () => {
    expect(run.code).toBe(0);
    expect(Object.keys(doc)).toEqual(['tables', 'problems']);
    expect(doc.tables.map((t) => `${t.sheet}!${t.range}`)).toEqual([
      'Spindle!A3:H13',
      'Spindle!A16:D25',
      'Chuck and feeder!B2:J34',
      'Channels!A1:G16',
    ]);
  });

  it('spindle permit: e-stop, air and either all guards closed outside setup, or jog (the jog-in-automatic don\'t-care absorbed)', () => {
    const o = output(doc, 'Spindle', 'Spindle run permit');
    // Worked by hand: ON = ES.AIR.GA.GB.LC.!SETUP.!JOG + ES.AIR.SETUP.JOG, don't-care ES.AIR.!SETUP.JOG.
    // The don't-care lets the second term drop SETUP and the first drop !JOG: 2 terms, 6 + 3 literals.
    expect(o.andOr).toBe(
      '(Guard_door_A_closed AND Guard_door_B_closed AND Light_curtain_clear AND E_stop_healthy AND Air_pressure_OK AND NOT Mode_setup) OR (E_stop_healthy AND Air_pressure_OK AND Jog_pressed)',
    );
    expect([o.proven, o.terms, o.literals]).toEqual([true, 2, 9]);
    // XOR form with the don't-care at 0: ES.AIR.GA.GB.LC.(1+SETUP)(1+JOG) + ES.AIR.SETUP.JOG = 5 monomials.
    expect(o.xorTerms).toBe(5);
    // E-stop, air, automatic, jog pressed: 2^3 guard combinations turned on.
    expect(o.permitsAlsoCount).toBe(8);
    expect(o.permitsAlso.every((p) => /^[01]{3}1101$/.test(p))).toBe(true);
    expect(o.check).toEqual({ combinations: 128, mismatchCount: 0, mismatches: [] });
  });

  it('air supply vote: two out of three, the textbook majority (ANF ab + ac + bc, three monomials)', () => {
    const o = output(doc, 'Spindle', 'Air supply OK');
    expect(o.andOr).toBe(
      '(Pressure_switch_1 AND Pressure_switch_2) OR (Pressure_switch_1 AND Pressure_switch_3) OR (Pressure_switch_2 AND Pressure_switch_3)',
    );
    expect([o.terms, o.literals, o.xorTerms]).toEqual([3, 6, 3]);
    expect(o.xor).toBe('(Pressure_switch_1 AND Pressure_switch_2) XOR (Pressure_switch_1 AND Pressure_switch_3) XOR (Pressure_switch_2 AND Pressure_switch_3)');
  });

  it('chuck and feeder: three outputs of the same five inputs, each with the inputs it ignores', () => {
    const release = output(doc, 'Chuck and feeder', 'Chuck air release');
    // AIR.HD.TQ + AIR.!HD.!CAP (the consensus AIR.TQ.!CAP is redundant); XOR: 5 monomials.
    expect([release.terms, release.literals, release.xorTerms, release.unusedInputs]).toEqual([2, 6, 5, ['Bottle in position']]);
    const feeder = output(doc, 'Chuck and feeder', 'Cap feeder enable');
    // AIR.!CAP.!HD: one product; ANF AIR(1+CAP)(1+HD) has 4 monomials, 1 with CAP and HD complemented.
    expect(feeder.andOr).toBe('NOT Cap_in_chuck AND NOT Head_down AND Air_pressure_OK');
    expect([feeder.terms, feeder.literals, feeder.xorTerms, feeder.bestXor.terms]).toEqual([1, 3, 4, 1]);
    expect(feeder.bestXor.complemented).toEqual(['Cap in chuck', 'Head down']);
    const lower = output(doc, 'Chuck and feeder', 'Head lower permit');
    // AIR.CAP.BOT.!TQ: ANF AIR.CAP.BOT + AIR.CAP.BOT.TQ.
    expect([lower.terms, lower.literals, lower.xorTerms, lower.unusedInputs]).toEqual([1, 4, 2, ['Head down']]);
  });

  it('discrepancy alarm: an OR of three XORs, six products in AND/OR, 26 monomials plain and 9 at the best polarity', () => {
    const o = output(doc, 'Channels', 'Channel discrepancy alarm');
    // !alarm = (1+a+b)(1+c+d)(1+e+f): 27 monomials, the constant cancels in 1 + ...: 26.
    // Complementing one channel of each pair: (a'+b)(c'+d)(e'+f) has 8 monomials, plus 1.
    expect([o.terms, o.literals, o.xorTerms, o.bestXor.terms, o.degree]).toEqual([6, 12, 26, 9, 3]);
    expect(o.check.combinations).toBe(64);
  });

  it('every printed form computes what the source rows ask, at every combination they specify', () => {
    doc.tables.forEach((table, t) => {
      const source = sourceTables[t]!;
      const n = table.inputs.length;
      const signals = table.inputs.map((header) => ({ header, identifier: table.identifiers[header]! }));
      table.outputs.forEach((o, j) => {
        for (const text of [o.andOr, o.xor, o.bestXor.expr]) {
          const parsed = parseExpression(text, signals);
          if (!parsed.ok) throw new Error(parsed.error.message);
          const values = truthTable(parsed.value, n);
          for (let k = 0; k < 2 ** n; k++) {
            const want = asked(source, j, k) ?? '0';
            if (want !== '-') expect(has(values, k) ? '1' : '0', `${o.name} ${text.slice(0, 30)} at ${k}`).toBe(want);
          }
        }
        expect(o.check.combinations).toBe(2 ** n);
        expect(o.check.mismatches).toEqual([]);
      });
    });
  });
});

describe('analyze report', () => {
  it('prints forms, proof, findings, signal names and the caution for the spindle table', async () => {
    const run = await runCli('analyze', CAPPER, '--sheet', 'Spindle', '--range', 'A3:H13');
    expect(run.code).toBe(0);
    expect(run.out).toContain('AND/OR form, proven minimum: 2 terms, 9 literals');
    expect(run.out).toContain('XOR form: 5 terms');
    expect(run.out).toContain('Best-polarity XOR form');
    expect(run.out).toContain('Proof over all 128 combinations: AND/OR OK, XOR OK, best XOR OK');
    expect(run.out).toContain("Don't-cares: 8 combinations, resolved as the minimal AND/OR form uses them; every form turns 8 of them ON");
    expect(run.out).toMatch(/ {4}Guard door A closed {2}Guard door B closed .* Jog pressed\n {4}- {20}- .* 1\n/);
    expect(run.out).toContain('E-stop healthy      -> E_stop_healthy');
    expect(run.out).toContain('CAUTION: derived logic is a design aid');
    expect(run.out).not.toContain('Air_supply_OK');
  });

  it('reads the semicolon CSV of the spindle table to the same forms', async () => {
    const run = await runCli('analyze', CSV, '--json');
    expect(run.code).toBe(0);
    const doc = JSON.parse(run.out) as Doc;
    expect(doc.tables[0]!.outputs[0]!.terms).toBe(2);
    expect(doc.tables[0]!.outputs[0]!.literals).toBe(9);
  });

  it('with --dont-cares safe every form keeps the spindle off where the table leaves it open', async () => {
    const run = await runCli('analyze', CSV, '--dont-cares', 'safe', '--json');
    expect(run.code).toBe(0);
    const out = (JSON.parse(run.out) as Doc).tables[0]!.outputs[0]! as unknown as { permitsAlsoCount: number; dontCares: string };
    expect([out.dontCares, out.permitsAlsoCount]).toEqual(['safe', 0]);
  });

  it('takes an output\'s safe value from --safe, by header or identifier', async () => {
    for (const name of ['Spindle run permit', 'spindle_run_permit']) {
      const run = await runCli('analyze', CSV, '--safe', `${name}=1`, '--json');
      expect(run.code).toBe(0);
      expect((JSON.parse(run.out) as Doc).tables[0]!.outputs[0]!.safeValue).toBe(1);
    }
  });
});

describe('the broken workbook', () => {
  let text: Run;
  let json: Run;
  beforeAll(async () => {
    [text, json] = await Promise.all([runCli('analyze', BROKEN), runCli('analyze', BROKEN, '--json')]);
  });

  it('exits 1', () => {
    expect(text.code).toBe(1);
    expect(json.code).toBe(1);
  });

  it('names every bad cell by sheet and address', () => {
    expect(text.out).toMatch(/error\s+'Air supply vote'!B4\s+blank cell/);
    expect(text.out).toMatch(/error\s+'Air supply vote'!A6\s+the number 2/);
    expect(text.out).toMatch(/error\s+'Air supply vote'!D8\s+.*#N\/A/);
    expect(text.out).toMatch(/error\s+'Air supply vote'!C9\s+'X' is ambiguous/);
    expect(text.out).toContain('Not cleared: 5 errors in the spec');
  });

  it('reports the gap and the conflict of the spindle table with the rows concerned', () => {
    const o = output(JSON.parse(json.out) as Doc, 'Spindle', 'Spindle run permit');
    // The missing light-curtain row: guards A and B closed, curtain broken, automatic, no jog.
    expect(o.gaps).toEqual(['1101100']);
    expect(o.conflicts).toEqual([{ rows: ['A12:H12', 'A13:H13'], example: '1111110', combinations: 1 }]);
    const table = (JSON.parse(json.out) as Doc).tables.find((t) => t.sheet === 'Spindle')!;
    expect(table.problems.find((p) => p.severity === 'error')!.cell).toBe('H13');
  });

  it("accepts X as don't-care only when asked, and says so", async () => {
    const run = await runCli('analyze', BROKEN, '--sheet', 'Air supply vote', '--x-means-dont-care');
    expect(run.code).toBe(1);
    expect(run.out).not.toContain("'Air supply vote'!C9");
    expect(run.out).toContain("X cells read as '-'");
  });
});

describe('usage errors exit 2 with a clear message', () => {
  const cases: [string, string[], RegExp][] = [
    ['an unknown option', ['analyze', CAPPER, '--fast'], /unknown option --fast/],
    ['an unknown command', ['analyse-all', CAPPER], /unknown command "analyse-all"/],
    ['no file', ['analyze', '--json'], /analyze needs a workbook or CSV file/],
    ['a missing file', ['analyze', join(scratch(), 'none.xlsx')], /none\.xlsx: no such file/],
    ['a bad range', ['analyze', CAPPER, '--sheet', 'Spindle', '--range', 'A1:ZZZZ9'], /--range "A1:ZZZZ9" is not an A1 range/],
    ['a range without a sheet', ['analyze', CAPPER, '--range', 'A1:H20'], /--range needs --sheet/],
    ['an option without its value', ['analyze', CAPPER, '--sheet'], /--sheet needs a value/],
    ['a bad --safe', ['analyze', CAPPER, '--safe', 'Spindle run permit'], /--safe needs NAME=0 or NAME=1/],
    ['a bad --dont-cares', ['analyze', CSV, '--dont-cares', 'some'], /--dont-cares needs minimal or safe, got "some"/],
  ];
  for (const [what, argv, message] of cases) {
    it(what, async () => {
      const run = await runCli(...argv);
      expect(run.code).toBe(2);
      expect(run.err).toMatch(message);
      expect(run.out).toBe('');
    });
  }

  it('an unknown sheet, listing the sheets there are', async () => {
    const run = await runCli('analyze', CAPPER, '--sheet', 'Capper');
    expect(run.code).toBe(2);
    expect(run.err).toContain('no sheet named "Capper" (sheets: Spindle, Chuck and feeder, Channels)');
  });

  it('a --safe that names no output', async () => {
    const run = await runCli('analyze', CSV, '--safe', 'Spindle brake=1');
    expect(run.code).toBe(2);
    expect(run.err).toContain('--safe Spindle brake: no output');
  });

  it('--help prints the usage and exits 0', async () => {
    const run = await runCli('--help');
    expect(run.code).toBe(0);
    expect(run.out).toContain('interlock-algebra analyze');
  });
});

describe('analyze -o', () => {
  it('writes a results workbook: source sheets unchanged, live check formulas with _xlfn.XOR', async () => {
    const out = join(scratch(), 'results.xlsx');
    const run = await runCli('analyze', CAPPER, '-o', out);
    expect(run.code).toBe(0);
    expect(run.out).toContain(`Results workbook written: ${out}`);
    const source = XLSX.read(readFileSync(CAPPER));
    const written = XLSX.read(readFileSync(out), { cellFormula: true, xlfn: true });
    expect(written.SheetNames.slice(0, 3)).toEqual(source.SheetNames);
    const values = (s: XLSX.WorkSheet): unknown[][] => XLSX.utils.sheet_to_json(s, { header: 1, raw: true });
    for (const name of source.SheetNames) expect(values(written.Sheets[name]!), name).toEqual(values(source.Sheets[name]!));
    const added = written.SheetNames.slice(3);
    expect(added.length).toBe(8); // a results sheet and a steps sheet per table
    const formulas = added.flatMap((name) =>
      Object.entries(written.Sheets[name]!)
        .filter(([k]) => !k.startsWith('!'))
        .map(([, c]) => (c as XLSX.CellObject).f)
        .filter((f): f is string => typeof f === 'string'),
    );
    expect(formulas.some((f) => f.includes('_xlfn.XOR('))).toBe(true);
    expect(formulas.some((f) => /(^|[^.])XOR\(/.test(f))).toBe(false); // never a bare XOR in the file
    expect(formulas.some((f) => f.includes('"DIFFERS"'))).toBe(true);
  });

  it('with --json, stdout stays the JSON document and the path goes to stderr; a missing folder is made', async () => {
    const out = join(scratch(), 'out', 'results.xlsx');
    const run = await runCli('analyze', CSV, '--json', '-o', out);
    expect(run.code).toBe(0);
    expect((JSON.parse(run.out) as Doc).tables.length).toBe(1);
    expect(run.err).toContain(`Results workbook written: ${out}`);
  });

  it('refuses the input as output, by any spelling, and leaves it untouched', async () => {
    const before = readFileSync(CAPPER);
    for (const out of [CAPPER, join(CAPPER, '..', 'source', '..', 'capper-cell.xlsx'), CAPPER.replace('capper-cell.xlsx', 'CAPPER-CELL.xlsx')]) {
      const run = await runCli('analyze', CAPPER, '-o', out);
      expect(run.code).toBe(2);
      expect(run.err).toContain('is the input file');
    }
    expect(readFileSync(CAPPER).equals(before)).toBe(true);
  });
});

describe('the installed command', () => {
  it('runs through bin/interlock-algebra.mjs with plain node', async () => {
    const bin = join(import.meta.dirname, '..', '..', 'bin', 'interlock-algebra.mjs');
    const { stdout } = await promisify(execFile)(process.execPath, [bin, 'analyze', CSV, '--json']);
    expect((JSON.parse(stdout) as Doc).tables[0]!.outputs[0]!.name).toBe('Spindle run permit');
    const usage = await promisify(execFile)(process.execPath, [bin, 'analyze', CSV, '--fast']).catch((e: { code: number }) => e);
    expect((usage as { code: number }).code).toBe(2);
  });
});
