// Ghosts: shapes that exist only in predictions (hallucinations). The true scene never draws them;
// a prediction run switches some on for a stretch of frames, giving each its ghost class.
import { DEMO_CLASS } from './classes.ts';
import type { Material } from './draw.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

/** Ghost names, used by the prediction plans to pick them. */
export const GHOST = { person: 'person', yardTruck: 'yardTruck', puddle: 'puddle', bollard: 'bollard', shrub: 'shrub' } as const;
export type GhostName = keyof typeof GHOST;

/** Adds the ghosts; returns their instance ids by name. */
export function ghostsAdd(b: SceneBuilder): Record<GhostName, number> {
  const m: Material = { kind: MATERIAL.flat, r: 128, g: 128, b: 128, seed: 0 };
  const blob = (x: number, z: number, w: number, h: number, cls: number) =>
    b.add({
      cls, ghostCls: cls, x, y: h / 2, z, r: Math.max(w, h),
      draw(d) {
        d.billboard(x, 0, z, [-w / 2, 0, w / 2, 0, w * 0.45, h * 0.8, w * 0.2, h, -w * 0.25, h * 0.95, -w * 0.5, h * 0.7], 6, m, h);
      },
    });
  const puddleXZ = [2, 19, 5.5, 18.5, 6.4, 22, 4, 24.5, 1.6, 23];
  return {
    person: blob(12, 58, 0.5, 1.7, DEMO_CLASS.person),
    yardTruck: b.add({
      cls: DEMO_CLASS.truck, ghostCls: DEMO_CLASS.truck, x: 21.9, y: 1.6, z: 44, r: 4,
      draw(d) {
        d.box(21.85, 0, 40.5, 21.95, 3.2, 47.5, m, m, m);
      },
    }),
    puddle: b.add({
      cls: DEMO_CLASS.water, ghostCls: DEMO_CLASS.water, x: 4, y: 0, z: 21.5, r: 4,
      draw(d) {
        d.ground(puddleXZ, 5, 0.03, m);
      },
    }),
    bollard: blob(-13.1, 63, 0.55, 0.8, DEMO_CLASS.bollard),
    shrub: blob(23.6, 302, 3, 2.2, DEMO_CLASS.vegetation),
  };
}
