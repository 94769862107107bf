// Terminal tractors with trailers, some carrying a container (its own instance, class container),
// parked under the cranes or driving the lanes at a steady speed.
import { DEMO_CLASS } from './classes.ts';
import type { Drawer, Material } from './draw.ts';
import { LANE_X } from './layout.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';
import { CONTAINER_COLORS, containerLooks } from './sceneYard.ts';

interface TruckPlan {
  x: number;
  /** Z of the cab front at time 0. */
  zf: number;
  /** +1 faces +Z, −1 faces −Z. */
  dir: 1 | -1;
  /** Speed along Z, m per frame. */
  v: number;
  loaded: boolean;
  paint: readonly [number, number, number];
}

const TRUCKS: readonly TruckPlan[] = [
  { x: LANE_X.underCrane, zf: 66, dir: 1, v: 0, loaded: true, paint: [176, 40, 34] },
  { x: LANE_X.oncoming, zf: 150, dir: -1, v: -1.2, loaded: true, paint: [222, 222, 216] },
  { x: LANE_X.ours + 0.3, zf: 62, dir: 1, v: 0.85, loaded: true, paint: [40, 84, 150] },
  { x: LANE_X.underCrane, zf: 150, dir: 1, v: 0, loaded: false, paint: [220, 178, 36] },
  { x: LANE_X.oncoming, zf: 268, dir: -1, v: -0.5, loaded: true, paint: [56, 120, 70] },
];

const LOAD_START = 4.6;
const LOAD_END = 16.8;

/** Returns [lo, hi] of a Z interval given as distances behind the cab front. */
function along(zf: number, dir: number, a: number, b: number): [number, number] {
  const p = zf - dir * a;
  const q = zf - dir * b;
  return p < q ? [p, q] : [q, p];
}

/** Adds the trucks (and their loads) to the scene; returns the truck instance ids. */
export function trucksAdd(b: SceneBuilder): number[] {
  const rng = b.rng;
  const ids: number[] = [];
  const rubber: Material = { kind: MATERIAL.flat, r: 34, g: 34, b: 36, seed: 3 };
  const chassis: Material = { kind: MATERIAL.flat, r: 58, g: 58, b: 62, seed: 4 };
  const glass: Material = { kind: MATERIAL.glass, r: 40, g: 50, b: 60, seed: 5 };
  for (const t of TRUCKS) {
    const [r, g, bl] = t.paint;
    const paint: Material = { kind: MATERIAL.flat, r, g, b: bl, seed: rng.int(1 << 30) };
    const sphereZ = t.zf - t.dir * 8.5;
    const drawTruck = (d: Drawer, ox: number, oz: number) => {
      const zf = t.zf + oz;
      const x = t.x + ox;
      const [c0, c1] = along(zf, t.dir, 0, 2.4);
      d.box(x - 1.25, 0.9, c0, x + 1.25, 3.2, c1, paint, paint, paint);
      const zg = zf + t.dir * 0.03;
      const pts = [x - 1.05, 2.0, zg, x + 1.05, 2.0, zg, x + 1.05, 3.0, zg, x - 1.05, 3.0, zg];
      d.face(pts, 4, x - 1.05, 2.0, zg, 1, 0, 0, 0, 1, 0, 0, 0, t.dir, glass, 2.1, 1);
      const [h0, h1] = along(zf, t.dir, 0.1, 5.5);
      d.box(x - 1.1, 0.5, h0, x + 1.1, 1.2, h1, chassis, chassis, chassis);
      const [l0, l1] = along(zf, t.dir, 4.5, 17);
      d.box(x - 1.2, 1.1, l0, x + 1.2, 1.45, l1, chassis, chassis, chassis);
      for (const a of [1.2, 4.6, 14.4, 15.7]) {
        const [w0, w1] = along(zf, t.dir, a - 0.5, a + 0.5);
        d.box(x - 1.28, 0, w0, x - 0.85, 1.05, w1, rubber, rubber, rubber);
        d.box(x + 0.85, 0, w0, x + 1.28, 1.05, w1, rubber, rubber, rubber);
      }
    };
    ids.push(b.add({ cls: DEMO_CLASS.truck, x: t.x, y: 2, z: sphereZ, r: 9.5, vz: t.v, draw: drawTruck }));
    if (t.loaded) {
      const [side, end, top] = containerLooks(rng.pick(CONTAINER_COLORS), rng.int(1 << 30), rng.next() < 0.4);
      b.add({
        cls: DEMO_CLASS.container,
        x: t.x,
        y: 2.7,
        z: t.zf - t.dir * 10.7,
        r: 6.6,
        vz: t.v,
        draw(d, ox, oz) {
          const [z0, z1] = along(t.zf + oz, t.dir, LOAD_START, LOAD_END);
          d.box(t.x + ox - 1.22, 1.45, z0, t.x + ox + 1.22, 4.04, z1, side, end, top);
        },
      });
    }
  }
  return ids;
}
