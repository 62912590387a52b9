// Where the command line writes: stdout for the report or JSON, stderr for errors and progress.
// Tests pass their own to run the CLI in-process.

export interface CliIo {
  out(text: string): void;
  err(text: string): void;
}

export const processIo: CliIo = {
  out: (text) => void process.stdout.write(text),
  err: (text) => void process.stderr.write(text),
};

/** Exit status: 0 all proven / equal, 1 a spec error or failed check, 2 usage or unreadable file. */
export const EXIT = { ok: 0, failed: 1, usage: 2 } as const;
export type ExitCode = (typeof EXIT)[keyof typeof EXIT];
