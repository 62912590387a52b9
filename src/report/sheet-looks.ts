// How each cell style of a SheetBlock looks, and how a results sheet prints: one description
// that the Excel host (Office.js formats) and the file host (styles in the .xlsx package) both
// follow, so a results sheet looks the same whichever host wrote it. Our own plain colours.
import type { CellStyle, PrintSetup } from './sheet-block.js';

export interface Look {
  readonly bold?: boolean;
  readonly italic?: boolean;
  /** Colours as #RRGGBB. */
  readonly color?: string;
  readonly fill?: string;
  readonly fontName?: string;
  readonly size?: number;
  readonly wrap?: boolean;
  readonly align?: 'left' | 'center' | 'right';
}

export const LOOKS: Readonly<Record<CellStyle, Look>> = {
  title: { bold: true, size: 14 },
  heading: { bold: true, fill: '#DCE6F0' },
  label: { bold: true },
  code: { fontName: 'Consolas', wrap: true },
  caution: { italic: true, color: '#7A2E00' },
  status: { bold: true, align: 'center' },
  input: { align: 'center' },
  number: { align: 'right' },
  // The colours of a DIFFERS status: the same warning wherever the sheet shows danger.
  unsafe: { bold: true, fill: '#F4C7C3', color: '#8B0000' },
};

/** Conditional formats on status cells: a cell containing DIFFERS red, OK green (DIFFERS first: it also contains no OK). */
export const STATUS_LOOKS = [
  { text: 'DIFFERS', fill: '#F4C7C3', font: '#8B0000' },
  { text: 'OK', fill: '#CDE8C5', font: '#1E5B1E' },
] as const;

/** The right part of every printed footer: page number and page count (header/footer codes &P, &N). */
export const PAGE_FOOTER = 'Page &P of &N';

/** Footer text as header/footer codes read it: a literal '&' is written '&&'. */
export function footerText(text: string): string {
  return text.replace(/&/g, '&&');
}

/**
 * How our sheets print: landscape, one page wide (as many pages down as needed), and on every
 * page the sheet's title row or, for a sheet of steps or checks, its column titles (`titleRow`).
 */
export function printSetup(footer: string, titleRow = 1): PrintSetup {
  return { landscape: true, fitToWidth: true, titleRows: { first: titleRow, last: titleRow }, footer };
}
