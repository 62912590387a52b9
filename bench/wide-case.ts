// One case of the wide bench (bench/wide.bench.ts starts it), alone in a fresh process so its
// peak memory is its own: node --expose-gc --import tsx bench/wide-case.ts '<CaseRequest as JSON>'.
// Loads the engine from a source tree (ours or the baseline commit's), analyses the warm-up table
// untimed (compiles the code), collects garbage, resets the process's high-water mark of resident
// memory (Linux /proc/self/clear_refs), then times the whole analysis of the table (read, forms,
// proofs, JSON) and prints one JSON line: a `CaseFigure`.
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import type { analyseTable } from '../src/analysis/analyse.js';
import type { TableAnalysis } from '../src/analysis/analysis-types.js';
import type { analysisJson } from '../src/report/analysis-json.js';
import type { readSpecTables } from '../src/table/read-tables.js';
import type { CellValue } from '../src/table/types.js';

/** Where a source tree keeps the three modules the bench calls, relative to its root. */
export interface Modules {
  readonly readSpecTables: string;
  readonly analyseTable: string;
  readonly analysisJson: string;
}

export interface CaseRequest {
  readonly root: string;
  readonly modules: Modules;
  readonly engine: 'bit-set' | 'symbolic';
  /** JSON files of the table's cells and of the warm-up table's. */
  readonly cells: string;
  readonly warm: string;
}

/** What one case printed: whole-analysis time, peak and starting resident memory, the result in words. */
export interface CaseFigure {
  readonly ms: number;
  /** Largest resident set of the process during the case (warm-up excluded when `ownPeak`). */
  readonly peakMb: number;
  /** Resident set just before the case: node, tsx, the engine's modules, the table. */
  readonly floorMb: number;
  /** False where the high-water mark could not be reset: the peak then includes the warm-up. */
  readonly ownPeak: boolean;
  readonly summary: string;
}

interface Engine {
  readonly readSpecTables: typeof readSpecTables;
  readonly analyseTable: typeof analyseTable;
  readonly analysisJson: typeof analysisJson;
}

async function load(root: string, modules: Modules): Promise<Engine> {
  const from = async (path: string): Promise<Engine> => (await import(pathToFileURL(join(root, path)).href)) as Engine;
  return {
    readSpecTables: (await from(modules.readSpecTables)).readSpecTables,
    analyseTable: (await from(modules.analyseTable)).analyseTable,
    analysisJson: (await from(modules.analysisJson)).analysisJson,
  };
}

function analyse(code: Engine, cells: CellValue[][], engine: CaseRequest['engine']): TableAnalysis {
  const table = code.readSpecTables({ sheet: 'Bench', origin: 'A1', cells }).tables[0]!;
  const a = code.analyseTable(table, { engine });
  JSON.stringify(code.analysisJson(a));
  return a;
}

function summary(a: TableAnalysis): string {
  const o = a.outputs[0];
  const w = a.wide?.outputs[0];
  if (o) return `${o.andOr.terms} terms${o.andOr.proven ? ' proven' : ''}, XOR ${o.xor.terms} terms, gaps ${o.gapCount}`;
  if (w) {
    const { engine } = a.wide!;
    // The baseline's engine counted gaps as one BigInt, before counts could be bounds.
    const gapCount: unknown = a.wide!.gapCount;
    const { atLeast, atMost } = typeof gapCount === 'bigint' ? { atLeast: gapCount, atMost: gapCount } : a.wide!.gapCount;
    const gaps = atLeast === atMost ? `${atLeast}` : `${atLeast}..${atMost}`;
    const form = `${w.andOr.terms} terms${w.andOr.proven ? ' proven' : ` heuristic, at least ${w.andOr.lowerBound.terms}`}`;
    const xor = w.xor && w.bestXor ? `XOR ${w.xor.terms} terms, best ${w.bestXor.terms}` : 'no XOR form';
    return `${form}, ${xor}, gaps ${gaps}${engine === 'rows' ? ', on the rows\' cubes' : ''}`;
  }
  const error = a.problems.find((p) => p.severity === 'error');
  return error ? `${error.code}: ${error.message.split(', so ')[0]}` : 'no output';
}

const status = (field: 'VmRSS' | 'VmHWM'): number =>
  Number(new RegExp(`${field}:\\s*(\\d+) kB`).exec(readFileSync('/proc/self/status', 'utf8'))![1]) / 1024;

function resetPeak(): boolean {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
    return true;
  } catch {
    return false;
  }
}

const request = JSON.parse(process.argv[2]!) as CaseRequest;
const cellsOf = (file: string): CellValue[][] => JSON.parse(readFileSync(file, 'utf8')) as CellValue[][];
const code = await load(request.root, request.modules);
const cells = cellsOf(request.cells);
analyse(code, cellsOf(request.warm), request.engine);
(globalThis as { gc?: () => void }).gc?.();
const ownPeak = resetPeak();
const floorMb = status('VmRSS');
const t0 = performance.now();
const a = analyse(code, cells, request.engine);
const ms = performance.now() - t0;
const figure: CaseFigure = { ms, peakMb: status('VmHWM'), floorMb, ownPeak, summary: summary(a) };
console.log(JSON.stringify(figure));
