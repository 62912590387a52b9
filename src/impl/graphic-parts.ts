// What the two graphical readers (LD and FBD networks) share: reading a variable an element
// names, and recording a block that is not evaluated.
import type { Expr } from '../logic/expr/ast.js';
import { blockKind, kindWord } from './constructs.js';
import type { PouBuilder } from './symbolic.js';
import type { CannotJudge, ReadContext } from './types.js';
import type { XmlElement } from './xml.js';

/**
 * The value of the variable an element names: a plain name is read (its value so far in the
 * scan); a member or element (`T1.Q`, `a[2]`) is opaque, of the kind of its base variable.
 */
export function namedValue(b: PouBuilder, context: ReadContext, name: string, id: string, line: number): Expr {
  if (!/[.[]/.test(name)) return b.read(name, line);
  const base = name.split(/[.[]/)[0]!;
  const type = b.variable(base, line).type;
  const kind = blockKind(type, context.blockTypes);
  return kind === 'function-call'
    ? b.opaque('unsupported', `${name} (member or element), localId ${id}`, line)
    : b.opaque(kind, `${kindWord(kind)} ${base} (${type}): ${name}, localId ${id}`, line);
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
