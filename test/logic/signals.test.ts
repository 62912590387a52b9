import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { signalFinder, signalIndex } from '../../src/logic/signals.js';

const signals = [
  { header: 'Guard A closed', identifier: 'Guard_A_closed' },
  { header: 'E-stop healthy', identifier: 'E_stop_healthy' },
];

describe('resolving a signal name', () => {
  it('matches the identifier case-insensitively', () => {
    expect(signalIndex(signals, 'guard_a_CLOSED')).toBe(0);
  });

  it('matches the header text case-insensitively', () => {
    expect(signalIndex(signals, ' e-stop HEALTHY ')).toBe(1);
  });

  it('says -1 for an unknown name rather than guessing', () => {
    expect(signalIndex(signals, 'Guard_A')).toBe(-1);
  });
});

describe('resolving many names against the same signals', () => {
  it('gives the same answer as signalIndex for every name', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ header: fc.constantFrom('A', ' a ', 'B b', 'x', 'X'), identifier: fc.constantFrom('a', 'A', 'b', 'x_1') }), { maxLength: 6 }),
        fc.constantFrom('a', 'A', ' b b', 'B B', 'x', 'X_1', 'none', ''),
        (list, name) => {
          expect(signalFinder(list)(name)).toBe(signalIndex(list, name));
        },
      ),
    );
  });
});
