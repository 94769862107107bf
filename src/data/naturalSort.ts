const CHUNK_RE = /(\d+)|(\D+)/g;

function chunksOf(s: string): string[] {
  return s.match(CHUNK_RE) ?? [];
}

function isDigits(s: string): boolean {
  const c = s.charCodeAt(0);
  return c >= 48 && c <= 57;
}

/**
 * Compares two names in natural order (frame2 before frame10): digit runs compare by numeric value
 * (of any length, without converting to a number), other runs case-insensitively; ties fall back to
 * plain code-unit order so the result is a total order. Returns negative, zero or positive.
 */
export function naturalCompare(a: string, b: string): number {
  const ca = chunksOf(a);
  const cb = chunksOf(b);
  const n = Math.min(ca.length, cb.length);
  for (let i = 0; i < n; i++) {
    const x = ca[i];
    const y = cb[i];
    if (x === y) continue;
    const dx = isDigits(x);
    const dy = isDigits(y);
    if (dx && dy) {
      const tx = x.replace(/^0+(?=\d)/, '');
      const ty = y.replace(/^0+(?=\d)/, '');
      if (tx.length !== ty.length) return tx.length - ty.length;
      if (tx !== ty) return tx < ty ? -1 : 1;
      if (x.length !== y.length) return x.length - y.length; // "07" after "7"
      continue;
    }
    if (dx !== dy) return dx ? -1 : 1; // digits sort before letters, as in most file managers
    const lx = x.toLowerCase();
    const ly = y.toLowerCase();
    if (lx !== ly) return lx < ly ? -1 : 1;
  }
  if (ca.length !== cb.length) return ca.length - cb.length;
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Returns a new array of the names in natural order. */
export function naturalSorted(names: readonly string[]): string[] {
  return [...names].sort(naturalCompare);
}
