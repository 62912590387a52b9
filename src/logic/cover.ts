// Exact minimum covering (unate covering), by branch and bound within a deadline.
import type { Deadline } from './deadline.js';
import { appendAll, minOf } from './arrays.js';

/**
 * Rows must each be covered by at least one chosen column. `rows[r]` lists the columns that
 * cover row r; `costs[c]` is the cost of column c (a positive integer). A cover is better
 * when it has fewer columns, or as many and a lower total cost (for sums of products:
 * fewer product terms, then fewer literals).
 */
export interface CoverProblem {
  readonly rows: readonly (readonly number[])[];
  readonly costs: readonly number[];
}

/** Proven lower bounds on a best cover. */
export interface CoverBound {
  /** Every cover has at least this many columns. */
  readonly columns: number;
  /** Every cover with the fewest columns costs at least this much. */
  readonly cost: number;
}

export interface CoverResult {
  /** Chosen columns, increasing. */
  readonly columns: number[];
  readonly lowerBound: CoverBound;
  /**
   * True when every search ran to its end and the bound equals the cover found (as many
   * columns, the same cost): no cover is better. Never true for a search the clock cut short.
   */
  readonly proven: boolean;
}

export function coverCost(problem: CoverProblem, columns: readonly number[]): number {
  let total = 0;
  for (const c of columns) total += problem.costs[c]!;
  return total;
}

/** Negative when cover a is better than cover b (fewer columns, then lower cost). */
export function compareCovers(problem: CoverProblem, a: readonly number[], b: readonly number[]): number {
  return a.length - b.length || coverCost(problem, a) - coverCost(problem, b);
}

/** Every row has a chosen column. */
export function isCover(problem: CoverProblem, columns: readonly number[]): boolean {
  const chosen = new Set(columns);
  return problem.rows.every((cols) => cols.some((c) => chosen.has(c)));
}

/**
 * A best cover. Essential columns and row and column dominance first; the reduced matrix
 * falls into independent blocks, each solved in two searches by branch and bound: the fewest
 * columns (all costs 1), then the lowest cost with at most that many columns. `start` is a
 * known cover (the first upper bound). When `deadline` passes, the searches stop and the best
 * cover found so far is returned with the bounds proven at the roots of the searches.
 */
export function exactCover(problem: CoverProblem, deadline: Deadline, start: readonly number[]): CoverResult {
  const colRows: number[][] = problem.costs.map(() => []);
  problem.rows.forEach((cols, r) => cols.forEach((c) => colRows[c]!.push(r)));
  const unit = problem.costs.map(() => 1);
  const search = (costs: readonly number[], cap: number): Search => new Search(problem.rows, colRows, costs, deadline, cap);
  const top = search(problem.costs, Infinity);
  const rowOn = new Uint8Array(problem.rows.length).fill(1);
  const colOn = new Uint8Array(problem.costs.length).fill(1);
  const chosen: number[] = [];
  // Cut short, the reductions leave a smaller problem whose best covers, with the columns
  // taken, are still best covers of the whole: the blocks below then give root bounds only.
  if (!top.reduce(rowOn, colOn, chosen)) throw new Error('bug: a row no column covers');
  let finished = !top.aborted;
  let boundColumns = chosen.length;
  let boundCost = coverCost(problem, chosen);
  for (const block of blocks(problem.rows, colRows, rowOn, colOn)) {
    const known = coverWithin(problem.rows, block, start);
    const fewest = search(unit, Infinity).run(block, known);
    let best = compareCovers(problem, known, fewest.columns) <= 0 ? known : fewest.columns;
    boundColumns += fewest.bound;
    finished &&= fewest.finished;
    if (fewest.bound === best.length) {
      const cheapest = search(problem.costs, best.length).run(block, best);
      best = cheapest.columns;
      boundCost += cheapest.bound;
      finished &&= cheapest.finished;
    } else boundCost += search(problem.costs, Infinity).rootBound(block, best);
    appendAll(chosen, best);
  }
  // Each block's cover is irredundant within it; once more over every row, to be sure.
  let columns = irredundant(colRows, problem.costs, [...new Set(chosen)], new Uint8Array(problem.rows.length).fill(1)).sort((a, b) => a - b);
  if (compareCovers(problem, start, columns) < 0) columns = [...start].sort((a, b) => a - b);
  const lowerBound = { columns: boundColumns, cost: boundCost };
  const proven = finished && boundColumns === columns.length && boundCost === coverCost(problem, columns);
  return { columns, lowerBound, proven };
}

/** Subgradient steps at the root of a search (40 per node below it, warm-started). */
const ROOT_STEPS = 600;

/** Subgradient steps the root of a search still takes past the deadline (a bounded overrun). */
const LATE_STEPS = 100;

/** A bound that costs are integers lets round up (less a margin for rounding errors). */
function integerBound(value: number): number {
  return Math.ceil(value - 1e-6);
}

interface BlockResult {
  readonly columns: number[];
  readonly finished: boolean;
  readonly bound: number;
}

interface Block {
  readonly rowOn: Uint8Array;
  readonly colOn: Uint8Array;
}

/** Connected parts of the active matrix (rows linked through shared columns). */
function blocks(rows: CoverProblem['rows'], colRows: number[][], rowOn: Uint8Array, colOn: Uint8Array): Block[] {
  const out: Block[] = [];
  const seenRow = new Uint8Array(rowOn.length);
  for (let r0 = 0; r0 < rowOn.length; r0++) {
    if (!rowOn[r0] || seenRow[r0]) continue;
    const bRows = new Uint8Array(rowOn.length);
    const bCols = new Uint8Array(colOn.length);
    const stack = [r0];
    seenRow[r0] = 1;
    while (stack.length > 0) {
      const r = stack.pop()!;
      bRows[r] = 1;
      for (const c of rows[r]!) {
        if (!colOn[c] || bCols[c]) continue;
        bCols[c] = 1;
        for (const r2 of colRows[c]!)
          if (rowOn[r2] && !seenRow[r2]) {
            seenRow[r2] = 1;
            stack.push(r2);
          }
      }
    }
    out.push({ rowOn: bRows, colOn: bCols });
  }
  return out;
}

/** A cover of the block's rows by its columns: those of a known cover, completed if need be. */
function coverWithin(rows: CoverProblem['rows'], block: Block, start: readonly number[]): number[] {
  const chosen = new Set(start.filter((c) => block.colOn[c]));
  for (let r = 0; r < rows.length; r++)
    if (block.rowOn[r] && !rows[r]!.some((c) => chosen.has(c))) chosen.add(rows[r]!.find((c) => block.colOn[c])!);
  return [...chosen];
}

/** `columns` less those whose rows (of the rows on) the others cover too, dearest first. */
function irredundant(colRows: number[][], costs: readonly number[], columns: readonly number[], rowOn: Uint8Array): number[] {
  const times = new Int32Array(rowOn.length);
  for (const c of columns) for (const r of colRows[c]!) times[r]!++;
  const kept: number[] = [];
  for (const c of [...columns].sort((a, b) => costs[b]! - costs[a]! || b - a)) {
    if (colRows[c]!.every((r) => !rowOn[r] || times[r]! >= 2)) for (const r of colRows[c]!) times[r]!--;
    else kept.push(c);
  }
  return kept;
}

/** Prices of the Lagrangian bound, one per row. */
interface Prices {
  readonly u: Float64Array;
}

class Search {
  /** The clock passed the deadline: the search (or the reductions) stopped early. */
  aborted = false;
  private best: number[] = [];
  private bestCost = Infinity;
  /** During `run`: the rows of the block. */
  private blockRows: Uint8Array = new Uint8Array(0);
  private readonly stamp: Int32Array;
  private stampValue = 0;
  /** During `run`: the bound proven at the root so far. */
  private rootLow = 0;

  /** `cap`: most columns a cover may have (Infinity: no limit). */
  constructor(
    private readonly rows: CoverProblem['rows'],
    private readonly colRows: number[][],
    private readonly costs: readonly number[],
    private readonly deadline: Deadline,
    private readonly cap: number,
  ) {
    this.stamp = new Int32Array(Math.max(rows.length, costs.length));
  }

  /**
   * Least-cost cover of the block within the cap, starting from a known one. `bound`: no
   * cover of the block within the cap costs less (the cover's cost when the search finished,
   * else the bound proven at the root).
   */
  run(block: Block, start: number[]): BlockResult {
    this.blockRows = block.rowOn;
    this.best = start;
    this.bestCost = start.reduce((k, c) => k + this.costs[c]!, 0);
    this.rootLow = 0;
    this.branch(block.rowOn.slice(), block.colOn.slice(), [], 0, undefined);
    const finished = !this.aborted;
    return { columns: this.best, finished, bound: finished ? this.bestCost : Math.min(this.bestCost, this.rootLow) };
  }

  /**
   * The root's bound alone (no branching): no cover costs less. The known cover's cost is the
   * goal of the subgradient steps. Past the deadline (the search before it used the time up)
   * still LATE_STEPS steps: from the starting prices alone the bound is far weaker.
   */
  rootBound(block: Block, known: number[]): number {
    const rowOn = block.rowOn.slice();
    const colOn = block.colOn.slice();
    const picked: number[] = [];
    if (!this.reduce(rowOn, colOn, picked)) throw new Error('bug: a block row no column covers');
    const cost = picked.reduce((k, c) => k + this.costs[c]!, 0);
    if (!rowOn.includes(1)) return cost;
    this.bestCost = known.reduce((k, c) => k + this.costs[c]!, 0);
    const steps = this.aborted ? LATE_STEPS : ROOT_STEPS;
    return integerBound(cost + this.lagrange(rowOn, colOn, cost, undefined, steps, Infinity, LATE_STEPS).rounded);
  }

  private branch(rowOn: Uint8Array, colOn: Uint8Array, chosen: number[], cost: number, start: Prices | undefined): void {
    const root = start === undefined;
    if (!root && this.outOfTime()) return;
    const costs = this.costs;
    const all = chosen.slice();
    let prices = start;
    let lead: Bound;
    // Nothing better than the best cover is left in this subtree.
    const settled = (): void => {
      if (root) this.rootLow = this.bestCost;
    };
    for (;;) {
      const picked: number[] = [];
      // At the root the reductions and bounds run even past the deadline (they stop early,
      // leaving a consistent smaller problem; the bound after LATE_STEPS), so that a bound is
      // always known.
      if (!this.reduce(rowOn, colOn, picked)) return settled();
      for (const c of picked) cost += costs[c]!;
      appendAll(all, picked);
      if (all.length > this.cap || cost > this.limit()) return settled();
      if (!rowOn.includes(1)) {
        this.offer(all);
        return settled();
      }
      if (!root && this.aborted) return;
      const steps = root ? (this.aborted ? LATE_STEPS : ROOT_STEPS) : 40;
      lead = this.lagrange(rowOn, colOn, cost, prices, steps, this.cap - all.length, root ? LATE_STEPS : 0);
      prices = lead.prices;
      if (lead.cover) this.offer(all.concat(lead.cover));
      // Fixing below only removes columns of no cover better than the best: bounds found
      // later hold for those covers, hence min(best, bound).
      if (root) this.rootLow = Math.max(this.rootLow, Math.min(this.bestCost, integerBound(cost + lead.rounded)));
      if (cost + lead.rounded > this.limit()) return settled();
      if (this.aborted) return;
      // Reduced-cost fixing: a column whose taking (or leaving) alone lifts the bound past the
      // best cover is left out (or taken).
      let fixed = false;
      const base = cost + lead.value;
      for (let c = 0; c < colOn.length; c++) {
        if (!colOn[c]) continue;
        const rc = lead.reduced[c]!;
        if (!lead.inRelaxed[c] && base + rc - lead.dearestIn > this.limit()) {
          colOn[c] = 0;
          fixed = true;
        } else if (lead.inRelaxed[c] && base - rc + lead.nextOut > this.limit()) {
          colOn[c] = 0;
          all.push(c);
          cost += costs[c]!;
          for (const r of this.colRows[c]!) rowOn[r] = 0;
          fixed = true;
        }
      }
      if (!fixed) break;
    }
    // Some column of the hardest row is in every cover; trying them in turn, those already
    // tried can be left out of the later branches. Lowest reduced cost first.
    const row = this.hardestRow(rowOn, colOn);
    const options = this.rows[row]!.filter((c) => colOn[c]).sort((a, b) => lead.reduced[a]! - lead.reduced[b]!);
    const cols = colOn.slice();
    for (const c of options) {
      const rowsLeft = rowOn.slice();
      for (const r of this.colRows[c]!) rowsLeft[r] = 0;
      cols[c] = 0;
      this.branch(rowsLeft, cols.slice(), all.concat(c), cost + costs[c]!, prices);
      if (this.aborted || cost + lead.rounded > this.limit()) return;
    }
  }

  /**
   * A cover of the block becomes the best when, its redundant columns dropped, it is better
   * (taking columns at branches and from the prices' cover, a column can end up redundant).
   */
  private offer(cols: number[]): void {
    const kept = irredundant(this.colRows, this.costs, cols, this.blockRows);
    const cost = kept.reduce((k, c) => k + this.costs[c]!, 0);
    if (kept.length <= this.cap && cost < this.bestCost) [this.best, this.bestCost] = [kept, cost];
  }

  private outOfTime(): boolean {
    if (!this.aborted && this.deadline.passed()) this.aborted = true;
    return this.aborted;
  }

  /** Costs are integers: only a cover costing at most this much is an improvement. */
  private limit(): number {
    return this.bestCost - 1 + 1e-3;
  }

  /** Active row with fewest active columns. */
  private hardestRow(rowOn: Uint8Array, colOn: Uint8Array): number {
    let best = -1;
    let fewest = Infinity;
    for (let r = 0; r < rowOn.length; r++) {
      if (!rowOn[r]) continue;
      let k = 0;
      for (const c of this.rows[r]!) k += colOn[c]!;
      if (k < fewest) [best, fewest] = [r, k];
    }
    return best;
  }

  /**
   * Lower bound on the cost of covering the active rows with at most `capLeft` active columns,
   * by Lagrangian relaxation: with a price u_r >= 0 on each row, sum(u) plus the sum of the at
   * most `capLeft` most negative reduced costs (cost - price of the column's rows) bounds every
   * such cover (the count stays a constraint of the relaxed problem rather than getting a
   * price of its own, which the subgradient steps found hard to tune). Prices are improved by subgradient steps (Held and Karp's rule) from
   * `start`, or from rows sharing no column each priced at their cheapest column (a maximal
   * independent set of rows). Every set of prices also suggests a cover: the columns they make
   * profitable, each open row's lowest-reduced-cost column, less columns made redundant.
   * `rounded` adds that, costs being integers, at least ceil(bound / dearest cost) columns are
   * needed, each at least the cheapest cost. Once the deadline passes, the steps stop (at the
   * latest after `late` of them).
   */
  private lagrange(rowOn: Uint8Array, colOn: Uint8Array, cost: number, start: Prices | undefined, steps: number, capLeft: number, late = 0): Bound {
    const costs = this.costs;
    const capped = Number.isFinite(capLeft);
    const activeRows: number[] = [];
    for (let r = 0; r < rowOn.length; r++) if (rowOn[r]) activeRows.push(r);
    const activeCols: number[] = [];
    const colActiveRows: number[][] = [];
    let cheapest = Infinity;
    let dearest = 0;
    for (let c = 0; c < colOn.length; c++) {
      if (!colOn[c]) continue;
      activeCols.push(c);
      colActiveRows.push(this.colRows[c]!.filter((r) => rowOn[r]));
      cheapest = Math.min(cheapest, costs[c]!);
      dearest = Math.max(dearest, costs[c]!);
    }
    const u = start ? start.u.slice() : this.independentRowPrices(activeRows, colOn);
    const reduced = new Float64Array(colOn.length);
    const g = new Float64Array(rowOn.length);
    // The relaxed problem's columns (indices into activeCols), those left out, by reduced cost.
    const negative: number[] = [];
    let taken = 0;
    let full = false;
    const evaluate = (): number => {
      let value = 0;
      for (const r of activeRows) {
        value += u[r]!;
        g[r] = 1;
      }
      negative.length = 0;
      for (let i = 0; i < activeCols.length; i++) {
        let rc = costs[activeCols[i]!]!;
        for (const r of colActiveRows[i]!) rc -= u[r]!;
        reduced[activeCols[i]!] = rc;
        if (rc < 0) negative.push(i);
      }
      full = negative.length >= capLeft;
      if (negative.length > capLeft) negative.sort((a, b) => reduced[activeCols[a]!]! - reduced[activeCols[b]!]!);
      taken = Math.min(negative.length, capLeft);
      for (let k = 0; k < taken; k++) {
        const i = negative[k]!;
        value += reduced[activeCols[i]!]!;
        for (const r of colActiveRows[i]!) g[r]!--;
      }
      return value;
    };
    let cover: number[] | undefined;
    let coverCost = Infinity;
    const primal = (): void => {
      const times = new Int32Array(rowOn.length);
      const picked: number[] = [];
      const take = (c: number): void => {
        picked.push(c);
        for (const r of this.colRows[c]!) times[r]!++;
      };
      for (let k = 0; k < taken; k++) take(activeCols[negative[k]!]!);
      for (const r of activeRows) {
        if (times[r]) continue;
        let pick = -1;
        for (const c of this.rows[r]!) if (colOn[c] && (pick < 0 || reduced[c]! < reduced[pick]!)) pick = c;
        take(pick);
      }
      picked.sort((a, b) => costs[b]! - costs[a]! || reduced[b]! - reduced[a]!);
      let total = 0;
      const kept: number[] = [];
      for (const c of picked) {
        if (this.colRows[c]!.every((r) => !rowOn[r] || times[r]! >= 2)) for (const r of this.colRows[c]!) times[r]!--;
        else {
          kept.push(c);
          total += costs[c]!;
        }
      }
      if (kept.length <= capLeft && total < coverCost) [cover, coverCost] = [kept, total];
    };
    let best = evaluate();
    let bestPrices: Prices = { u: u.slice() };
    if (steps > 0) primal();
    const target = this.limit() - cost;
    let lambda = 2;
    let stall = 0;
    for (let step = 0; step < steps && best <= target && lambda > 0.01; step++) {
      let norm = 0;
      for (const r of activeRows) if (g[r]! > 0 || u[r]! > 0) norm += g[r]! * g[r]!;
      if (norm === 0) break;
      const goal = Number.isFinite(target) ? target + 1 : best * 1.05 + 1;
      const t = (lambda * (goal - best)) / norm;
      for (const r of activeRows) u[r] = Math.max(0, u[r]! + t * g[r]!);
      const value = evaluate();
      if (step % 8 === 7) {
        primal();
        // Past the deadline the prices so far still give a valid bound.
        if (this.outOfTime()) steps = Math.min(steps, late);
      }
      if (value > best + 1e-9) {
        best = value;
        bestPrices = { u: u.slice() };
        stall = 0;
      } else if (++stall >= 10) {
        lambda /= 2;
        stall = 0;
      }
    }
    u.set(bestPrices.u);
    const value = evaluate();
    if (steps > 0) primal();
    const rounded = capped ? value : Math.max(value, Math.ceil(value / dearest - 1e-9) * cheapest);
    // What leaving a relaxed column out, or putting another in, costs the bound at least.
    const inRelaxed = new Uint8Array(colOn.length);
    for (let k = 0; k < taken; k++) inRelaxed[activeCols[negative[k]!]!] = 1;
    let nextOut = 0;
    for (const c of activeCols) if (!inRelaxed[c]) nextOut = Math.min(nextOut, reduced[c]!);
    // Full, putting another column in pushes the highest reduced cost in the answer out.
    let dearestIn = -Infinity;
    for (let k = 0; k < taken; k++) dearestIn = Math.max(dearestIn, reduced[activeCols[negative[k]!]!]!);
    if (!full || taken === 0) dearestIn = 0;
    return { value, rounded, prices: bestPrices, reduced, inRelaxed, nextOut, dearestIn, cover, coverCost };
  }

  /** Prices: rows sharing no column (fewest columns first) each at its cheapest column. */
  private independentRowPrices(activeRows: number[], colOn: Uint8Array): Float64Array {
    const u = new Float64Array(this.rows.length);
    const width = (r: number): number => this.rows[r]!.reduce((k, c) => k + colOn[c]!, 0);
    const used = new Uint8Array(colOn.length);
    for (const r of [...activeRows].sort((a, b) => width(a) - width(b))) {
      const cols = this.rows[r]!.filter((c) => colOn[c]);
      if (cols.some((c) => used[c])) continue;
      for (const c of cols) used[c] = 1;
      u[r] = minOf(cols.map((c) => this.costs[c]!));
    }
    return u;
  }

  /**
   * Take essential columns (into `picked`), drop dominated rows and columns, until nothing
   * changes. False when some active row has no active column left.
   */
  reduce(rowOn: Uint8Array, colOn: Uint8Array, picked: number[]): boolean {
    const { rows, costs } = this;
    for (let changed = true; changed; ) {
      if (this.outOfTime()) return true;
      changed = false;
      for (let r = 0; r < rows.length; r++) {
        if (!rowOn[r]) continue;
        let only = -1;
        let k = 0;
        for (const c of rows[r]!) if (colOn[c]) [only, k] = [c, k + 1];
        if (k === 0) return false;
        if (k === 1) {
          picked.push(only);
          colOn[only] = 0;
          for (const r2 of this.colRows[only]!) rowOn[r2] = 0;
          changed = true;
        }
      }
      changed = this.dropDominatedRows(rowOn, colOn) || changed;
      changed = this.dropDominatedColumns(rowOn, colOn, costs) || changed;
    }
    return true;
  }

  /** A row whose columns include all of another row's is covered whenever that one is. */
  private dropDominatedRows(rowOn: Uint8Array, colOn: Uint8Array): boolean {
    const rows = this.rows;
    let changed = false;
    for (let r = 0; r < rows.length; r++) {
      if (!rowOn[r]) continue;
      if ((r & 255) === 255 && this.outOfTime()) return false;
      const mark = ++this.stampValue;
      let size = 0;
      let rarest = -1;
      let rarestCount = Infinity;
      for (const c of rows[r]!) {
        if (!colOn[c]) continue;
        this.stamp[c] = mark;
        size++;
        const k = this.colRows[c]!.length;
        if (k < rarestCount) [rarest, rarestCount] = [c, k];
      }
      for (const r2 of this.colRows[rarest]!) {
        if (r2 === r || !rowOn[r2]) continue;
        let shared = 0;
        for (const c of rows[r2]!) if (colOn[c] && this.stamp[c] === mark) shared++;
        if (shared === size) {
          rowOn[r2] = 0;
          changed = true;
        }
      }
    }
    return changed;
  }

  /** A column whose rows are among a no-dearer column's rows is never needed. */
  private dropDominatedColumns(rowOn: Uint8Array, colOn: Uint8Array, costs: readonly number[]): boolean {
    const rows = this.rows;
    let changed = false;
    for (let c = 0; c < colOn.length; c++) {
      if (!colOn[c]) continue;
      if ((c & 255) === 255 && this.outOfTime()) return false;
      const mark = ++this.stampValue;
      let size = 0;
      let rarest = -1;
      let rarestCount = Infinity;
      for (const r of this.colRows[c]!) {
        if (!rowOn[r]) continue;
        this.stamp[r] = mark;
        size++;
        const k = rows[r]!.length;
        if (k < rarestCount) [rarest, rarestCount] = [r, k];
      }
      if (size === 0) {
        colOn[c] = 0;
        changed = true;
        continue;
      }
      for (const c2 of rows[rarest]!) {
        if (c2 === c || !colOn[c2] || costs[c2]! > costs[c]!) continue;
        let shared = 0;
        for (const r of this.colRows[c2]!) if (rowOn[r] && this.stamp[r] === mark) shared++;
        if (shared === size) {
          colOn[c] = 0;
          changed = true;
          break;
        }
      }
    }
    return changed;
  }
}

interface Bound {
  readonly value: number;
  readonly rounded: number;
  readonly prices: Prices;
  /** Per column: cost - price of its active rows. */
  readonly reduced: Float64Array;
  /** Columns of the relaxed problem's answer (1), the others (0). */
  readonly inRelaxed: Uint8Array;
  /** The lowest reduced cost left out of it, or 0 if none is negative. */
  readonly nextOut: number;
  /** When the answer has as many columns as allowed, the highest reduced cost in it; else 0. */
  readonly dearestIn: number;
  /** A cover of the active rows within the cap that the prices suggested, and its cost. */
  readonly cover: number[] | undefined;
  readonly coverCost: number;
}
