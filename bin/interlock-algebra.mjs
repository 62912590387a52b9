#!/usr/bin/env node
// The installed command: the compiled CLI in build/cli/ (scripts/build-cli.mjs, run by
// `npm ci`). When src/ is newer than the build (a developer's edit) it is rebuilt first, in
// a fraction of a second; when it cannot be (a read-only install) the build there is run.
import { cliBuildStale, buildCli, CLI_ENTRY } from '../scripts/build-cli.mjs';
import { existsSync } from 'node:fs';
import { pathToFileURL } from 'node:url';

if (cliBuildStale()) {
  try {
    await buildCli();
  } catch (e) {
    if (!existsSync(CLI_ENTRY)) {
      process.stderr.write(`error: the command is not built and could not be built (${e.message}); run "npm run build:cli"\n`);
      process.exit(2);
    }
  }
}
const { runCli } = await import(pathToFileURL(CLI_ENTRY).href);
await runCli();
