// Vegetation: trees with a noisy crown outline, and the wooded hills far behind the basin.
import { DEMO_CLASS } from './classes.ts';
import type { Material } from './draw.ts';
import { fbm2 } from './random.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

const CROWN_POINTS = 22;

/** Adds one tree (trunk and crown, one instance) standing at (x, z); returns its instance id. */
export function treeAdd(b: SceneBuilder, x: number, z: number, crown: number, trunk: number): number {
  const rng = b.rng;
  const seed = rng.int(1 << 30);
  const leaf: Material = { kind: MATERIAL.foliage, r: 62 + rng.int(20), g: 104 + rng.int(26), b: 52 + rng.int(14), seed };
  const bark: Material = { kind: MATERIAL.flat, r: 84, g: 66, b: 50, seed };
  const cy = trunk + crown * 0.8;
  const outline = new Float64Array(CROWN_POINTS * 2);
  for (let i = 0; i < CROWN_POINTS; i++) {
    const a = (i / CROWN_POINTS) * Math.PI * 2;
    const k = 0.78 + 0.4 * fbm2(Math.cos(a) * 1.7 + 3, Math.sin(a) * 1.7 + 3, seed, 2);
    outline[i * 2] = Math.cos(a) * crown * k;
    outline[i * 2 + 1] = cy + Math.sin(a) * crown * k * 0.9;
  }
  return b.add({
    cls: DEMO_CLASS.vegetation, x, y: cy, z, r: crown + cy,
    draw(d) {
      d.member(x, 0, z, x, trunk + crown * 0.3, z, 0.18, bark);
      d.billboard(x, 0, z, outline, CROWN_POINTS, leaf, cy + crown);
    },
  });
}

/** Adds the wooded hills (two long ridges: ahead and to the left); returns nothing. */
export function hillsAdd(b: SceneBuilder): void {
  const seed = b.rng.int(1 << 30);
  const mat: Material = { kind: MATERIAL.hills, r: 88, g: 112, b: 98, seed };
  const ahead = ridge(-6000, 6000, 120, 70, 190, seed);
  const zA = 3400;
  const ptsA = new Float64Array((ahead.length / 2) * 3);
  for (let i = 0; i < ahead.length / 2; i++) ptsA.set([ahead[i * 2], ahead[i * 2 + 1], zA], i * 3);
  b.add({
    cls: DEMO_CLASS.vegetation, x: 0, y: 100, z: zA, r: 6100,
    draw(d) {
      d.face(ptsA, ptsA.length / 3, 0, 0, zA, 1, 0, 0, 0, 1, 0, 0, 0, -1, mat, 12000, 300);
    },
  });
  const left = ridge(-400, 3400, 80, 40, 150, seed + 1);
  const xL = -2600;
  const ptsL = new Float64Array((left.length / 2) * 3);
  for (let i = 0; i < left.length / 2; i++) ptsL.set([xL, left[i * 2 + 1], left[i * 2]], i * 3);
  b.add({
    cls: DEMO_CLASS.vegetation, x: xL, y: 100, z: 1500, r: 2000,
    draw(d) {
      d.face(ptsL, ptsL.length / 3, xL, 0, 0, 0, 0, 1, 0, 1, 0, 1, 0, 0, mat, 4000, 300);
    },
  });
}

// A ridge outline from a to b along one axis: pairs (along, height), closed along the ground.
function ridge(a: number, b: number, step: number, base: number, amp: number, seed: number): Float64Array {
  const n = Math.floor((b - a) / step) + 1;
  const out = new Float64Array((n + 2) * 2);
  for (let i = 0; i < n; i++) {
    const p = a + i * step;
    out[i * 2] = p;
    out[i * 2 + 1] = base + amp * fbm2(p / 900, 0.5, seed, 3);
  }
  out.set([b, -20, a, -20], n * 2);
  return out;
}
