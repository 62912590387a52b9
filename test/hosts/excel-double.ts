// A strict stand-in for the few Excel JavaScript API calls the Excel host uses (src/hosts/excel-api.ts).
// Strict where the real API is strict, so that a host passing here does not fail in Excel:
// - a property read before `load` + `sync` throws PropertyNotLoaded (as Office.js does);
// - commands run only at `sync`, in order; a bad sheet name fails the sync (ItemNotFound);
// - `values`/`formulas` must match the range's rows x columns (InvalidArgument);
// - a sync whose request or response is over 5 MB fails (Request/ResponsePayloadSizeLimitExceeded),
//   with the request measured as the JSON of its commands.
// - members of a requirement set above `excelApi` (pageLayout 1.9, freezePanes 1.7) throw ApiNotFound.
// Formulas are stored, not calculated. Error codes and messages follow office-js dist (excel-web-16.00.js).
import { columnIndex, parseRange, rangeAddress, sheetPrefix, type RangeRef } from '../../src/table/grid.js';
import type { XlContext, XlPageLayout, XlRangeFormat, XlRun, XlSupports, XlValue } from '../../src/hosts/excel-api.js';

export const LIMIT = 5 * 1024 * 1024;
const MAX_ROWS = 1048576;
const MAX_COLUMNS = 16384;

export class DoubleError extends Error {
  constructor(
    readonly code: string,
    message: string,
  ) {
    super(message);
  }
}

/** A cell as a test seeds it: a plain value, an error, or a date serial shown as a date. */
export type SeedCell = XlValue | null | { error: string } | { date: number };

interface CellModel {
  value: XlValue;
  formula?: string;
  error?: boolean;
  numberFormat: string;
  format: Record<string, unknown>;
}

export interface SheetModel {
  name: string;
  cells: Map<string, CellModel>;
  conditionalFormats: { range: string; text?: string; fill?: string; font?: string }[];
  columnWidths: Map<number, number>;
  frozenRows: number;
  print: { orientation?: string; zoom?: Record<string, unknown>; titleRows?: string; leftFooter?: string; rightFooter?: string };
}

export interface SyncRecord {
  readonly requestBytes: number;
  readonly responseBytes: number;
  readonly commands: readonly string[];
  readonly failed?: string;
}

type Thunk<T> = () => T;
type Command = { kind: string; bytes: number; run: () => void };

const key = (r: number, c: number) => `${r},${c}`;

function notLoaded(prop: string): never {
  throw new DoubleError(
    'PropertyNotLoaded',
    `The property '${prop}' is not available. Before reading the property's value, call the load method on the containing object and call "context.sync()" on the associated request context.`,
  );
}

/** Excel turns typed text into numbers and booleans; a leading apostrophe keeps it text. */
function typed(input: XlValue): { value: XlValue; formula?: string } {
  if (typeof input !== 'string') return { value: input };
  if (input.startsWith("'")) return { value: input.slice(1) };
  if (input.startsWith('=')) return { value: '', formula: input };
  if (input.trim() !== '' && !Number.isNaN(Number(input))) return { value: Number(input) };
  if (/^(true|false)$/i.test(input.trim())) return { value: input.trim().toLowerCase() === 'true' };
  return { value: input };
}

export class ExcelDouble {
  readonly sheets: SheetModel[] = [];
  readonly syncs: SyncRecord[] = [];
  /** Every command run, in order, e.g. "formulas Results!A1:C3", "format Results!A1:C1". */
  readonly log: string[] = [];
  selection = { sheet: '', range: 'A1' };
  activeSheet = '';
  readonly tables: { name: string; sheet: string; range: string }[] = [];

  addSheet(name: string, rows: readonly (readonly SeedCell[])[] = [], origin = 'A1'): SheetModel {
    const sheet: SheetModel = { name, cells: new Map(), conditionalFormats: [], columnWidths: new Map(), frozenRows: 0, print: {} };
    this.sheets.push(sheet);
    const at = parseRange(origin)!;
    rows.forEach((row, r) =>
      row.forEach((seed, c) => {
        if (seed === null || seed === '') return;
        const cell: CellModel = { value: '', numberFormat: 'General', format: {} };
        if (typeof seed === 'object' && 'error' in seed) Object.assign(cell, { value: seed.error, error: true });
        else if (typeof seed === 'object') Object.assign(cell, { value: seed.date, numberFormat: 'yyyy-mm-dd' });
        else cell.value = seed;
        sheet.cells.set(key(at.top + r, at.left + c), cell);
      }),
    );
    if (!this.activeSheet) this.activeSheet = name;
    return sheet;
  }

  sheet(name: string): SheetModel | undefined {
    return this.sheets.find((s) => s.name.toLowerCase() === name.toLowerCase());
  }

  /** The values of a sheet's cells in an A1 range, '' for empty ('=...' for formula cells). */
  read(sheetName: string, range: string): XlValue[][] {
    const sheet = this.sheet(sheetName)!;
    const r = parseRange(range)!;
    const out: XlValue[][] = [];
    for (let row = r.top; row <= r.bottom; row++) {
      const line: XlValue[] = [];
      for (let col = r.left; col <= r.right; col++) {
        const cell = sheet.cells.get(key(row, col));
        line.push(cell?.formula ?? cell?.value ?? '');
      }
      out.push(line);
    }
    return out;
  }

  cellFormat(sheetName: string, address: string): Record<string, unknown> {
    const r = parseRange(address)!;
    return this.sheet(sheetName)!.cells.get(key(r.top, r.left))?.format ?? {};
  }

  /** The highest ExcelApi requirement set this Excel has (the manifest asks for 1.6). */
  excelApi = '1.9';

  /** `Office.context.requirements.isSetSupported('ExcelApi', version)` for this Excel. */
  readonly supports: XlSupports = (version) => minorOf(version) <= minorOf(this.excelApi);

  /** `Excel.run` over this workbook. */
  readonly run: XlRun = async (batch) => batch(new DoubleContext(this));
}

class DoubleContext implements XlContext {
  readonly pending: Command[] = [];
  readonly workbook: DoubleWorkbook;

  constructor(readonly model: ExcelDouble) {
    this.workbook = new DoubleWorkbook(this);
  }

  queue(kind: string, bytes: number, run: () => void): void {
    this.pending.push({ kind, bytes: bytes + 120, run });
  }

  async sync(): Promise<void> {
    const commands = this.pending.splice(0);
    const requestBytes = commands.reduce((n, c) => n + (c.kind.startsWith('load') ? 120 : c.bytes), 0);
    const names = commands.map((c) => c.kind);
    if (requestBytes > LIMIT) {
      this.model.syncs.push({ requestBytes, responseBytes: 0, commands: names, failed: 'RequestPayloadSizeLimitExceeded' });
      throw new DoubleError('RequestPayloadSizeLimitExceeded', 'The request payload size has exceeded the limit.');
    }
    let responseBytes = 0;
    try {
      for (const c of commands) {
        c.run();
        if (c.kind.startsWith('load')) responseBytes += c.bytes;
        else this.model.log.push(c.kind);
      }
    } catch (error) {
      this.model.syncs.push({ requestBytes, responseBytes, commands: names, failed: (error as DoubleError).code });
      throw error;
    }
    if (responseBytes > LIMIT) {
      this.model.syncs.push({ requestBytes, responseBytes, commands: names, failed: 'ResponsePayloadSizeLimitExceeded' });
      throw new DoubleError('ResponsePayloadSizeLimitExceeded', 'The response payload size has exceeded the limit.');
    }
    this.model.syncs.push({ requestBytes, responseBytes, commands: names });
  }

  /** Queue a load: at sync, `take` computes the loaded values; their JSON size counts as response. */
  load(target: { loaded: Map<string, unknown> }, label: string, take: () => Record<string, unknown>): void {
    const command: Command = {
      kind: `load ${label}`,
      bytes: 0,
      run: () => {
        const got = take();
        // Objects in a loaded collection count as the properties loaded on them.
        command.bytes = JSON.stringify(got, (_k, v: unknown) =>
          typeof v === 'object' && v !== null && 'loaded' in v && v.loaded instanceof Map ? Object.fromEntries(v.loaded) : v,
        ).length;
        for (const [k, v] of Object.entries(got)) target.loaded.set(k, v);
      },
    };
    this.pending.push(command);
  }
}

function minorOf(version: string): number {
  const m = /^1\.(\d+)$/.exec(version);
  if (!m) throw new Error(`not an ExcelApi version: ${version}`);
  return Number(m[1]);
}

function props(names: string): string[] {
  return names.split(',').map((s) => s.trim()).filter(Boolean);
}

class DoubleWorkbook {
  readonly worksheets: DoubleWorksheets;
  readonly tables: DoubleTables;
  constructor(private readonly ctx: DoubleContext) {
    this.worksheets = new DoubleWorksheets(ctx);
    this.tables = new DoubleTables(ctx);
  }
  getSelectedRange(): DoubleRange {
    const m = this.ctx.model;
    const sheet = new DoubleWorksheet(this.ctx, () => m.selection.sheet);
    return new DoubleRange(this.ctx, sheet, () => parseRange(m.selection.range)!);
  }
}

class DoubleWorksheets {
  readonly loaded = new Map<string, unknown>();
  constructor(private readonly ctx: DoubleContext) {}
  get items(): DoubleWorksheet[] {
    return (this.loaded.get('items') as DoubleWorksheet[] | undefined) ?? notLoaded('items');
  }
  load(names: string): this {
    this.ctx.load(this, 'worksheets', () => {
      const wantsName = props(names).some((p) => p === 'items/name' || p === 'name');
      const items = this.ctx.model.sheets.map((s) => {
        const w = new DoubleWorksheet(this.ctx, () => s.name);
        if (wantsName) w.loaded.set('name', s.name);
        return w;
      });
      return { items };
    });
    return this;
  }
  getItem(name: string): DoubleWorksheet {
    return new DoubleWorksheet(this.ctx, () => name);
  }
  add(name?: string): DoubleWorksheet {
    const wanted = name ?? `Sheet${this.ctx.model.sheets.length + 1}`;
    this.ctx.queue(`add sheet ${wanted}`, wanted.length, () => {
      if (wanted.length > 31 || /[\\/?*[\]:]/.test(wanted) || wanted.trim() === '') {
        throw new DoubleError('InvalidArgument', `The sheet name ${wanted} is not valid.`);
      }
      if (this.ctx.model.sheet(wanted)) throw new DoubleError('ItemAlreadyExists', `A sheet named ${wanted} already exists.`);
      this.ctx.model.addSheet(wanted);
    });
    return new DoubleWorksheet(this.ctx, () => wanted);
  }
}

class DoubleWorksheet {
  readonly loaded = new Map<string, unknown>();
  constructor(
    private readonly ctx: DoubleContext,
    readonly nameOf: Thunk<string>,
  ) {}
  resolve(): SheetModel {
    const sheet = this.ctx.model.sheet(this.nameOf());
    if (!sheet) throw new DoubleError('ItemNotFound', `The requested resource doesn't exist (sheet ${this.nameOf()}).`);
    return sheet;
  }
  get name(): string {
    return (this.loaded.get('name') as string | undefined) ?? notLoaded('name');
  }
  load(names: string): this {
    this.ctx.load(this, 'worksheet', () => (props(names).includes('name') ? { name: this.resolve().name } : {}));
    return this;
  }
  getRange(address = 'A1'): DoubleRange {
    return new DoubleRange(this.ctx, this, () => {
      const r = parseRange(address);
      if (!r) throw new DoubleError('InvalidArgument', `The address ${address} is not valid.`);
      return r;
    });
  }
  getUsedRangeOrNullObject(valuesOnly?: boolean): DoubleRange {
    return new DoubleRange(this.ctx, this, () => usedRect(this.resolve(), undefined, valuesOnly));
  }
  /** Office.js has no such member in an Excel below the member's requirement set. */
  private needs(version: string, member: string): void {
    if (!this.ctx.model.supports(version)) {
      throw new DoubleError('ApiNotFound', `The API you are trying to use could not be found (${member}, ExcelApi ${version}).`);
    }
  }
  get freezePanes(): { freezeRows(count?: number): void } {
    this.needs('1.7', 'freezePanes');
    return {
      freezeRows: (count = 1) =>
        this.ctx.queue(`freezeRows ${this.nameOf()}`, 20, () => {
          if (!Number.isInteger(count) || count < 0 || count > MAX_ROWS) throw new DoubleError('InvalidArgument', `The argument ${count} is not valid.`);
          this.resolve().frozenRows = count;
        }),
    };
  }
  get pageLayout(): XlPageLayout {
    this.needs('1.9', 'pageLayout');
    return pageLayout(this.ctx, this);
  }
  activate(): void {
    this.ctx.queue('activate', 10, () => {
      this.ctx.model.activeSheet = this.resolve().name;
    });
  }
}

/** A write-only page layout: each set is a command; reading a property before load throws. */
function pageLayout(ctx: DoubleContext, sheet: DoubleWorksheet): XlPageLayout {
  const set = (what: string, value: unknown, check: () => boolean, apply: (p: SheetModel['print']) => void) =>
    ctx.queue(`pageLayout ${what} ${sheet.nameOf()}`, JSON.stringify(value).length, () => {
      if (!check()) throw new DoubleError('InvalidArgument', `The argument ${JSON.stringify(value)} for ${what} is not valid.`);
      apply(sheet.resolve().print);
    });
  const pages = (n: unknown) => n === undefined || (Number.isInteger(n) && (n as number) >= 0);
  const footer: { leftFooter: string; rightFooter: string } = {
    get leftFooter(): string {
      return notLoaded('leftFooter');
    },
    set leftFooter(text: string) {
      set('leftFooter', text, () => typeof text === 'string', (p) => (p.leftFooter = text));
    },
    get rightFooter(): string {
      return notLoaded('rightFooter');
    },
    set rightFooter(text: string) {
      set('rightFooter', text, () => typeof text === 'string', (p) => (p.rightFooter = text));
    },
  };
  return {
    get orientation(): 'Portrait' | 'Landscape' {
      return notLoaded('orientation');
    },
    set orientation(o: 'Portrait' | 'Landscape') {
      set('orientation', o, () => o === 'Portrait' || o === 'Landscape', (p) => (p.orientation = o));
    },
    get zoom(): XlPageLayout['zoom'] {
      return notLoaded('zoom');
    },
    set zoom(z: XlPageLayout['zoom']) {
      set('zoom', z, () => pages(z.horizontalFitToPages) && pages(z.verticalFitToPages), (p) => (p.zoom = { ...z }));
    },
    headersFooters: { defaultForAllPages: footer },
    setPrintTitleRows(rows: string) {
      set('printTitleRows', rows, () => /^\$?[1-9]\d*:\$?[1-9]\d*$/.test(rows), (p) => (p.titleRows = rows));
    },
  };
}

function usedRect(sheet: SheetModel, within: RangeRef | undefined, _valuesOnly?: boolean): RangeRef | null {
  let box: RangeRef | null = null;
  for (const [k, cell] of sheet.cells) {
    if (cell.value === '' && cell.formula === undefined) continue;
    const [r, c] = k.split(',').map(Number) as [number, number];
    if (within && (r < within.top || r > within.bottom || c < within.left || c > within.right)) continue;
    box = box
      ? { top: Math.min(box.top, r), left: Math.min(box.left, c), bottom: Math.max(box.bottom, r), right: Math.max(box.right, c) }
      : { top: r, left: c, bottom: r, right: c };
  }
  return box;
}

/** Format objects whose property writes become commands on the range. */
function formatProxy(ctx: DoubleContext, range: DoubleRange, path: string): Record<string, unknown> {
  return new Proxy(
    {},
    {
      get: (_t, prop: string) => {
        if (prop === 'fill' || prop === 'font') return formatProxy(ctx, range, `${path}${prop}.`);
        return notLoaded(`${path}${prop}`);
      },
      set: (_t, prop: string, value: unknown) => {
        ctx.queue(`format ${range.label()}`, JSON.stringify(value).length + prop.length, () => {
          const { sheet, rect } = range.resolveOrFail();
          if (prop === 'columnWidth') {
            for (let c = rect.left; c <= rect.right; c++) sheet.columnWidths.set(c, value as number);
            return;
          }
          for (let r = rect.top; r <= rect.bottom; r++) {
            for (let c = rect.left; c <= rect.right; c++) {
              const cell = sheet.cells.get(key(r, c)) ?? { value: '', numberFormat: 'General', format: {} };
              cell.format[`${path}${prop}`] = value;
              sheet.cells.set(key(r, c), cell);
            }
          }
        });
        return true;
      },
    },
  );
}

class DoubleRange {
  readonly loaded = new Map<string, unknown>();
  readonly format: XlRangeFormat;

  constructor(
    private readonly ctx: DoubleContext,
    readonly sheetProxy: DoubleWorksheet,
    private readonly rectOf: Thunk<RangeRef | null>,
  ) {
    this.format = formatProxy(ctx, this, '') as unknown as XlRangeFormat;
  }

  label(): string {
    return `${this.sheetProxy.nameOf()}!…`;
  }

  resolve(): { sheet: SheetModel; rect: RangeRef | null } {
    const sheet = this.sheetProxy.resolve();
    const rect = this.rectOf();
    if (rect && (rect.bottom >= MAX_ROWS || rect.right >= MAX_COLUMNS || rect.top < 0 || rect.left < 0)) {
      throw new DoubleError('InvalidArgument', 'The range lies outside the sheet.');
    }
    return { sheet, rect };
  }

  resolveOrFail(): { sheet: SheetModel; rect: RangeRef } {
    const { sheet, rect } = this.resolve();
    if (!rect) throw new DoubleError('InvalidObjectPath', 'The object path is not valid: a null object was used.');
    return { sheet, rect };
  }

  private derive(f: (r: RangeRef) => RangeRef | null): DoubleRange {
    return new DoubleRange(this.ctx, this.sheetProxy, () => {
      const r = this.rectOf();
      return r ? f(r) : null;
    });
  }

  getCell(row: number, column: number): DoubleRange {
    return this.derive((r) => ({ top: r.top + row, left: r.left + column, bottom: r.top + row, right: r.left + column }));
  }
  getResizedRange(deltaRows: number, deltaColumns: number): DoubleRange {
    return this.derive((r) => {
      const out = { ...r, bottom: r.bottom + deltaRows, right: r.right + deltaColumns };
      if (out.bottom < out.top || out.right < out.left) throw new DoubleError('InvalidArgument', 'The resized range is empty.');
      return out;
    });
  }
  getOffsetRange(rowOffset: number, columnOffset: number): DoubleRange {
    return this.derive((r) => ({ top: r.top + rowOffset, left: r.left + columnOffset, bottom: r.bottom + rowOffset, right: r.right + columnOffset }));
  }
  getUsedRangeOrNullObject(valuesOnly?: boolean): DoubleRange {
    return new DoubleRange(this.ctx, this.sheetProxy, () => {
      const r = this.rectOf();
      return r ? usedRect(this.sheetProxy.resolve(), r, valuesOnly) : null;
    });
  }
  get worksheet(): DoubleWorksheet {
    return this.sheetProxy;
  }

  load(names: string): this {
    this.ctx.load(this, 'range', () => {
      const { sheet, rect } = this.resolve();
      const out: Record<string, unknown> = { isNullObject: rect === null };
      for (const p of props(names)) {
        if (p === 'isNullObject') continue;
        if (!rect) {
          out[p] = undefined;
          continue;
        }
        if (p === 'address') out[p] = `${sheetPrefix(sheet.name)}!${rangeAddress(rect)}`;
        else if (p === 'rowCount') out[p] = rect.bottom - rect.top + 1;
        else if (p === 'columnCount') out[p] = rect.right - rect.left + 1;
        else if (p === 'values' || p === 'formulas' || p === 'valueTypes' || p === 'numberFormat') out[p] = grid(sheet, rect, p);
        else throw new Error(`double: load of ${p} is not modelled`);
      }
      return out;
    });
    return this;
  }

  private got<T>(prop: string): T {
    if (!this.loaded.has(prop)) notLoaded(prop);
    if (prop !== 'isNullObject' && this.loaded.get('isNullObject') === true) {
      throw new DoubleError('InvalidObjectPath', `Reading ${prop} of a null object.`);
    }
    return this.loaded.get(prop) as T;
  }
  get address(): string { return this.got('address'); }
  get rowCount(): number { return this.got('rowCount'); }
  get columnCount(): number { return this.got('columnCount'); }
  get isNullObject(): boolean { return this.got('isNullObject'); }
  get valueTypes(): string[][] { return this.got('valueTypes'); }
  get values(): XlValue[][] { return this.got('values'); }
  get formulas(): XlValue[][] { return this.got('formulas'); }
  get numberFormat(): string[][] { return this.got('numberFormat'); }
  set values(data: XlValue[][]) { this.write('values', data); }
  set formulas(data: XlValue[][]) { this.write('formulas', data); }
  set numberFormat(data: string[][]) { this.write('numberFormat', data as XlValue[][]); }

  private write(prop: 'values' | 'formulas' | 'numberFormat', data: XlValue[][]): void {
    this.ctx.queue(`${prop} ${this.sheetProxy.nameOf()}`, JSON.stringify(data).length, () => {
      const { sheet, rect } = this.resolveOrFail();
      const rows = rect.bottom - rect.top + 1;
      const cols = rect.right - rect.left + 1;
      if (!Array.isArray(data) || data.length !== rows || data.some((row) => !Array.isArray(row) || row.length !== cols)) {
        throw new DoubleError('InvalidArgument', "The number of rows or columns in the input array doesn't match the size or dimensions of the range.");
      }
      data.forEach((row, r) =>
        row.forEach((input, c) => {
          const k = key(rect.top + r, rect.left + c);
          const cell = sheet.cells.get(k) ?? { value: '', numberFormat: 'General', format: {} };
          if (prop === 'numberFormat') cell.numberFormat = String(input);
          else {
            // Office.js reads '=...' as a formula whether it is set through values or formulas.
            const t = typed(input);
            cell.value = t.value;
            cell.formula = t.formula;
          }
          sheet.cells.set(k, cell);
        }),
      );
    });
  }

  readonly conditionalFormats = {
    add: (type: string) => {
      const record: SheetModel['conditionalFormats'][number] = { range: '' };
      this.ctx.queue(`conditionalFormat ${this.sheetProxy.nameOf()}`, 60, () => {
        if (type !== 'ContainsText') throw new Error(`double: conditional format ${type} is not modelled`);
        const { sheet, rect } = this.resolveOrFail();
        record.range = rangeAddress(rect);
        sheet.conditionalFormats.push(record);
      });
      const part = (field: 'fill' | 'font') => ({
        set color(v: string) {
          record[field] = v;
        },
        get color(): string {
          return notLoaded('color');
        },
        bold: false,
      });
      return {
        textComparison: {
          format: { fill: part('fill'), font: part('font') },
          set rule(r: { operator: string; text: string }) {
            if (r.operator !== 'Contains') throw new Error(`double: operator ${r.operator} is not modelled`);
            record.text = r.text;
          },
          get rule(): { operator: string; text: string } {
            return notLoaded('rule');
          },
        },
      };
    },
  };

  select(): void {
    this.ctx.queue('select', 10, () => {
      const { sheet, rect } = this.resolveOrFail();
      this.ctx.model.selection = { sheet: sheet.name, range: rangeAddress(rect) };
    });
  }
}

function grid(sheet: SheetModel, rect: RangeRef, prop: 'values' | 'formulas' | 'valueTypes' | 'numberFormat'): unknown[][] {
  const out: unknown[][] = [];
  for (let r = rect.top; r <= rect.bottom; r++) {
    const row: unknown[] = [];
    for (let c = rect.left; c <= rect.right; c++) {
      const cell = sheet.cells.get(key(r, c));
      if (prop === 'numberFormat') row.push(cell?.numberFormat ?? 'General');
      else if (prop === 'formulas') row.push(cell?.formula ?? cell?.value ?? '');
      else if (prop === 'values') row.push(cell?.value ?? '');
      else row.push(valueType(cell));
    }
    out.push(row);
  }
  return out;
}

function valueType(cell: CellModel | undefined): string {
  if (!cell || (cell.value === '' && cell.formula === undefined)) return 'Empty';
  if (cell.error) return 'Error';
  if (typeof cell.value === 'boolean') return 'Boolean';
  if (typeof cell.value === 'number') return 'Double';
  return 'String';
}

class DoubleTables {
  readonly loaded = new Map<string, unknown>();
  constructor(private readonly ctx: DoubleContext) {}
  get items(): DoubleTable[] {
    return (this.loaded.get('items') as DoubleTable[] | undefined) ?? notLoaded('items');
  }
  load(names: string): this {
    this.ctx.load(this, 'tables', () => ({
      items: this.ctx.model.tables.map((t) => {
        const table = new DoubleTable(this.ctx, t);
        if (props(names).includes('items/name')) table.loaded.set('name', t.name);
        return table;
      }),
    }));
    return this;
  }
}

class DoubleTable {
  readonly loaded = new Map<string, unknown>();
  readonly worksheet: DoubleWorksheet;
  constructor(
    private readonly ctx: DoubleContext,
    private readonly model: { name: string; sheet: string; range: string },
  ) {
    this.worksheet = new DoubleWorksheet(ctx, () => model.sheet);
  }
  get name(): string {
    return (this.loaded.get('name') as string | undefined) ?? notLoaded('name');
  }
  load(names: string): this {
    this.ctx.load(this, 'table', () => (props(names).includes('name') ? { name: this.model.name } : {}));
    return this;
  }
  getRange(): DoubleRange {
    return this.worksheet.getRange(this.model.range);
  }
}

/** Column index of letters, for tests that look at column widths. */
export function column(letters: string): number {
  return columnIndex(letters)!;
}

/**
 * `Office.context.document.settings` as the document keeps it: `set` changes the in-memory copy
 * only, `saveAsync` stores it in the document later (its callback never runs synchronously),
 * `reopened()` is the add-in loaded again with what the document saved. Values are kept as
 * JSON, as Office stores them; a value JSON cannot hold fails like Office.js (InvalidArgument).
 * A missing setting reads null. `refuseSaves` makes saveAsync report status 'failed'.
 */
export class SettingsDouble {
  refuseSaves = false;
  private memory: Map<string, string>;
  constructor(private readonly document: Map<string, string> = new Map()) {
    this.memory = new Map(document);
  }
  get(name: string): unknown {
    const v = this.memory.get(name);
    return v === undefined ? null : JSON.parse(v);
  }
  set(name: string, value: unknown): void {
    const json = JSON.stringify(value);
    if (json === undefined) throw new DoubleError('InvalidArgument', 'The argument is invalid or missing or has an incorrect format.');
    this.memory.set(name, json);
  }
  saveAsync(callback?: (result: { status: unknown; error: { message: string } | null }) => void): void {
    setTimeout(() => {
      if (this.refuseSaves) return callback?.({ status: 'failed', error: { message: 'The settings could not be saved.' } });
      for (const [k, v] of this.memory) this.document.set(k, v);
      callback?.({ status: 'succeeded', error: null });
    }, 0);
  }
  /** The add-in opened again on the same document: only what was saved is there. */
  reopened(): SettingsDouble {
    return new SettingsDouble(this.document);
  }
}
