// Small things on the quay: bollards along the edge, light masts (thin poles with a lamp head) and
// unlabelled clutter (pallets, cones, a lashing cage, hose coils) that the ground truth marks void.
import { DEMO_CLASS, DEMO_IGNORE } from './classes.ts';
import type { Material } from './draw.ts';
import { QUAY_EDGE_X } from './layout.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

const BOLLARD = [-0.18, 0, 0.18, 0, 0.16, 0.5, 0.3, 0.56, 0.3, 0.66, -0.3, 0.66, -0.3, 0.56, -0.16, 0.5];
const BOLLARD_CAP = [-0.3, 0.66, 0.3, 0.66, 0.26, 0.76, -0.26, 0.76];
const CONE = [-0.22, 0, 0.22, 0, 0.05, 0.72, -0.05, 0.72];
const MASTS: readonly (readonly [number, number])[] = [
  [15.2, 24], [15.2, 86], [15.2, 150], [15.2, 214], [15.2, 278], [15.2, 342], [41, 20], [41, 104], [41, 196],
];

function flat(r: number, g: number, b: number, seed: number): Material {
  return { kind: MATERIAL.flat, r, g, b, seed };
}

/** Adds bollards, light masts and clutter to the scene; returns nothing. */
export function propsAdd(b: SceneBuilder): void {
  const rng = b.rng;
  const iron = flat(40, 40, 44, 11);
  const yellow = flat(214, 180, 40, 12);
  for (let z = -6; z < 372; z += 18) {
    const x = QUAY_EDGE_X + 0.9;
    const zz = z + rng.range(-1, 1);
    b.add({
      cls: DEMO_CLASS.bollard, x, y: 0.4, z: zz, r: 0.6,
      draw(d) {
        d.billboard(x, 0, zz, BOLLARD, 8, iron, 0.8);
        d.billboard(x, 0, zz, BOLLARD_CAP, 4, yellow, 0.8);
      },
    });
  }
  const galv = flat(156, 160, 164, 13);
  const lamp = flat(208, 210, 200, 14);
  for (const [x, z] of MASTS) {
    b.add({
      cls: DEMO_CLASS.lightMast, x, y: 14, z, r: 15,
      draw(d) {
        d.box(x - 0.45, 0, z - 0.45, x + 0.45, 0.7, z + 0.45, galv, galv, galv);
        d.member(x, 0.7, z, x, 28.6, z, 0.26, galv);
        d.member(x - 1.7, 28.6, z, x + 1.7, 28.6, z, 0.1, galv);
        for (const dx of [-1.5, -0.5, 0.5, 1.5]) d.box(x + dx - 0.28, 27.9, z - 0.2, x + dx + 0.28, 28.5, z + 0.2, lamp, lamp, lamp);
      },
    });
  }
  clutterAdd(b);
}

function clutterAdd(b: SceneBuilder): void {
  const wood = flat(150, 112, 70, 21);
  const cage = flat(112, 118, 120, 22);
  const orange = flat(236, 96, 30, 23);
  const hose = flat(30, 30, 32, 24);
  for (const [x, z] of [[-9.4, 45], [-9.6, 107], [11.8, 64], [-12.2, 160]] as const) {
    const h = 1.2 + (b.rng.int(3) * 0.15);
    b.add({
      cls: DEMO_IGNORE, voidAs: DEMO_CLASS.container, x, y: h / 2, z, r: 1.2,
      draw(d) {
        d.box(x - 0.6, 0, z - 0.5, x + 0.6, h, z + 0.5, wood, wood, wood);
      },
    });
  }
  b.add({
    cls: DEMO_IGNORE, voidAs: DEMO_CLASS.container, x: -12.3, y: 0.6, z: 33, r: 3.3,
    draw(d) {
      d.box(-12.9, 0, 30, -11.7, 1.2, 36, cage, cage, cage);
    },
  });
  for (const [x, z] of [[-3.8, 16], [-3.8, 20], [-3.8, 24], [3.4, 62], [3.4, 66], [-4.2, 132]] as const) {
    b.add({
      cls: DEMO_IGNORE, voidAs: DEMO_CLASS.quay, x, y: 0.35, z, r: 0.4,
      draw(d) {
        d.billboard(x, 0, z, CONE, 4, orange, 0.72);
      },
    });
  }
  for (const z of [84, 230]) {
    b.add({
      cls: DEMO_IGNORE, voidAs: DEMO_CLASS.quay, x: -12.4, y: 0.2, z, r: 0.8,
      draw(d) {
        d.billboard(-12.4, 0, z, [-0.6, 0, 0.6, 0, 0.7, 0.2, 0.4, 0.38, -0.4, 0.38, -0.7, 0.2], 6, hose, 0.4);
      },
    });
  }
}
