// Random AND/OR forms drawn as FBD by the test writer and read back: the same function on
// every combination of the inputs.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { has } from '../../src/logic/bits.js';
import { truthTable } from '../../src/logic/expr/evaluate.js';
import { readPlcopen } from '../../src/impl/plcopen-reader.js';
import { verifyImplementation } from '../../src/impl/verify.js';
import { parseXml } from '../../src/impl/xml.js';
import { tinyTable } from '../report/fixtures.js';
import { schemaViolations } from '../report/plcopen-schema.js';
import { sumOfProductsFbd, type Literal } from './fbd-writer.js';

const form = fc.integer({ min: 1, max: 5 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    products: fc.array(
      fc.uniqueArray(fc.record({ input: fc.integer({ min: 0, max: n - 1 }), negated: fc.boolean() }), { minLength: 1, maxLength: n, selector: (l) => l.input }),
      { maxLength: 4 },
    ),
    viaConnectors: fc.boolean(),
  }),
);

const holds = (products: readonly (readonly Literal[])[], bits: readonly number[]): boolean =>
  products.some((p) => p.every((l) => (bits[l.input] === 1) !== l.negated));

describe('FBD drawings of random AND/OR forms (property)', () => {
  it('read back to the same function on every combination, and verify as equal', () => {
    fc.assert(
      fc.property(form, ({ n, products, viaConnectors }) => {
        const inputs = Array.from({ length: n }, (_, i) => `x${i + 1}`);
        const xml = sumOfProductsFbd(inputs, products, viaConnectors);
        const tree = parseXml(xml);
        if (!tree.ok) throw new Error(tree.error.message);
        expect(schemaViolations(tree.value)).toEqual([]);
        const read = readPlcopen('form.xml', xml);
        if (!read.ok) throw new Error(read.error.message);
        const pou = read.value.pous[0]!;
        const q = pou.outputs.find((o) => o.name === 'q')!;
        expect(q.cannotJudge).toEqual([]);
        const m = pou.inputs.length;
        const table = truthTable(q.expr!, m);
        const rows: string[] = [];
        for (let k = 0; k < 1 << n; k++) {
          const bits = inputs.map((_, i) => (k >> (n - 1 - i)) & 1);
          // The same combination over the POU's inputs, which come in the order they are read.
          const there = pou.inputs.reduce((acc, name, j) => acc | (bits[inputs.indexOf(name)]! << (m - 1 - j)), 0);
          expect(has(table, there), `combination ${bits.join('')}`).toBe(holds(products, bits));
          rows.push(`${bits.join(' ')} | ${holds(products, bits) ? 1 : 0}`);
        }
        const report = verifyImplementation([tinyTable({ inputs, outputs: ['q'], rows })], read.value);
        expect(report.outputs[0]!.status).toBe('equal');
      }),
      { numRuns: 150 },
    );
  });
});
