// `npm run bench`: every bench/*.bench.ts in turn, each printing its figures beside a baseline
// measured in the same run. `npm run bench -- transform` runs the ones whose name matches.
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const filter = process.argv[2];
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => !filter || f.includes(filter))
  .sort();
for (const file of files) {
  console.log(`\n== ${file.replace('.bench.ts', '')} ==`);
  const mod = (await import(pathToFileURL(join(here, file)).href)) as { run: () => Promise<void> };
  await mod.run();
}
