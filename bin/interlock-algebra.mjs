#!/usr/bin/env node
// The installed command: the CLI is TypeScript, run through tsx's loader (no build step).
import { register } from 'tsx/esm/api';

register();
const { runCli } = await import('../src/cli/main.ts');
await runCli();
