// Access paths into structured variables: structure members (`io.bClosed`, nested), array
// elements with constant indices (`aIn[3]`, `aGrid[1,2]`) and members of function block
// instances (`tonSync.Q`). A path that resolves to a BOOL is a variable of its own to the
// readers; a member of an instance is a named source (the block's state, not this scan's
// inputs) that a mapping may take as a spec input.
import { blockKind } from './constructs.js';
import { LineError } from './line-error.js';
import type { CannotJudgeKind, ImplVariable, StructType } from './types.js';

/** One step of a path after its base name. */
export type PathStep = { readonly member: string } | { readonly index: readonly number[] } | { readonly variableIndex: string };

export interface ParsedPath {
  readonly base: string;
  readonly steps: readonly PathStep[];
}

/** What a path resolves against: the file's structure types and its own blocks. */
export interface PathTypes {
  /** Structure types of the file by upper-case name. */
  readonly types: ReadonlyMap<string, StructType>;
  readonly blockTypes: ReadonlySet<string>;
  readonly pouVariables: ReadonlyMap<string, readonly ImplVariable[]>;
}

export type Resolved = { readonly ok: true; readonly variable: ImplVariable } | { readonly ok: false; readonly kind: CannotJudgeKind; readonly why: string };

const BOOL_MEMBERS = (...names: string[]): Record<string, string> => Object.fromEntries(names.map((n) => [n, 'BOOL']));
const TIMER = { ...BOOL_MEMBERS('IN', 'Q'), PT: 'TIME', ET: 'TIME' };

/**
 * Members of the standard function blocks (inputs and outputs), from memory of IEC 61131-3
 * ed. 2 section 2.5.2.3; the TON members agree with Beckhoff's Tc2_Standard TON page.
 */
const STANDARD_MEMBERS: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  TON: TIMER, TOF: TIMER, TP: TIMER, LTON: { ...TIMER, PT: 'LTIME', ET: 'LTIME' }, LTOF: { ...TIMER, PT: 'LTIME', ET: 'LTIME' }, LTP: { ...TIMER, PT: 'LTIME', ET: 'LTIME' },
  CTU: { ...BOOL_MEMBERS('CU', 'R', 'Q'), PV: 'INT', CV: 'INT' },
  CTD: { ...BOOL_MEMBERS('CD', 'LD', 'Q'), PV: 'INT', CV: 'INT' },
  CTUD: { ...BOOL_MEMBERS('CU', 'CD', 'R', 'LD', 'QU', 'QD'), PV: 'INT', CV: 'INT' },
  R_TRIG: BOOL_MEMBERS('CLK', 'Q'),
  F_TRIG: BOOL_MEMBERS('CLK', 'Q'),
  SR: BOOL_MEMBERS('S1', 'R', 'Q1'),
  RS: BOOL_MEMBERS('S', 'R1', 'Q1'),
};

const ELEMENTARY = /^(BOOL|BYTE|WORD|DWORD|LWORD|SINT|INT|DINT|LINT|USINT|UINT|UDINT|ULINT|REAL|LREAL|TIME|LTIME|DATE|LDATE|TOD|LTOD|TIME_OF_DAY|DT|LDT|DATE_AND_TIME|CHAR|WCHAR|(W?STRING)(\s*[[(].*)?)$/i;

/** A type with no members or elements (BOOL, INT, STRING[20]...). */
export function isElementary(type: string): boolean {
  return ELEMENTARY.test(type.trim());
}

const PATH = /^([A-Za-z_][A-Za-z0-9_]*)((?:\.[A-Za-z0-9_]+|\[[^\]]*\])*)$/;
const STEP = /\.([A-Za-z0-9_]+)|\[([^\]]*)\]/g;

/** `a.b[3].c` split into its base and steps; undefined when the text is no path. */
export function parsePath(text: string): ParsedPath | undefined {
  const m = PATH.exec(text.replace(/\s+/g, ''));
  if (!m) return undefined;
  const steps: PathStep[] = [];
  for (const s of m[2]!.matchAll(STEP)) {
    if (s[1] !== undefined) steps.push({ member: s[1] });
    else {
      const parts = s[2]!.split(',');
      steps.push(parts.every((p) => /^[+-]?[0-9]+$/.test(p)) ? { index: parts.map(Number) } : { variableIndex: s[2]! });
    }
  }
  return { base: m[1]!, steps };
}

/** Whether a name is a path (has a member or an index). */
export function isPath(name: string): boolean {
  return /[.[]/.test(name) && !name.startsWith('%');
}

/** The lower-case key of a path as the readers store it: no spaces, indices as plain integers. */
export function pathKey(text: string): string {
  const p = parsePath(text);
  if (!p) return text.toLowerCase();
  return (p.base + p.steps.map(stepText).join('')).toLowerCase();
}

/** The part of a key up to its first variable index (what a write with a variable index may change). */
export function fixedPrefix(p: ParsedPath): string {
  const cut = p.steps.findIndex((s) => 'variableIndex' in s);
  return (p.base + p.steps.slice(0, cut < 0 ? p.steps.length : cut).map(stepText).join('')).toLowerCase();
}

function stepText(s: PathStep): string {
  return 'member' in s ? `.${s.member}` : 'index' in s ? `[${s.index.join(',')}]` : `[${s.variableIndex}]`;
}

/** A named type stands for its definition (a chain of names at most as long as the table). */
function expandAlias(type: string, types: PathTypes): string {
  let t = type.trim();
  for (let n = 0; n < types.types.size; n++) {
    const alias = types.types.get(t.toUpperCase())?.alias;
    if (alias === undefined) break;
    t = alias.trim();
  }
  return t;
}

const ARRAY = /^ARRAY\s*\[(.*)\]\s*OF\s+(.+)$/is;

/**
 * The declaration a path stands for: its type, its initial value (the member's own, or the
 * whole variable's initial value text, which the readers then report as not read), the
 * section of its base; a member of a block instance carries `source`. An index outside the
 * declared bounds is an error at the line (compilers refuse it too).
 */
export function resolvePath(base: ImplVariable, path: ParsedPath, types: PathTypes, line: number): Resolved {
  let type = base.type.trim();
  let name = base.name;
  let initial = base.initial;
  for (const [i, step] of path.steps.entries()) {
    type = expandAlias(type, types);
    const upper = type.toUpperCase();
    const rest = (): string => name + path.steps.slice(i).map(stepText).join('');
    if ('variableIndex' in step) {
      return { ok: false, kind: 'unsupported', why: `array element ${rest()} at line ${line}: the index ${step.variableIndex} is not a constant` };
    }
    if ('index' in step) {
      const array = ARRAY.exec(type);
      if (!array) return { ok: false, kind: 'unsupported', why: `${rest()} at line ${line}: ${name} (${type || 'undeclared'}) is not an array` };
      const bounds = array[1]!.split(',').map((b) => /^\s*([+-]?[0-9]+)\s*\.\.\s*([+-]?[0-9]+)\s*$/.exec(b));
      if (bounds.some((b) => !b)) return { ok: false, kind: 'unsupported', why: `array element ${rest()} at line ${line}: the bounds of ${name} (${array[1]!.trim()}) are not integer literals` };
      if (bounds.length !== step.index.length) throw new LineError(line, `${rest()}: ${name} has ${bounds.length} dimension(s), ${step.index.length} index(es) given`);
      step.index.forEach((k, d) => {
        const [lo, hi] = [Number(bounds[d]![1]), Number(bounds[d]![2])];
        if (k < lo || k > hi) throw new LineError(line, `index ${k} of ${name} is outside its bounds ${lo}..${hi}`);
      });
      type = array[2]!.trim();
      name += stepText(step);
      continue;
    }
    const struct = types.types.get(upper);
    if (struct) {
      const member = struct.members.find((m) => m.name.toLowerCase() === step.member.toLowerCase());
      if (!member) return { ok: false, kind: 'unsupported', why: `member ${rest()} at line ${line}: ${struct.name} (line ${struct.line}) has no member ${step.member}` };
      name += `.${member.name}`;
      type = member.type.trim();
      initial = initial ?? member.initial;
      continue;
    }
    const kind = blockKind(upper, types.blockTypes);
    const own = types.blockTypes.has(upper) ? types.pouVariables.get(upper) : undefined;
    if (kind !== 'function-call') {
      const members = own
        ? Object.fromEntries(own.filter((v) => v.section === 'input' || v.section === 'output' || v.section === 'in-out').map((v) => [v.name.toUpperCase(), v.type]))
        : (STANDARD_MEMBERS[upper] ?? {});
      const memberType = members[step.member.toUpperCase()];
      if (memberType === undefined) return { ok: false, kind, why: `member ${rest()} at line ${line}: ${type} has no input or output ${step.member}` };
      if (i < path.steps.length - 1) return { ok: false, kind, why: `${rest()} at line ${line}: a member of an output of ${name} (${type}) is not read` };
      const memberName = own?.find((v) => v.name.toUpperCase() === step.member.toUpperCase())?.name ?? step.member.toUpperCase();
      return { ok: true, variable: { name: `${name}.${memberName}`, section: 'local', type: memberType, line: base.line, source: { kind, instance: name, type } } };
    }
    const why = isElementary(type)
      ? `${rest()} at line ${line}: ${name} is ${type}, which has no members (bit access is not read)`
      : `member ${rest()} at line ${line}: the type ${type || 'of an undeclared name'} of ${name} is not declared in this file`;
    return { ok: false, kind: 'unsupported', why };
  }
  return {
    ok: true,
    variable: {
      name,
      section: base.section,
      type: expandAlias(type, types),
      line: base.line,
      ...(initial !== undefined ? { initial } : {}),
      ...(base.constant ? { constant: true } : {}),
      ...(base.address ? { address: base.address } : {}),
    },
  };
}
