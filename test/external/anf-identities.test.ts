// The Möbius transform and ANF against published identities and a classical theorem.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  add,
  complement,
  emptySet,
  fullSet,
  has,
  inputSet,
  intersect,
  symmetricDifference,
  union,
  wordCount,
  type BitSet,
} from '../../src/logic/bits.js';
import { anfOf, type Monomial } from '../../src/logic/anf.js';
import { mobius, mobiusInPlace } from '../../src/logic/mobius.js';

/** Monomials written as letters of the inputs a, b, c, ... of n (a = leftmost); '1' = TRUE. */
function terms(n: number, ...written: string[]): Monomial[] {
  return written.map((t) =>
    t === '1' ? 0 : [...t].reduce((m, letter) => m | (1 << (n - 1 - (letter.charCodeAt(0) - 97))), 0),
  );
}

const [a2, b2] = [inputSet(2, 0), inputSet(2, 1)];
const [a3, b3, c3] = [inputSet(3, 0), inputSet(3, 1), inputSet(3, 2)];
const and = (...sets: BitSet[]): BitSet => sets.reduce((x, y) => intersect(x, y));
const or = (...sets: BitSet[]): BitSet => sets.reduce((x, y) => union(x, y));
const xor = (...sets: BitSet[]): BitSet => sets.reduce((x, y) => symmetricDifference(x, y));

/** The set of n inputs whose combinations satisfy `rule` (a truth table restated row by row). */
function table(n: number, rule: (k: number) => boolean): BitSet {
  const set = emptySet(n);
  for (let k = 0; k < 1 << n; k++) if (rule(k)) add(set, k);
  return set;
}

describe('ANF of basic gates (Wikipedia, "Algebraic normal form", section "Performing operations within algebraic normal form")', () => {
  it('OR is a ⊕ b ⊕ ab', () => {
    expect(anfOf(or(a2, b2), 2)).toEqual(terms(2, 'a', 'b', 'ab'));
  });

  it('AND is ab', () => {
    expect(anfOf(and(a2, b2), 2)).toEqual(terms(2, 'ab'));
  });

  it('XOR is a ⊕ b', () => {
    expect(anfOf(xor(a2, b2), 2)).toEqual(terms(2, 'a', 'b'));
  });

  it('NOT is XOR with 1: NOT a is 1 ⊕ a', () => {
    expect(anfOf(complement(a2, 2), 2)).toEqual(terms(2, '1', 'a'));
  });
});

// Full adder: Wikipedia, "Adder (electronics)", section "Full adder": S = A ⊕ B ⊕ Cin,
// Cout = (A·B) + (Cin·(A ⊕ B)). The majority ANF ab ⊕ ac ⊕ bc: from memory, a standard identity.
describe('ANF of majority and the full adder (Wikipedia, "Adder (electronics)")', () => {
  it('2-out-of-3 majority, (a AND b) OR (a AND c) OR (b AND c), is ab ⊕ ac ⊕ bc', () => {
    const majority = or(and(a3, b3), and(a3, c3), and(b3, c3));
    expect(anfOf(majority, 3)).toEqual(terms(3, 'ab', 'ac', 'bc'));
  });

  it('full-adder sum S = A ⊕ B ⊕ Cin is a ⊕ b ⊕ c', () => {
    expect(anfOf(xor(a3, b3, c3), 3)).toEqual(terms(3, 'a', 'b', 'c'));
  });

  it('full-adder carry Cout = (A AND B) OR (Cin AND (A ⊕ B)) is ab ⊕ ac ⊕ bc', () => {
    const carry = or(and(a3, b3), and(c3, xor(a3, b3)));
    expect(anfOf(carry, 3)).toEqual(terms(3, 'ab', 'ac', 'bc'));
  });
});

// Tony R. Kuphaldt, "Lessons In Electric Circuits", Vol. IV Digital (edition 4, from memory),
// ch. 7 "Boolean Algebra", section "Converting truth tables into Boolean expressions": the
// incinerator flame-sensor example. Its truth tables are restated below; the ANFs are ours.
describe('flame detection with three sensors A, B, C (Kuphaldt, "Lessons In Electric Circuits", Vol. IV, ch. 7)', () => {
  const flames = (k: number): number => (k & 1) + ((k >> 1) & 1) + ((k >> 2) & 1);

  it('the 2-out-of-3 alarm (valve opens when two or more sensors see flame) is AB ⊕ AC ⊕ BC', () => {
    expect(anfOf(table(3, (k) => flames(k) >= 2), 3)).toEqual(terms(3, 'ab', 'ac', 'bc'));
  });

  it('sensor disagreement (not all three agree) is A ⊕ B ⊕ C ⊕ AB ⊕ AC ⊕ BC', () => {
    const disagree = table(3, (k) => flames(k) !== 0 && flames(k) !== 3);
    expect(anfOf(disagree, 3)).toEqual(terms(3, 'a', 'b', 'c', 'ab', 'ac', 'bc'));
  });

  it('all three sensors agreeing on flame is ABC', () => {
    expect(anfOf(table(3, (k) => flames(k) === 3), 3)).toEqual(terms(3, 'abc'));
  });
});

describe('the transform matrix (subset rule; Lucas\' theorem, É. Lucas 1878)', () => {
  /** C(j, i) with BigInt, exactly. */
  function binomial(j: number, i: number): bigint {
    let r = 1n;
    for (let t = 0; t < i; t++) r = (r * BigInt(j - t)) / BigInt(t + 1);
    return r;
  }

  it('has entry (i, j) = 1 exactly when the bits of i are a subset of the bits of j, = C(j, i) mod 2, for n = 1..5', () => {
    for (let n = 1; n <= 5; n++) {
      for (let i = 0; i < 1 << n; i++) {
        // Column of the matrix for input i: the transform of the function that is 1 only at i.
        const unit = emptySet(n);
        add(unit, i);
        const column = mobius(unit, n);
        for (let j = 0; j < 1 << n; j++) {
          const entry = has(column, j) ? 1 : 0;
          expect(entry).toBe((i & j) === i ? 1 : 0);
          expect(BigInt(entry)).toBe(binomial(j, i) % 2n);
        }
      }
    }
  });
});

describe('the transform is its own inverse over GF(2)', () => {
  const twice = (words: BitSet, n: number): BitSet => {
    const copy = words.slice();
    mobiusInPlace(copy, n);
    mobiusInPlace(copy, n);
    return copy;
  };

  it('gives back any function of up to 12 inputs when applied twice', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 12 }).chain((n) =>
          fc.tuple(
            fc.constant(n),
            fc.uint32Array({ minLength: wordCount(n), maxLength: wordCount(n) }).map((w) => intersect(w, fullSet(n))),
          ),
        ),
        ([n, values]) => {
          expect(twice(values, n)).toEqual(values);
        },
      ),
    );
  });

  it('gives back any function across the word boundary (5, 6 and 7 inputs)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(5, 6, 7).chain((n) =>
          fc.tuple(fc.constant(n), fc.uint32Array({ minLength: wordCount(n), maxLength: wordCount(n) })),
        ),
        ([n, values]) => {
          expect(twice(values, n)).toEqual(values);
        },
      ),
    );
  });
});
