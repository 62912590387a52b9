// Text from the user's files reaches the terminal inert: control characters and
// bidirectional controls are shown as escapes; the JSON document stays exact JSON.
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { jsonSafe, terminalSafe } from '../../src/cli/terminal-text.js';
import { runCli, scratch } from './run-cli.js';

const ESC = '\u001b';
const RLO = '\u202e';
const CSI = '\u009b';

/** A one-input table whose header holds an ESC sequence, a right-to-left override and a C1 CSI, and whose output header holds a NUL. */
function hostileCsv(): string {
  const file = join(scratch(), 'hostile.csv');
  writeFileSync(file, `input;output\nGuard${ESC}[2J${RLO}A${CSI};Out\u0000\n1;1\n0;0\n`);
  return file;
}

/** Nothing that a terminal acts on: no C0 control but newline, no DEL or C1, no bidi control. */
const RAW = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/;

describe('terminal output of text from the user', () => {
  it('the readable report shows ESC, NUL, C1 and U+202E as escapes', async () => {
    const run = await runCli('analyze', hostileCsv());
    expect(run.code).toBe(0);
    expect(run.out).not.toMatch(RAW);
    expect(run.out).toContain('Guard\\u001b[2J<U+202E>A\\u009b');
    expect(run.out).toContain('Out\\u0000');
  });

  it('error messages on stderr are escaped too (a path with an ESC in it)', async () => {
    const run = await runCli('analyze', join(scratch(), `evil${ESC}]0;title${RLO}.csv`));
    expect(run.code).toBe(2);
    expect(run.err).not.toMatch(RAW);
    expect(run.err).toContain('evil\\u001b]0;title<U+202E>.csv');
  });

  it('usage errors echo an option name escaped', async () => {
    const run = await runCli('analyze', 'x.csv', `--${ESC}[31m`);
    expect(run.code).toBe(2);
    expect(run.err).toContain('unknown option --\\u001b[31m');
  });

  it('--json keeps the exact header text, escaped as JSON, with nothing raw in the bytes', async () => {
    const run = await runCli('analyze', hostileCsv(), '--json');
    expect(run.out).not.toMatch(RAW);
    const doc = JSON.parse(run.out) as { tables: { inputs: string[] }[] };
    expect(doc.tables[0]!.inputs).toEqual([`Guard${ESC}[2J${RLO}A${CSI}`]);
  });
});

describe('escaping for the terminal and for JSON', () => {
  it('leaves ordinary text, tabs, newlines and non-Latin letters alone', () => {
    const text = 'Schutztür geschlossen\t→ 安全門\nok';
    expect(terminalSafe(text)).toBe(text);
    expect(jsonSafe(JSON.stringify(text))).toBe(JSON.stringify(text));
  });

  it('JSON made safe parses back to the same value, for any string', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        const safe = jsonSafe(JSON.stringify({ s }));
        expect(safe).not.toMatch(RAW);
        expect(JSON.parse(safe)).toEqual({ s });
      }),
    );
  });

  it('terminal text made safe holds nothing a terminal acts on, for any string', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary' }), (s) => {
        expect(terminalSafe(s).replace(/[\n\t]/g, '')).not.toMatch(RAW);
      }),
    );
  });
});
