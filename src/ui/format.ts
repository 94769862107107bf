/** Returns a ratio 0..1 as a percentage with one decimal ("83.4"), or "—" when undefined. */
export function pct(v: number | null | undefined, digits = 1): string {
  return v === null || v === undefined || Number.isNaN(v) ? '—' : (v * 100).toFixed(digits);
}

/** Returns a count with thousands separators ("1,204"). */
export function count(n: number): string {
  return Math.round(n).toLocaleString('en-US');
}

/** Returns a compact count ("1.2k", "3.4M") for tight table cells. */
export function countShort(n: number): string {
  if (n < 1000) return String(Math.round(n));
  if (n < 1e6) return (n / 1e3).toFixed(n < 1e4 ? 1 : 0) + 'k';
  return (n / 1e6).toFixed(n < 1e7 ? 1 : 0) + 'M';
}

/**
 * Returns a CSS colour for a score on a ramp of our own (dark red → amber → sand → sea green), `t`
 * a ratio 0..1 where 1 is best; gray for undefined.
 */
export function scoreColor(t: number | null): string {
  if (t === null || Number.isNaN(t)) return '#3a4048';
  const stops: [number, number, number, number][] = [
    [0, 122, 31, 43],
    [0.45, 217, 120, 43],
    [0.75, 226, 200, 110],
    [1, 63, 170, 140],
  ];
  const x = Math.max(0, Math.min(1, t));
  let i = 0;
  while (i < stops.length - 2 && x > stops[i + 1][0]) i++;
  const [t0, r0, g0, b0] = stops[i];
  const [t1, r1, g1, b1] = stops[i + 1];
  const f = (x - t0) / (t1 - t0);
  const mix = (a: number, b: number) => Math.round(a + (b - a) * f);
  return `rgb(${mix(r0, r1)}, ${mix(g0, g1)}, ${mix(b0, b1)})`;
}
