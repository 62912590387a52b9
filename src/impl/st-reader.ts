// Structured Text read back: POUs, their declarations, and their statements executed
// symbolically into one Boolean expression per assigned BOOL. Expressions go to the engine's
// parser; this file only finds statements and the parts a truth table cannot judge.
import {
  fail,
  FALSE,
  isReserved,
  ok,
  parseExpression,
  TRUE,
  type Expr,
  type Result,
  type Signal,
} from '../logic/index.js';
import { blockKind, kindWord } from './constructs.js';
import { mapVars } from './expr-dag.js';
import { functionTable } from './functions.js';
import { isElementary, parsePath, pathKey } from './paths.js';
import { isOp, isWord, tokenize, type Token } from './st-lexer.js';
import { PouBuilder, orFolded, type PouHeader } from './symbolic.js';
import type { CannotJudge, CannotJudgeKind, ImplPou, ImplProgram, ImplVariable, PouKind, ReadContext, StructType, VarSection } from './types.js';
import { LineError } from './line-error.js';

/** The text a run of tokens points into, and the same text with comments blanked. */
export interface StText {
  readonly source: string;
  readonly clean: string;
}

/** Statements as tokens, with the text they come from. */
export interface StBlock {
  readonly name: string;
  readonly line: number;
  readonly tokens: readonly Token[];
  readonly text: StText;
}

/**
 * A POU's ST body with what belongs to it: actions (run where the body calls them), and
 * blocks that run at times a single scan does not show (methods, transitions, steps, actions
 * in a language not read): what they write is unchecked.
 */
export interface StBody {
  readonly tokens: readonly Token[];
  readonly text: StText;
  readonly actions: readonly StBlock[];
  readonly elsewhere: readonly { readonly what: string; readonly line: number; readonly tokens?: readonly Token[]; readonly everyOutput?: string }[];
}

/** The source with everything outside the tokens (comments) blanked; offsets and lines kept. */
export function stText(source: string, tokens: readonly Token[]): StText {
  const parts: string[] = [];
  let at = 0;
  for (const t of tokens) {
    parts.push(source.slice(at, t.start).replace(/[^\n]/g, ' '), source.slice(t.start, t.end));
    at = t.end;
  }
  parts.push(source.slice(at).replace(/[^\n]/g, ' '));
  return { source, clean: parts.join('') };
}

const SECTIONS: Readonly<Record<string, VarSection>> = {
  VAR_INPUT: 'input',
  VAR_OUTPUT: 'output',
  VAR_IN_OUT: 'in-out',
  VAR: 'local',
  VAR_TEMP: 'temp',
  VAR_EXTERNAL: 'external',
  VAR_GLOBAL: 'global',
};

const POU_END: Readonly<Record<PouKind, string>> = {
  PROGRAM: 'END_PROGRAM',
  FUNCTION_BLOCK: 'END_FUNCTION_BLOCK',
  FUNCTION: 'END_FUNCTION',
};

const OPENERS: Readonly<Record<string, string>> = {
  IF: 'END_IF',
  CASE: 'END_CASE',
  FOR: 'END_FOR',
  WHILE: 'END_WHILE',
  REPEAT: 'END_REPEAT',
};
const CLOSERS = new Set(Object.values(OPENERS));

/** Words that end or structure statements: never part of an expression. */
const STATEMENT_WORDS = new Set([
  ...Object.keys(OPENERS),
  ...CLOSERS,
  'THEN', 'ELSIF', 'ELSE', 'OF', 'TO', 'BY', 'DO', 'UNTIL', 'RETURN', 'EXIT', 'CONTINUE',
  ...Object.keys(SECTIONS), 'END_VAR', ...Object.values(POU_END), ...Object.keys(POU_END),
]);

/** Blocks inside a POU that are not its body. */
const INNER_BLOCKS: Readonly<Record<string, string>> = {
  ACTION: 'END_ACTION',
  METHOD: 'END_METHOD',
  PROPERTY: 'END_PROPERTY',
  TRANSITION: 'END_TRANSITION',
  STEP: 'END_STEP',
  INITIAL_STEP: 'END_STEP',
};

const isBoolType = (type: string): boolean => type === '' || type.trim().toUpperCase() === 'BOOL';

const LOGIC_FUNCTIONS = new Set(['AND', 'OR', 'XOR', 'NOT']);
const BOOL_WORDS = new Set(['TRUE', 'FALSE']);

/** Read a whole .st file: every PROGRAM, FUNCTION_BLOCK and FUNCTION in it. */
export function readStFile(file: string, text: string): Result<ImplProgram> {
  const lexed = tokenize(text);
  if (!lexed.ok) return fail({ message: `${file} ${lexed.error.message}` });
  const tokens = lexed.value;
  try {
    const found = findPous(tokens, text);
    const blockTypes = new Set(found.pous.filter((p) => p.kind === 'FUNCTION_BLOCK').map((p) => p.name.toUpperCase()));
    const pouVariables = new Map(found.pous.map((p) => [p.name.toUpperCase(), p.variables]));
    const whole = stText(text, tokens);
    const readOne = (p: FoundPou): Result<ImplPou> =>
      readStBody(context, p, { tokens: p.body, text: whole, actions: p.actions.map((a) => ({ ...a, text: whole })), elsewhere: p.elsewhere });
    const functions = functionTable(found.pous, readOne);
    const context: ReadContext = { file, globals: found.globals, blockTypes, pouVariables, types: found.types, functionNamed: functions.named };
    const pous: ImplPou[] = [];
    for (const p of found.pous) {
      const read = functions.read(p);
      if (!read.ok) return read;
      pous.push(read.value);
    }
    if (pous.length === 0) return fail({ message: `${file}: no PROGRAM, FUNCTION_BLOCK or FUNCTION found` });
    return ok({ file, format: 'st', pous, types: { types: found.types, blockTypes, pouVariables } });
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `${file} line ${e.line}: ${e.message}` });
    throw e;
  }
}

interface FoundPou extends PouHeader {
  readonly body: Token[];
  readonly actions: { name: string; line: number; tokens: Token[] }[];
  readonly elsewhere: { what: string; line: number; tokens: Token[]; everyOutput?: string }[];
}

/** POU headers, declarations and body extents; global variables of the whole file. */
function findPous(tokens: readonly Token[], source: string): { pous: FoundPou[]; globals: ImplVariable[]; types: Map<string, StructType> } {
  const pous: FoundPou[] = [];
  const globals: ImplVariable[] = [];
  const types = new Map<string, StructType>();
  let i = 0;
  while (i < tokens.length) {
    const t = tokens[i]!;
    const word = t.kind === 'ident' ? t.text.toUpperCase() : '';
    if (word === 'PROGRAM' || word === 'FUNCTION_BLOCK' || word === 'FUNCTION') {
      const kind = word as PouKind;
      const nameToken = tokens[i + 1];
      if (nameToken?.kind !== 'ident') throw new LineError(t.line, `expected a name after ${word}`);
      i += 2;
      const variables: ImplVariable[] = [];
      if (kind === 'FUNCTION') {
        if (!isOp(tokens[i], ':')) throw new LineError(nameToken.line, `expected ': <type>' after FUNCTION ${nameToken.text}`);
        const typeToken = tokens[i + 1];
        if (!typeToken) throw new LineError(nameToken.line, 'expected the return type');
        variables.push({ name: nameToken.text, section: 'output', type: typeToken.text, line: nameToken.line });
        i += 2;
      }
      while (i < tokens.length && tokens[i]!.kind === 'ident' && Object.hasOwn(SECTIONS, tokens[i]!.text.toUpperCase())) {
        i = readSection(tokens, i, source, variables);
      }
      const end = POU_END[kind];
      const body: Token[] = [];
      const actions: FoundPou['actions'] = [];
      const elsewhere: FoundPou['elsewhere'] = [];
      while (i < tokens.length && !isWord(tokens[i], end)) {
        const x = tokens[i]!;
        if (isWord(x, 'PROGRAM', 'FUNCTION_BLOCK', 'FUNCTION')) {
          throw new LineError(x.line, `${word} ${nameToken.text} (line ${t.line}) has no ${end} before this`);
        }
        // A block starts with its word and a name (a variable called Step is no block).
        const inner = x.kind === 'ident' && tokens[i + 1]?.kind === 'ident' ? INNER_BLOCKS[x.text.toUpperCase()] : undefined;
        if (inner === undefined) {
          body.push(x);
          i++;
          continue;
        }
        const from = i;
        while (i < tokens.length && !isWord(tokens[i], inner)) i++;
        if (i >= tokens.length) throw new LineError(x.line, `${x.text} has no ${inner}`);
        const blockWord = x.text.toUpperCase();
        const blockName = tokens[from + 1]?.kind === 'ident' ? tokens[from + 1]!.text : '';
        if (blockWord === 'ACTION') {
          const colon = isOp(tokens[from + 2], ':') ? from + 3 : from + 2;
          actions.push({ name: blockName, line: x.line, tokens: tokens.slice(colon, i) });
        } else {
          const what = `${blockWord.toLowerCase().replace('_', ' ')} ${blockName}`;
          const sfc = blockWord !== 'METHOD' && blockWord !== 'PROPERTY';
          const everyOutput = sfc ? 'sequential function chart elements are not read' : undefined;
          elsewhere.push({ what, line: x.line, tokens: tokens.slice(from + 2, i), ...(everyOutput ? { everyOutput } : {}) });
        }
        i++;
      }
      if (i >= tokens.length) throw new LineError(t.line, `${word} ${nameToken.text} has no ${end}`);
      pous.push({ name: nameToken.text, kind, language: 'ST', line: t.line, variables, body, actions, elsewhere });
      i++;
    } else if (word === 'VAR_GLOBAL') {
      i = readSection(tokens, i, source, globals);
    } else if (word === 'TYPE') {
      i = readTypes(tokens, i, source, types);
    } else if (word === 'CONFIGURATION') {
      // A configuration may hold global variables.
      const end = `END_${word}`;
      i++;
      while (i < tokens.length && !isWord(tokens[i], end)) {
        if (isWord(tokens[i], 'VAR_GLOBAL')) i = readSection(tokens, i, source, globals);
        else i++;
      }
      if (i >= tokens.length) throw new LineError(t.line, `${word} has no ${end}`);
      i++;
    } else if (isOp(t, ';')) i++;
    else throw new LineError(t.line, `expected PROGRAM, FUNCTION_BLOCK or FUNCTION, found '${t.text}'`);
  }
  return { pous, globals, types };
}

/** One VAR_xxx ... END_VAR section; returns the index after END_VAR. */
function readSection(tokens: readonly Token[], start: number, source: string, into: ImplVariable[]): number {
  const head = tokens[start]!;
  const section = SECTIONS[head.text.toUpperCase()]!;
  let i = start + 1;
  let constant = false;
  while (isWord(tokens[i], 'CONSTANT', 'RETAIN', 'NON_RETAIN', 'PERSISTENT')) {
    if (isWord(tokens[i], 'CONSTANT')) constant = true;
    i++;
  }
  return readDeclarations(tokens, i, source, { head, section, constant, end: 'END_VAR' }, into) + 1;
}

/** Declarations `a, b AT %IX0.1 : TYPE := init;` up to the word `end`; returns its index. */
function readDeclarations(
  tokens: readonly Token[],
  start: number,
  source: string,
  list: { readonly head: Token; readonly section: VarSection; readonly constant: boolean; readonly end: string },
  into: ImplVariable[],
): number {
  const { head, section, constant } = list;
  let i = start;
  while (!isWord(tokens[i], list.end)) {
    if (i >= tokens.length) throw new LineError(head.line, `${head.text} has no ${list.end}`);
    const names: { token: Token; address?: string }[] = [];
    for (;;) {
      const name = tokens[i];
      if (name?.kind !== 'ident' || STATEMENT_WORDS.has(name.text.toUpperCase())) {
        throw new LineError(name?.line ?? head.line, `expected a variable name in ${head.text}`);
      }
      i++;
      if (isWord(tokens[i], 'AT')) {
        names.push({ token: name, address: tokens[i + 1]?.text ?? '' });
        i += 2;
      } else names.push({ token: name });
      if (!isOp(tokens[i], ',')) break;
      i++;
    }
    const first = names[0]!.token;
    if (!isOp(tokens[i], ':')) throw new LineError(first.line, `expected ':' and a type after ${names.map((n) => n.token.text).join(', ')}`);
    i++;
    const typeStart = i;
    i = skipTo(tokens, i, (t) => isOp(t, ':=') || isOp(t, ';'), head.line, 'declaration');
    if (i === typeStart) throw new LineError(first.line, `expected a type for ${first.text}`);
    const type = sourceOf(source, tokens, typeStart, i);
    let initial: string | undefined;
    if (isOp(tokens[i], ':=')) {
      const initStart = ++i;
      i = skipTo(tokens, i, (t) => isOp(t, ';'), head.line, 'declaration');
      initial = sourceOf(source, tokens, initStart, i);
    }
    i++;
    for (const { token, address } of names) {
      into.push({
        name: token.text,
        section,
        type,
        line: token.line,
        ...(initial !== undefined ? { initial } : {}),
        ...(address !== undefined ? { address } : {}),
        ...(constant ? { constant } : {}),
      });
    }
  }
  return i;
}

/**
 * A TYPE ... END_TYPE block: structures (members with their types and initial values) and
 * other named types (kept as the type they stand for: `T_Row : ARRAY [1..4] OF BOOL`).
 * Returns the index after END_TYPE.
 */
function readTypes(tokens: readonly Token[], start: number, source: string, into: Map<string, StructType>): number {
  const head = tokens[start]!;
  let i = start + 1;
  while (!isWord(tokens[i], 'END_TYPE')) {
    const name = tokens[i];
    if (i >= tokens.length || name === undefined) throw new LineError(head.line, 'TYPE has no END_TYPE');
    if (name.kind !== 'ident' || !isOp(tokens[i + 1], ':')) throw new LineError(name.line, `expected 'Name :' in TYPE, found '${name.text}'`);
    i += 2;
    if (isWord(tokens[i], 'STRUCT')) {
      const members: ImplVariable[] = [];
      i = readDeclarations(tokens, i + 1, source, { head: tokens[i]!, section: 'local', constant: false, end: 'END_STRUCT' }, members) + 1;
      into.set(name.text.toUpperCase(), { name: name.text, line: name.line, members });
    } else {
      const typeStart = i;
      i = skipTo(tokens, i, (t) => isOp(t, ';') || isOp(t, ':='), name.line, 'type declaration');
      into.set(name.text.toUpperCase(), { name: name.text, line: name.line, members: [], alias: sourceOf(source, tokens, typeStart, i) });
      i = skipTo(tokens, i, (t) => isOp(t, ';'), name.line, 'type declaration');
    }
    if (isOp(tokens[i], ';')) i++;
  }
  return i + 1;
}

/** Index of the first token at bracket depth 0 that satisfies `stop`. */
function skipTo(tokens: readonly Token[], from: number, stop: (t: Token) => boolean, line: number, what: string): number {
  let depth = 0;
  for (let i = from; i < tokens.length; i++) {
    const t = tokens[i]!;
    if (depth === 0 && stop(t)) return i;
    if (isOp(t, '(') || isOp(t, '[')) depth++;
    else if (isOp(t, ')') || isOp(t, ']')) depth--;
  }
  throw new LineError(line, `${what} starting on line ${line} is not finished (missing ';' or keyword)`);
}

function sourceOf(source: string, tokens: readonly Token[], from: number, to: number): string {
  return from >= to ? '' : source.slice(tokens[from]!.start, tokens[to - 1]!.end);
}

/** Read one POU's statements (tokens between its declarations and its END_xxx). */
export function readStBody(context: ReadContext, header: PouHeader, body: StBody): Result<ImplPou> {
  try {
    const calls = new Calls(context, header);
    const assigned = assignedNames(body.tokens, calls);
    for (const a of body.actions) for (const n of assignedNames(a.tokens, calls)) assigned.add(n);
    const elsewhereWrites = body.elsewhere.map((e) => ownWrites(e.tokens ?? [], calls, header));
    for (const names of elsewhereWrites) for (const n of names) assigned.add(n);
    const builder = new PouBuilder(header, context.globals, assigned, context);
    const run = { actions: new Map(body.actions.map((a) => [a.name.toUpperCase(), a])), called: new Set<string>(), steps: 0 };
    new BodyReader(context, builder, calls, body.tokens, body.text, run, 0).run();
    // What runs outside the scan's statements may change what they assign, at a time unknown.
    const later: { what: string; line: number; names: readonly string[] }[] = body.elsewhere.map((e, i) => ({ ...e, names: [...elsewhereWrites[i]!] }));
    for (const a of body.actions) {
      if (!run.called.has(a.name.toUpperCase())) later.push({ what: `action ${a.name}`, line: a.line, names: [...ownWrites(a.tokens, calls, header)] });
    }
    for (const e of body.elsewhere) {
      if (e.everyOutput) builder.taintEveryOutput('unsupported', `${e.what} (line ${e.line}) of ${header.name}: ${e.everyOutput}`, e.line);
    }
    for (const l of later) {
      for (const lower of l.names) {
        const when = l.what.startsWith('action') ? `it is not called in the body of ${header.name}` : 'it runs when called from outside the scan';
        builder.writeUnknown(lower, l.line, (name) => builder.cannotJudge('unsupported', `${l.what} (line ${l.line}) writes ${name}; ${when}`, l.line), true);
      }
    }
    return ok(builder.finish());
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `${context.file} line ${e.line}: ${e.message}` });
    throw e;
  }
}

/** Names of the POU's own variables (and paths under them) that a block (action, method...) assigns. */
function ownWrites(tokens: readonly Token[], calls: Calls, header: PouHeader): Set<string> {
  const own = new Set(header.variables.map((v) => v.name.toLowerCase()));
  return new Set([...assignedNames(tokens, calls)].filter((n) => own.has(parsePath(n)?.base.toLowerCase() ?? n)));
}

/** End (exclusive) of an access path a.b.c or a[i].b starting at token k, at most `to`. */
function accessEnd(tokens: readonly Token[], k: number, to = tokens.length): number {
  let end = k + 1;
  while (end < to && (isOp(tokens[end], '.') || isOp(tokens[end], '['))) {
    end = isOp(tokens[end], '.') ? end + 2 : skipTo(tokens, end + 1, (x) => isOp(x, ']'), tokens[k]!.line, 'index') + 1;
  }
  return Math.min(end, to);
}

function pathText(tokens: readonly Token[], from: number, to: number): string {
  return tokens.slice(from, to).map((x) => x.text).join('');
}

/** Every name or path the body assigns: `x :=`, `io.b :=`, `x S=`, `x R=`, call outputs `=> x` and in-out actuals. */
function assignedNames(tokens: readonly Token[], calls: Calls): Set<string> {
  const out = new Set<string>();
  tokens.forEach((t, i) => {
    if (t.kind !== 'ident') return;
    const prev = tokens[i - 1];
    const next = tokens[i + 1];
    if (!isOp(prev, '.')) {
      const end = accessEnd(tokens, i);
      const after = tokens[end];
      const named = isOp(prev, '(') || isOp(prev, ',');
      if ((isOp(after, ':=') && !named) || isOp(prev, '=>') || (isWord(after, 'S', 'R') && isOp(tokens[end + 1], '='))) {
        out.add(pathKey(pathText(tokens, i, end)));
      }
    }
    if (isOp(next, '(') && !STATEMENT_WORDS.has(t.text.toUpperCase())) {
      const close = skipTo(tokens, i + 2, (y) => isOp(y, ')'), t.line, 'call');
      for (const w of calls.writes(calleeAt(tokens, i), tokens, i + 2, close, undefined)) out.add(w.target.text.toLowerCase());
    }
  });
  return out;
}

/** The name called at token k (followed by '('): `f`, or a path `inst.m` ending at k. */
function calleeAt(tokens: readonly Token[], k: number): string {
  let j = k;
  while (isOp(tokens[j - 1], '.') && tokens[j - 2]?.kind === 'ident') j -= 2;
  return tokens.slice(j, k + 1).map((x) => x.text).join('');
}

/** One argument of a call: `p := e`, `p => x`, or positional `e` (tokens [from, to)). */
interface Argument {
  readonly param?: string;
  readonly output: boolean;
  readonly from: number;
  readonly to: number;
}

function argumentsOf(tokens: readonly Token[], open: number, close: number, line: number): Argument[] {
  const out: Argument[] = [];
  let i = open;
  while (i < close) {
    const end = Math.min(skipTo(tokens, i, (x) => isOp(x, ',') || isOp(x, ')'), line, 'call'), close);
    const notOut = isWord(tokens[i], 'NOT') ? 1 : 0;
    const head = tokens[i + notOut];
    const op = tokens[i + notOut + 1];
    if (head?.kind === 'ident' && (isOp(op, ':=') || isOp(op, '=>')) && i + notOut + 2 <= end) {
      out.push({ param: head.text, output: isOp(op, '=>'), from: i + notOut + 2, to: end });
    } else if (end > i) out.push({ output: false, from: i, to: end });
    i = end + 1;
  }
  return out;
}

/** A variable or path a call may write: a `=>` output (`param`), or an actual passed to a VAR_IN_OUT (or maybe one). */
interface Write {
  readonly target: { readonly text: string; readonly line: number };
  readonly why: string;
  readonly param?: string;
}

/** What the POU knows of the things it calls: which of their parameters write back. */
class Calls {
  private readonly byName = new Map<string, ImplVariable>();

  constructor(
    private readonly context: ReadContext,
    header: PouHeader,
  ) {
    for (const v of [...context.globals, ...header.variables]) this.byName.set(v.name.toLowerCase(), v);
  }

  private declared(name: string): ImplVariable | undefined {
    return this.byName.get(name.toLowerCase());
  }

  /**
   * Whether a call statement of `callee` is of something whose effects are known: a declared
   * instance, a POU of the file, a standard function. Anything else (an action or a program
   * not in the file) may write any variable.
   */
  known(callee: string): boolean {
    const type = (this.declared(callee)?.type ?? callee).trim().toUpperCase();
    return this.declared(callee) !== undefined || this.context.pouVariables.has(type) || isReserved(type);
  }

  /**
   * The variables a call of `callee` with arguments in tokens [open, close) writes. The
   * project's own POUs say which parameters are VAR_IN_OUT; standard functions and blocks
   * write only their `=>` outputs; anything else may write back any variable passed to it.
   */
  writes(callee: string, tokens: readonly Token[], open: number, close: number, b: PouBuilder | undefined): Write[] {
    const instance = this.declared(callee);
    const type = (instance ? instance.type : callee).trim().toUpperCase();
    const own = this.context.pouVariables.get(type);
    const standard = !own && (isReserved(type) || blockKind(type, this.context.blockTypes) !== 'function-call');
    // A FUNCTION's own name is its result, not a parameter.
    const params = own?.filter((v) => (v.section === 'input' || v.section === 'in-out' || v.section === 'output') && v.name.toUpperCase() !== type) ?? [];
    const line = tokens[open - 1]?.line ?? 1;
    const out: Write[] = [];
    // A block or function of the file that declares globals (VAR_EXTERNAL) may write them.
    for (const g of own ?? []) {
      const here = this.declared(g.name);
      if (g.section === 'external' && !g.constant && here && (here.section === 'global' || here.section === 'external')) {
        out.push({ target: { text: here.name, line }, why: `${callee} (${instance?.type.trim() ?? callee}) may write the global ${here.name} (its VAR_EXTERNAL)` });
      }
    }
    argumentsOf(tokens, open, close, line).forEach((arg, position) => {
      const head = tokens[arg.from];
      if (head?.kind !== 'ident' || accessEnd(tokens, arg.from, arg.to) !== arg.to) return;
      const target = { text: pathText(tokens, arg.from, arg.to), line: head.line };
      if (arg.output) {
        out.push({ target, why: `output ${arg.param} of ${callee} (=> ${target.text})`, param: arg.param! });
        return;
      }
      if (standard) return;
      const formal = arg.param === undefined ? params[position] : params.find((p) => p.name.toLowerCase() === arg.param!.toLowerCase());
      if (own && formal?.section !== 'in-out') return;
      const d = b ? b.variable(head.text, target.line) : this.declared(head.text);
      if (!own && (d === undefined || d.section === 'input' || d.constant)) return;
      out.push({
        target,
        why: own ? `VAR_IN_OUT ${formal!.name} of ${callee} (${instance?.type.trim() ?? callee}) writes back into ${target.text}` : `${callee} may write back into ${target.text} (its parameters are not known)`,
      });
    });
    return out;
  }
}

/** Far deeper than hand-written code goes; keeps the reader's recursion bounded. */
const MAX_IF_DEPTH = 100;
/** Actions calling actions: deeper than this is refused (it is recursion). */
const MAX_ACTION_DEPTH = 16;
/** Statements run in all, actions inlined at every call counted each time. */
const MAX_STEPS = 1_000_000;

interface Run {
  readonly actions: ReadonlyMap<string, StBlock>;
  readonly called: Set<string>;
  steps: number;
}

class BodyReader {
  private i = 0;
  private depth = 0;
  /** The source with everything outside tokens (comments) blanked: expression text comes from here. */
  private readonly clean: string;

  constructor(
    private readonly context: ReadContext,
    private readonly b: PouBuilder,
    private readonly calls: Calls,
    private readonly tokens: readonly Token[],
    text: StText,
    private readonly runState: Run,
    private readonly actionDepth: number,
  ) {
    this.clean = text.clean;
  }

  run(): void {
    this.statements([]);
    if (this.i < this.tokens.length) throw new LineError(this.tokens[this.i]!.line, `unexpected '${this.tokens[this.i]!.text}'`);
  }

  private get t(): Token | undefined {
    return this.tokens[this.i];
  }

  /** Statements until one of the words `until` (not consumed) or the end. */
  private statements(until: readonly string[]): void {
    while (this.i < this.tokens.length && !isWord(this.t, ...until)) {
      if (++this.runState.steps > MAX_STEPS) throw new LineError(this.t!.line, `more than ${MAX_STEPS} statements to run (actions called again and again)`);
      this.statement();
    }
  }

  private statement(): void {
    const t = this.t!;
    if (isOp(t, ';')) {
      this.i++;
      return;
    }
    if (t.kind !== 'ident') throw new LineError(t.line, `expected a statement, found '${t.text}'`);
    const word = t.text.toUpperCase();
    if (word === 'IF') return this.ifStatement();
    if (word === 'CASE' || word === 'FOR' || word === 'WHILE' || word === 'REPEAT') return this.flowBlock();
    if (word === 'RETURN' || word === 'EXIT' || word === 'CONTINUE') {
      this.i++;
      if (isOp(this.t, ';')) this.i++;
      const last = this.i >= this.tokens.length && this.actionDepth === 0;
      if (!(word === 'RETURN' && last)) this.b.taintEveryOutput('control-flow', `${word} at line ${t.line}`, t.line);
      return;
    }
    if (STATEMENT_WORDS.has(word)) throw new LineError(t.line, `unexpected ${t.text}`);
    this.targetStatement();
  }

  private ifStatement(): void {
    const line = this.t!.line;
    if (++this.depth > MAX_IF_DEPTH) throw new LineError(line, `IF statements nest deeper than ${MAX_IF_DEPTH} levels`);
    const chain = this.b.beginIf();
    let keyword = 'IF';
    while (keyword === 'IF' || keyword === 'ELSIF') {
      this.i++;
      const thenAt = skipTo(this.tokens, this.i, (x) => isWord(x, 'THEN'), line, `${keyword} condition`);
      const cond = this.expression(this.i, thenAt);
      chain.enter();
      this.i = thenAt + 1;
      this.statements(['ELSIF', 'ELSE', 'END_IF']);
      chain.leave(cond);
      if (this.i >= this.tokens.length) throw new LineError(line, 'IF has no END_IF');
      keyword = this.t!.text.toUpperCase();
    }
    if (keyword === 'ELSE') {
      this.i++;
      chain.enter();
      this.statements(['END_IF']);
      chain.leave(null);
      if (this.i >= this.tokens.length) throw new LineError(line, 'IF has no END_IF');
    }
    this.i++;
    if (isOp(this.t, ';')) this.i++;
    chain.end(line);
    this.depth--;
  }

  /** CASE and loops: what they assign takes a value a truth table cannot judge. */
  private flowBlock(): void {
    const open = this.t!;
    const word = open.text.toUpperCase();
    let depth = 0;
    const start = this.i;
    for (; this.i < this.tokens.length; this.i++) {
      const x = this.tokens[this.i]!;
      if (x.kind !== 'ident') continue;
      const w = x.text.toUpperCase();
      if (Object.hasOwn(OPENERS, w)) depth++;
      else if (CLOSERS.has(w) && --depth === 0) break;
    }
    if (this.i >= this.tokens.length) throw new LineError(open.line, `${word} has no ${OPENERS[word]}`);
    const inside = this.tokens.slice(start, this.i);
    this.i++;
    if (isOp(this.t, ';')) this.i++;
    const names = assignedNames(inside, this.calls);
    // An action called inside writes what the action assigns.
    inside.forEach((x, k) => {
      const action = x.kind === 'ident' && isOp(inside[k + 1], '(') ? this.runState.actions.get(x.text.toUpperCase()) : undefined;
      if (action) {
        this.runState.called.add(x.text.toUpperCase());
        for (const n of assignedNames(action.tokens, this.calls)) names.add(n);
      }
    });
    // Block instances called inside are called at some point: their members are new values after it.
    inside.forEach((x, k) => {
      if (x.kind === 'ident' && isOp(inside[k + 1], '(') && !isOp(inside[k - 1], '.')) this.b.instanceCalled(x.text);
    });
    for (const name of names) {
      this.b.writeUnknown(name, open.line, (v) => this.b.cannotJudge('control-flow', `${word} at line ${open.line} assigns ${v}`, open.line));
    }
  }

  /** `x := e;`, `x S= e;`, `x R= e;`, `inst(...);`, `f(...);`, `inst.m(...);`. */
  private targetStatement(): void {
    const first = this.t!;
    const end = accessEnd(this.tokens, this.i);
    const simple = end === this.i + 1;
    const target = pathText(this.tokens, this.i, end);
    const after = this.tokens[end];
    this.i = end;
    // The BOOL variable or path assigned, if it is one this scan can follow.
    const boolTarget = (): string | undefined => {
      if (simple) return this.b.isBool(first.text, first.line) ? first.text : undefined;
      const parsed = parsePath(target);
      const r = parsed && !parsed.steps.some((x) => 'variableIndex' in x) ? this.b.resolve(target, first.line) : undefined;
      return r?.ok && !r.variable.source && r.variable.type.toUpperCase() === 'BOOL' ? r.variable.name : undefined;
    };
    /** An assignment of something that is no BOOL: nothing for an INT, every member unknown for a structure. */
    const otherTarget = (what: string): void => {
      const d = simple ? this.b.variable(first.text, first.line) : undefined;
      if (d && isElementary(d.type)) return;
      this.b.writeUnknown(target, first.line, (v) => this.b.cannotJudge('unsupported', `${what} ${v} at line ${first.line} is not followed member by member`, first.line));
    };
    if (isOp(after, ':=')) {
      const semi = skipTo(this.tokens, end + 1, (x) => isOp(x, ';'), first.line, 'assignment');
      const name = boolTarget();
      if (name !== undefined) this.b.assign(name, this.expression(end + 1, semi), first.line);
      else {
        this.callWritesIn(end + 1, semi);
        otherTarget('assignment to');
      }
      this.i = semi + 1;
    } else if (isWord(after, 'S', 'R') && isOp(this.tokens[end + 1], '=')) {
      const semi = skipTo(this.tokens, end + 2, (x) => isOp(x, ';'), first.line, 'assignment');
      const op = `${after!.text.toUpperCase()}=`;
      this.callWritesIn(end + 2, semi);
      // Both S= and R= of one variable stay in its reasons: the later one keeps the earlier one's value.
      const name = boolTarget();
      if (name !== undefined) {
        const value = this.b.opaque('set-reset', `${op} on ${target} at line ${first.line}`, first.line);
        const before = this.b.assignedValue(name);
        this.b.assign(name, before ? orFolded(before, value) : value, first.line);
      } else otherTarget(`${op} on`);
      this.i = semi + 1;
    } else if (isOp(after, '(')) {
      const close = skipTo(this.tokens, end + 1, (x) => isOp(x, ')'), first.line, 'call');
      if (simple) this.call(first, end + 1, close);
      else this.pathCall(target, first, end + 1, close);
      this.i = close + 1;
      if (isOp(this.t, ';')) this.i++;
    } else {
      throw new LineError(first.line, `expected ':=' or a call after ${target}`);
    }
  }

  /** A call statement: an action of the POU (run here), an instance of a timer, counter... or a function. */
  private call(name: Token, from: number, to: number): void {
    const action = this.runState.actions.get(name.text.toUpperCase());
    if (action) {
      if (from !== to) throw new LineError(name.line, `action ${action.name} is called with arguments`);
      if (this.actionDepth >= MAX_ACTION_DEPTH) throw new LineError(name.line, `actions call actions deeper than ${MAX_ACTION_DEPTH} levels (at ${action.name})`);
      this.runState.called.add(name.text.toUpperCase());
      new BodyReader(this.context, this.b, this.calls, action.tokens, action.text, this.runState, this.actionDepth + 1).run();
      return;
    }
    if (!this.calls.known(name.text)) {
      const what = `call of ${name.text} at line ${name.line}: no instance, function or action of that name is read, so what it writes is not known`;
      this.writeBack(name.text, 'function-call', from, to, this.b.taintEveryOutput('function-call', what, name.line));
      return;
    }
    const declared = this.b.variable(name.text, name.line);
    const kind = declared.section === 'undeclared' ? 'function-call' : blockKind(declared.type, this.context.blockTypes);
    const what =
      kind === 'function-call'
        ? `call of ${name.text} at line ${name.line}`
        : `${kindWord(kind)} ${name.text} (${declared.type}) called at line ${name.line}`;
    const item = this.b.cannotJudge(kind, what, name.line);
    if (kind !== 'function-call') this.b.instanceCalled(name.text);
    this.writeBack(name.text, kind, from, to, item);
  }

  /** Calls inside an expression (tokens [from, to)) that write back: their targets become opaque. */
  private callWritesIn(from: number, to: number): void {
    for (let k = from; k < to; k++) {
      const x = this.tokens[k]!;
      if (x.kind !== 'ident' || !isOp(this.tokens[k + 1], '(') || LOGIC_FUNCTIONS.has(x.text.toUpperCase())) continue;
      const close = skipTo(this.tokens, k + 2, (y) => isOp(y, ')'), x.line, 'call');
      const callee = calleeAt(this.tokens, k);
      for (const w of this.calls.writes(callee, this.tokens, k + 2, close, this.b)) {
        this.b.writeUnknown(w.target.text, w.target.line, () => this.b.cannotJudge('function-call', `${w.why} at line ${w.target.line}`, w.target.line));
      }
    }
  }

  /** `inst.m(...)`: a method or action of an instance, not read; what it may write back is opaque. */
  private pathCall(path: string, first: Token, from: number, to: number): void {
    const item = this.b.cannotJudge('function-block', `call of ${path} at line ${first.line} (a method or action of an instance, or an instance inside a structure, not read)`, first.line);
    // Either the path is an instance or its last member is a method of one: both may change.
    this.b.instanceCalled(path);
    this.b.instanceCalled(path.slice(0, path.lastIndexOf('.')));
    this.writeBack(path, 'function-block', from, to, item);
  }


  /** Variables the call writes (outputs `=> x`, in-out actuals) take a value from it that is not judged. */
  private writeBack(callee: string, kind: CannotJudgeKind, from: number, to: number, item: CannotJudge): void {
    for (const w of this.calls.writes(callee, this.tokens, from, to, this.b)) {
      const out = w.target;
      // `Q => x` of an instance: x is the member it names (tonSync.Q), a named source.
      const member = w.param !== undefined && kind !== 'function-call' ? this.b.resolve(`${callee}.${w.param}`, out.line) : undefined;
      const name = member?.ok && member.variable.type.toUpperCase() === 'BOOL' ? member.variable.name : undefined;
      const target = this.b.resolve(out.text, out.line);
      if (name !== undefined && target.ok && isBoolType(target.variable.type) && !target.variable.source) {
        this.b.assign(target.variable.name, this.b.read(name, out.line), out.line);
      } else if (w.param !== undefined) this.b.writeUnknown(out.text, out.line, () => item);
      else this.b.writeUnknown(out.text, out.line, () => this.b.cannotJudge(kind, `${w.why} at line ${out.line}`, out.line));
    }
  }

  /**
   * The value of the expression in tokens [from, to): the parts a truth table cannot judge
   * are replaced by opaque placeholders, the rest handed to the engine's parser, and every
   * variable substituted by its current value.
   */
  private expression(from: number, to: number): Expr {
    const value = this.valueOf(from, to);
    this.callWritesIn(from, to);
    return value;
  }

  private valueOf(from: number, to: number): Expr {
    const tokens = this.tokens;
    const first = tokens[from];
    if (!first || from >= to) throw new LineError(tokens[from - 1]?.line ?? 1, 'expected an expression');
    const text = this.clean.slice(first.start, tokens[to - 1]!.end);
    const lineAt = (k: number): number => tokens[k]!.line;

    const whole = this.wholeOpaque(from, to);
    if (whole) return this.b.opaque(whole.kind, `${whole.why} "${clip(text)}" at line ${first.line}`, first.line);

    // Rewrite: pieces of text, each remembering where it came from in the source.
    let rewritten = '';
    const anchors: { at: number; source: number }[] = [];
    const signals: Signal[] = [];
    const values: Expr[] = [];
    let copiedTo = first.start;
    const replace = (a: number, b: number, value: Expr | string): void => {
      const startTok = tokens[a]!;
      rewritten += this.clean.slice(copiedTo, startTok.start);
      anchors.push({ at: rewritten.length, source: startTok.start });
      if (typeof value === 'string') rewritten += value;
      else {
        const placeholder = `__p${signals.length}`;
        signals.push({ header: placeholder, identifier: placeholder });
        values.push(value);
        rewritten += placeholder;
      }
      copiedTo = tokens[b - 1]!.end;
      anchors.push({ at: rewritten.length, source: copiedTo });
    };

    for (let k = from; k < to; k++) {
      const x = tokens[k]!;
      const next = tokens[k + 1];
      const upper = x.text.toUpperCase();
      if (x.kind === 'literal') {
        replace(k, k + 1, /^(BOOL#)?(1|TRUE)$/i.test(x.text) ? 'TRUE' : 'FALSE');
      } else if (x.kind === 'address') {
        replace(k, k + 1, this.b.read(x.text, x.line));
      } else if (x.kind !== 'ident' || LOGIC_FUNCTIONS.has(upper) || BOOL_WORDS.has(upper)) {
        continue;
      } else if (k + 1 < to && isOp(next, '(')) {
        const close = skipTo(tokens, k + 2, (y) => isOp(y, ')'), x.line, 'call');
        replace(k, close + 1, this.callValue(k, close));
        k = close;
      } else if (k + 1 < to && (isOp(next, '.') || isOp(next, '['))) {
        const end = accessEnd(tokens, k, to);
        const path = this.clean.slice(x.start, tokens[end - 1]!.end);
        if (end < to && isOp(tokens[end], '(')) {
          const close = skipTo(tokens, end + 1, (y) => isOp(y, ')'), x.line, 'call');
          replace(k, close + 1, this.b.opaque('function-block', `call of ${path}(...) at line ${x.line}`, x.line));
          k = close;
        } else {
          replace(k, end, this.access(pathText(tokens, k, end), x.line));
          k = end - 1;
        }
      } else {
        replace(k, k + 1, this.b.read(x.text, lineAt(k)));
      }
    }
    rewritten += this.clean.slice(copiedTo, tokens[to - 1]!.end);

    const parsed = parseExpression(rewritten, signals);
    if (!parsed.ok) {
      const pos = parsed.error.position ?? 0;
      const anchor = [...anchors].reverse().find((a) => a.at <= pos);
      const sourcePos = anchor ? anchor.source + (pos - anchor.at) : first.start + pos;
      const at = [...tokens.slice(from, to)].reverse().find((y) => y.start <= sourcePos) ?? first;
      // A nesting cap says so; other faults say what was expected.
      const expected = parsed.error.expected && !/nests deeper/.test(parsed.error.message) ? `expected ${parsed.error.expected}` : parsed.error.message;
      throw new LineError(at.line, `in "${clip(text)}": ${expected} near '${this.clean.slice(at.start, at.end)}'`);
    }
    return substitute(parsed.value, values);
  }

  /** A structure member, array element or instance member: its value, or why it cannot be read. */
  private access(path: string, line: number): Expr {
    const r = this.b.resolve(path, line);
    if (!r.ok) return this.b.opaque(r.kind, r.why, line);
    if (!isBoolType(r.variable.type)) return this.b.opaque('non-bool', `${r.variable.name} (${r.variable.type}) at line ${line}`, line);
    return this.b.read(r.variable.name, line);
  }

  /**
   * A call in an expression: a FUNCTION of the file is inlined (its result over its inputs,
   * with the arguments' values put in); any other function is opaque.
   */
  private callValue(k: number, close: number): Expr {
    const name = this.tokens[k]!;
    const line = name.line;
    const fn = this.context.functionNamed(name.text.toUpperCase());
    if (!fn) return this.b.opaque('function-call', `function ${name.text}(...) at line ${line}`, line);
    if (!fn.ok) return this.b.opaque('function-call', `function ${fn.name}(...) at line ${line} is not inlined: ${fn.why}`, line);
    const given = new Map<string, Expr>();
    for (const [position, arg] of argumentsOf(this.tokens, k + 2, close, line).entries()) {
      const param = arg.param === undefined ? fn.params[position] : fn.params.find((p) => p.name.toLowerCase() === arg.param!.toLowerCase());
      if (arg.output || !param) {
        const what = arg.output ? `an output (${arg.param} =>) is passed` : arg.param === undefined ? 'more arguments than inputs are given' : `${fn.name} has no input ${arg.param}`;
        return this.b.opaque('function-call', `function ${fn.name}(...) at line ${line} is not inlined: ${what}`, line);
      }
      // Only the inputs its result reads are evaluated (they are BOOL, or the result would not be read).
      if (fn.inputs.some((n) => n.toLowerCase() === param.name.toLowerCase())) given.set(param.name.toLowerCase(), this.valueOf(arg.from, arg.to));
    }
    return mapVars(fn.result, (v) => {
      const param = fn.inputs[v.input]!.toLowerCase();
      const value = given.get(param);
      if (value) return value;
      const text = fn.params.find((p) => p.name.toLowerCase() === param)?.initial?.trim() ?? 'FALSE';
      return /^(TRUE|1|BOOL#(TRUE|1))$/i.test(text) ? TRUE : /^(FALSE|0|BOOL#(FALSE|0))$/i.test(text) ? FALSE : this.b.opaque('unsupported', `initial value '${text}' of input ${param} of ${fn.name} is not read`, line);
    });
  }

  /**
   * Whether the whole expression is beyond a truth table: comparisons, arithmetic, numbers,
   * strings, or non-BOOL variables (outside the arguments of calls, which are opaque anyway).
   */
  private wholeOpaque(from: number, to: number): { kind: 'non-bool' | 'unsupported'; why: string } | undefined {
    for (let k = from; k < to; k++) {
      const x = this.tokens[k]!;
      const upper = x.text.toUpperCase();
      if (x.kind === 'ident') {
        if (STATEMENT_WORDS.has(upper)) throw new LineError(x.line, `unexpected ${x.text} in an expression`);
        if (upper === 'MOD') return { kind: 'non-bool', why: 'arithmetic' };
        if (LOGIC_FUNCTIONS.has(upper) || BOOL_WORDS.has(upper)) continue;
        if (isOp(this.tokens[k + 1], '(') && k + 1 < to) {
          k = skipTo(this.tokens, k + 2, (y) => isOp(y, ')'), x.line, 'call');
        } else if (isOp(this.tokens[k + 1], '.') || isOp(this.tokens[k + 1], '[')) {
          const end = accessEnd(this.tokens, k, to);
          const path = pathText(this.tokens, k, end);
          k = end - 1;
          if (k + 1 < to && isOp(this.tokens[k + 1], '(')) k = skipTo(this.tokens, k + 2, (y) => isOp(y, ')'), x.line, 'call');
          else {
            const parsed = parsePath(path);
            const r = parsed && !parsed.steps.some((y) => 'variableIndex' in y) ? this.b.resolve(path, x.line) : undefined;
            if (r?.ok && !isBoolType(r.variable.type)) return { kind: 'non-bool', why: `uses ${r.variable.name} (${r.variable.type})` };
          }
        } else if (!this.b.isBool(x.text, x.line)) {
          return { kind: 'non-bool', why: `uses ${x.text} (${this.b.variable(x.text, x.line).type})` };
        }
      } else if (x.kind === 'literal') {
        if (!/^BOOL#(0|1|TRUE|FALSE)$/i.test(x.text) && x.text !== '0' && x.text !== '1') {
          return { kind: 'non-bool', why: 'uses a non-BOOL value' };
        }
      } else if (x.kind === 'string') return { kind: 'non-bool', why: 'uses a string' };
      else if (x.kind === 'op') {
        if (['=', '<>', '<', '>', '<=', '>='].includes(x.text)) return { kind: 'non-bool', why: 'comparison' };
        if (['+', '-', '*', '/', '**'].includes(x.text)) return { kind: 'non-bool', why: 'arithmetic' };
        if (!['(', ')', ',', '&'].includes(x.text)) return { kind: 'unsupported', why: `'${x.text}' in an expression` };
      }
    }
    return undefined;
  }
}

function clip(text: string): string {
  const flat = text.replace(/\s+/g, ' ').trim();
  return flat.length > 60 ? `${flat.slice(0, 57)}...` : flat;
}

/** Replace each placeholder variable (index into values) by its value. */
function substitute(e: Expr, values: readonly Expr[]): Expr {
  switch (e.kind) {
    case 'const':
      return e.value ? TRUE : FALSE;
    case 'var':
      return values[e.input]!;
    case 'not':
      return { kind: 'not', arg: substitute(e.arg, values) };
    default:
      return { kind: e.kind, args: e.args.map((a) => substitute(a, values)) };
  }
}
