import { describe, expect, it } from 'vitest';
import { demoCamera } from '../../src/demo/camera.ts';
import { hoodPass, hoodTop, photoFinish } from '../../src/demo/finish.ts';
import { hash3, Rng } from '../../src/demo/random.ts';
import { rasterTargetCreate } from '../../src/demo/raster.ts';

// Plain per-pixel version of photoFinish: clamped 5-tap blur, vignette, the same hashed grain.
function photoFinishReference(rgb: Float32Array, w: number, h: number, seed: number, frame: number): Uint8Array {
  const out = new Uint8Array(w * h * 3);
  const at = (x: number, y: number, k: number) => rgb[(Math.min(h - 1, Math.max(0, y)) * w + Math.min(w - 1, Math.max(0, x))) * 3 + k];
  const fseed = hash3(seed, frame, 77);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const r2 = ((x + 0.5 - w / 2) ** 2 + (y + 0.5 - h / 2) ** 2) / ((w / 2) ** 2 + (h / 2) ** 2);
      const hh = hash3(x, y, fseed);
      const lum = (((hh & 255) + ((hh >>> 8) & 255)) / 255 - 1) * 5;
      for (let k = 0; k < 3; k++) {
        const blur = (4 * at(x, y, k) + at(x - 1, y, k) + at(x + 1, y, k) + at(x, y - 1, k) + at(x, y + 1, k)) / 8;
        const v = blur * (1 - 0.22 * r2) + lum + (((hh >>> (16 + 5 * k)) & 31) - 15.5) * 0.08;
        out[(y * w + x) * 3 + k] = Math.min(255, Math.max(0, Math.round(v)));
      }
    }
  }
  return out;
}

describe('photoFinish', () => {
  it('matches the plain reference within rounding (±1)', () => {
    const rng = new Rng(4);
    const w = 37;
    const h = 23;
    const rgb = new Float32Array(w * h * 3).map(() => rng.range(-20, 280));
    const fast = photoFinish(rgb, w, h, 3, 8);
    const ref = photoFinishReference(rgb, w, h, 3, 8);
    let worst = 0;
    for (let i = 0; i < fast.length; i++) worst = Math.max(worst, Math.abs(fast[i] - ref[i]));
    expect(worst).toBeLessThanOrEqual(1);
  });

  it('adds grain that differs between frames', () => {
    const rgb = new Float32Array(16 * 16 * 3).fill(128);
    const a = photoFinish(rgb, 16, 16, 1, 0);
    const b = photoFinish(rgb, 16, 16, 1, 1);
    expect(a.some((v, i) => v !== b[i])).toBe(true);
  });
});

describe('hoodPass', () => {
  it('marks every pixel below the hood edge, and only those, with the given class', () => {
    const cam = demoCamera(0, 48, 120, 60);
    const t = rasterTargetCreate(120, 60, false);
    hoodPass(t, cam, 255);
    for (let y = 0; y < 60; y++) {
      for (let x = 0; x < 120; x++) expect(t.label[y * 120 + x] === 255).toBe(y + 0.5 >= hoodTop(cam, x));
    }
  });
});
