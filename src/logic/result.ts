// Errors are values at the engine's edges: bad data gives a Failure, never an exception.

export type Result<T, E = EngineError> = { ok: true; value: T } | { ok: false; error: E };

/** What went wrong with data handed to the engine, and where when there is a place. */
export interface EngineError {
  readonly message: string;
  /** 0-based character position in an expression text, when the error is a parse error. */
  readonly position?: number;
  /** What the parser expected at `position`. */
  readonly expected?: string;
}

export function ok<T>(value: T): { ok: true; value: T } {
  return { ok: true, value };
}

export function fail<E = EngineError>(error: E): { ok: false; error: E } {
  return { ok: false, error };
}
