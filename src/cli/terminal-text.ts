// Text for a terminal. Headers, sheet names and paths come from the user's files, and a cell
// holding ESC [ 2 J, a right-to-left override (U+202E) or a NUL would otherwise act on the
// terminal or reorder what the reader sees. Such characters are shown, not sent.

/** C0 controls but tab and newline, DEL and the C1 controls (U+009B is a CSI on some terminals). */
const CONTROL = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g;

/**
 * Bidirectional formatting characters (Unicode's Bidi_Control property) and the line and
 * paragraph separators, which terminals and JavaScript treat unlike the rest of a string.
 */
const FORMATTING = /[\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

const hex4 = (c: string): string => c.charCodeAt(0).toString(16).padStart(4, '0');

/** `\u001b` for a control character, `<U+202E>` for a bidirectional control: visible, inert. */
export function terminalSafe(text: string): string {
  return text.replace(CONTROL, (c) => `\\u${hex4(c)}`).replace(FORMATTING, (c) => `<U+${hex4(c).toUpperCase()}>`);
}

/**
 * JSON text with the same value, safe to print: JSON.stringify already writes the C0 controls
 * as \u escapes; this also escapes DEL, the C1 controls, the bidirectional controls and
 * U+2028/U+2029. They can only stand inside strings, where `\uXXXX` means the same character,
 * so a parser reads back exactly the document that was built.
 */
export function jsonSafe(json: string): string {
  return json.replace(/[\u007f-\u009f]/g, (c) => `\\u${hex4(c)}`).replace(FORMATTING, (c) => `\\u${hex4(c)}`);
}
