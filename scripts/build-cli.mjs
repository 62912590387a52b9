// Compiles the command line to plain JavaScript in build/cli/ (esbuild), so that the command
// starts without a TypeScript loader. Run by `npm ci` (the prepare script), by
// `npm run build:cli`, and by bin/interlock-algebra.mjs when the sources are newer than the
// build. Plain .mjs so that node runs it as it is.
//
// One ES module per command (split at the dynamic imports of src/cli/main.ts), npm packages
// left to node_modules (SheetJS is then loaded only where a workbook is written or parsed),
// and the SheetJS parse worker copied beside the bundle, where file-host.ts looks for it
// (`new URL('./parse-worker.mjs', import.meta.url)`).
import { copyFileSync, mkdirSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
export const CLI_OUT = join(root, 'build', 'cli');
export const CLI_ENTRY = join(CLI_OUT, 'main.mjs');
const SOURCES = ['src', 'package.json'];

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
