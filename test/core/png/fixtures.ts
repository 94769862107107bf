import { classTableFromJson, type ClassTable } from '../../../src/core/classTable.ts';
import { seededRandom } from './seeded.ts';

/** Returns `n` distinct seeded #rrggbb colours as 0xRRGGBB integers, none equal to any in `avoid`. */
export function seededColors(n: number, seed: number, avoid: number[] = []): number[] {
  const rnd = seededRandom(seed);
  const seen = new Set(avoid);
  const out: number[] = [];
  while (out.length < n) {
    const c = Math.floor(rnd() * 0x1000000);
    if (seen.has(c)) continue;
    seen.add(c);
    out.push(c);
  }
  return out;
}

/** Returns a flat r,g,b palette of `n` distinct seeded colours. */
export function seededPalette(n: number, seed: number): Uint8Array {
  const p = new Uint8Array(n * 3);
  seededColors(n, seed).forEach((c, i) => p.set([c >> 16, (c >> 8) & 255, c & 255], i * 3));
  return p;
}

/** Returns a class table from classes.json-shaped input built from ids and seeded colours; throws if invalid. */
export function testTable(ids: number[], seed: number, ignore = 255, ignoreColor: string | null = '#000000'): ClassTable {
  const colors = seededColors(ids.length, seed, ignoreColor ? [parseInt(ignoreColor.slice(1), 16)] : []);
  const json = {
    ignore,
    ...(ignoreColor ? { ignoreColor } : {}),
    classes: ids.map((id, i) => ({ id, name: `class ${id}`, color: '#' + colors[i].toString(16).padStart(6, '0') })),
  };
  const r = classTableFromJson(json);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}
