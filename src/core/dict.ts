/**
 * A record keyed by names that come from files and folders (run names, class names). Made without a
 * prototype, so a run called `constructor`, `__proto__` or `toString` is a plain key: it neither reads
 * an inherited member nor replaces the object's prototype.
 */
export type Dict<T> = Record<string, T>;

/** Returns an empty Dict. */
export function dictCreate<T>(): Dict<T> {
  return Object.create(null) as Dict<T>;
}

/** Returns a Dict holding `entries` (later entries win), or a copy of another record's own keys. */
export function dictFrom<T>(entries: Iterable<readonly [string, T]> | Readonly<Record<string, T>>): Dict<T> {
  const out = dictCreate<T>();
  const list = Symbol.iterator in entries ? (entries as Iterable<readonly [string, T]>) : Object.entries(entries as Record<string, T>);
  for (const [k, v] of list) out[k] = v;
  return out;
}
