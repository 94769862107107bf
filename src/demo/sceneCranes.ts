// Ship-to-shore cranes straddling the lanes: four legs on the crane rails, portal beams, an A-frame
// and a lattice boom reaching out over the water. Thin members on purpose: the diagonal bracing is
// a few pixels wide at yard distances, the hard case for segmentation.
import { DEMO_CLASS } from './classes.ts';
import type { Material } from './draw.ts';
import { CRANE_RAIL_X } from './layout.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

const PAINTS = [
  [226, 230, 232],
  [206, 84, 44],
  [52, 96, 160],
] as const;

const LEG_HALF_SPAN = 8; // legs at z0 ± 8 m
const SILL = 16;
const PORTAL = 44;
const BOOM_LO = 44;
const BOOM_HI = 49.5;
const BOOM_HALF = 3.5; // the two boom trusses at z0 ± 3.5 m
const BOOM_TIP = -62;
const BACKREACH = 31;

/** Adds the cranes to the scene; returns their instance ids. */
export function cranesAdd(b: SceneBuilder): number[] {
  const rng = b.rng;
  const ids: number[] = [];
  for (const zBase of [58, 118, 182, 246]) {
    const z0 = zBase + rng.range(-4, 4);
    const paint = rng.pick(PAINTS);
    const steel: Material = { kind: MATERIAL.flat, r: paint[0], g: paint[1], b: paint[2], seed: rng.int(1 << 30) };
    const house: Material = { ...steel, r: paint[0] * 0.92, g: paint[1] * 0.92, b: paint[2] * 0.92 };
    const cable: Material = { kind: MATERIAL.flat, r: 60, g: 60, b: 64, seed: 1 };
    const seg: number[] = [];
    const m = (ax: number, ay: number, az: number, bx: number, by: number, bz: number, r: number) =>
      seg.push(ax, ay, az, bx, by, bz, r);
    const [xw, xl] = CRANE_RAIL_X;
    for (const x of [xw, xl]) {
      for (const s of [-1, 1]) m(x, 1.5, z0 + s * LEG_HALF_SPAN, x, PORTAL + 1, z0 + s * LEG_HALF_SPAN, 0.75);
      m(x, SILL, z0 - LEG_HALF_SPAN, x, SILL, z0 + LEG_HALF_SPAN, 0.55);
      m(x, PORTAL, z0 - LEG_HALF_SPAN, x, PORTAL, z0 + LEG_HALF_SPAN, 0.6);
      // X bracing between the two legs on each rail
      m(x, SILL, z0 - LEG_HALF_SPAN, x, PORTAL, z0 + LEG_HALF_SPAN, 0.22);
      m(x, SILL, z0 + LEG_HALF_SPAN, x, PORTAL, z0 - LEG_HALF_SPAN, 0.22);
    }
    for (const s of [-1, 1]) {
      const z = z0 + s * LEG_HALF_SPAN;
      m(xw, SILL, z, xl, SILL, z, 0.6);
      m(xw, PORTAL, z, xl, PORTAL, z, 0.65);
    }
    for (const s of [-1, 1]) {
      const z = z0 + s * BOOM_HALF;
      m(BOOM_TIP, BOOM_LO, z, BACKREACH, BOOM_LO, z, 0.38);
      m(BOOM_TIP + 4, BOOM_HI, z, BACKREACH, BOOM_HI, z, 0.32);
      m(BOOM_TIP, BOOM_LO, z, BOOM_TIP + 4, BOOM_HI, z, 0.3);
      for (let x = BOOM_TIP + 4, k = 0; x < BACKREACH - 0.1; x += 5, k++) {
        const x2 = Math.min(BACKREACH, x + 5);
        if (k % 2 === 0) m(x, BOOM_HI, z, x2, BOOM_LO, z, 0.14);
        else m(x, BOOM_LO, z, x2, BOOM_HI, z, 0.14);
        m(x, BOOM_LO, z, x, BOOM_HI, z, 0.1);
      }
      // A-frame and stays
      const apexX = 2;
      m(xw, PORTAL, z, apexX, 74, z, 0.5);
      m(xl, PORTAL, z, apexX, 74, z, 0.5);
      m(apexX, 74, z, -34, BOOM_HI, z, 0.1);
      m(apexX, 74, z, -55, BOOM_HI, z, 0.1);
      m(apexX, 74, z, BACKREACH - 2, BOOM_HI, z, 0.12);
    }
    for (let x = BOOM_TIP + 4; x < BACKREACH; x += 10) m(x, BOOM_LO, z0 - BOOM_HALF, x, BOOM_LO, z0 + BOOM_HALF, 0.12);
    m(2, 74, z0 - BOOM_HALF, 2, 74, z0 + BOOM_HALF, 0.35);
    // trolley hoist ropes and spreader over the lane below
    const trolleyX = rng.range(-40, -14);
    const hookY = rng.range(14, 30);
    for (const s of [-1, 1]) m(trolleyX, BOOM_LO - 1.8, z0 + s * 1.2, trolleyX, hookY + 0.5, z0 + s * 1.2, 0.05);
    const segs = Float64Array.from(seg);
    const rubber: Material = { kind: MATERIAL.flat, r: 44, g: 44, b: 46, seed: 2 };
    ids.push(
      b.add({
        cls: DEMO_CLASS.crane,
        x: (BOOM_TIP + BACKREACH) / 2,
        y: 37,
        z: z0,
        r: 62,
        draw(d) {
          for (let i = 0; i < segs.length; i += 7) {
            const mat = segs[i + 6] <= 0.05 ? cable : steel;
            d.member(segs[i], segs[i + 1], segs[i + 2], segs[i + 3], segs[i + 4], segs[i + 5], segs[i + 6], mat);
          }
          for (const x of [xw, xl]) {
            for (const s of [-1, 1]) d.box(x - 0.9, 0.1, z0 + s * LEG_HALF_SPAN - 2.8, x + 0.9, 1.6, z0 + s * LEG_HALF_SPAN + 2.8, rubber, rubber, rubber);
          }
          d.box(15, BOOM_HI, z0 - 4.5, 27, BOOM_HI + 5, z0 + 4.5, house, house, house);
          d.box(trolleyX - 2, BOOM_LO - 2, z0 - 2.4, trolleyX + 2, BOOM_LO, z0 + 2.4, house, house, house);
          d.box(trolleyX - 2.5, hookY - 0.4, z0 - 6, trolleyX + 2.5, hookY + 0.5, z0 + 6, steel, steel, steel);
        },
      }),
    );
  }
  return ids;
}
