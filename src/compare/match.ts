// Which signal of the new table is which of the old, and which table is which: by identifier,
// then by header (case-insensitive), nothing guessed. A signal matched by identifier whose
// header text changed is reported as renamed.
import { signalIndex, type Signal } from '../logic/index.js';
import type { SpecTable } from '../table/index.js';

export interface SignalPair {
  readonly old: Signal;
  readonly new: Signal;
  readonly oldIndex: number;
  readonly newIndex: number;
  /** Same identifier, other header text. */
  readonly renamed: boolean;
}

export interface SignalMatch {
  readonly pairs: readonly SignalPair[];
  /** Signals of the new table with no partner in the old one, with their index in the new list. */
  readonly added: readonly { readonly signal: Signal; readonly index: number }[];
  readonly removed: readonly { readonly signal: Signal; readonly index: number }[];
}

const key = (s: string): string => s.trim().toLowerCase();

/** "Old signal OLD is new signal NEW": the user's word where names alone do not pair them. */
export type Rename = readonly [oldName: string, newName: string];

/**
 * Pairs in the new table's order: the user's renames first (by header or identifier), then
 * identifiers over all signals, then headers. A rename naming no signal of these lists is skipped
 * (the caller says so when no list has it).
 */
export function matchSignals(oldSignals: readonly Signal[], newSignals: readonly Signal[], renames: readonly Rename[] = []): SignalMatch {
  const partner = new Map<number, number>(); // new index -> old index
  const taken = new Set<number>();
  for (const [from, to] of renames) {
    const i = signalIndex(oldSignals, from);
    const j = signalIndex(newSignals, to);
    if (i < 0 || j < 0 || taken.has(i) || partner.has(j)) continue;
    partner.set(j, i);
    taken.add(i);
  }
  for (const by of [(s: Signal) => key(s.identifier), (s: Signal) => key(s.header)]) {
    newSignals.forEach((s, j) => {
      if (partner.has(j)) return;
      const i = oldSignals.findIndex((o, k) => !taken.has(k) && by(o) === by(s));
      if (i < 0) return;
      partner.set(j, i);
      taken.add(i);
    });
  }
  const pairs: SignalPair[] = [];
  const added: { signal: Signal; index: number }[] = [];
  newSignals.forEach((s, j) => {
    const i = partner.get(j);
    if (i === undefined) added.push({ signal: s, index: j });
    else pairs.push({ old: oldSignals[i]!, new: s, oldIndex: i, newIndex: j, renamed: oldSignals[i]!.header.trim() !== s.header.trim() });
  });
  const removed = oldSignals.flatMap((signal, index) => (taken.has(index) ? [] : [{ signal, index }]));
  return { pairs, added, removed };
}

export interface TablePair {
  readonly old: SpecTable;
  readonly new: SpecTable;
}

export interface TableMatch {
  readonly pairs: readonly TablePair[];
  /** Why some tables could not be paired, with what to give instead; empty when all were. */
  readonly unmatched: readonly string[];
}

const where = (t: SpecTable): string => `${t.sheet}!${t.range}`;

/**
 * Tables paired by sheet (case-insensitive) and their order on it. One table on each side is
 * a pair whatever the sheets are called. A sheet with a different number of tables on the two
 * sides, or a table with no partner, cannot be paired without help (--old-sheet/--old-range and
 * --new-sheet/--new-range): that is said once per sheet.
 */
export function matchTables(oldTables: readonly SpecTable[], newTables: readonly SpecTable[]): TableMatch {
  if (oldTables.length === 1 && newTables.length === 1) return { pairs: [{ old: oldTables[0]!, new: newTables[0]! }], unmatched: [] };
  const bySheet = (tables: readonly SpecTable[]): Map<string, SpecTable[]> => {
    const m = new Map<string, SpecTable[]>();
    for (const t of tables) m.set(key(t.sheet), [...(m.get(key(t.sheet)) ?? []), t]);
    return m;
  };
  const olds = bySheet(oldTables);
  const news = bySheet(newTables);
  const pairs: TablePair[] = [];
  const unmatched: string[] = [];
  for (const sheet of new Set([...olds.keys(), ...news.keys()])) {
    const o = olds.get(sheet) ?? [];
    const n = news.get(sheet) ?? [];
    if (o.length === n.length) o.forEach((t, i) => pairs.push({ old: t, new: n[i]! }));
    else {
      const list = (ts: SpecTable[]): string => (ts.length === 0 ? 'none' : ts.map(where).join(', '));
      unmatched.push(
        `sheet "${(o[0] ?? n[0])!.sheet}": the old workbook has ${o.length} table(s) (${list(o)}), the new one ${n.length} (${list(n)}); ` +
          'choose the pair with --old-sheet/--old-range and --new-sheet/--new-range',
      );
    }
  }
  return { pairs, unmatched };
}
