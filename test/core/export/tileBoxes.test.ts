import { describe, expect, it } from 'vitest';
import { tileAxisStarts, tileBoxesOf, tileModeCheck } from '../../../src/core/export/tileBoxes.ts';
import type { FlagBox } from '../../../src/core/review/flag.ts';

function boxes(b: FlagBox | null, w: number, h: number, mode: Parameters<typeof tileBoxesOf>[3]): FlagBox[] {
  const r = tileBoxesOf(b, w, h, mode);
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

describe('crop mode: the flagged box plus padding, clamped to the frame', () => {
  it('pads on every side inside the frame and clamps at its edges', () => {
    expect(boxes([50, 40, 60, 45], 200, 100, { kind: 'crop', padding: 8 })).toEqual([[42, 32, 68, 53]]);
    expect(boxes([2, 3, 60, 99], 200, 100, { kind: 'crop', padding: 16 })).toEqual([[0, 0, 76, 100]]);
    expect(boxes([190, 0, 200, 5], 200, 100, { kind: 'crop', padding: 0 })).toEqual([[190, 0, 200, 5]]);
    expect(boxes(null, 200, 100, { kind: 'crop', padding: 30 })).toEqual([[0, 0, 200, 100]]);
  });

  it('clips a box hanging over the frame edge, and refuses one wholly outside', () => {
    expect(boxes([180, 90, 260, 130], 200, 100, { kind: 'crop', padding: 4 })).toEqual([[176, 86, 200, 100]]);
    const r = tileBoxesOf([300, 0, 310, 5], 200, 100, { kind: 'crop', padding: 4 });
    expect(!r.ok && r.error).toBe('flag box [300, 0, 310, 5] lies outside the 200×100 frame');
  });
});

describe('tile mode: fixed-size tiles covering the flagged area', () => {
  it('one tile centred on a small box, shifted inside the frame at the edges', () => {
    expect(boxes([100, 100, 110, 110], 1024, 512, { kind: 'tile', size: 64 })).toEqual([[73, 73, 137, 137]]);
    expect(boxes([0, 0, 10, 10], 1024, 512, { kind: 'tile', size: 64 })).toEqual([[0, 0, 64, 64]]);
    expect(boxes([1020, 508, 1024, 512], 1024, 512, { kind: 'tile', size: 64 })).toEqual([[960, 448, 1024, 512]]);
  });

  it('a frame smaller than the tile gives the whole frame', () => {
    expect(boxes([10, 10, 20, 20], 100, 50, { kind: 'tile', size: 512 })).toEqual([[0, 0, 100, 50]]);
  });

  it('random boxes: tiles lie in the frame, have the set size when the frame allows, cover the box, and are as few as possible', () => {
    const rnd = seeded(3);
    for (let k = 0; k < 2000; k++) {
      const W = 1 + Math.floor(rnd() * 900), H = 1 + Math.floor(rnd() * 600);
      const size = 8 + Math.floor(rnd() * 300);
      const x0 = Math.floor(rnd() * W), y0 = Math.floor(rnd() * H);
      const x1 = x0 + 1 + Math.floor(rnd() * (W - x0)), y1 = y0 + 1 + Math.floor(rnd() * (H - y0));
      const tiles = boxes([x0, y0, x1, y1], W, H, { kind: 'tile', size });
      const nx = W <= size ? 1 : Math.ceil((x1 - x0) / size), ny = H <= size ? 1 : Math.ceil((y1 - y0) / size);
      expect(tiles.length).toBe(nx * ny);
      const covered = new Uint8Array(W * H);
      for (const [a0, b0, a1, b1] of tiles) {
        expect(a0 >= 0 && b0 >= 0 && a1 <= W && b1 <= H).toBe(true);
        expect(a1 - a0).toBe(Math.min(size, W));
        expect(b1 - b0).toBe(Math.min(size, H));
        for (let y = b0; y < b1; y++) covered.fill(1, y * W + a0, y * W + a1);
      }
      for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++) if (!covered[y * W + x]) throw new Error(`pixel ${x},${y} not covered (${W}×${H}, box ${[x0, y0, x1, y1]}, size ${size})`);
    }
  });

  it('spreads overlapping tiles evenly when the covering strip is longer than the frame', () => {
    // 3 tiles of 400 over 1000 pixels: starts 0, 300, 600.
    expect(tileAxisStarts(5, 999, 400, 1000)).toEqual([0, 300, 600]);
  });
});

describe('tileModeCheck', () => {
  it('names the setting and its range', () => {
    expect(tileModeCheck({ kind: 'crop', padding: -1 })).toEqual({ ok: false, error: 'padding must be a whole number of pixels 0..8192, got -1' });
    expect(tileModeCheck({ kind: 'tile', size: 4 })).toEqual({ ok: false, error: 'tile size must be a whole number of pixels 8..8192, got 4' });
    expect(tileModeCheck({ kind: 'tile', size: 512 }).ok).toBe(true);
  });
});
