// A signal as the spec names it and as Structured Text names it.

export interface Signal {
  /** The header text as written in the spec table. */
  readonly header: string;
  /** A valid IEC 61131-3 identifier derived from the header (DESIGN.md section 3). */
  readonly identifier: string;
}

/**
 * Index of the signal a name refers to: header or identifier, case-insensitively
 * (headers also with surrounding blanks trimmed). -1 when none does.
 */
export function signalIndex(signals: readonly Signal[], name: string): number {
  const key = name.trim().toLowerCase();
  const byId = signals.findIndex((s) => s.identifier.toLowerCase() === key);
  if (byId >= 0) return byId;
  return signals.findIndex((s) => s.header.trim().toLowerCase() === key);
}

/**
 * `signalIndex` for many look-ups in the same signals: the keys are indexed once, so a
 * parser resolving a million names does not scan the list a million times. Same answers.
 */
export function signalFinder(signals: readonly Signal[]): (name: string) => number {
  const byId = new Map<string, number>();
  const byHeader = new Map<string, number>();
  signals.forEach((s, i) => {
    const id = s.identifier.toLowerCase();
    if (!byId.has(id)) byId.set(id, i);
    const header = s.header.trim().toLowerCase();
    // A header spelled as its identifier is found by the identifier first anyway.
    if (header !== id && !byHeader.has(header)) byHeader.set(header, i);
  });
  return (name) => {
    const key = name.trim().toLowerCase();
    return byId.get(key) ?? byHeader.get(key) ?? -1;
  };
}
