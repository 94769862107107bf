/** Outcome of an operation on user input: a value, or a message a user can act on. */
export type Result<T> = { ok: true; value: T } | { ok: false; error: string };

/** Returns a successful Result holding `value`. */
export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

/** Returns a failed Result whose message names the file and the problem. */
export function fail<T = never>(file: string, problem: string): Result<T> {
  return { ok: false, error: file ? `${file}: ${problem}` : problem };
}
