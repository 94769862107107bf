// Characters a name part may not hold: C0/C1 controls and DEL, bidirectional overrides (they make a
// name read differently from what it is), and the separators and characters Windows refuses.
const UNSAFE_RE = /[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069\\/:*?"<>|]/g;
const WINDOWS_RESERVED_RE = /^(con|prn|aux|nul|com[0-9]|lpt[0-9])(\..*)?$/i;

/** Longest name part written, in code points. */
export const ZIP_PART_MAX = 80;

/**
 * Returns `name` as one safe path part of a ZIP entry: no separators or backslashes, no control or
 * bidi characters, no `..`, no leading or trailing dot or underscore, runs of `_` as one, not a Windows device name, at most
 * `max` code points, never empty (`_`).
 */
export function zipNamePart(name: string, max = ZIP_PART_MAX): string {
  let s = name.normalize('NFC').replace(UNSAFE_RE, '_').replace(/\s+/g, '_');
  s = s.replace(/\.{2,}/g, '.').replace(/_{2,}/g, '_').replace(/^[._]+|[._]+$/g, '');
  s = [...s].slice(0, max).join('').replace(/[._]+$/g, '');
  if (s === '') s = '_';
  if (WINDOWS_RESERVED_RE.test(s)) s = `_${s}`;
  return s;
}

/** Returns a function giving each name a unique version (`name`, `name-2`, …, compared case-insensitively). */
export function zipNamesUnique(): (name: string) => string {
  const taken = new Set<string>();
  return (name) => {
    let out = name;
    for (let n = 2; taken.has(out.toLowerCase()); n++) out = `${name}-${n}`;
    taken.add(out.toLowerCase());
    return out;
  };
}

/** Returns whether a ZIP entry path is safe to extract: relative, `/`-separated, every part safe as zipNamePart leaves it. */
export function zipPathIsSafe(path: string): boolean {
  if (path === '' || path.startsWith('/')) return false;
  return path.split('/').every((p) => p !== '' && p !== '.' && p !== '..' && !p.includes('..') && zipNamePart(p, Infinity) === p);
}
