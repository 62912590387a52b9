// Small text helpers shared by the hand-over pack's writers.

/** Text safe inside XML/SVG character data and attribute values (control characters dropped). */
export function escapeXml(s: string): string {
  return s.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '').replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Text safe inside an IEC 61131-3 comment `(* ... *)`: no comment brackets, one line. */
export function stCommentText(s: string): string {
  return s.replace(/[\r\n\t]+/g, ' ').replace(/\(\*/g, '( *').replace(/\*\)/g, '* )');
}

/** Text safe inside an XML comment: no `--`, no trailing `-`. */
export function xmlCommentText(s: string): string {
  return s
    .replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '')
    .replace(/-{2,}/g, (m) => m.split('').join(' '))
    .replace(/-$/, '- ');
}

/** Cut to `chars` characters, ending in an ellipsis when cut. */
export function fit(s: string, chars: number): string {
  return s.length <= chars ? s : `${s.slice(0, Math.max(1, chars - 1))}…`;
}

/** Break at blanks into lines of at most `chars` characters; a longer word is cut. */
export function wrap(s: string, chars: number): string[] {
  const lines: string[] = [];
  let current = '';
  for (const word of s.split(/\s+/).filter((w) => w !== '')) {
    const candidate = current === '' ? word : `${current} ${word}`;
    if (candidate.length <= chars) current = candidate;
    else {
      if (current !== '') lines.push(current);
      current = fit(word, chars);
    }
  }
  if (current !== '') lines.push(current);
  return lines;
}

/** "1 term", "3 terms"; counts of a wide table may be BigInt. */
export function plural(count: number | bigint, one: string, many = `${one}s`): string {
  return `${count} ${count === 1 || count === 1n ? one : many}`;
}

/** Why a table analysed on its rows' cubes has no XOR form. */
export const NO_XOR = "not derived: an XOR form is computed from the function's decision diagram, and this table's rows have none of workable size";
