// The caution that travels with every piece of logic handed to a person (DESIGN.md section 7).

export const CAUTION_LINES: readonly string[] = [
  'CAUTION: derived logic is a design aid, not a validated safety function.',
  'Safety functions must be designed, validated and verified under the applicable local codes and',
  'standards (for machinery e.g. ISO 13849-1/-2, IEC 62061, IEC 60204-1; NFPA 79 where it applies;',
  'IEC 61511 for process plants) and signed off by a competent, licensed engineer before commissioning.',
  'A truth table captures combinational logic only: timing and sequence (two-hand synchronous',
  'actuation, dual-channel discrepancy times, restart interlocks, stop categories) are outside it.',
];

export const CAUTION = CAUTION_LINES.join(' ');
