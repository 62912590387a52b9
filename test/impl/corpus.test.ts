// The programs corpus (fixtures/corpus/): hand-written PLC programs of invented machines, in
// ST, PLCopen ST, LD and FBD, each checked by the command line's own `verify` (in-process,
// --json) against the verdict derived by hand in its header comment. The table below mirrors
// those headers: per output the verdict, the exact counterexamples (input patterns, leftmost
// input first), the unsafe and spurious-trip counts, and for UNCHECKED the reason kinds and lines.
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseXml } from '../../src/impl/xml.js';
import { runCli, SAMPLES } from '../cli/run-cli.js';
import { schemaViolations } from '../report/plcopen-schema.js';

const CORPUS = join(import.meta.dirname, 'fixtures', 'corpus');

/** A spec file and the spec options it is read with. */
interface Spec {
  readonly file: string;
  readonly options: readonly string[];
}

const own = (name: string, ...options: string[]): Spec => ({ file: join(CORPUS, 'specs', name), options });
const sample = (name: string, ...options: string[]): Spec => ({ file: join(SAMPLES, name), options });

const PRESS = own('press-hp4.csv');
const ROBOT = own('robot-cell-rc1.csv');
const PUMP = own('pump-p12.csv');
const HOIST = own('hoist-h2.csv', '--safe', 'Brake_set=1');
const MIXER = own('mixer-m7.csv');
const CONVEYOR = sample('conveyor-cv3.xlsx');
const BURNER = sample('burner-purge.xlsx', '--sheet', 'Burner purge', '--range', 'A3:G18', '--x-means-dont-care');

type Style = 'ST program' | 'ST function block' | 'PLCopen ST' | 'LD' | 'FBD';

type Expected =
  | { readonly verdict: 'EQUAL' }
  | { readonly verdict: 'DIFFERS'; readonly counterexamples: readonly string[]; readonly unsafe: number; readonly spurious: number }
  | { readonly verdict: 'UNCHECKED'; readonly reasons: readonly (readonly [kind: string, line: number])[] };

interface CorpusProgram {
  readonly file: string;
  readonly style: Style;
  readonly spec: Spec;
  readonly map?: string;
  /** By output identifier, in the order verify reports them. */
  readonly outputs: Readonly<Record<string, Expected>>;
}

const EQUAL = { verdict: 'EQUAL' } as const;
const differs = (counterexamples: string[], unsafe: number, spurious: number): Expected => ({ verdict: 'DIFFERS', counterexamples, unsafe, spurious });
const unchecked = (...reasons: [string, number][]): Expected => ({ verdict: 'UNCHECKED', reasons });

const PROGRAMS: readonly CorpusProgram[] = [
  { file: 'press-hp4-correct.st', style: 'ST program', spec: PRESS, outputs: { Stroke_permit: EQUAL, Ready_lamp: EQUAL } },
  { file: 'press-hp4-setup-bypass.st', style: 'ST function block', spec: PRESS, outputs: { Stroke_permit: differs(['0101', '0111'], 2, 0), Ready_lamp: EQUAL } },
  { file: 'press-hp4-hmi.st', style: 'ST program', spec: PRESS, outputs: { Stroke_permit: EQUAL, Ready_lamp: unchecked(['undriven', 33]) } },
  { file: 'press-hp4-single-stroke.st', style: 'ST program', spec: PRESS, outputs: { Stroke_permit: unchecked(['edge', 33]), Ready_lamp: EQUAL } },
  { file: 'press-hp4-st-body.xml', style: 'PLCopen ST', spec: PRESS, outputs: { Stroke_permit: differs(['1101'], 0, 1), Ready_lamp: differs(['1011'], 0, 1) } },
  { file: 'press-hp4-ld-mapped.xml', style: 'LD', spec: PRESS, map: 'press-hp4-ld-map.csv', outputs: { Stroke_permit: EQUAL, Ready_lamp: EQUAL } },
  { file: 'press-hp4-struct.st', style: 'ST program', spec: PRESS, map: 'press-hp4-struct-map.csv', outputs: { Stroke_permit: EQUAL, Ready_lamp: differs(['1110', '1111'], 2, 0) } },
  { file: 'conveyor-cv3-array.st', style: 'ST program', spec: CONVEYOR, map: 'conveyor-cv3-array-map.csv', outputs: { M_BELT: EQUAL, Y_DIV: EQUAL } },
  { file: 'hoist-h2-function.st', style: 'ST program', spec: HOIST, outputs: { Hoist_up_permit: EQUAL, Hoist_down_permit: EQUAL, Brake_set: differs(['0011', '0110', '1110'], 1, 2) } },
  { file: 'mixer-m7-struct-fn.st', style: 'ST program', spec: MIXER, outputs: { Agitator_permit: EQUAL, Lid_discrepancy: EQUAL, Lid_unlock_permit: EQUAL } },
  { file: 'conveyor-cv3-seal.st', style: 'ST program', spec: CONVEYOR, outputs: { M_BELT: unchecked(['seal-in', 29]), Y_DIV: EQUAL } },
  { file: 'conveyor-cv3-ld.xml', style: 'LD', spec: CONVEYOR, outputs: { M_BELT: EQUAL, Y_DIV: differs(['101', '110'], 2, 0) } },
  { file: 'conveyor-cv3-fbd.xml', style: 'FBD', spec: CONVEYOR, outputs: { M_BELT: EQUAL, Y_DIV: differs(['110'], 1, 0) } },
  { file: 'burner-purge-timer.st', style: 'ST function block', spec: BURNER, outputs: { Purge_timer_enable: EQUAL, False_flame_alarm: unchecked(['timer', 38]) } },
  { file: 'burner-purge-fbd.xml', style: 'FBD', spec: BURNER, outputs: { Purge_timer_enable: differs(['11110', '11111'], 1, 1), False_flame_alarm: EQUAL } },
  { file: 'robot-cell-correct.st', style: 'ST function block', spec: ROBOT, outputs: { Auto_permit: EQUAL, Gate_unlock_permit: EQUAL } },
  {
    file: 'robot-cell-gaps.st',
    style: 'ST program',
    spec: ROBOT,
    outputs: { Auto_permit: differs(['1101', '1111'], 2, 0), Gate_unlock_permit: differs(['0001', '1001'], 2, 0) },
  },
  { file: 'robot-cell-case.st', style: 'ST program', spec: ROBOT, outputs: { Auto_permit: unchecked(['control-flow', 27]), Gate_unlock_permit: EQUAL } },
  { file: 'robot-cell-ld-latch.xml', style: 'LD', spec: ROBOT, outputs: { Auto_permit: unchecked(['seal-in', 76]), Gate_unlock_permit: EQUAL } },
  { file: 'pump-p12-st-body.xml', style: 'PLCopen ST', spec: PUMP, outputs: { Pump_run: EQUAL, Dry_run_alarm: EQUAL } },
  { file: 'pump-p12-both.st', style: 'ST program', spec: PUMP, outputs: { Pump_run: differs(['10111', '11110'], 1, 1), Dry_run_alarm: EQUAL } },
  { file: 'pump-p12-sel.st', style: 'ST program', spec: PUMP, outputs: { Pump_run: unchecked(['function-call', 28]), Dry_run_alarm: EQUAL } },
  { file: 'pump-p12-ld.xml', style: 'LD', spec: PUMP, outputs: { Pump_run: differs(['10101', '11110'], 2, 0), Dry_run_alarm: EQUAL } },
  {
    file: 'pump-p12-defaults.st',
    style: 'ST function block',
    spec: PUMP,
    outputs: { Pump_run: EQUAL, Dry_run_alarm: differs(['00001', '00101', '01010', '01110'], 4, 0) },
  },
  { file: 'hoist-h2-fbd.xml', style: 'FBD', spec: HOIST, outputs: { Hoist_up_permit: EQUAL, Hoist_down_permit: EQUAL, Brake_set: EQUAL } },
  {
    file: 'hoist-h2-wrong.st',
    style: 'ST function block',
    spec: HOIST,
    outputs: { Hoist_up_permit: EQUAL, Hoist_down_permit: differs(['0110', '1110'], 0, 2), Brake_set: differs(['0010', '0011', '1010'], 3, 0) },
  },
  {
    file: 'hoist-h2-userfb.st',
    style: 'ST program',
    spec: HOIST,
    outputs: { Hoist_up_permit: unchecked(['function-block', 43]), Hoist_down_permit: EQUAL, Brake_set: EQUAL },
  },
  {
    file: 'mixer-m7.st',
    style: 'ST program',
    spec: MIXER,
    outputs: { Agitator_permit: EQUAL, Lid_discrepancy: EQUAL, Lid_unlock_permit: differs(['0001', '0101', '1001'], 3, 0) },
  },
  {
    file: 'mixer-m7-setreset.st',
    style: 'ST function block',
    spec: MIXER,
    outputs: { Agitator_permit: unchecked(['set-reset', 27], ['set-reset', 28]), Lid_discrepancy: EQUAL, Lid_unlock_permit: EQUAL },
  },
  {
    file: 'mixer-m7-prevscan.xml',
    style: 'PLCopen ST',
    spec: MIXER,
    outputs: { Agitator_permit: EQUAL, Lid_discrepancy: EQUAL, Lid_unlock_permit: unchecked(['previous-scan', 47]) },
  },
];

/** What `verify --json` says of one output: the fields this corpus checks. */
interface OutputJson {
  readonly identifier: string;
  readonly status: 'equal' | 'differs' | 'unchecked' | 'not-found';
  readonly mismatchCount: number;
  readonly unsafeCount: number;
  readonly spuriousTripCount: number;
  readonly counterexamples: readonly {
    readonly inputs: readonly number[];
    readonly expected: 0 | 1;
    readonly actual: 0 | 1;
    readonly kind: 'unsafe' | 'spurious-trip';
  }[];
  readonly gaps: { readonly safe: 0 | 1 };
  readonly cannotJudge: readonly { readonly kind: string; readonly line: number }[];
}

async function verify(p: CorpusProgram): Promise<{ code: number; outputs: readonly OutputJson[] }> {
  const map = p.map ? ['--map', join(CORPUS, p.map)] : [];
  const r = await runCli('verify', p.spec.file, '--impl', join(CORPUS, p.file), '--json', ...map, ...p.spec.options);
  if (r.out === '') throw new Error(`verify printed no report: ${r.err}`);
  return { code: r.code, outputs: (JSON.parse(r.out) as { outputs: OutputJson[] }).outputs };
}

/**
 * Unsafe and spurious-trip counts of one output, classified here from its counterexamples
 * (all of them: `observed` checks that none was left unlisted): unsafe where the spec asks the
 * safe value and the program does not give it, a spurious trip the other way. The one place to
 * change once verify reports these counts itself: return the engine's figures here.
 */
// The engine's own counts; each listed counterexample's kind must also agree with the spec's
// safe value (unsafe = the spec requires the safe value and the program gives the other).
function tripCounts(o: OutputJson): { unsafe: number; spurious: number } {
  for (const c of o.counterexamples) expect(c.kind).toBe(c.expected === o.gaps.safe ? 'unsafe' : 'spurious-trip');
  return { unsafe: o.unsafeCount, spurious: o.spuriousTripCount };
}

function observed(o: OutputJson): Expected {
  if (o.status === 'equal') return EQUAL;
  if (o.status === 'differs') {
    expect(o.counterexamples.length).toBe(o.mismatchCount);
    return { verdict: 'DIFFERS', counterexamples: o.counterexamples.map((c) => c.inputs.join('')).sort(), ...tripCounts(o) };
  }
  if (o.status === 'unchecked') return { verdict: 'UNCHECKED', reasons: o.cannotJudge.map((c) => [c.kind, c.line] as const) };
  throw new Error(`${o.identifier} was not found in the program`);
}

function summary(p: CorpusProgram): string {
  const words = Object.entries(p.outputs).map(([name, e]) => {
    if (e.verdict === 'DIFFERS') return `${name} DIFFERS at ${e.counterexamples.join(', ')} (${e.unsafe} unsafe, ${e.spurious} spurious)`;
    if (e.verdict === 'UNCHECKED') return `${name} UNCHECKED (${e.reasons.map(([k, l]) => `${k}, line ${l}`).join('; ')})`;
    return `${name} EQUAL`;
  });
  return `${p.file} (${p.style}): ${words.join('; ')}`;
}

describe('the programs corpus', () => {
  const files = readdirSync(CORPUS).filter((f) => f.endsWith('.st') || f.endsWith('.xml'));

  it('holds at least 20 programs of its own, every one in the table, in ST, PLCopen ST, LD and FBD', () => {
    expect(PROGRAMS.length).toBeGreaterThanOrEqual(20);
    expect(PROGRAMS.map((p) => p.file).sort()).toEqual([...files].sort());
    expect(new Set(PROGRAMS.map((p) => p.style))).toEqual(new Set<Style>(['ST program', 'ST function block', 'PLCopen ST', 'LD', 'FBD']));
  });

  it('mixes every verdict: equal, unsafe only, spurious trips only, both, gaps and unchecked', () => {
    const all = PROGRAMS.flatMap((p) => Object.values(p.outputs));
    const differing = all.filter((e) => e.verdict === 'DIFFERS');
    expect(all.some((e) => e.verdict === 'EQUAL')).toBe(true);
    expect(differing.some((e) => e.unsafe > 0 && e.spurious === 0)).toBe(true);
    expect(differing.some((e) => e.unsafe === 0 && e.spurious > 0)).toBe(true);
    expect(differing.some((e) => e.unsafe > 0 && e.spurious > 0)).toBe(true);
    expect(new Set(all.flatMap((e) => (e.verdict === 'UNCHECKED' ? e.reasons.map(([k]) => k) : []))).size).toBeGreaterThanOrEqual(8);
  });

  for (const p of PROGRAMS) {
    it(summary(p), async () => {
      const { code, outputs } = await verify(p);
      expect(Object.fromEntries(outputs.map((o) => [o.identifier, observed(o)]))).toEqual(p.outputs);
      expect(code).toBe(Object.values(p.outputs).every((e) => e.verdict === 'EQUAL') ? 0 : 1);
    });
  }

  it('each counterexample of the table is named in its program\'s hand derivation', () => {
    for (const p of PROGRAMS) {
      const header = /^(?:<\?xml[^>]*>\s*<!--([\s\S]*?)-->|\(\*([\s\S]*?)\*\))/.exec(readFileSync(join(CORPUS, p.file), 'utf8'));
      const text = header?.[1] ?? header?.[2] ?? '';
      expect(text, p.file).toContain('Invented demo data');
      for (const e of Object.values(p.outputs)) if (e.verdict === 'DIFFERS') for (const c of e.counterexamples) expect(text, `${p.file}: ${c}`).toContain(c);
    }
  });

  for (const file of files.filter((f) => f.endsWith('.xml'))) {
    it(`${file} follows TC6 2.01: element order and required attributes as the schema's, and XML's comment rule`, () => {
      const text = readFileSync(join(CORPUS, file), 'utf8');
      // XML 1.0 (section 2.5) forbids "--" inside a comment; our reader lets it pass, xmllint does not.
      expect(text).not.toMatch(/<!--(?:(?!--)[\s\S])*--(?!>)/);
      const root = parseXml(text);
      if (!root.ok) throw new Error(root.error.message);
      expect(schemaViolations(root.value)).toEqual([]);
    });
  }
});
