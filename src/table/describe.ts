// A cube or a combination in words for a problem or a card: "GuardA=1, GuardB=0".
import { cubeToPattern, widePattern, type Cube, type Signal, type WideCube } from '../logic/index.js';

/** A pattern over the inputs, leftmost first ('-' = any), in words; "every combination" for all '-'. */
export function describePattern(pattern: string, inputs: readonly Pick<Signal, 'header'>[]): string {
  const parts = inputs.flatMap((s, i) => (pattern[i] === '0' || pattern[i] === '1' ? [`${s.header}=${pattern[i]}`] : []));
  return parts.length === 0 ? 'every combination' : parts.join(', ');
}

/** A cube of either engine in words, as `describePattern`. */
export function describeCube(c: Cube | WideCube, inputs: readonly Pick<Signal, 'header'>[]): string {
  const n = inputs.length;
  return describePattern(typeof c.mask === 'bigint' ? widePattern(n, c as WideCube) : cubeToPattern(n, c as Cube), inputs);
}
