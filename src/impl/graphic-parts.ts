// What the two graphical readers (LD and FBD networks) share: the body's elements by localId,
// errors as values, reading a variable an element names, recording a block not evaluated.
import { fail, ok, type Expr, type Result } from '../logic/index.js';
import { blockKind, kindWord } from './constructs.js';
import { LineError } from './line-error.js';
import type { PouBuilder } from './symbolic.js';
import { parsePath } from './paths.js';
import type { CannotJudge, ImplPou, ReadContext } from './types.js';
import { localName, type XmlElement } from './xml.js';

/** One element of a graphical body: its local name as `kind`, its localId as `id`. */
export interface BodyElement {
  readonly el: XmlElement;
  readonly kind: string;
  readonly id: string;
}

/**
 * The elements of an LD or FBD body in document order, those in `ignored` left out. An element
 * not in `known`, without a localId, or with a localId used before is an error at its line.
 */
export function bodyElements(body: XmlElement, pou: string, known: ReadonlySet<string>, ignored: ReadonlySet<string> = new Set()): BodyElement[] {
  const language = localName(body.name);
  const seen = new Map<string, BodyElement>();
  for (const el of body.children) {
    const kind = localName(el.name);
    if (!known.has(kind)) throw new LineError(el.line, `unknown element <${el.name}> in the ${language} body of ${pou}`);
    if (ignored.has(kind)) continue;
    const id = el.attrs['localId'];
    if (id === undefined) throw new LineError(el.line, `<${kind}> in ${pou} has no localId`);
    const twice = seen.get(id);
    if (twice) throw new LineError(el.line, `localId ${id} is used twice in ${pou} (first on line ${twice.el.line})`);
    seen.set(id, { el, kind, id });
  }
  return [...seen.values()];
}

/** A body read by `read`, a LineError it throws turned into an error naming the file and line. */
export function readBody(context: ReadContext, read: () => ImplPou): Result<ImplPou> {
  try {
    return ok(read());
  } catch (e) {
    if (e instanceof LineError) return fail({ message: `${context.file} line ${e.line}: ${e.message}` });
    throw e;
  }
}

/** A BOOL structure member or array element with constant indices (not a block's member): its name as declared. */
function followedPath(b: PouBuilder, name: string, line: number): string | undefined {
  const parsed = parsePath(name);
  const r = parsed && !parsed.steps.some((s) => 'variableIndex' in s) ? b.resolve(name, line) : undefined;
  return r?.ok && !r.variable.source && r.variable.type.toUpperCase() === 'BOOL' ? r.variable.name : undefined;
}

/**
 * The value of the variable an element names: a plain name, a BOOL structure member or array
 * element (`io.bClosed`, `a[2]`) is read (its value so far in the scan); a block's member
 * (`T1.Q`: the diagram runs its block at a point the element order does not fix) or a path
 * not followed is opaque, of the kind of its base variable.
 */
export function namedValue(b: PouBuilder, context: ReadContext, name: string, id: string, line: number): Expr {
  if (!/[.[]/.test(name)) return b.read(name, line);
  const path = followedPath(b, name, line);
  if (path !== undefined) return b.read(path, line);
  const base = name.split(/[.[]/)[0]!;
  const type = b.variable(base, line).type;
  const kind = blockKind(type, context.blockTypes);
  return kind === 'function-call'
    ? b.opaque('unsupported', `${name} (member or element), localId ${id}`, line)
    : b.opaque(kind, `${kindWord(kind)} ${base} (${type}): ${name}, localId ${id}`, line);
}

/**
 * A coil or output variable writes `value` to what it names: a plain BOOL or a followed path;
 * any other path is named, and what is under it unknown from here on. True when more than
 * the one variable may have changed.
 */
export function writeNamed(b: PouBuilder, name: string, value: Expr, line: number, why: string): boolean {
  if (!/[.[]/.test(name)) {
    if (b.isBool(name, line)) b.assign(name, value, line);
    return false;
  }
  const path = followedPath(b, name, line);
  if (path !== undefined) {
    b.assign(path, value, line);
    return false;
  }
  const item = b.cannotJudge('unsupported', why, line);
  return b.writeUnknown(name, line, () => item);
}

/** A block the reader does not evaluate (timer, counter, user block...), recorded once. */
export function unevaluatedBlock(b: PouBuilder, context: ReadContext, el: XmlElement, id: string): CannotJudge {
  const type = el.attrs['typeName'] ?? '';
  const name = el.attrs['instanceName'];
  const known = blockKind(type, context.blockTypes);
  // An instance of something not known to be a block type is still an instance, with state.
  const kind = known === 'function-call' && name ? 'function-block' : known;
  return b.cannotJudge(kind, `${kindWord(kind)} block ${name ? `${name} (${type})` : type}, localId ${id}`, el.line);
}
