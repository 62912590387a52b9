// Every name the hand-over pack writes into Structured Text or PLCopen XML is a valid
// IEC 61131-3 identifier (isValidIdentifier of src/logic/identifiers.ts), unique
// case-insensitively within its block: over the sample workbooks and over fuzzed headers.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { isValidIdentifier } from '../../src/logic/identifiers.js';
import { childNamed, childrenNamed, localName, parseXml, textContent, type XmlElement } from '../../src/impl/xml.js';
import { analyseTable } from '../../src/analysis/analyse.js';
import type { TableAnalysis } from '../../src/analysis/analysis-types.js';
import { readSpecTables } from '../../src/table/read-tables.js';
import { exportPlcopen } from '../../src/report/plcopen-export.js';
import { exportSt } from '../../src/report/st-export.js';
import { SAMPLE_WORKBOOKS, sheetCells } from '../../scripts/make-samples.js';
import { analysisOf, VOTE } from './fixtures.js';

const source = { workbook: 'sample.xlsx' };

/** Names declared per block in the ST text: the block's name, then its variables. */
function stNames(st: string): string[][] {
  return [...st.matchAll(/^(?:FUNCTION_BLOCK|PROGRAM) (\S+)\n([\s\S]*?)^END_(?:FUNCTION_BLOCK|PROGRAM)$/gm)].map((m) => [
    m[1]!,
    ...[...m[2]!.matchAll(/^\s+(\S+) : BOOL;$/gm)].map((d) => d[1]!),
  ]);
}

/** Names per POU of the XML: the POU's, its variables', and those on its contacts and coils. */
function xmlNames(xml: string): string[][] {
  const root = parseXml(xml);
  if (!root.ok) throw new Error(root.error.message);
  const walk = (e: XmlElement): XmlElement[] => [e, ...e.children.flatMap(walk)];
  const pous = childrenNamed(childNamed(childNamed(root.value, 'types')!, 'pous')!, 'pou');
  return pous.map((pou) => {
    const declared = walk(pou).filter((e) => localName(e.name) === 'variable' && e.attrs['name'] !== undefined).map((e) => e.attrs['name']!);
    const used = walk(pou).filter((e) => ['contact', 'coil'].includes(localName(e.name))).map((e) => textContent(childNamed(e, 'variable')!));
    for (const u of used) expect(declared).toContain(u);
    return [pou.attrs['name']!, ...declared];
  });
}

function expectValid(blocks: string[][]): void {
  for (const names of blocks) {
    for (const name of names) expect(isValidIdentifier(name), name).toBe(true);
    expect(new Set(names.map((x) => x.toLowerCase())).size, names.join(' ')).toBe(names.length);
  }
}

function namesOfAllExports(analyses: readonly TableAnalysis[]): string[][] {
  return [
    ...stNames(exportSt(analyses, { source })),
    ...xmlNames(exportPlcopen(analyses, { source })),
    ...xmlNames(exportPlcopen(analyses, { source, body: 'LD' })),
  ];
}

describe('identifiers in the hand-over pack', () => {
  for (const workbook of SAMPLE_WORKBOOKS) {
    it(`are valid IEC 61131-3 identifiers for every table of the sample ${workbook.file}`, () => {
      const analyses = workbook.sheets.flatMap((sheet) =>
        readSpecTables({ sheet: sheet.name, origin: 'A1', cells: sheetCells(sheet) }).tables.map((t) => analyseTable(t)),
      );
      expect(analyses.length).toBeGreaterThan(0);
      const blocks = namesOfAllExports(analyses);
      expect(blocks).toHaveLength(3 * analyses.length);
      expectValid(blocks);
      const pouNames = blocks.slice(0, analyses.length).map((b) => b[0]!.toLowerCase());
      expect(new Set(pouNames).size).toBe(analyses.length);
    });
  }

  it('are valid IEC 61131-3 identifiers whatever the headers and sheet name (fuzzed)', () => {
    const header = fc.string({ unit: 'binary', maxLength: 40 }).map((s) => (s.trim() === '' ? `h${s.length}` : s));
    fc.assert(
      fc.property(fc.array(header, { minLength: 3, maxLength: 3 }), header, header, (inputs, output, sheet) => {
        const analysis = analysisOf({ ...VOTE, sheet, inputs, outputs: [output] });
        expectValid(namesOfAllExports([analysis]));
      }),
      { numRuns: 100 },
    );
  });
});
