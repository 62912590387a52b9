// Which signal columns of a table are inputs and which are outputs, and by which rule.
import { clip, isBlank, isNoteWord, roleWord } from './cell-values.js';
import { settingName } from './settings.js';
import type { CellAt, BlockLayout, MergeAt } from './table-layout.js';
import type { HostKind, RoleRule } from './types.js';

export interface Roles {
  readonly rule: RoleRule;
  /** Grid columns, left to right. */
  readonly inputs: readonly number[];
  readonly outputs: readonly number[];
  /** Columns of the block that no role cell covers: notes beside the rows (role row only). */
  readonly outside: readonly number[];
}

/** A complaint about one cell (grid coordinates), or about the header row when `col` is absent. */
export interface RoleComplaint {
  readonly row: number;
  readonly col?: number;
  readonly message: string;
}

/** How to tell inputs from outputs, naming the host's own option for the count of inputs. */
export function howToMarkRoles(host: HostKind): string {
  return (
    'put a row reading input / output (or IN / OUT, I / Q) above the headers, leave one empty column between the inputs ' +
    `(left) and the outputs (right), or say how many of the leftmost columns are inputs: ${settingName('inputs', host)}`
  );
}

/**
 * Roles by the first rule that applies: a role row, an empty separator column, the user's
 * count of inputs. No rule: a complaint, never a guess. `columns` are the block's columns that
 * may hold signals (annotation columns by header or contents already left out).
 */
export function decideRoles(
  cellAt: CellAt,
  mergeAt: MergeAt,
  layout: BlockLayout,
  columns: readonly number[],
  inputCount: number | undefined,
  host: HostKind,
): { roles: Roles } | { complaints: RoleComplaint[] } {
  if (layout.roleRow !== undefined) return fromRoleRow(cellAt, mergeAt, layout.roleRow, columns);
  if (layout.separator !== undefined) {
    const sep = layout.separator;
    return {
      roles: { rule: 'separator-column', inputs: columns.filter((c) => c < sep), outputs: columns.filter((c) => c > sep), outside: [] },
    };
  }
  if (inputCount !== undefined) {
    if (!Number.isInteger(inputCount) || inputCount < 1 || inputCount >= columns.length) {
      const message =
        `the chosen number of inputs (${inputCount}) does not fit this table's ${columns.length} signal columns: ` +
        `choose 1 to ${columns.length - 1} so that at least one output is left`;
      return { complaints: [{ row: layout.headerRow, message }] };
    }
    return { roles: { rule: 'user-choice', inputs: columns.slice(0, inputCount), outputs: columns.slice(inputCount), outside: [] } };
  }
  return { complaints: [{ row: layout.headerRow, message: `cannot tell inputs from outputs: ${howToMarkRoles(host)}` }] };
}

/**
 * A role cell covers exactly its columns: its merged area, or itself. Only in a row with no
 * merged role cell and no repeated role word does a blank cell take the role on its left (a
 * single "Inputs" typed over several columns without merging). Columns left of every role
 * cell, under a note word (Notes, Remarks) or past a role cell's span are outside: notes.
 */
function fromRoleRow(cellAt: CellAt, mergeAt: MergeAt, row: number, columns: readonly number[]): { roles: Roles } | { complaints: RoleComplaint[] } {
  const words = columns.map((c) => roleWord(cellAt(row, c)));
  const roleCols = columns.filter((_, i) => words[i] !== undefined);
  const merged = roleCols.some((c) => spanOf(mergeAt, row, c) > c);
  const repeated = new Set(roleCols.map((c) => roleWord(cellAt(row, c)))).size < roleCols.length;
  const exact = merged || repeated;
  const inputs: number[] = [];
  const outputs: number[] = [];
  const outside: number[] = [];
  const complaints: RoleComplaint[] = [];
  let current: 'input' | 'output' | 'outside' | 'unreadable' = 'outside';
  let spanEnd = -1;
  for (const col of columns) {
    const v = cellAt(row, col);
    const word = roleWord(v);
    if (word) {
      current = word;
      spanEnd = exact ? spanOf(mergeAt, row, col) : Number.MAX_SAFE_INTEGER;
    } else if (col <= spanEnd && isBlank(v)) {
      // inside the role cell's merged area, or a blank after a single unmerged role word
    } else if (isBlank(v) || isNoteWord(v) || roleCols.length === 0 || col < roleCols[0]!) {
      current = 'outside';
      spanEnd = isBlank(v) ? -1 : spanOf(mergeAt, row, col);
    } else {
      complaints.push({ row, col, message: `the role cell reads "${clip(String(v).trim())}"; write input or output (or a note word such as Notes)` });
      current = 'unreadable';
      spanEnd = spanOf(mergeAt, row, col);
    }
    if (current === 'input') inputs.push(col);
    else if (current === 'output') outputs.push(col);
    else if (current === 'outside') outside.push(col);
  }
  return complaints.length > 0 ? { complaints } : { roles: { rule: 'role-row', inputs, outputs, outside } };
}

/** The last column of the merged area at this cell, or the cell's own column. */
function spanOf(mergeAt: MergeAt, row: number, col: number): number {
  const m = mergeAt(row, col);
  return m ? m.right : col;
}
