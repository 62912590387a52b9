// `npm run fuzz`: random spec tables and programs through the implementation check, each
// judged by the interpreter of this folder. Options: --seconds N (default 60), --seed S (the
// run's seed; printed at the start), --case C (run one case seed only), --keep-going (record
// the first contradiction of each cause until time is up, instead of stopping at the first).
// Exit 0 with "N programs checked, 0 contradictions"; exit 1 on a contradiction, after
// printing the shrunk program, its spec table and both verdicts.
import { causeOf, judge, type CaseResult, type Contradiction } from './check.js';
import { generateCase, type FuzzCase } from './generate.js';
import { expectedVerdicts } from './interpreter.js';
import { programFile } from './print.js';
import { shrink } from './shrink.js';
import { specText } from './spec.js';

interface Options {
  seconds: number;
  seed: number;
  caseSeed?: number;
  keepGoing: boolean;
}

function parse(argv: readonly string[]): Options {
  const opts: Options = { seconds: 60, seed: (Date.now() ^ (process.pid << 16)) >>> 0, keepGoing: false };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    const num = (): number => {
      const v = Number(argv[++i]);
      if (!Number.isFinite(v) || v < 0) throw new Error(`${a} needs a number`);
      return v;
    };
    if (a === '--seconds') opts.seconds = num();
    else if (a === '--seed') opts.seed = num() >>> 0;
    else if (a === '--case') opts.caseSeed = num() >>> 0;
    else if (a === '--keep-going') opts.keepGoing = true;
    else throw new Error(`unknown option ${a} (--seconds N, --seed S, --case C, --keep-going)`);
  }
  return opts;
}

/** The seed of the i-th case of a run. */
export function caseSeed(runSeed: number, i: number): number {
  return (runSeed + Math.imul(i, 0x9e3779b9)) >>> 0;
}

function firstOf(r: CaseResult): Contradiction | undefined {
  return r.contradictions[0];
}

interface Shrunk {
  readonly small: FuzzCase;
  readonly contradiction: Contradiction;
  readonly cause: string;
}

/** The case shrunk while it fails the same way, its contradiction, and the construct it rests on. */
function shrunk(c: FuzzCase, x: Contradiction, budget: number): Shrunk {
  const small = shrink(c, (d) => judge(d).contradictions.some((y) => y.kind === x.kind), budget);
  const y = judge(small).contradictions.find((z) => z.kind === x.kind) ?? x;
  const expected = y.output ? expectedVerdicts(small.program, small.spec)[small.spec.outputs.indexOf(y.output)] : undefined;
  return { small, contradiction: y, cause: causeOf(small, y, expected) };
}

function report(runSeed: number | undefined, c: FuzzCase, s: Shrunk, seconds: number): string {
  const y = s.contradiction;
  const file = programFile(s.small.program);
  return [
    '',
    `CONTRADICTION (${y.kind}) after ${seconds.toFixed(1)} s: ${s.cause}`,
    `  ${runSeed === undefined ? '' : `run seed ${runSeed}, `}case ${c.seed} (replay: npm run fuzz -- --case ${c.seed})`,
    y.output ? `  output ${y.output}` : '',
    `  product:     ${y.product}`,
    `  interpreter: ${y.interpreter}`,
    '  spec table (shrunk):',
    specText(s.small.spec).replace(/^/gm, '    '),
    `  program (shrunk), ${file.name}:`,
    file.text.replace(/^/gm, '    '),
  ]
    .filter((l) => l !== '')
    .join('\n');
}

function main(): number {
  let opts: Options;
  try {
    opts = parse(process.argv.slice(2));
  } catch (e) {
    console.error(`fuzz: ${(e as Error).message}`);
    return 2;
  }
  const start = Date.now();
  const elapsed = (): number => (Date.now() - start) / 1000;
  if (opts.caseSeed !== undefined) {
    console.log(`fuzz: one case, seed ${opts.caseSeed}`);
    const c = generateCase(opts.caseSeed);
    const x = firstOf(judge(c));
    if (!x) {
      console.log('1 programs checked, 0 contradictions');
      return 0;
    }
    const at = elapsed();
    console.log(report(undefined, c, shrunk(c, x, 4000), at));
    return 1;
  }
  console.log(`fuzz: run seed ${opts.seed}, ${opts.seconds} s${opts.keepGoing ? ', keep going' : ''} (replay: npm run fuzz -- --seed ${opts.seed})`);
  const verdicts = new Map<string, number>();
  const causes = new Map<string, { seconds: number; cases: number; count: number }>();
  // Time spent generating and checking, without the shrinking of contradictions.
  let checking = 0;
  let checked = 0;
  let skipped = 0;
  let uncheckedKnown = 0;
  let contradictions = 0;
  for (let i = 0; elapsed() < opts.seconds; i++) {
    const t0 = Date.now();
    const c = generateCase(caseSeed(opts.seed, i));
    const r = judge(c);
    checking += (Date.now() - t0) / 1000;
    checked++;
    if (r.skipped) skipped++;
    uncheckedKnown += r.uncheckedKnown;
    r.verdicts.forEach((v) => verdicts.set(v, (verdicts.get(v) ?? 0) + 1));
    const x = firstOf(r);
    if (!x) continue;
    contradictions++;
    if (!opts.keepGoing) {
      const at = elapsed();
      console.log(report(opts.seed, c, shrunk(c, x, 4000), at));
      console.log(`\n${checked} programs checked, 1 contradiction (run seed ${opts.seed})`);
      return 1;
    }
    // A small budget: enough to tell the cause; each cause is printed once.
    const s = shrunk(c, x, 200);
    const cause = `${s.cause} [${s.contradiction.kind}]`;
    const seen = causes.get(cause);
    if (seen) seen.count++;
    else {
      causes.set(cause, { seconds: checking, cases: checked, count: 1 });
      console.log(report(opts.seed, c, s, checking));
    }
  }
  const tally = [...verdicts].map(([v, n]) => `${n} ${v}`).join(', ');
  console.log(`\nproduct verdicts: ${tally || 'none'}; unchecked although the interpreter knows the value: ${uncheckedKnown}; set aside (too much state): ${skipped}`);
  if (causes.size > 0) {
    console.log('first contradiction of each cause: seconds of checking (shrinking not counted), programs checked by then, contradictions of that cause:');
    for (const [cause, s] of [...causes].sort((a, b) => a[1].seconds - b[1].seconds)) {
      console.log(`  ${s.seconds.toFixed(2).padStart(7)} s  ${String(s.cases).padStart(6)}  ${String(s.count).padStart(5)}  ${cause}`);
    }
  }
  console.log(`\n${checked} programs checked, ${contradictions} contradictions (run seed ${opts.seed})`);
  return contradictions === 0 ? 0 : 1;
}

process.exitCode = main();
