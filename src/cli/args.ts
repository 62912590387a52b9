// Command-line words -> a command, or the usage error to print (exit status 2).
import { fail, ok, type Result, type SafeValue } from '../logic/index.js';
import type { FormChoice } from '../report/index.js';
import { parseRange, type DontCarePolicy } from '../table/index.js';

/** Which tables to read, and how (the options of every command that reads a workbook). */
export interface SpecChoice {
  readonly sheet?: string;
  readonly range?: string;
  readonly xMeansDontCare: boolean;
  readonly inputs?: number;
  /** Safe value per output, by header or identifier. */
  readonly safe: Readonly<Record<string, SafeValue>>;
  /** Longest the workbook parse may take, in milliseconds. */
  readonly timeLimitMs?: number;
  /** How don't-cares are resolved into each output's one function (default minimal). */
  readonly dontCares?: DontCarePolicy;
}

export type Command =
  | { readonly name: 'help' }
  | { readonly name: 'analyze'; readonly file: string; readonly spec: SpecChoice; readonly json: boolean; readonly out?: string }
  | {
      readonly name: 'export';
      readonly file: string;
      readonly spec: SpecChoice;
      readonly st?: string;
      readonly plcopen?: string;
      readonly svg?: string;
      readonly steps?: string;
      readonly form: FormChoice;
      readonly ladderBody: boolean;
    }
  | {
      readonly name: 'verify';
      readonly file: string;
      readonly spec: SpecChoice;
      readonly impl: string;
      readonly map?: string;
      readonly json: boolean;
      /** Gaps are not judged (default: judged at the safe value). */
      readonly gapsFree: boolean;
    }
  | { readonly name: 'record'; readonly file: string; readonly json: boolean; readonly timeLimitMs?: number }
  | CompareCommand;

export interface CompareCommand {
  readonly name: 'compare';
  readonly old: string;
  readonly new: string;
  readonly oldSpec: SpecChoice;
  readonly newSpec: SpecChoice;
  readonly json: boolean;
  /** A filled-in commissioning test record of the old revision. */
  readonly oldRecord?: string;
  readonly out?: string;
  /** Old signal -> new signal, where neither identifier nor header pairs them. */
  readonly renames: readonly (readonly [string, string])[];
}

export const USAGE = `Usage:
  interlock-algebra analyze <workbook.xlsx|table.csv> [--json] [-o results.xlsx] [spec options]
  interlock-algebra export  <workbook> [--st FILE] [--plcopen FILE] [--svg DIR] [--steps FILE]
                            [--form and-or|xor|best-xor] [--ld] [spec options]
  interlock-algebra verify  <workbook> --impl <file.st|file.xml> [--map mapping.csv] [--json]
                            [--gaps-free] [spec options]
                            (--gaps-free: combinations no row covers are not judged; by
                            default the program must hold the safe value there)
  interlock-algebra record  <filled-record.xlsx> [--json]
                            reads filled-in test records back: each step passed, failed or not run,
                            and whether the table is still the revision the record was made from
  interlock-algebra compare OLD NEW [--json] [--old-record FILLED.xlsx] [-o change.xlsx] [spec options]
                            [--old-sheet NAME] [--old-range A1:H20] [--new-sheet NAME] [--new-range A1:H20]
                            [--rename OLD=NEW]  (a signal of the old table that the new one calls otherwise)

Spec options:
  --sheet NAME            read only this sheet
  --range A1:H20|TABLE    read only this range (of --sheet, or of the only sheet), or this Excel table
  --x-means-dont-care     read X cells as '-' (any / don't-care); otherwise an X is an error
  --inputs N              the first N signal columns are inputs, the rest outputs
  --safe NAME=0|1         an output's safe value (default 0); may be given more than once
  --dont-cares minimal|safe  how don't-care cells are resolved, once, for every form, proof and
                          file: as the minimal AND/OR form uses them (default), or all at the safe value
  --time-limit SECONDS    longest the workbook may take to read (default 60)

Exit status: 0 every form proven against the spec (verify: the implementation is equal;
compare: every output behaves the same), 1 a spec error or a failed check (record: a step not
passed, or a stale record; compare: a behaviour changed), 2 a usage error or a file that cannot
be read.`;

type Kind = 'flag' | 'value' | 'many';
const SPEC_FLAGS: Record<string, Kind> = {
  '--sheet': 'value',
  '--range': 'value',
  '--x-means-dont-care': 'flag',
  '--inputs': 'value',
  '--safe': 'many',
  '--time-limit': 'value',
  '--dont-cares': 'value',
};
const COMMAND_FLAGS: Record<string, Record<string, Kind>> = {
  analyze: { ...SPEC_FLAGS, '--json': 'flag', '-o': 'value', '--out': 'value' },
  export: { ...SPEC_FLAGS, '--st': 'value', '--plcopen': 'value', '--svg': 'value', '--steps': 'value', '--form': 'value', '--ld': 'flag' },
  verify: { ...SPEC_FLAGS, '--impl': 'value', '--map': 'value', '--json': 'flag', '--gaps-free': 'flag' },
  // The settings come from the record itself, so that the table is read as it was then.
  record: { '--json': 'flag', '--time-limit': 'value' },
};

const FORMS: Readonly<Record<string, FormChoice>> = { 'and-or': 'andOr', xor: 'xor', 'best-xor': 'bestXor' };

interface Words {
  readonly positional: string[];
  readonly values: Map<string, string[]>;
}

function splitWords(argv: readonly string[], flags: Record<string, Kind>): Result<Words, string> {
  const positional: string[] = [];
  const values = new Map<string, string[]>();
  for (let i = 0; i < argv.length; i++) {
    const word = argv[i]!;
    if (!word.startsWith('-') || word === '-') {
      positional.push(word);
      continue;
    }
    const eq = word.indexOf('=');
    const name = word.startsWith('--') && eq > 0 ? word.slice(0, eq) : word;
    const kind = flags[name];
    if (!kind) return fail(`unknown option ${name}`);
    let value = 'true';
    if (kind !== 'flag') {
      if (eq > 0 && word.startsWith('--')) value = word.slice(eq + 1);
      else if (i + 1 < argv.length) value = argv[++i]!;
      else return fail(`${name} needs a value`);
    } else if (eq > 0 && word.startsWith('--')) return fail(`${name} takes no value`);
    const seen = values.get(name) ?? [];
    if (kind !== 'many' && seen.length > 0) return fail(`${name} given twice`);
    values.set(name, [...seen, value]);
  }
  return ok({ positional, values });
}

function readSpec(values: Map<string, string[]>): Result<SpecChoice, string> {
  const one = (name: string): string | undefined => values.get(name)?.[0];
  const range = one('--range');
  // Otherwise the name of an Excel table, looked up once the file is open (load.ts).
  if (range !== undefined && !parseRange(range) && !/^[A-Za-z_\\][\w.\\]*$/.test(range))
    return fail(`--range "${range}" is not an A1 range such as A1:H20 (nor an Excel table name)`);
  const inputsText = one('--inputs');
  const inputs = inputsText === undefined ? undefined : Number(inputsText);
  if (inputs !== undefined && (!Number.isInteger(inputs) || inputs < 1)) return fail(`--inputs needs a whole number of at least 1, got "${inputsText}"`);
  const safe: Record<string, SafeValue> = {};
  for (const pair of values.get('--safe') ?? []) {
    const m = /^(.+)=([01])$/.exec(pair);
    if (!m) return fail(`--safe needs NAME=0 or NAME=1, got "${pair}"`);
    safe[m[1]!.trim()] = m[2] === '1' ? 1 : 0;
  }
  const limitText = one('--time-limit');
  const seconds = limitText === undefined ? undefined : Number(limitText);
  if (seconds !== undefined && !(seconds > 0 && seconds <= 3600)) return fail(`--time-limit needs seconds between 0 and 3600, got "${limitText}"`);
  const sheet = one('--sheet');
  const dontCares = one('--dont-cares');
  if (dontCares !== undefined && dontCares !== 'minimal' && dontCares !== 'safe')
    return fail(`--dont-cares needs minimal or safe, got "${dontCares}"`);
  return ok({
    ...(sheet !== undefined ? { sheet } : {}),
    ...(range !== undefined ? { range } : {}),
    xMeansDontCare: values.has('--x-means-dont-care'),
    ...(inputs !== undefined ? { inputs } : {}),
    safe,
    ...(seconds !== undefined ? { timeLimitMs: seconds * 1000 } : {}),
    ...(dontCares !== undefined ? { dontCares } : {}),
  });
}

export function parseArgs(argv: readonly string[]): Result<Command, string> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') return ok({ name: 'help' });
  if (name === 'compare') return parseCompare(rest);
  const flags = COMMAND_FLAGS[name];
  if (!flags) return fail(`unknown command "${name}" (expected analyze, export, verify, record or compare)`);
  if (rest.includes('--help') || rest.includes('-h')) return ok({ name: 'help' });
  const words = splitWords(rest, flags);
  if (!words.ok) return words;
  const { positional, values } = words.value;
  if (positional.length === 0) return fail(`${name} needs a workbook or CSV file`);
  if (positional.length > 1) return fail(`${name} takes one file, got ${positional.length}: ${positional.join(', ')}`);
  const file = positional[0]!;
  const spec = readSpec(values);
  if (!spec.ok) return spec;
  const one = (flag: string): string | undefined => values.get(flag)?.[0];
  if (name === 'record') {
    const { timeLimitMs } = spec.value;
    return ok({ name, file, json: values.has('--json'), ...(timeLimitMs !== undefined ? { timeLimitMs } : {}) });
  }
  if (name === 'analyze') {
    if (values.has('-o') && values.has('--out')) return fail('-o and --out are the same option; give one');
    const out = one('-o') ?? one('--out');
    return ok({ name, file, spec: spec.value, json: values.has('--json'), ...(out !== undefined ? { out } : {}) });
  }
  if (name === 'export') {
    const targets = { st: one('--st'), plcopen: one('--plcopen'), svg: one('--svg'), steps: one('--steps') };
    if (Object.values(targets).every((t) => t === undefined)) return fail('export needs at least one of --st, --plcopen, --svg, --steps');
    const formText = one('--form') ?? 'and-or';
    const form = FORMS[formText];
    if (!form) return fail(`--form needs and-or, xor or best-xor, got "${formText}"`);
    const defined = Object.fromEntries(Object.entries(targets).filter(([, v]) => v !== undefined)) as Record<string, string>;
    return ok({ name, file, spec: spec.value, ...defined, form, ladderBody: values.has('--ld') });
  }
  const impl = one('--impl');
  if (impl === undefined) return fail('verify needs --impl <file.st|file.xml>');
  const map = one('--map');
  return ok({ name: 'verify', file, spec: spec.value, impl, ...(map !== undefined ? { map } : {}), json: values.has('--json'), gapsFree: values.has('--gaps-free') });
}

const COMPARE_FLAGS: Record<string, Kind> = {
  ...SPEC_FLAGS,
  '--old-sheet': 'value',
  '--old-range': 'value',
  '--new-sheet': 'value',
  '--new-range': 'value',
  '--old-record': 'value',
  '--rename': 'many',
  '--json': 'flag',
  '-o': 'value',
  '--out': 'value',
};

/** `compare OLD NEW`: the spec options apply to both files; --old-sheet, --new-range and the like choose per file. */
function parseCompare(rest: readonly string[]): Result<Command, string> {
  if (rest.includes('--help') || rest.includes('-h')) return ok({ name: 'help' });
  const words = splitWords(rest, COMPARE_FLAGS);
  if (!words.ok) return words;
  const { positional, values } = words.value;
  if (positional.length !== 2) return fail(`compare needs two files, the old revision and the new one; got ${positional.length}`);
  const side = (which: 'old' | 'new'): Result<SpecChoice, string> => {
    const own = new Map(values);
    for (const what of ['sheet', 'range']) {
      const given = values.get(`--${which}-${what}`);
      if (given) own.set(`--${what}`, given);
    }
    return readSpec(own);
  };
  const oldSpec = side('old');
  if (!oldSpec.ok) return oldSpec;
  const newSpec = side('new');
  if (!newSpec.ok) return newSpec;
  if (values.has('-o') && values.has('--out')) return fail('-o and --out are the same option; give one');
  const out = values.get('-o')?.[0] ?? values.get('--out')?.[0];
  const oldRecord = values.get('--old-record')?.[0];
  const renames: [string, string][] = [];
  for (const pair of values.get('--rename') ?? []) {
    const m = /^([^=]+)=([^=]+)$/.exec(pair);
    if (!m) return fail(`--rename needs OLD=NEW (the old signal's name, the new one's), got "${pair}"`);
    renames.push([m[1]!.trim(), m[2]!.trim()]);
  }
  return ok({
    name: 'compare',
    old: positional[0]!,
    new: positional[1]!,
    oldSpec: oldSpec.value,
    newSpec: newSpec.value,
    json: values.has('--json'),
    renames,
    ...(oldRecord !== undefined ? { oldRecord } : {}),
    ...(out !== undefined ? { out } : {}),
  });
}
