// The layers of the sources and the arrows between them, read from the import statements of
// every file in src/ and taskpane/. The same table is in DEVELOPERS.md ("Layers").
import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { join, posix } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));

type Layer = 'logic' | 'table' | 'analysis' | 'impl' | 'report' | 'compare' | 'hosts' | 'workflow' | 'cli' | 'taskpane';

/** Which layers each layer may import. */
const MAY_IMPORT: Record<Layer, readonly Layer[]> = {
  logic: [],
  table: ['logic'],
  analysis: ['logic', 'table'],
  impl: ['logic', 'table'],
  report: ['logic', 'table', 'analysis', 'impl'],
  compare: ['logic', 'table', 'analysis', 'report'],
  hosts: ['logic', 'table', 'report'],
  workflow: ['logic', 'table', 'analysis', 'impl', 'report', 'compare', 'hosts'],
  cli: ['logic', 'table', 'analysis', 'impl', 'report', 'compare', 'hosts', 'workflow'],
  taskpane: ['logic', 'table', 'analysis', 'impl', 'report', 'hosts', 'workflow'],
};

/** The modules other layers import a layer through (none: no layer imports it). */
const ENTRIES: Record<Layer, readonly string[]> = {
  logic: ['index.ts'],
  table: ['index.ts'],
  analysis: ['index.ts'],
  impl: ['index.ts'],
  report: ['index.ts'],
  compare: ['index.ts'],
  hosts: ['index.ts', 'node.ts'],
  workflow: ['index.ts'],
  cli: [],
  taskpane: [],
};

/** Programs run by path (the SheetJS parse worker), not modules whose names are imported. */
const PROGRAMS = ['src/hosts/parse-worker.mjs'];

const LAYERS = Object.keys(MAY_IMPORT) as Layer[];

function folderOf(layer: Layer): string {
  return layer === 'taskpane' ? 'taskpane' : `src/${layer}`;
}

function layerOf(path: string): Layer | undefined {
  return LAYERS.find((l) => path.startsWith(`${folderOf(l)}/`));
}

function sourceFiles(dir: string): string[] {
  return readdirSync(join(ROOT, dir)).flatMap((name) => {
    const path = posix.join(dir, name);
    if (statSync(join(ROOT, path)).isDirectory()) return sourceFiles(path);
    return /\.(ts|tsx|mjs|mts)$/.test(name) ? [path] : [];
  });
}

/** The relative specifiers of a file's static imports and re-exports and its dynamic imports. */
function specifiersOf(text: string): string[] {
  const patterns = [
    /^\s*(?:import|export)\b[^;'"]*?\bfrom\s*['"]([^'"]+)['"]/gm,
    /^\s*import\s*['"]([^'"]+)['"]/gm,
    /\bimport\s*\(\s*(?:\/\*[^*]*\*\/\s*)?['"]([^'"]+)['"]\s*\)/g,
  ];
  return patterns.flatMap((p) => [...text.matchAll(p)].map((m) => m[1]!)).filter((s) => s.startsWith('.'));
}

/** The file a specifier names: './x.js' is './x.ts' (or .tsx) in the sources. */
function resolve(from: string, specifier: string): string {
  const path = posix.normalize(posix.join(posix.dirname(from), specifier));
  const stem = path.replace(/\.js$/, '');
  return [`${stem}.ts`, `${stem}.tsx`, path].find((p) => existsSync(join(ROOT, p))) ?? path;
}

interface Arrow {
  readonly file: string;
  readonly target: string;
  readonly from: Layer;
  readonly to: Layer;
}

const files = [...sourceFiles('src'), ...sourceFiles('taskpane')];
const arrows: Arrow[] = files.flatMap((file) =>
  specifiersOf(readFileSync(join(ROOT, file), 'utf8')).flatMap((s) => {
    const target = resolve(file, s);
    const from = layerOf(file);
    const to = layerOf(target);
    return from && to && from !== to ? [{ file, target, from, to }] : [];
  }),
);

describe('layers', () => {
  it('every source file lies in a layer of the table', () => {
    expect(files.filter((f) => !layerOf(f))).toEqual([]);
  });

  it('finds the imports between layers it checks', () => {
    expect(arrows.length).toBeGreaterThan(100);
    expect(arrows).toContainEqual({ file: 'src/workflow/examine.ts', target: 'src/analysis/index.ts', from: 'workflow', to: 'analysis' });
  });

  it('a layer imports only the layers the table allows it', () => {
    const wrong = arrows.filter((a) => !MAY_IMPORT[a.from].includes(a.to)).map((a) => `${a.file} -> ${a.target}`);
    expect(wrong).toEqual([]);
  });

  it('another layer is reached only through its entry module', () => {
    const entries = (l: Layer) => ENTRIES[l].map((e) => `${folderOf(l)}/${e}`);
    const deep = arrows.filter((a) => !entries(a.to).includes(a.target) && !PROGRAMS.includes(a.target)).map((a) => `${a.file} -> ${a.target}`);
    expect(deep).toEqual([]);
  });

  it('every entry module exists', () => {
    const missing = LAYERS.flatMap((l) => ENTRIES[l].map((e) => `${folderOf(l)}/${e}`)).filter((p) => !existsSync(join(ROOT, p)));
    expect(missing).toEqual([]);
  });

  it('the arrows of the table never lead back to where they started', () => {
    const reaches = (from: Layer, to: Layer, seen: Set<Layer>): boolean => {
      for (const l of MAY_IMPORT[from]) {
        if (l === to) return true;
        if (seen.has(l)) continue;
        seen.add(l);
        if (reaches(l, to, seen)) return true;
      }
      return false;
    };
    expect(LAYERS.filter((l) => reaches(l, l, new Set()))).toEqual([]);
  });

  it("the developer guide's table of layers is this one", () => {
    const guide = readFileSync(join(ROOT, 'DEVELOPERS.md'), 'utf8');
    const rows = [...guide.matchAll(/^\| `(src\/\w+|taskpane)\/` \|[^|]*\| ([^|]*) \| ([^|]*) \|$/gm)];
    const table = Object.fromEntries(
      rows.map((r) => [
        r[1]!.replace('src/', ''),
        { mayImport: [...r[2]!.matchAll(/`(\w+)`/g)].map((m) => m[1]), entries: [...r[3]!.matchAll(/`([\w.]+)`/g)].map((m) => m[1]) },
      ]),
    );
    const expected = Object.fromEntries(LAYERS.map((l) => [l, { mayImport: [...MAY_IMPORT[l]], entries: [...ENTRIES[l]] }]));
    expect(table).toEqual(expected);
  });
});
