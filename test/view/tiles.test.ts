import { describe, expect, it } from 'vitest';
import { tileBytes, tilesOf } from '../../src/view/tiles.ts';

describe('tiles', () => {
  it('cover the image exactly once', () => {
    const tiles = tilesOf(130, 70, 64);
    expect(tiles.length).toBe(6);
    const seen = new Uint8Array(130 * 70);
    for (const t of tiles) for (let y = t.y; y < t.y + t.height; y++) for (let x = t.x; x < t.x + t.width; x++) seen[y * 130 + x]++;
    expect(seen.every((n) => n === 1)).toBe(true);
  });
  it('pad each row to 4 bytes (WebGL default unpack alignment) and copy the right pixels', () => {
    const src = Uint8Array.from({ length: 7 * 5 * 2 }, (_, i) => i);
    const out = tileBytes(src, 7, 2, { x: 2, y: 1, width: 3, height: 2 }); // 6 bytes a row → stride 8
    expect([...out]).toEqual([18, 19, 20, 21, 22, 23, 0, 0, 32, 33, 34, 35, 36, 37, 0, 0]);
    const aligned = new Uint8Array(8 * 3);
    expect(tileBytes(aligned, 8, 1, { x: 0, y: 0, width: 8, height: 3 })).toBe(aligned); // no copy
  });
});
