// The readable report's lines for an output of a table of more than 24 inputs (symbolic engine).
import { combinationPattern, inputBit, widePattern, type Signal, type WideProof } from '../logic/index.js';
import type { WideOutputAnalysis, WideTableAnalysis } from '../analysis/index.js';

const LISTED = 8;

function plural(k: bigint | number, word: string): string {
  return `${k} ${word}${BigInt(k) === 1n ? '' : 's'}`;
}

function proofWord(proof: WideProof): string {
  return proof.mismatchCount === 0n ? 'OK' : `DIFFERS at ${plural(proof.mismatchCount, 'combination')}`;
}

function listed(patterns: readonly string[], total: bigint): string {
  const more = total - BigInt(Math.min(patterns.length, LISTED));
  return patterns.slice(0, LISTED).join(', ') + (more > 0n ? ` and ${more} more` : '');
}

export function wideOutputLines(o: WideOutputAnalysis, inputs: readonly Signal[], wide: WideTableAnalysis): string[] {
  const { n } = wide;
  const id = o.signal.identifier;
  const a = o.andOr;
  const complemented = inputs.filter((_, i) => o.bestXor.polarity & inputBit(n, i)).map((s) => s.identifier);
  const lines = ['', `Output ${o.signal.header} (${id}), safe value ${o.safe} (symbolic engine)`];
  lines.push(`  AND/OR form, ${a.proven ? 'proven minimum' : 'heuristic (not proven minimal)'}: ${plural(a.terms, 'term')}, ${plural(a.literals, 'literal')}`);
  lines.push(`    ${id} := ${a.text};`);
  // A form too long to print is named, never written as if it were a statement.
  const statement = (f: WideOutputAnalysis['xor']): string => (f.expr ? `    ${id} := ${f.text};` : `    (${f.text}; its terms were proven)`);
  lines.push(`  XOR form: ${plural(o.xor.terms, 'term')}, degree ${o.degree}`, statement(o.xor));
  const exhaustive = o.bestXor.exhaustive ? 'best of all polarities' : 'best polarity found (search not exhaustive)';
  const which = complemented.length === 0 ? 'no input complemented' : `complemented: ${complemented.join(', ')}`;
  lines.push(`  Best-polarity XOR form: ${plural(o.bestXor.terms, 'term')}, ${exhaustive}, ${which}`, statement(o.bestXor));
  lines.push(`  Proof over all ${a.proof.combinations} combinations: AND/OR ${proofWord(a.proof)}, XOR ${proofWord(o.xor.proof)}, best XOR ${proofWord(o.bestXor.proof)}`);
  for (const [label, proof] of [['AND/OR', a.proof], ['XOR', o.xor.proof], ['best XOR', o.bestXor.proof]] as const)
    if (proof.mismatchCount > 0n) lines.push(`    ${label} differs from the spec at: ${listed(proof.mismatches.map((k) => combinationPattern(n, k)), proof.mismatchCount)}`);
  const unused = o.unusedInputs.map((i) => inputs[i]!.identifier);
  lines.push(`  Inputs that do not matter: ${unused.length === 0 ? 'none' : unused.join(', ')}`);
  lines.push(
    wide.gapCount === 0n
      ? '  Gaps: none'
      : `  Gaps: ${plural(wide.gapCount, 'combination')} no row covers, set to the safe value ${o.safe}: ${listed(wide.gaps.map((c) => widePattern(n, c)), BigInt(wide.gaps.length))}`,
  );
  for (const c of o.conflicts)
    lines.push(`  Conflict: rows ${c.rowCellsA} and ${c.rowCellsB} ask for 1 and 0 at ${plural(c.combinations, 'combination')} (e.g. ${combinationPattern(n, c.example)}); the safe value ${o.safe} is used`);
  if (o.dontCareCount > 0n) {
    const on = o.permitsAlsoCount;
    const how = o.dontCares === 'minimal' ? 'as the minimal AND/OR form uses them' : 'at the safe value';
    lines.push(`  Don't-cares: ${plural(o.dontCareCount, 'combination')}, resolved ${how}; ${on === 0n ? 'none of them' : `${on} of them`} ON${on === 0n ? '' : `: ${listed(o.permitsAlso.map((k) => combinationPattern(n, k)), on)}`}`);
  }
  return lines;
}
