// Name mappings for an implementation check, in every host: a mapping file (the CSV the
// command line's --map takes) and/or a mapping sheet of the workbook (two columns: spec
// signal, program variable). Both go through the one reader of src/impl/mapping.ts; a host
// only brings the text or the cells.
import { fail, ok, type Result } from '../logic/index.js';
import { readMappingCsv, readMappingGrid, type NameMapping, type NamePair } from '../impl/index.js';
import type { WorkbookHost } from '../hosts/index.js';
import type { Grid } from '../table/index.js';

/** Where a mapping comes from: a file's text, or the cells of a sheet as the host read them. Plain data. */
export type MappingSource = { readonly kind: 'file'; readonly fileName: string; readonly text: string } | { readonly kind: 'sheet'; readonly grid: Grid };

/** The cells of a mapping sheet, read through the host (its used range). */
export async function readMappingSheet(host: WorkbookHost, sheet: string): Promise<MappingSource> {
  return { kind: 'sheet', grid: await host.readGrid(sheet) };
}

/**
 * The mappings given, as one: none is no mapping. A spec signal mapped in two of them is an
 * error naming both places, as within one mapping.
 */
export function readMappings(sources: readonly MappingSource[]): Result<NameMapping | undefined> {
  const read: NameMapping[] = [];
  for (const source of sources) {
    const m = source.kind === 'file' ? readMappingCsv(source.fileName, source.text) : readMappingGrid(source.grid);
    if (!m.ok) return m;
    read.push(source.kind === 'sheet' ? { ...m.value, source: `sheet ${m.value.source}` } : m.value);
  }
  if (read.length <= 1) return ok(read[0]);
  const bySpec = new Map<string, NamePair>();
  for (const pair of read.flatMap((m) => m.pairs)) {
    const twice = bySpec.get(pair.spec.toLowerCase());
    if (twice) return fail({ message: `${pair.where}: spec signal '${pair.spec}' is mapped twice (also at ${twice.where})` });
    bySpec.set(pair.spec.toLowerCase(), pair);
  }
  return ok({ source: read.map((m) => m.source).join(' and '), pairs: read.flatMap((m) => m.pairs) });
}
