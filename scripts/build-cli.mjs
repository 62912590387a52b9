// Compiles the command line to plain JavaScript in build/cli/ (esbuild), so that the command
// starts without a TypeScript loader. Run by `npm ci` (the prepare script), by
// `npm run build:cli`, and by bin/interlock-algebra.mjs when the sources are newer than the
// build. Plain .mjs so that node runs it as it is.
//
// One ES module per command (split at the dynamic imports of src/cli/main.ts), npm packages
// left to node_modules (SheetJS is then loaded only where a workbook is written or parsed),
// and the SheetJS parse worker copied beside the bundle, where file-host.ts looks for it
// (`new URL('./parse-worker.mjs', import.meta.url)`).
import { copyFileSync, mkdirSync, readFileSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const CLI_OUT = join(root, 'build', 'cli');
export const CLI_ENTRY = join(CLI_OUT, 'main.mjs');
const SOURCES = ['src', 'package.json'];

/** Per entry module (src/<layer>/index.ts, src/hosts/node.ts): the module each name comes from. */
const entryMaps = new Map();
function entryMap(path) {
  if (!entryMaps.has(path)) {
    const names = new Map();
    for (const m of readFileSync(path, 'utf8').matchAll(/^export \{([^}]*)\} from '(\.\/[^']+)';$/gm)) {
      for (const item of m[1].split(',')) names.set(item.trim().replace(/^type\s+/, ''), resolve(dirname(path), m[2]));
    }
    entryMaps.set(path, names);
  }
  return entryMaps.get(path);
}

// Other layers import a layer through its entry module; the bundle imports the modules behind
// it instead. esbuild splits chunks by file, so through the entry `--help` would load every
// layer the entry re-exports (tens of ms at each start), not only what args.ts uses.
const behindEntries = {
  name: 'behind-entries',
  setup(build) {
    build.onLoad({ filter: /[\\/]src[\\/].*\.ts$/ }, (args) => {
      const text = readFileSync(args.path, 'utf8').replace(/^import \{([^}]*)\} from '([^']+\/(?:index|node)\.js)';$/gm, (whole, list, spec) => {
        const entry = resolve(dirname(args.path), spec).replace(/\.js$/, '.ts');
        if (!['index.ts', 'node.ts'].includes(basename(entry)) || dirname(entry) === dirname(args.path)) return whole;
        const names = entryMap(entry);
        const byModule = new Map();
        for (const item of list.split(',').map((s) => s.trim()).filter(Boolean)) {
          const module = names.get(item.replace(/^type\s+/, '').split(/\s+as\s+/)[0]);
          if (!module) return whole;
          byModule.set(module, [...(byModule.get(module) ?? []), item]);
        }
        return [...byModule].map(([module, items]) => `import { ${items.join(', ')} } from './${relative(dirname(args.path), module)}';`).join('\n');
      });
      return { contents: text, loader: 'ts' };
    });
  },
};

export async function buildCli() {
  const { build } = await import('esbuild');
  // Built beside, then moved into place: a command started meanwhile finds the old build or the new one.
  const temp = `${CLI_OUT}.${process.pid}.tmp`;
  rmSync(temp, { recursive: true, force: true });
  mkdirSync(temp, { recursive: true });
  await build({
    entryPoints: { main: join(root, 'src', 'cli', 'main.ts') },
    outdir: temp,
    outExtension: { '.js': '.mjs' },
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    chunkNames: 'chunk-[hash]',
    logLevel: 'warning',
    plugins: [behindEntries],
  });
  // The parse worker runs as its own process, beside the bundle, with the plain modules it imports.
  for (const file of ['parse-worker.mjs', 'package-facts.mjs', 'zip-package.mjs']) copyFileSync(join(root, 'src', 'hosts', file), join(temp, file));
  rmSync(CLI_OUT, { recursive: true, force: true });
  renameSync(temp, CLI_OUT);
}

/** Newest modification time of the files the build is made from. */
function newestSource() {
  let newest = 0;
  const visit = (path) => {
    const info = statSync(path);
    if (info.isDirectory()) for (const name of readdirSync(path)) visit(join(path, name));
    else newest = Math.max(newest, info.mtimeMs);
  };
  for (const s of SOURCES) visit(join(root, s));
  return newest;
}

/** Whether build/cli is missing or older than a source file (a developer edited src/). */
export function cliBuildStale() {
  try {
    return statSync(CLI_ENTRY).mtimeMs < newestSource();
  } catch {
    return true;
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await buildCli();
