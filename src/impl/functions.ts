// The project's own FUNCTIONs, read once each and inlined where an expression calls them.
// IEC 61131-3 functions keep nothing between calls (their variables start from their initial
// values at each call), so a function whose result is a BOOL expression over its VAR_INPUTs
// alone is that expression at every call. Anything else is named, never guessed.
import type { Result } from '../logic/index.js';
import { varsOf } from './expr-dag.js';
import type { PouHeader } from './symbolic.js';
import type { ImplPou, InlineFunction } from './types.js';

export interface FunctionTable<P> {
  /** The FUNCTION of that upper-case name, as it is inlined; undefined when there is none. */
  readonly named: (name: string) => InlineFunction | undefined;
  /** A POU read (each once; a function read for inlining is not read again). */
  readonly read: (pou: P) => Result<ImplPou>;
}

export function functionTable<P extends PouHeader>(pous: readonly P[], readOne: (pou: P) => Result<ImplPou>): FunctionTable<P> {
  const byName = new Map(pous.filter((p) => p.kind === 'FUNCTION').map((p) => [p.name.toUpperCase(), p]));
  const reads = new Map<P, Result<ImplPou>>();
  const inlined = new Map<string, InlineFunction>();
  const reading: string[] = [];
  const read = (p: P): Result<ImplPou> => {
    let r = reads.get(p);
    if (!r) {
      r = readOne(p);
      reads.set(p, r);
    }
    return r;
  };
  const named = (name: string): InlineFunction | undefined => {
    const p = byName.get(name);
    if (!p) return undefined;
    const done = inlined.get(name);
    if (done) return done;
    if (reading.includes(name)) {
      const chain = [...reading.slice(reading.indexOf(name)), name].map((n) => byName.get(n)!.name).join(' -> ');
      return { ok: false, name: p.name, why: `it is called within itself (${chain}): recursion is not read` };
    }
    reading.push(name);
    const r = read(p);
    reading.pop();
    const fn = r.ok ? inlineOf(p, r.value) : { ok: false as const, name: p.name, why: 'its body cannot be read' };
    inlined.set(name, fn);
    return fn;
  };
  return { named, read };
}

/** The function's result as an expression over its VAR_INPUTs, or why it cannot be inlined. */
function inlineOf(header: PouHeader, pou: ImplPou): InlineFunction {
  const no = (why: string): InlineFunction => ({ ok: false, name: pou.name, why });
  const result = header.variables.find((v) => v.section === 'output' && v.name.toLowerCase() === pou.name.toLowerCase());
  if (!result || result.type.trim().toUpperCase() !== 'BOOL') return no(`it returns ${result?.type.trim() || 'no declared type'}, not BOOL`);
  const other = header.variables.find((v) => v.section === 'in-out' || v.section === 'external' || (v.section === 'output' && v !== result));
  if (other) {
    const section = other.section === 'in-out' ? 'VAR_IN_OUT' : other.section === 'external' ? 'VAR_EXTERNAL' : 'VAR_OUTPUT';
    return no(`it declares ${section} ${other.name} (line ${other.line}): what it passes back is not inlined`);
  }
  const out = pou.outputs.find((o) => o.name.toLowerCase() === pou.name.toLowerCase());
  if (!out) return no('it never assigns its result');
  const first = out.cannotJudge[0];
  if (first || !out.expr) return no(first ? `${first.what} (line ${first.line})` : 'its result is not read');
  const params = header.variables.filter((v) => v.section === 'input');
  const outside = varsOf(out.expr).map((j) => pou.inputs[j]!).find((n) => !params.some((v) => v.name.toLowerCase() === n.toLowerCase()));
  if (outside !== undefined) return no(`its result reads ${outside}, which is not one of its VAR_INPUTs (a global, an undeclared name or a block's member)`);
  return { ok: true, name: pou.name, params, inputs: pou.inputs, result: out.expr };
}
