// The rasteriser and the background pass against plain per-pixel references: pixel-centre
// point-in-polygon (even-odd crossing rule) and a per-pixel ray–ground intersection.
import { describe, expect, it } from 'vitest';
import { demoCamera } from '../../src/demo/camera.ts';
import { groundClassAt, groundPass } from '../../src/demo/ground.ts';
import { drawState, faceState, rasterFacePolygon, rasterTargetCreate } from '../../src/demo/raster.ts';
import { Rng } from '../../src/demo/random.ts';

function insideEvenOdd(px: number, py: number, xs: number[], ys: number[]): boolean {
  let inside = false;
  for (let i = 0, j = xs.length - 1; i < xs.length; j = i++) {
    if (ys[i] <= py !== ys[j] <= py) {
      const x = xs[i] + ((py - ys[i]) * (xs[j] - xs[i])) / (ys[j] - ys[i]);
      if (px < x) inside = !inside;
    }
  }
  return inside;
}

describe('rasterFacePolygon', () => {
  it('fills exactly the pixels whose centre is inside the polygon (even-odd), convex or not', () => {
    const rng = new Rng(9);
    let total = 0;
    const W = 97;
    const H = 61;
    for (let trial = 0; trial < 40; trial++) {
      const n = 3 + rng.int(9);
      const xs: number[] = [];
      const ys: number[] = [];
      for (let i = 0; i < n; i++) {
        xs.push(rng.range(-15, W + 15));
        ys.push(rng.range(-10, H + 10));
      }
      const t = rasterTargetCreate(W, H, false);
      Object.assign(drawState, { f: 100, cx: W / 2, cy: H / 2, cls: 7, inst: 3 });
      Object.assign(faceState, { nx: 0, ny: 0, nz: 1, nd: 10, ux: 1, uy: 0, uz: 0, ou: 0, vx: 0, vy: 1, vz: 0, ov: 0 });
      rasterFacePolygon(t, Float64Array.from(xs), Float64Array.from(ys), n);
      const wrong: string[] = [];
      let filled = 0;
      for (let y = 0; y < H; y++) {
        for (let x = 0; x < W; x++) {
          const want = insideEvenOdd(x + 0.5, y + 0.5, xs, ys);
          if ((t.label[y * W + x] === 7) !== want) wrong.push(`(${x}, ${y})`);
          // plane z = 10 in camera space
          if (want && (filled++, Math.abs(t.depth[y * W + x] - 10) > 1e-9)) wrong.push(`depth (${x}, ${y})`);
        }
      }
      expect(wrong, `trial ${trial}`).toEqual([]);
      total += filled;
    }
    expect(total).toBeGreaterThan(40 * 500); // the polygons did cover pixels
  });

  it('keeps the nearer surface where two faces overlap', () => {
    const t = rasterTargetCreate(20, 20, false);
    Object.assign(drawState, { f: 10, cx: 10, cy: 10 });
    const square = [Float64Array.from([2, 18, 18, 2]), Float64Array.from([2, 2, 18, 18])] as const;
    Object.assign(drawState, { cls: 1, inst: 1 });
    Object.assign(faceState, { nx: 0, ny: 0, nz: 1, nd: 5 });
    rasterFacePolygon(t, square[0], square[1], 4);
    Object.assign(drawState, { cls: 2, inst: 2 });
    Object.assign(faceState, { nd: 9 });
    rasterFacePolygon(t, Float64Array.from([0, 20, 20, 0]), Float64Array.from([0, 0, 20, 20]), 4);
    expect(t.label[10 * 20 + 10]).toBe(1);
    expect(t.label[0]).toBe(2);
  });
});

describe('groundPass', () => {
  it('classifies every pixel as the ground point its ray hits (or sky above the horizon)', () => {
    for (const [frame, w, h] of [[0, 160, 80], [33, 211, 107]] as const) {
      const cam = demoCamera(frame, 48, w, h);
      const t = rasterTargetCreate(w, h, false);
      groundPass(t, cam);
      const wrong: string[] = [];
      const classes = new Set<number>();
      for (let y = 0; y < h; y++) {
        for (let x = 0; x < w; x++) {
          // ray through the pixel centre in world axes: right = (cos, 0, −sin), forward = (sin, 0, cos)
          const rx = (x + 0.5 - cam.cx) / cam.f;
          const ry = -(y + 0.5 - cam.cy) / cam.f;
          const i = y * w + x;
          if (ry >= -0.02 / cam.f) {
            if (t.label[i] !== 0) wrong.push(`sky (${x}, ${y})`);
            continue;
          }
          const s = cam.y / -ry;
          const X = cam.x + s * (rx * cam.cos + cam.sin);
          const Z = cam.z + s * (cam.cos - rx * cam.sin);
          if (t.label[i] !== groundClassAt(X, Z, s / cam.f)) wrong.push(`(${x}, ${y})`);
          if (Math.abs(t.depth[i] - s) > s * 1e-6) wrong.push(`depth (${x}, ${y})`); // stored as float32
          classes.add(t.label[i]);
        }
      }
      expect(wrong).toEqual([]);
      expect(classes.size).toBeGreaterThanOrEqual(3); // water, quay and rail at least
    }
  });
});
