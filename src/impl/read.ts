// One entry point for any implementation file: Structured Text or PLCopen XML.
import type { Result } from '../logic/index.js';
import { readPlcopen } from './plcopen-reader.js';
import { readStFile } from './st-reader.js';
import type { ImplProgram } from './types.js';

/** `.st` files as Structured Text, `.xml` as PLCopen XML; other names by their content. */
export function readImplementation(fileName: string, text: string): Result<ImplProgram> {
  const lower = fileName.toLowerCase();
  if (lower.endsWith('.xml')) return readPlcopen(fileName, text);
  if (lower.endsWith('.st')) return readStFile(fileName, text);
  return text.trimStart().startsWith('<') ? readPlcopen(fileName, text) : readStFile(fileName, text);
}
