import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { sha256Hex } from '../../src/report/sha256.js';

// Revision stamps hash with our own SHA-256; checked against the published examples of
// FIPS 180-2 (Appendix B, "abc" and the 448-bit message; values from memory) and against
// Node's OpenSSL-backed node:crypto as a reference library.
describe('SHA-256 against published vectors and node:crypto', () => {
  it('hashes "abc" as in FIPS 180-2 appendix B.1', () => {
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('hashes the two-block message of FIPS 180-2 appendix B.2', () => {
    expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
  });

  it('hashes the empty message as node:crypto does', () => {
    expect(sha256Hex('')).toBe(createHash('sha256').update('').digest('hex'));
  });

  it('agrees with node:crypto on any text, including lengths around the 64-byte block edge', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'grapheme', maxLength: 200 }), (s) => {
        expect(sha256Hex(s)).toBe(createHash('sha256').update(s, 'utf8').digest('hex'));
      }),
      { numRuns: 300 },
    );
    for (let n = 50; n < 140; n++) expect(sha256Hex('x'.repeat(n))).toBe(createHash('sha256').update('x'.repeat(n)).digest('hex'));
  });
});
