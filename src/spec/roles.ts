// Which signal columns of a table are inputs and which are outputs, and by which rule.
import { clip, isBlank, roleWord } from './cell-values.js';
import type { CellAt, BlockLayout } from './table-layout.js';
import type { RoleRule } from './types.js';

export interface Roles {
  readonly rule: RoleRule;
  /** Grid columns, left to right. */
  readonly inputs: readonly number[];
  readonly outputs: readonly number[];
}

/** A complaint about one cell (grid coordinates), or about the header row when `col` is absent. */
export interface RoleComplaint {
  readonly row: number;
  readonly col?: number;
  readonly message: string;
}

export const HOW_TO_MARK_ROLES =
  'put a row reading input / output above the headers, leave one empty column between the inputs ' +
  '(left) and the outputs (right), or choose how many of the leftmost columns are inputs';

/**
 * Roles by the first rule that applies: a role row (a blank role cell takes the role of the
 * nearest role cell on its left, as a merged "Inputs" cell over several columns reads), an
 * empty separator column, the user's count of inputs. No rule: a complaint, never a guess.
 */
export function decideRoles(
  cellAt: CellAt,
  layout: BlockLayout,
  columns: readonly number[],
  inputCount: number | undefined,
): { roles: Roles } | { complaints: RoleComplaint[] } {
  if (layout.roleRow !== undefined) return fromRoleRow(cellAt, layout.roleRow, columns);
  if (layout.separator !== undefined) {
    const sep = layout.separator;
    return {
      roles: { rule: 'separator-column', inputs: columns.filter((c) => c < sep), outputs: columns.filter((c) => c > sep) },
    };
  }
  if (inputCount !== undefined) {
    if (!Number.isInteger(inputCount) || inputCount < 1 || inputCount >= columns.length) {
      const message =
        `the chosen number of inputs (${inputCount}) does not fit this table's ${columns.length} signal columns: ` +
        `choose 1 to ${columns.length - 1} so that at least one output is left`;
      return { complaints: [{ row: layout.headerRow, message }] };
    }
    return { roles: { rule: 'user-choice', inputs: columns.slice(0, inputCount), outputs: columns.slice(inputCount) } };
  }
  return { complaints: [{ row: layout.headerRow, message: `cannot tell inputs from outputs: ${HOW_TO_MARK_ROLES}` }] };
}

function fromRoleRow(cellAt: CellAt, row: number, columns: readonly number[]): { roles: Roles } | { complaints: RoleComplaint[] } {
  const inputs: number[] = [];
  const outputs: number[] = [];
  const complaints: RoleComplaint[] = [];
  // 'unreadable': blank cells after a bad role cell share its complaint.
  let current: 'input' | 'output' | 'unreadable' | undefined;
  for (const col of columns) {
    const v = cellAt(row, col);
    const word = roleWord(v);
    if (word) current = word;
    else if (!isBlank(v)) {
      complaints.push({ row, col, message: `the role cell reads "${clip(String(v).trim())}"; write input or output` });
      current = 'unreadable';
    } else if (!current) {
      complaints.push({ row, col, message: 'blank role cell with no input/output cell on its left; write input or output' });
    }
    if (current === 'input') inputs.push(col);
    else if (current === 'output') outputs.push(col);
  }
  return complaints.length > 0 ? { complaints } : { roles: { rule: 'role-row', inputs, outputs } };
}
