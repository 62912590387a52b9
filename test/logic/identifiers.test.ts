import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { MAX_IDENTIFIER_LENGTH, fullIdentifier, isReserved, isValidIdentifier, toIdentifiers } from '../../src/logic/identifiers.js';

describe('identifiers from headers', () => {
  it('turns spaces and symbols into single underscores', () => {
    expect(toIdentifiers(['Guard A closed', 'E-stop  healthy', ' Air pressure (bar) OK '])).toEqual([
      'Guard_A_closed',
      'E_stop_healthy',
      'Air_pressure_bar_OK',
    ]);
  });

  it('transliterates common accents: ä -> ae, é -> e, ß -> ss', () => {
    expect(toIdentifiers(['Tür geschlossen', 'Sécurité', 'Fuß'])).toEqual(['Tuer_geschlossen', 'Securite', 'Fuss']);
  });

  it('gives a name that would start with a digit the prefix S_', () => {
    expect(toIdentifiers(['1S1 guard'])).toEqual(['S_1S1_guard']);
  });

  it('never returns a keyword or standard name of IEC 61131-3, in any case', () => {
    expect(toIdentifiers(['Step', 'ton', 'Time', 'and', 'BOOL_TO_INT', 'ctu_dint'])).toEqual([
      'Step_Sig',
      'ton_Sig',
      'Time_Sig',
      'and_Sig',
      'BOOL_TO_INT_Sig',
      'ctu_dint_Sig',
    ]);
  });

  it('keeps names that only look like a conversion function', () => {
    expect(isReserved('Auto_to_Manual')).toBe(false);
    expect(isReserved('int_to_real')).toBe(true);
  });

  it('makes repeats unique case-insensitively with _2, _3, and keeps names unique as derived', () => {
    expect(toIdentifiers(['Guard', 'guard', 'GUARD', 'Guard 2'])).toEqual(['Guard', 'guard_3', 'GUARD_4', 'Guard_2']);
  });

  it('cuts names at 24 characters on a word break, without a trailing underscore', () => {
    expect(toIdentifiers(['Light curtain muting lamp_ok healthy'])).toEqual(['Light_curtain_muting']);
    expect(toIdentifiers(['Light curtain muting la ok'])).toEqual(['Light_curtain_muting_la']);
    expect(toIdentifiers(['Channel discrepancy alarm'])).toEqual(['Channel_discrepancy']);
  });

  it('leaves a word out rather than number a cut name that another header already has', () => {
    expect(toIdentifiers(['Light curtain muting', 'Light curtain muting active', 'Light curtain muting lamp', 'Light curtain muting sensor 2'])).toEqual([
      'Light_curtain_muting',
      'Light_curtain_active',
      'Light_curtain_lamp',
      'Light_curtain_sensor_2',
    ]);
  });

  it('numbers cut names only when no choice of whole words tells them apart', () => {
    expect(toIdentifiers(['Supercalifragilistic expialidocious A', 'Supercalifragilistic expialidocious B'])).toEqual([
      'Supercalifragilistic_A',
      'Supercalifragilistic_B',
    ]);
    expect(toIdentifiers(['Discrepancy alarm channel pair', 'Discrepancy alarm channel pair!'])).toEqual([
      'Discrepancy_alarm',
      'Discrepancy_alarm_2',
    ]);
  });

  it('cuts inside a word only when the last word break would waste more than half the room', () => {
    expect(toIdentifiers(['Ab Supercalifragilisticexpialidocious'])).toEqual(['Ab_Supercalifragilistice']);
  });

  it('gives the identifier a header would have before any cut, to tell which were cut', () => {
    expect(fullIdentifier('Light curtain muting active')).toBe('Light_curtain_muting_active');
    expect(fullIdentifier('→')).toBe('');
  });

  it('names a header with nothing usable Signal_<position>', () => {
    expect(toIdentifiers(['Start', '', '→→', '日本'])).toEqual(['Start', 'Signal_2', 'Signal_3', 'Signal_4']);
  });

  it('are always valid and unique, whatever the headers (fast-check)', () => {
    const header = fc.oneof(
      fc.string({ unit: 'grapheme', maxLength: 40 }),
      fc.constantFrom('Step', 'and', 'a', 'A', 'a_2', 'Signal_1', '1', 'int_to_real', 'x__y_', 'ÄÖÜß'),
    );
    fc.assert(
      fc.property(fc.array(header, { maxLength: 12 }), (headers) => {
        const ids = toIdentifiers(headers);
        expect(ids).toHaveLength(headers.length);
        const bad = ids.filter(
          (id) => !isValidIdentifier(id) || id.length > MAX_IDENTIFIER_LENGTH || /__|_$|^[0-9_]|[^A-Za-z0-9_]/.test(id),
        );
        expect(bad).toEqual([]);
        expect(new Set(ids.map((s) => s.toLowerCase())).size).toBe(ids.length);
      }),
      { numRuns: 500 },
    );
  });
});
