// What kind of construct an instance or block type is, for the cannot-judge report.
import type { CannotJudgeKind } from './types.js';

// IEC 61131-3 standard function blocks (timers, counters, edge detection, bistables), from
// memory of the standard's list; the L-prefixed timers are its LTIME variants.
const STANDARD_BLOCKS: Readonly<Record<string, CannotJudgeKind>> = {
  TON: 'timer', TOF: 'timer', TP: 'timer', TONR: 'timer', LTON: 'timer', LTOF: 'timer', LTP: 'timer',
  CTU: 'counter', CTD: 'counter', CTUD: 'counter',
  CTU_INT: 'counter', CTD_INT: 'counter', CTUD_INT: 'counter',
  CTU_DINT: 'counter', CTD_DINT: 'counter', CTUD_DINT: 'counter',
  CTU_LINT: 'counter', CTD_LINT: 'counter', CTUD_LINT: 'counter',
  CTU_UDINT: 'counter', CTD_UDINT: 'counter', CTUD_UDINT: 'counter',
  CTU_ULINT: 'counter', CTD_ULINT: 'counter', CTUD_ULINT: 'counter',
  R_TRIG: 'edge', F_TRIG: 'edge',
  SR: 'set-reset', RS: 'set-reset',
};

/**
 * The kind of an instance of `type`: a standard block's own kind, 'function-block' for a
 * block type the project defines, otherwise 'function-call' (not known to be a block).
 */
export function blockKind(type: string, userBlocks: ReadonlySet<string>): CannotJudgeKind {
  const upper = type.trim().toUpperCase();
  return STANDARD_BLOCKS[upper] ?? (userBlocks.has(upper) ? 'function-block' : 'function-call');
}

const WORDS: Readonly<Record<CannotJudgeKind, string>> = {
  'seal-in': 'seal-in',
  'previous-scan': 'previous-scan value',
  timer: 'timer',
  counter: 'counter',
  edge: 'edge detection',
  'set-reset': 'set/reset',
  'function-call': 'function call',
  'function-block': 'function block',
  'non-bool': 'non-BOOL value',
  'control-flow': 'control flow',
  unsupported: 'unsupported construct',
  undriven: 'not an input',
};

/** The kind in words, as reports print it. */
export function kindWord(kind: CannotJudgeKind): string {
  return WORDS[kind];
}
