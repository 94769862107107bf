// Yard workers in hi-vis vests, standing near the cranes or walking: flat figures turned to the
// camera, built from parts that do not overlap (trousers, vest, sleeves, head, helmet).
import { DEMO_CLASS } from './classes.ts';
import type { Material } from './draw.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

// x, z at time 0 and walking speed (m per frame)
const PEOPLE: readonly (readonly [number, number, number, number])[] = [
  [-9.6, 52, 0, 0], [-8.6, 54.6, 0.02, 0], [-12.2, 44, 0, -0.14], [-4.4, 71, 0, 0], [-10.4, 122, 0, 0.05],
  [8.9, 98, 0, -0.1], [-6.2, 178, 0, 0], [10.6, 30, 0, 0], [-12.6, 214, 0, 0], [-2.5, 27.5, 0.09, 0],
  [11.2, 140, 0, 0.06],
];

const VESTS = [[236, 112, 32], [212, 222, 56], [240, 150, 40]] as const;
const SHIRTS = [[70, 84, 110], [120, 120, 124], [40, 60, 90]] as const;
const SKINS = [[198, 150, 118], [150, 104, 78], [226, 184, 152], [110, 76, 58]] as const;
const HELMETS = [[236, 236, 232], [226, 196, 40], [224, 120, 36]] as const;

const TORSO = [-0.2, 0.86, 0.2, 0.86, 0.23, 1.44, 0.08, 1.5, -0.08, 1.5, -0.23, 1.44];
const ARM_L = [-0.31, 0.92, -0.222, 0.92, -0.238, 1.44, -0.3, 1.4];
const ARM_R = [0.222, 0.92, 0.31, 0.92, 0.3, 1.4, 0.238, 1.44];
const HEAD = [-0.07, 1.51, 0.07, 1.51, 0.1, 1.56, 0.1, 1.66, -0.1, 1.66, -0.1, 1.56];
const HELMET = [-0.12, 1.66, 0.12, 1.66, 0.1, 1.74, 0.04, 1.78, -0.04, 1.78, -0.1, 1.74];

function mat(kind: number, c: readonly number[], seed: number): Material {
  return { kind, r: c[0], g: c[1], b: c[2], seed };
}

/** Adds the people to the scene; returns their instance ids. */
export function peopleAdd(b: SceneBuilder): number[] {
  const rng = b.rng;
  const ids: number[] = [];
  for (const [x, z, vx, vz] of PEOPLE) {
    const seed = rng.int(1 << 30);
    const trousers = mat(MATERIAL.flat, [38, 42, 58], seed);
    const vest = mat(MATERIAL.hivis, rng.pick(VESTS), seed);
    const shirt = mat(MATERIAL.flat, rng.pick(SHIRTS), seed);
    const skin = mat(MATERIAL.flat, rng.pick(SKINS), seed);
    const helmet = mat(MATERIAL.flat, rng.pick(HELMETS), seed);
    const walking = vx !== 0 || vz !== 0;
    ids.push(
      b.add({
        cls: DEMO_CLASS.person,
        x,
        y: 0.9,
        z,
        r: 1,
        vx,
        vz,
        draw(d, ox, oz) {
          const px = x + ox;
          const pz = z + oz;
          const sw = walking ? 0.09 * Math.sin(Math.hypot(ox, oz) * 5) : 0;
          d.billboard(px, 0, pz, [-0.19 + sw, 0, -0.03 + sw, 0, -0.02, 0.86, -0.18, 0.86], 4, trousers, 1.8);
          d.billboard(px, 0, pz, [0.03 - sw, 0, 0.19 - sw, 0, 0.18, 0.86, 0.02, 0.86], 4, trousers, 1.8);
          d.billboard(px, 0, pz, TORSO, 6, vest, 1.5);
          d.billboard(px, 0, pz, ARM_L, 4, shirt, 1.8);
          d.billboard(px, 0, pz, ARM_R, 4, shirt, 1.8);
          d.billboard(px, 0, pz, HEAD, 6, skin, 1.8);
          d.billboard(px, 0, pz, HELMET, 6, helmet, 1.8);
        },
      }),
    );
  }
  return ids;
}
