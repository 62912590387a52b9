import { describe, expect, it } from 'vitest';
import { signalIndex } from '../../src/logic/signals.js';

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
