// Buildings: the warehouse, office and control tower at the quay end, and a strip of town along
// the far shores; trees between them and hills behind.
import { DEMO_CLASS } from './classes.ts';
import type { Material } from './draw.ts';
import { SHORE_FAR_Z, SHORE_LEFT_X } from './layout.ts';
import type { SceneBuilder } from './scene.ts';
import { hillsAdd, treeAdd } from './sceneGreen.ts';
import { MATERIAL } from './shade.ts';

const FACADES = [[206, 198, 180], [172, 176, 182], [184, 150, 120], [126, 134, 146], [220, 218, 210], [150, 92, 70]] as const;

function look(kind: number, c: readonly number[], seed: number): Material {
  return { kind, r: c[0], g: c[1], b: c[2], seed };
}

/** Adds one box-shaped building (one instance); returns its instance id. */
export function buildingAdd(
  b: SceneBuilder, x0: number, z0: number, x1: number, z1: number, h: number, wall: Material, roof: Material,
): number {
  return b.add({
    cls: DEMO_CLASS.building, x: (x0 + x1) / 2, y: h / 2, z: (z0 + z1) / 2, r: Math.hypot(x1 - x0, h, z1 - z0) / 2,
    draw(d) {
      d.box(x0, 0, z0, x1, h, z1, wall, wall, roof);
    },
  });
}

/** Adds buildings, trees and hills to the scene; returns nothing. */
export function buildingsAdd(b: SceneBuilder): void {
  const rng = b.rng;
  const roof = look(MATERIAL.flat, [118, 118, 116], 40);
  buildingAdd(b, 24, 300, 110, 362, 14, look(MATERIAL.corrugated, [98, 120, 142], 41), roof);
  buildingAdd(b, -2, 318, 16, 334, 24, look(MATERIAL.windows, [200, 190, 168], 42), roof);
  buildingAdd(b, -12, 290, -5, 297, 30, look(MATERIAL.windows, [226, 226, 220], 43), roof);
  buildingAdd(b, -12.5, 296.5, -4.5, 298.5, 34, look(MATERIAL.glass, [60, 70, 80], 44), roof);
  buildingAdd(b, -12, 345, -2, 362, 9, look(MATERIAL.flat, [150, 84, 64], 45), roof);
  for (const z of [258, 266, 275, 285, 294]) treeAdd(b, 20 + rng.range(-0.6, 0.6), z, rng.range(2.8, 4.2), rng.range(2.5, 4));
  for (const z of [304, 311, 338]) treeAdd(b, -9 + rng.range(-1, 1), z, rng.range(2.5, 3.6), rng.range(2, 3.5));
  // the far shores: a strip of town with trees in the gaps
  for (let z = 400; z < SHORE_FAR_Z; ) {
    const w = rng.range(16, 60);
    farAdd(b, SHORE_LEFT_X - 22, z, SHORE_LEFT_X, z + w, true);
    z += w + rng.range(4, 36);
  }
  for (let x = SHORE_LEFT_X; x < 1200; ) {
    const w = rng.range(16, 70);
    farAdd(b, x, SHORE_FAR_Z, x + w, SHORE_FAR_Z + 24, false);
    x += w + rng.range(4, 40);
  }
  hillsAdd(b);
}

// One far-shore building, sometimes with a tree in front of its shore-side face.
function farAdd(b: SceneBuilder, x0: number, z0: number, x1: number, z1: number, left: boolean): void {
  const rng = b.rng;
  const kind = rng.pick([MATERIAL.windows, MATERIAL.windows, MATERIAL.flat, MATERIAL.corrugated]);
  const h = rng.next() < 0.15 ? rng.range(30, 55) : rng.range(6, 24);
  buildingAdd(b, x0, z0, x1, z1, h, look(kind, rng.pick(FACADES), rng.int(1 << 30)), look(MATERIAL.flat, [110, 106, 100], 46));
  if (rng.next() < 0.45) {
    const crown = rng.range(4, 8);
    if (left) treeAdd(b, x1 + crown + 1, rng.range(z0, z1), crown, rng.range(2, 5));
    else treeAdd(b, rng.range(x0, x1), z0 - crown - 1, crown, rng.range(2, 5));
  }
}
