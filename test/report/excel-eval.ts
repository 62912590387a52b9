// A test oracle: evaluates the few Excel functions the live check writes (IF, AND, OR, NOT,
// XOR, COUNTIF with a text criterion), `--`, `=`, numbers, "text", TRUE/FALSE and A1 cell
// references, over the cells of a SheetBlock. Excel's rules followed (Microsoft support pages
// of each function, from memory): `=` between a number and text or a logical value is FALSE;
// AND/OR/XOR take logical values, numbers (0 = FALSE) and ignore text in referenced cells;
// `--` turns TRUE/FALSE and numeric text into numbers; a blank cell is 0.
import { parseA1, parseRange } from '../../src/table/grid.js';
import type { SheetBlock } from '../../src/report/sheet-block.js';

export type Value = number | string | boolean;

export function evaluateCell(block: SheetBlock, address: string): Value {
  const at = parseA1(address);
  if (!at) throw new Error(`not a cell: ${address}`);
  const cell = block.rows[at.row]?.[at.col] ?? null;
  if (cell === null || cell.value === null) return 0;
  return cell.formula === undefined ? cell.value : evaluateFormula(block, cell.formula);
}

export function evaluateFormula(block: SheetBlock, formula: string): Value {
  const tokens = formula.match(/"[^"]*"|[A-Za-z_][A-Za-z0-9_.]*(?::[A-Z]+[0-9]+)?|[0-9]+(?:\.[0-9]+)?|--|[-=(),]/g) ?? [];
  let pos = 0;
  const peek = () => tokens[pos];
  const next = () => {
    const t = tokens[pos++];
    if (t === undefined) throw new Error(`formula ends early: ${formula}`);
    return t;
  };
  const expect = (t: string) => {
    if (next() !== t) throw new Error(`expected ${t} in ${formula}`);
  };
  const comparison = (): Value => {
    const left = unary();
    if (peek() !== '=') return left;
    next();
    const right = unary();
    return typeof left === typeof right && (typeof left === 'string' ? left.toLowerCase() === (right as string).toLowerCase() : left === right);
  };
  const unary = (): Value => {
    if (peek() === '--' || peek() === '-') {
      const op = next();
      const v = toNumber(unary());
      return op === '--' ? v : -v;
    }
    return primary();
  };
  const primary = (): Value => {
    const t = next();
    if (t === '(') {
      const v = comparison();
      expect(')');
      return v;
    }
    if (/^"/.test(t)) return t.slice(1, -1);
    if (/^[0-9]/.test(t)) return Number(t);
    const upper = t.toUpperCase();
    if (peek() === '(') {
      next();
      const args: Value[][] = [];
      if (peek() !== ')') {
        for (;;) {
          args.push(argument());
          if (peek() === ',') next();
          else break;
        }
      }
      expect(')');
      return call(upper, args);
    }
    if (upper === 'TRUE') return true;
    if (upper === 'FALSE') return false;
    return evaluateCell(block, t);
  };
  /** An argument: a single value, or the values of a range (for COUNTIF). */
  const argument = (): Value[] => {
    const t = peek()!;
    if (/:/.test(t)) {
      next();
      const r = parseRange(t)!;
      const out: Value[] = [];
      for (let row = r.top; row <= r.bottom; row++) for (let col = r.left; col <= r.right; col++) {
        const cell = block.rows[row]?.[col] ?? null;
        out.push(cell === null || cell.value === null ? '' : cell.formula === undefined ? cell.value : evaluateFormula(block, cell.formula));
      }
      return out;
    }
    return [comparison()];
  };
  const call = (name: string, args: Value[][]): Value => {
    const flat = args.map((a) => a[0]!);
    switch (name) {
      case 'IF':
        return toLogical(flat[0]!) ? flat[1]! : flat[2]!;
      case 'NOT':
        return !toLogical(flat[0]!);
      case 'AND':
        return flat.every(toLogical);
      case 'OR':
        return flat.some(toLogical);
      case 'XOR':
        return flat.filter(toLogical).length % 2 === 1;
      case 'COUNTIF':
        return args[0]!.filter((v) => typeof v === 'string' && v.toLowerCase() === String(flat[1]).toLowerCase()).length;
      default:
        throw new Error(`function ${name} is not known to the test oracle`);
    }
  };
  const v = comparison();
  if (pos !== tokens.length) throw new Error(`unread tokens in ${formula}`);
  return v;
}

function toNumber(v: Value): number {
  if (typeof v === 'number') return v;
  if (typeof v === 'boolean') return v ? 1 : 0;
  if (v.trim() !== '' && !Number.isNaN(Number(v))) return Number(v);
  throw new Error(`#VALUE!: ${JSON.stringify(v)} is not a number`);
}

function toLogical(v: Value): boolean {
  if (typeof v === 'boolean') return v;
  if (typeof v === 'number') return v !== 0;
  throw new Error(`#VALUE!: text ${JSON.stringify(v)} as a logical value`);
}
