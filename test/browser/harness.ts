// What the browser tests share: named checks that record their outcome, plain assertions, and
// where the pages are served and the screenshots go.
import { join, resolve } from 'node:path';

export const ROOT = resolve(import.meta.dirname, '../..');
export const SHOTS = join(ROOT, 'test-output/screenshots');

export const results: { name: string; ok: boolean; detail?: string }[] = [];
/** The origin the pages are served from, once the server runs. */
export const ORIGIN = { value: '' };

export async function check(name: string, body: () => Promise<void>): Promise<void> {
  try {
    await body();
    results.push({ name, ok: true });
    console.log(`  ok    ${name}`);
  } catch (e) {
    const detail = e instanceof Error ? e.message : String(e);
    results.push({ name, ok: false, detail });
    console.log(`  FAIL  ${name}\n        ${detail.split('\n').join('\n        ')}`);
  }
}

export function expect(cond: boolean, message: string): void {
  if (!cond) throw new Error(message);
}

export function same<T>(actual: T, expected: T, what: string): void {
  const a = JSON.stringify(actual);
  const b = JSON.stringify(expected);
  if (a !== b) throw new Error(`${what}:\n  expected ${b}\n  got      ${a}`);
}

