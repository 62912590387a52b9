// A sheet to write, independent of the host that writes it (SheetJS file or Office.js).

/** `unsafe`: a count or counterexample on the dangerous side (the spec requires the safe value, the program gives the other). */
export type CellStyle = 'title' | 'heading' | 'label' | 'code' | 'caution' | 'status' | 'input' | 'number' | 'unsafe';

export interface BlockCell {
  readonly value: string | number | boolean | null;
  /**
   * An Excel formula without the leading '=', with function names as a user types them
   * (`XOR(...)`). The file host stores XOR as `_xlfn.XOR`; Office.js takes it as typed.
   * `value` is the value the formula is expected to compute (written as the cached value).
   */
  readonly formula?: string;
  readonly style?: CellStyle;
}

export interface SheetBlock {
  /** Wanted sheet name (at most 31 characters); a host adds a suffix if it is taken. */
  readonly name: string;
  /** Rows from A1 downwards; a null entry is an empty cell. */
  readonly rows: readonly (readonly (BlockCell | null)[])[];
  /** Column widths in characters, from column A. */
  readonly columnWidths?: readonly number[];
  /** A1 ranges of status cells that read OK / DIFFERS, for a conditional format. */
  readonly statusRanges?: readonly string[];
  /** How the sheet prints: landscape, one page wide, the first `titleRows` rows on every page, a footer. */
  readonly print?: PrintSetup;
  /** Rows from row 1 kept in view while the rest scrolls (frozen panes). */
  readonly freezeRows?: number;
  /**
   * Blocks of the same list whose sheets this block's formulas name (`'Name'!A1`, by the name
   * they want), as the distance from this block (1 = the next block). The sheets' final names
   * are known only when written (a name may be taken): `writeSheets` puts them in.
   */
  readonly refersTo?: readonly number[];
}

/** A sheet name as a formula writes it: always quoted, a quote inside doubled ('It''s'!A1). */
export function quotedSheet(name: string): string {
  return `'${name.replace(/'/g, "''")}'`;
}

/** The block with every formula reference to sheet `from` made one to sheet `to`. */
export function renameSheetRefs(block: SheetBlock, from: string, to: string): SheetBlock {
  const was = `${quotedSheet(from)}!`;
  const now = `${quotedSheet(to)}!`;
  const rows = block.rows.map((row) => row.map((c) => (c?.formula?.includes(was) ? { ...c, formula: c.formula.split(was).join(now) } : c)));
  return { ...block, rows };
}

export interface PrintSetup {
  readonly landscape: boolean;
  readonly fitToWidth: boolean;
  /** Rows repeated at the top of every printed page, 1-based and inclusive: the title row, or a table's column titles. */
  readonly titleRows: { readonly first: number; readonly last: number };
  /** Footer text (left part); the page number goes on the right. */
  readonly footer: string;
}
