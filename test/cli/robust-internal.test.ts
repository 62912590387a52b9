// Whatever escapes a command is a bug of ours: one line "internal error: ... (please report)",
// exit status 2, never a stack trace (IA_DEBUG shows it, for developers).
import { describe, expect, it } from 'vitest';
import { DEBUG_VARIABLE, escapedError, main } from '../../src/cli/main.js';
import { CSV } from './run-cli.js';

function collect(): { io: { out: (t: string) => void; err: (t: string) => void }; text: () => string } {
  let err = '';
  return { io: { out: () => undefined, err: (t) => void (err += t) }, text: () => err };
}

describe('an exception escaping main', () => {
  it('is one line asking for a report, exit 2', async () => {
    const { io, text } = collect();
    // The report cannot be written out: the failure happens inside the command.
    const code = await main(['analyze', CSV], {
      out: () => {
        throw new TypeError('stdout went away');
      },
      err: io.err,
    });
    expect(code).toBe(2);
    expect(text()).toBe('internal error: TypeError: stdout went away (please report)\n');
  });

  it(`prints the stack trace as well when ${DEBUG_VARIABLE} is set`, () => {
    const { io, text } = collect();
    const code = escapedError(new RangeError('bug'), io, { [DEBUG_VARIABLE]: '1' });
    expect(code).toBe(2);
    expect(text()).toMatch(/^internal error: RangeError: bug \(please report\)\nRangeError: bug\n\s+at /);
  });

  it('keeps a thrown non-error to its first line', () => {
    const { io, text } = collect();
    escapedError('first\nsecond', io, {});
    expect(text()).toBe('internal error: first (please report)\n');
  });

  it('a file-system error that escapes is the user\'s situation: exit 2 with path and reason', () => {
    const { io, text } = collect();
    const code = escapedError(Object.assign(new Error('x'), { code: 'EROFS', syscall: 'open', path: '/mnt/ro/x.st' }), io, {});
    expect(code).toBe(2);
    expect(text()).toBe('error: cannot open /mnt/ro/x.st: the file system is read-only (EROFS)\n');
  });
});
