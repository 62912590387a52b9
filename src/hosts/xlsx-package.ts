// Results sheets added to a copy of the user's workbook at the package level: new worksheet
// parts, their relationships and content types, and the styles they use appended to the
// styles part. Every other part is copied with its stored bytes, so it stays byte-identical;
// the styles part only grows (nothing in it is changed). SheetJS is never asked to write the
// user's workbook, so nothing it cannot keep (styles, Tables, validation) is lost, and no
// crafted part is parsed on the way out. Browser-safe (no node:); the host brings inflate.
import { fail, maxOf, ok, type Result } from '../logic/index.js';
import { cellAddress, parseA1, type CellValue } from '../table/index.js';
import {
  footerText,
  LOOKS,
  PAGE_FOOTER,
  STATUS_LOOKS,
  type BlockCell,
  type CellStyle,
  type Look,
  type SheetBlock,
} from '../report/index.js';
import { readZip, storedEntry, writeZip, type ZipEntry } from './zip-package.mjs';

/** Raw inflate of one entry, refusing output over `maxBytes` (the host's own, bounded). */
export type InflateRaw = (data: Uint8Array, maxBytes: number) => Promise<Uint8Array>;

export interface NamedBlock {
  /** The sheet name to use, already free in the workbook. */
  readonly name: string;
  readonly block: SheetBlock;
}

const MAIN_NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const REL_NS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const WORKSHEET_REL = `${REL_NS}/worksheet`;
const STYLES_REL = `${REL_NS}/styles`;
const WORKSHEET_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml';
const STYLES_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml';
/** The parts we read to add sheets are small; anything larger is not a workbook we should edit. */
const PART_LIMIT = 32 * 1024 * 1024;
const STYLE_NAMES = Object.keys(LOOKS) as CellStyle[];

/** The user's workbook with our sheets added after theirs. */
export async function addSheets(original: Uint8Array, blocks: readonly NamedBlock[], inflate: InflateRaw): Promise<Result<Uint8Array>> {
  const zip = readZip(original);
  if (!zip.ok) return zip;
  const entries = zip.value;
  const byName = new Map(entries.map((e) => [e.name, e]));
  const text = async (name: string): Promise<string | undefined> => {
    const e = byName.get(name);
    if (!e) return undefined;
    const bytes = e.method === 0 ? e.data : e.method === 8 ? await inflate(e.data, PART_LIMIT) : undefined;
    return bytes && new TextDecoder().decode(bytes);
  };
  try {
    const rootRels = await text('_rels/.rels');
    const workbookPath = rootRels && targetOf(rootRels, `${REL_NS}/officeDocument`, '');
    const workbookXml = workbookPath && (await text(workbookPath));
    const relsPath = workbookPath && relsPathOf(workbookPath);
    const relsXml = relsPath && (await text(relsPath));
    const types = await text('[Content_Types].xml');
    if (!workbookPath || !workbookXml || !relsPath || !relsXml || !types) return fail({ message: 'not a workbook package (workbook part or its relationships missing)' });
    const dir = workbookPath.slice(0, workbookPath.lastIndexOf('/') + 1);
    const stylesPath = targetOf(relsXml, STYLES_REL, dir);
    const stylesXml = stylesPath ? await text(stylesPath) : undefined;
    if (stylesPath && stylesXml === undefined) return fail({ message: `the styles part ${stylesPath} is missing` });
    const edit = new PackageEdit(entries, dir, workbookXml, relsXml, types, stylesPath ?? `${dir}styles.xml`, stylesXml);
    for (const b of blocks) edit.addSheet(b);
    return ok(edit.finish(workbookPath, relsPath));
  } catch (e) {
    return fail({ message: `could not add the results to the workbook: ${e instanceof Error ? e.message : String(e)}` });
  }
}

/** A new workbook of plain sheets (a CSV source) followed by our sheets. */
export async function newWorkbook(sources: readonly { name: string; origin: string; cells: readonly (readonly CellValue[])[] }[], blocks: readonly NamedBlock[]): Promise<Result<Uint8Array>> {
  const skeleton = writeZip([
    storedEntry('[Content_Types].xml', utf8(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/></Types>`)),
    storedEntry('_rels/.rels', utf8(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="${PKG_REL_NS}"><Relationship Id="rId1" Type="${REL_NS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`)),
    storedEntry('xl/workbook.xml', utf8(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook xmlns="${MAIN_NS}" xmlns:r="${REL_NS}"><bookViews><workbookView/></bookViews><sheets></sheets></workbook>`)),
    storedEntry('xl/_rels/workbook.xml.rels', utf8(`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<Relationships xmlns="${PKG_REL_NS}"></Relationships>`)),
  ]);
  const plain = sources.map((s) => ({ name: s.name, block: blockOfCells(s.name, s.origin, s.cells) }));
  return addSheets(skeleton, [...plain, ...blocks], () => Promise.reject(new Error('bug: the skeleton holds no deflated part')));
}

const PKG_REL_NS = 'http://schemas.openxmlformats.org/package/2006/relationships';

/** The cells of a source sheet as a block at their own place (an error or date keeps its text or serial number). */
function blockOfCells(name: string, origin: string, cells: readonly (readonly CellValue[])[]): SheetBlock {
  const at = parseA1(origin) ?? { row: 0, col: 0 };
  const value = (v: CellValue): BlockCell['value'] => (v === null || typeof v !== 'object' ? v : 'error' in v ? v.error : v.date);
  const rows: (BlockCell | null)[][] = Array.from({ length: at.row }, () => []);
  for (const row of cells) rows.push([...Array.from({ length: at.col }, () => null), ...row.map((v) => (v === null ? null : { value: value(v) }))]);
  return { name, rows };
}

function utf8(s: string): Uint8Array {
  return new TextEncoder().encode(s);
}

/** The part a relationship of `type` points to, as a package path; `dir` is the source part's folder. */
function targetOf(rels: string, type: string, dir: string): string | undefined {
  for (const m of rels.matchAll(/<(?:\w+:)?Relationship\b([^>]*)>/g)) {
    const attrs = m[1]!;
    if (attr(attrs, 'Type') !== type || attr(attrs, 'TargetMode') === 'External') continue;
    const target = attr(attrs, 'Target');
    if (!target) continue;
    return resolvePath(dir, decodeXml(target));
  }
  return undefined;
}

function resolvePath(dir: string, target: string): string {
  const parts = (target.startsWith('/') ? target.slice(1) : dir + target).split('/');
  const out: string[] = [];
  for (const p of parts) {
    if (p === '..') out.pop();
    else if (p !== '.' && p !== '') out.push(p);
  }
  return out.join('/');
}

function relsPathOf(part: string): string {
  const slash = part.lastIndexOf('/');
  return `${part.slice(0, slash + 1)}_rels/${part.slice(slash + 1)}.rels`;
}

function attr(attrs: string, name: string): string | undefined {
  const m = new RegExp(`(?:^|\\s)${name}\\s*=\\s*("([^"]*)"|'([^']*)')`).exec(attrs);
  return m ? (m[2] ?? m[3]) : undefined;
}

export function escapeXmlText(s: string): string {
  return s.replace(/[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffe\uffff]/g, '').replace(/[&<>"]/g, (c) => `&#${c.charCodeAt(0)};`);
}

function decodeXml(s: string): string {
  return s.replace(/&(#x[0-9a-fA-F]+|#\d+|amp|lt|gt|quot|apos);/g, (_, e: string) =>
    e[0] === '#' ? String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : Number(e.slice(1))) : ({ amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" } as Record<string, string>)[e]!,
  );
}

/** The root element's namespace prefix ("x:" or ""), so that what we insert is in the same namespace. */
function prefixOf(xml: string, root: string): string {
  const m = new RegExp(`<(\\w+:)?${root}[\\s>]`).exec(xml);
  return m?.[1] ?? '';
}

/** Insert `content` just before the closing tag of `element` (which must exist). */
function insertBeforeClose(xml: string, element: string, content: string): string {
  const close = xml.lastIndexOf(`</${element}>`);
  if (close >= 0) return xml.slice(0, close) + content + xml.slice(close);
  const empty = new RegExp(`<${element}(\\b[^>]*?)\\s*/>`).exec(xml);
  if (!empty) throw new Error(`no ${element} element`);
  return xml.slice(0, empty.index) + `<${element}${empty[1]}>${content}</${element}>` + xml.slice(empty.index + empty[0].length);
}

/** The pieces of the styles part we add to, with the ids our looks get. */
class StyleAppender {
  readonly xfOf = new Map<string, number>();
  readonly dxfIds: number[] = [];
  private xml: string;
  private readonly p: string;

  constructor(xml: string | undefined) {
    this.xml = xml ?? `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<styleSheet xmlns="${MAIN_NS}"><fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts><fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills><borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders><cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs><cellXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/></cellXfs><cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles></styleSheet>`;
    this.p = prefixOf(this.xml, 'styleSheet');
  }

  /** Append the fonts, fills, cell formats and conditional-format looks our sheets use. */
  appendLooks(): void {
    const fonts = this.count('fonts', 'font');
    const fills = this.count('fills', 'fill');
    let xfs = this.count('cellXfs', 'xf');
    const newFonts: string[] = [];
    const newFills: string[] = [];
    const newXfs: string[] = [];
    const add = (key: string, look: Look): void => {
      const fontId = fonts + newFonts.length;
      newFonts.push(this.font(look));
      let fillId = 0;
      if (look.fill) {
        fillId = fills + newFills.length;
        newFills.push(`<${this.p}fill><${this.p}patternFill patternType="solid"><${this.p}fgColor rgb="${argb(look.fill)}"/><${this.p}bgColor indexed="64"/></${this.p}patternFill></${this.p}fill>`);
      }
      const align = look.align || look.wrap ? `<${this.p}alignment${look.align ? ` horizontal="${look.align}"` : ''}${look.wrap ? ' wrapText="1"' : ''} vertical="top"/>` : '';
      const open = `<${this.p}xf numFmtId="0" fontId="${fontId}" fillId="${fillId}" borderId="0" xfId="0" applyFont="1"${fillId ? ' applyFill="1"' : ''}`;
      newXfs.push(align ? `${open} applyAlignment="1">${align}</${this.p}xf>` : `${open}/>`);
      this.xfOf.set(key, xfs++);
    };
    for (const name of STYLE_NAMES) add(name, LOOKS[name]);
    add('plain', {});
    this.append('fonts', newFonts);
    this.append('fills', newFills);
    this.append('cellXfs', newXfs);
    const dxfs = this.count('dxfs', 'dxf');
    const newDxfs = STATUS_LOOKS.map(
      (s) => `<${this.p}dxf><${this.p}font><${this.p}color rgb="${argb(s.font)}"/></${this.p}font><${this.p}fill><${this.p}patternFill><${this.p}bgColor rgb="${argb(s.fill)}"/></${this.p}patternFill></${this.p}fill></${this.p}dxf>`,
    );
    STATUS_LOOKS.forEach((_, i) => this.dxfIds.push(dxfs + i));
    if (this.has('dxfs')) this.append('dxfs', newDxfs);
    else this.insertDxfs(newDxfs);
  }

  toString(): string {
    return this.xml;
  }

  private font(look: Look): string {
    const p = this.p;
    return (
      `<${p}font>${look.bold ? `<${p}b/>` : ''}${look.italic ? `<${p}i/>` : ''}<${p}sz val="${look.size ?? 11}"/>` +
      `${look.color ? `<${p}color rgb="${argb(look.color)}"/>` : ''}<${p}name val="${look.fontName ?? 'Calibri'}"/></${p}font>`
    );
  }

  private has(element: string): boolean {
    return new RegExp(`<${this.p}${element}[\\s>/]`).test(this.xml);
  }

  /** Children of `element` now in the part (its count attribute may be missing or wrong). */
  private count(element: string, child: string): number {
    const m = new RegExp(`<${this.p}${element}\\b[^>]*?(/>|>([\\s\\S]*?)</${this.p}${element}>)`).exec(this.xml);
    if (!m || m[1] === '/>') return 0;
    return (m[2]!.match(new RegExp(`<${this.p}${child}[\\s>/]`, 'g')) ?? []).length;
  }

  private append(element: string, items: readonly string[]): void {
    if (items.length === 0) return;
    const total = this.count(element, element === 'cellXfs' ? 'xf' : element.slice(0, -1)) + items.length;
    if (!this.has(element)) throw new Error(`the styles part has no ${element}`);
    this.xml = insertBeforeClose(this.xml, `${this.p}${element}`, items.join(''));
    this.xml = this.xml.replace(new RegExp(`<${this.p}${element}\\b([^>]*?)\\s+count="\\d+"`), `<${this.p}${element}$1 count="${total}"`);
  }

  /** dxfs comes after cellStyles (or cellXfs) and before tableStyles, colors, extLst. */
  private insertDxfs(items: readonly string[]): void {
    const block = `<${this.p}dxfs count="${items.length}">${items.join('')}</${this.p}dxfs>`;
    for (const after of ['cellStyles', 'cellXfs']) {
      const close = `</${this.p}${after}>`;
      const at = this.xml.indexOf(close);
      if (at >= 0) {
        this.xml = this.xml.slice(0, at + close.length) + block + this.xml.slice(at + close.length);
        return;
      }
    }
    throw new Error('the styles part has no cellXfs');
  }
}

function argb(hex: string): string {
  return `FF${hex.replace('#', '').toUpperCase()}`;
}

/** The edits of one package: parts to replace and parts to add. */
class PackageEdit {
  private readonly replaced = new Map<string, string>();
  private readonly added: { path: string; xml: string }[] = [];
  private readonly styles: StyleAppender;
  private readonly wp: string;
  private sheetCount: number;
  private nextSheetId: number;
  private readonly usedIds: Set<string>;
  private readonly usedPaths: Set<string>;
  private readonly definedNames: string[] = [];

  constructor(
    private readonly entries: readonly ZipEntry[],
    private readonly dir: string,
    private workbook: string,
    private rels: string,
    private types: string,
    private readonly stylesPath: string,
    stylesXml: string | undefined,
  ) {
    this.wp = prefixOf(workbook, 'workbook');
    this.usedIds = new Set([...rels.matchAll(/\bId\s*=\s*"([^"]*)"/g)].map((m) => m[1]!));
    this.styles = new StyleAppender(stylesXml);
    this.styles.appendLooks();
    if (stylesXml === undefined) {
      this.rels = insertBeforeClose(this.rels, `${prefixOf(rels, 'Relationships')}Relationships`, this.relationship(STYLES_REL, this.relTarget(stylesPath)));
      this.types = insertBeforeClose(this.types, `${prefixOf(types, 'Types')}Types`, `<Override PartName="/${stylesPath}" ContentType="${STYLES_TYPE}"/>`);
    }
    const sheets = [...workbook.matchAll(new RegExp(`<${this.wp}sheet\\b([^>]*)/?>`, 'g'))];
    this.sheetCount = sheets.length;
    this.nextSheetId = 1 + maxOf(sheets.map((m) => Number(attr(m[1]!, 'sheetId') ?? 0)), 0);
    this.usedPaths = new Set(entries.map((e) => e.name.toLowerCase()));
  }

  addSheet({ name, block }: NamedBlock): void {
    let k = 1;
    while (this.usedPaths.has(`${this.dir}worksheets/sheet${k}.xml`.toLowerCase())) k++;
    const path = `${this.dir}worksheets/sheet${k}.xml`;
    this.usedPaths.add(path.toLowerCase());
    const id = this.freeId();
    this.rels = insertBeforeClose(this.rels, `${prefixOf(this.rels, 'Relationships')}Relationships`, this.relationship(WORKSHEET_REL, this.relTarget(path), id));
    this.types = insertBeforeClose(this.types, `${prefixOf(this.types, 'Types')}Types`, `<Override PartName="/${path}" ContentType="${WORKSHEET_TYPE}"/>`);
    this.workbook = insertBeforeClose(
      this.workbook,
      `${this.wp}sheets`,
      `<${this.wp}sheet xmlns:r="${REL_NS}" name="${escapeXmlText(name)}" sheetId="${this.nextSheetId++}" r:id="${id}"/>`,
    );
    if (block.print) {
      const { first, last } = block.print.titleRows;
      this.definedNames.push(
        `<${this.wp}definedName name="_xlnm.Print_Titles" localSheetId="${this.sheetCount}">${escapeXmlText(`'${name.replace(/'/g, "''")}'!$${first}:$${last}`)}</${this.wp}definedName>`,
      );
    }
    this.sheetCount++;
    this.added.push({ path, xml: worksheetXml(block, this.styles) });
  }

  finish(workbookPath: string, relsPath: string): Uint8Array {
    if (this.definedNames.length > 0) this.workbook = withDefinedNames(this.workbook, this.wp, this.definedNames);
    this.replaced.set(workbookPath, this.workbook);
    this.replaced.set(relsPath, this.rels);
    this.replaced.set('[Content_Types].xml', this.types);
    this.replaced.set(this.stylesPath, this.styles.toString());
    const out: ZipEntry[] = this.entries.map((e) => {
      const xml = this.replaced.get(e.name);
      return xml === undefined ? e : storedEntry(e.name, utf8(xml), e);
    });
    if (!this.entries.some((e) => e.name === this.stylesPath)) out.push(storedEntry(this.stylesPath, utf8(this.styles.toString())));
    for (const a of this.added) out.push(storedEntry(a.path, utf8(a.xml)));
    return writeZip(out);
  }

  private freeId(): string {
    let k = 1;
    while (this.usedIds.has(`rIdIA${k}`)) k++;
    this.usedIds.add(`rIdIA${k}`);
    return `rIdIA${k}`;
  }

  private relationship(type: string, target: string, id = this.freeId()): string {
    return `<${prefixOf(this.rels, 'Relationships')}Relationship Id="${id}" Type="${type}" Target="${escapeXmlText(target)}"/>`;
  }

  private relTarget(path: string): string {
    return path.startsWith(this.dir) ? path.slice(this.dir.length) : `/${path}`;
  }
}

/** definedNames comes after sheets (and functionGroups, externalReferences) and before calcPr and the rest. */
function withDefinedNames(workbook: string, p: string, names: readonly string[]): string {
  if (new RegExp(`<${p}definedNames[\\s>/]`).test(workbook)) return insertBeforeClose(workbook, `${p}definedNames`, names.join(''));
  const block = `<${p}definedNames>${names.join('')}</${p}definedNames>`;
  const later = ['calcPr', 'oleSize', 'customWorkbookViews', 'pivotCaches', 'smartTagPr', 'smartTagTypes', 'webPublishing', 'fileRecoveryPr', 'webPublishObjects', 'extLst'];
  let at = workbook.lastIndexOf(`</${p}workbook>`);
  for (const name of later) {
    const i = workbook.search(new RegExp(`<${p}${name}[\\s>/]`));
    if (i >= 0 && i < at) at = i;
  }
  return workbook.slice(0, at) + block + workbook.slice(at);
}

/** Excel's functions added after the 2007 file format carry `_xlfn.` inside a file (DESIGN.md section 3); ours use XOR. */
export function fileFormula(typed: string): string {
  return typed.replace(/(?<![A-Za-z0-9_.])XOR\(/gi, '_xlfn.XOR(');
}

function worksheetXml(block: SheetBlock, styles: StyleAppender): string {
  const width = maxOf(block.rows.map((r) => r.length), 1);
  const height = Math.max(1, block.rows.length);
  const parts: string[] = [`<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet xmlns="${MAIN_NS}" xmlns:r="${REL_NS}">`];
  if (block.print?.fitToWidth) parts.push('<sheetPr><pageSetUpPr fitToPage="1"/></sheetPr>');
  parts.push(`<dimension ref="A1:${cellAddress(height - 1, width - 1)}"/>`);
  const frozen = block.freezeRows ?? 0;
  const pane = frozen > 0 ? `<pane ySplit="${frozen}" topLeftCell="A${frozen + 1}" activePane="bottomLeft" state="frozen"/>` : '';
  parts.push(`<sheetViews><sheetView workbookViewId="0">${pane}</sheetView></sheetViews><sheetFormatPr defaultRowHeight="15"/>`);
  if (block.columnWidths && block.columnWidths.length > 0)
    parts.push(`<cols>${block.columnWidths.map((w, i) => `<col min="${i + 1}" max="${i + 1}" width="${Math.max(1, Math.min(255, w + 1))}" customWidth="1"/>`).join('')}</cols>`);
  parts.push('<sheetData>');
  block.rows.forEach((row, r) => {
    const cells = row.map((cell, c) => (cell ? cellXml(cell, cellAddress(r, c), styles) : '')).join('');
    if (cells !== '') parts.push(`<row r="${r + 1}">${cells}</row>`);
  });
  parts.push('</sheetData>');
  let priority = 1;
  for (const range of block.statusRanges ?? []) {
    const first = range.split(':')[0]!;
    const rules = STATUS_LOOKS.map(
      (s, i) =>
        `<cfRule type="containsText" dxfId="${styles.dxfIds[i]}" priority="${priority++}" operator="containsText" text="${s.text}"><formula>NOT(ISERROR(SEARCH("${s.text}",${first})))</formula></cfRule>`,
    );
    parts.push(`<conditionalFormatting sqref="${range}">${rules.join('')}</conditionalFormatting>`);
  }
  parts.push('<pageMargins left="0.5" right="0.5" top="0.6" bottom="0.6" header="0.3" footer="0.3"/>');
  if (block.print) {
    parts.push(`<pageSetup orientation="${block.print.landscape ? 'landscape' : 'portrait'}"${block.print.fitToWidth ? ' fitToWidth="1" fitToHeight="0"' : ''}/>`);
    parts.push(`<headerFooter><oddFooter>${escapeXmlText(`&L${footerText(block.print.footer)}&R${PAGE_FOOTER}`)}</oddFooter></headerFooter>`);
  }
  parts.push('</worksheet>');
  return parts.join('');
}

/** One cell; text as an inline string, so the shared-strings part is never touched. */
function cellXml(cell: BlockCell, ref: string, styles: StyleAppender): string {
  const style = styles.xfOf.get(cell.style ?? 'plain')!;
  const s = ` r="${ref}" s="${style}"`;
  const v = cell.value;
  if (cell.formula !== undefined) {
    const f = `<f>${escapeXmlText(fileFormula(cell.formula))}</f>`;
    if (typeof v === 'number') return `<c${s}>${f}<v>${v}</v></c>`;
    if (typeof v === 'boolean') return `<c${s} t="b">${f}<v>${v ? 1 : 0}</v></c>`;
    return `<c${s} t="str">${f}<v>${escapeXmlText(v ?? '')}</v></c>`;
  }
  if (typeof v === 'number') return Number.isFinite(v) ? `<c${s}><v>${v}</v></c>` : '';
  if (typeof v === 'boolean') return `<c${s} t="b"><v>${v ? 1 : 0}</v></c>`;
  if (v === null || v === '') return '';
  return `<c${s} t="inlineStr"><is><t xml:space="preserve">${escapeXmlText(v)}</t></is></c>`;
}

