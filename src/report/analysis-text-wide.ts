// The readable report's lines for an output of a table of more than 24 inputs (symbolic engine).
import { boundsWords, combinationPattern, inputBit, widePattern, type Signal, type WideProof } from '../logic/index.js';
import type { WideOutputAnalysis, WideTableAnalysis } from '../analysis/index.js';
import { NO_XOR } from './text.js';

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
  const lines = ['', `Output ${o.signal.header} (${id}), safe value ${o.safe} (${wide.engine === 'rows' ? "row-cube engine: the rows have no decision diagram of workable size" : 'symbolic engine'})`];
  const heuristic = `heuristic (not proven minimal; every form has at least ${plural(a.lowerBound.terms, 'term')})`;
  lines.push(`  AND/OR form, ${a.proven ? 'proven minimum' : heuristic}: ${plural(a.terms, 'term')}, ${plural(a.literals, 'literal')}`);
  lines.push(`    ${id} := ${a.text};`);
  const { xor, bestXor } = o;
  if (xor && bestXor) {
    const complemented = inputs.filter((_, i) => bestXor.polarity & inputBit(n, i)).map((s) => s.identifier);
    // A form too long to print is named, never written as if it were a statement.
    const statement = (f: typeof xor): string => (f.expr ? `    ${id} := ${f.text};` : `    (${f.text}; its terms were proven)`);
    lines.push(`  XOR form: ${plural(xor.terms, 'term')}, degree ${o.degree}`, statement(xor));
    const exhaustive = bestXor.exhaustive ? 'best of all polarities' : 'best polarity found (search not exhaustive)';
    const which = complemented.length === 0 ? 'no input complemented' : `complemented: ${complemented.join(', ')}`;
    lines.push(`  Best-polarity XOR form: ${plural(bestXor.terms, 'term')}, ${exhaustive}, ${which}`, statement(bestXor));
  } else lines.push(`  XOR forms: ${NO_XOR}`);
  const proofs: [string, WideProof][] = [['AND/OR', a.proof], ...(xor && bestXor ? ([['XOR', xor.proof], ['best XOR', bestXor.proof]] as [string, WideProof][]) : [])];
  lines.push(`  Proof over all ${a.proof.combinations} combinations: ${proofs.map(([label, proof]) => `${label} ${proofWord(proof)}`).join(', ')}`);
  for (const [label, proof] of proofs)
    if (proof.mismatchCount > 0n) lines.push(`    ${label} differs from the spec at: ${listed(proof.mismatches.map((k) => combinationPattern(n, k)), proof.mismatchCount)}`);
  const unused = o.unusedInputs.map((i) => inputs[i]!.identifier);
  lines.push(`  Inputs that do not matter: ${unused.length === 0 ? 'none' : unused.join(', ')}`);
  lines.push(
    wide.gapCount.atMost === 0n
      ? '  Gaps: none'
      : `  Gaps: ${boundsWords(wide.gapCount, 'combination')} no row covers, set to the safe value ${o.safe}: ${listed(wide.gaps.map((c) => widePattern(n, c)), BigInt(wide.gaps.length))}`,
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
