// What a workbook package says beside its cell values, read from its XML parts ourselves (the
// checked entries of zip-package.mjs), so that nothing SheetJS skips is lost silently: which
// part holds which sheet, hidden sheets, rows and columns, merged areas, formula cells,
// shared-string indexes, cells past Excel's limits, and the Excel Table objects.
// Part names and relationships: ECMA-376 Part 2 (Open Packaging Conventions); sheet XML:
// ECMA-376 Part 1, 18.3 (worksheets), 18.4 (shared strings), 18.5 (tables).
// Plain JavaScript, browser-safe; every scan is one linear pass of a regular expression that
// cannot backtrack past the next '<'.

export const MAX_ROWS = 1048576;
export const MAX_COLUMNS = 16384;

const decoder = new TextDecoder();

/** The text of a part, or undefined when the package has no such (undamaged) part. */
export function partText(parts, name) {
  const data = parts.get(name);
  return data === undefined ? undefined : decoder.decode(data);
}

const ENTITIES = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

function unescapeXml(text) {
  if (!text.includes('&')) return text;
  return text.replace(/&(#x[0-9a-fA-F]+|#[0-9]+|amp|lt|gt|quot|apos);/g, (_, e) =>
    e[0] === '#' ? String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10)) : ENTITIES[e],
  );
}

/** The attributes of one tag's text, local names (a prefix such as r: dropped), values unescaped. */
const ATTRIBUTE = /([A-Za-z_][\w.-]*:)?([A-Za-z_][\w.-]*)\s*=\s*(?:"([^"]*)"|'([^']*)')/g;

export function attributes(tagText) {
  const out = Object.create(null);
  ATTRIBUTE.lastIndex = 0;
  for (let m; (m = ATTRIBUTE.exec(tagText)); ) out[m[2]] = unescapeXml(m[3] ?? m[4] ?? '');
  return out;
}

/** Every start tag of the given local names: [name, attribute text, self-closing, index after the tag]. */
function tagPattern(names) {
  return new RegExp(`<(?:[A-Za-z_][\\w.-]*:)?(${names.join('|')})(?=[\\s/>])([^<>]*?)(/?)>`, 'g');
}

function* tags(xml, names) {
  const re = tagPattern(names);
  for (let m; (m = re.exec(xml)); ) yield [m[1], m[2], m[3] === '/', re.lastIndex];
}

/** A relationship target resolved against the folder of the part that names it. */
function resolvePart(from, target) {
  if (target.startsWith('/')) return target.slice(1);
  const parts = from.split('/').slice(0, -1);
  for (const piece of target.split('/')) {
    if (piece === '..') parts.pop();
    else if (piece !== '.' && piece !== '') parts.push(piece);
  }
  return parts.join('/');
}

/** The relationships of a part: id -> { type (last word of the type URI), part }. */
function relationships(parts, part) {
  const slash = part.lastIndexOf('/');
  const relsName = `${part.slice(0, slash + 1)}_rels/${part.slice(slash + 1)}.rels`;
  const xml = partText(parts, relsName) ?? '';
  const out = new Map();
  for (const [, text] of tags(xml, ['Relationship'])) {
    const a = attributes(text);
    if (!a.Id || !a.Target || a.TargetMode === 'External') continue;
    out.set(a.Id, { type: (a.Type ?? '').split('/').pop(), part: resolvePart(part, a.Target) });
  }
  return out;
}

/** "B7" -> { r: 6, c: 1 } (0-based), or undefined. */
export function decodeCell(ref) {
  const m = /^\$?([A-Za-z]{1,4})\$?(\d{1,8})$/.exec(ref);
  if (!m) return undefined;
  let c = 0;
  for (const ch of m[1].toUpperCase()) c = c * 26 + (ch.charCodeAt(0) - 64);
  return { r: Number(m[2]) - 1, c: c - 1 };
}

export function columnName(c) {
  let s = '';
  for (let n = c + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

export function encodeCell(r, c) {
  return `${columnName(c)}${r + 1}`;
}

/**
 * The workbook's sheets in order, with the part holding each, its visibility, and the shared
 * strings part; the package's main part found through its root relationships.
 */
export function workbookFacts(parts) {
  const root = relationships(parts, '');
  const main = [...root.values()].find((r) => r.type === 'officeDocument')?.part ?? 'xl/workbook.xml';
  const xml = partText(parts, main);
  if (xml === undefined) return undefined;
  const rels = relationships(parts, main);
  const sheets = [];
  for (const [, text] of tags(xml, ['sheet'])) {
    const a = attributes(text);
    sheets.push({ name: a.name ?? '', part: rels.get(a.id ?? '')?.part, state: a.state ?? 'visible' });
  }
  const strings = [...rels.values()].find((r) => r.type === 'sharedStrings')?.part;
  const stringsXml = strings === undefined ? '' : (partText(parts, strings) ?? '');
  let sharedStrings = 0;
  for (const _ of tags(stringsXml, ['si'])) sharedStrings++;
  return { main, sheets, sharedStrings };
}

/** The Excel Table objects of a sheet part: { name, range }, from its table relationships. */
export function sheetTables(parts, sheetPart) {
  const out = [];
  for (const rel of relationships(parts, sheetPart).values()) {
    if (rel.type !== 'table') continue;
    const xml = partText(parts, rel.part);
    const first = xml === undefined ? undefined : tags(xml, ['table']).next().value;
    if (!first) continue;
    const a = attributes(first[1]);
    const name = a.displayName ?? a.name;
    if (name && a.ref) out.push({ name, range: a.ref });
  }
  return out;
}

/** Runs of consecutive numbers as [first, last] pairs (input sorted ascending). */
function runs(sorted) {
  const out = [];
  for (const n of sorted) {
    const last = out[out.length - 1];
    if (last && n === last[1] + 1) last[1] = n;
    else if (!last || n > last[1]) out.push([n, n]);
  }
  return out;
}

/**
 * One pass over a sheet part's XML: hidden rows and columns (as runs), merged areas, and per
 * cell that holds a value or a formula, a call `cell(r, c, facts)` with facts `{ value,
 * formula, sharedString }` (value: a stored value; sharedString: the index of a t="s" cell,
 * -1 when it is not a number). Cells past Excel's last row or column are
 * counted in `pastLimits` with the first one's reference.
 */
export function scanSheet(xml, cell) {
  const hiddenRows = [];
  const hiddenColumns = [];
  const merges = [];
  const pastLimits = { count: 0, first: '' };
  let row = -1;
  let col = -1;
  let open; // the cell being read: { r, c, t, formula }
  let valueAt = -1;
  const finish = () => {
    if (open && (valueAt >= 0 || open.formula)) {
      const text = valueAt >= 0 && !open.inline ? xml.slice(valueAt, xml.indexOf('<', valueAt)).trim() : '';
      const value = open.inline || text !== '';
      const sharedString = open.t === 's' && value ? (/^\d+$/.test(text) ? Number(text) : -1) : undefined;
      if (open.r >= MAX_ROWS || open.c >= MAX_COLUMNS) {
        if (pastLimits.count++ === 0) pastLimits.first = encodeCell(open.r, open.c);
      } else cell(open.r, open.c, { value, formula: open.formula, sharedString });
    }
    open = undefined;
    valueAt = -1;
  };
  // The loop of tags() written out: this runs once per cell of every sheet.
  const re = tagPattern(['row', 'c', 'col', 'f', 'v', 'is', 'mergeCell']);
  for (let m; (m = re.exec(xml)); ) {
    const name = m[1];
    const text = m[2];
    const closed = m[3] === '/';
    const after = re.lastIndex;
    if (name === 'row' || name === 'c') finish();
    const a = name === 'f' || name === 'v' || name === 'is' ? undefined : attributes(text);
    if (name === 'row') {
      row = a.r !== undefined && /^\d+$/.test(a.r) ? Number(a.r) - 1 : row + 1;
      col = -1;
      if (a.hidden === '1' || a.hidden === 'true') hiddenRows.push(row);
    } else if (name === 'c') {
      const at = a.r !== undefined ? decodeCell(a.r) : undefined;
      if (at) {
        row = at.r;
        col = at.c;
      } else col++;
      open = closed ? undefined : { r: row, c: col, t: a.t ?? 'n', formula: false, inline: false };
    } else if (name === 'col') {
      if (a.hidden === '1' || a.hidden === 'true') {
        const min = Number(a.min);
        const max = Number(a.max);
        if (min >= 1 && max >= min && max <= MAX_COLUMNS) hiddenColumns.push([min - 1, max - 1]);
      }
    } else if (name === 'mergeCell') {
      if (a.ref) merges.push(a.ref);
    } else if (open && name === 'f') open.formula = true;
    else if (open && (name === 'v' || name === 'is') && !closed) {
      valueAt = after;
      open.inline = name === 'is';
    }
  }
  finish();
  return { hiddenRows: runs(hiddenRows.sort((x, y) => x - y)), hiddenColumns, merges, pastLimits };
}
