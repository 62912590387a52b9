import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildFunction, type TableRow } from '../../src/logic/boolfn.js';
import { count, has, members } from '../../src/logic/bits.js';
import { cubeFromPattern, cubeMembers, cubeToPattern } from '../../src/logic/cube.js';

const row = (pattern: string, value: 0 | 1 | '-'): TableRow => ({ cube: cubeFromPattern(pattern), value });

describe('cubes', () => {
  it('a pattern with dashes covers every combination its fixed inputs allow', () => {
    expect(cubeMembers(3, cubeFromPattern('1-0'))).toEqual([4, 6]);
    expect(cubeToPattern(3, cubeFromPattern('1-0'))).toBe('1-0');
  });

  it('pattern and cube convert both ways', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom('0', '1', '-'), { minLength: 1, maxLength: 12 }), (chars) => {
        const p = chars.join('');
        expect(cubeToPattern(p.length, cubeFromPattern(p))).toBe(p);
        expect(cubeMembers(p.length, cubeFromPattern(p)).length).toBe(2 ** chars.filter((c) => c === '-').length);
      }),
    );
  });
});

describe('building a function from rows', () => {
  it('paints 1 rows into the on-set and dash rows into the don\'t-care set', () => {
    const built = buildFunction(2, [row('11', 1), row('0-', 0), row('10', '-')]);
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    expect(members(built.value.fn.on)).toEqual([3]);
    expect(members(built.value.fn.dc)).toEqual([2]);
    expect(count(built.value.gaps)).toBe(0);
  });

  it('uncovered combinations are gaps and take the safe value 0 by default', () => {
    const built = buildFunction(2, [row('11', 1)]);
    if (!built.ok) throw new Error('expected a function');
    expect(members(built.value.gaps)).toEqual([0, 1, 2]);
    expect(members(built.value.fn.on)).toEqual([3]);
  });

  it('gaps take the safe value 1 when the output is safe when on', () => {
    const built = buildFunction(2, [row('11', 0)], 1);
    if (!built.ok) throw new Error('expected a function');
    expect(members(built.value.fn.on)).toEqual([0, 1, 2]);
  });

  it('overlapping rows asking for 1 and 0 are a conflict naming both rows, and take the safe value', () => {
    const built = buildFunction(3, [row('1--', 1), row('000', 0), row('11-', 0)]);
    if (!built.ok) throw new Error('expected a function');
    expect(built.value.conflicts).toEqual([{ rowA: 0, rowB: 2, example: 6, combinations: 2 }]);
    expect(has(built.value.fn.on, 6)).toBe(false);
    expect(has(built.value.fn.on, 4)).toBe(true);
  });

  it('a definite row wins over an overlapping don\'t-care row without a conflict', () => {
    const built = buildFunction(2, [row('--', '-'), row('11', 1)]);
    if (!built.ok) throw new Error('expected a function');
    expect(built.value.conflicts).toEqual([]);
    expect(members(built.value.fn.on)).toEqual([3]);
    expect(members(built.value.fn.dc)).toEqual([0, 1, 2]);
  });

  it('refuses more than 24 inputs with a message, not an exception', () => {
    const built = buildFunction(25, []);
    expect(built.ok).toBe(false);
    if (!built.ok) expect(built.error.message).toMatch(/25 inputs/);
  });
});
