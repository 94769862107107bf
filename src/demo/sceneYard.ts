// The container yard: blocks of stacked 40 ft and 20 ft boxes beside the lanes, one instance per box.
import { DEMO_CLASS } from './classes.ts';
import { FACE, type Material } from './draw.ts';
import { YARD_X } from './layout.ts';
import type { SceneBuilder } from './scene.ts';
import { MATERIAL } from './shade.ts';

/** Box colours of the yard: weathered paints a harbour is full of. */
export const CONTAINER_COLORS: readonly (readonly [number, number, number])[] = [
  [150, 52, 38], [38, 72, 126], [32, 108, 112], [122, 126, 130], [212, 214, 208], [200, 156, 42],
  [60, 108, 62], [196, 94, 38], [108, 72, 50], [140, 42, 66], [74, 138, 176],
];

const BOX_W = 2.44;
const BOX_H = 2.59;
const ROW_PITCH = 2.54;
const BAY_PITCH = 12.9;
const LONG = 12.19;
const SHORT = 6.06;

const BLOCKS = [
  { x0: YARD_X, z0: -40, rows: 6, bays: 8, lo: 1, hi: 4 },
  { x0: YARD_X, z0: 80, rows: 6, bays: 7, lo: 1, hi: 4 },
  { x0: YARD_X, z0: 184, rows: 6, bays: 5, lo: 1, hi: 3 },
  { x0: YARD_X + 23, z0: -40, rows: 7, bays: 17, lo: 2, hi: 5 },
] as const;

/** Returns the three looks (side, end, top) of a container painted `rgb`. */
export function containerLooks(rgb: readonly [number, number, number], seed: number, logo: boolean): [Material, Material, Material] {
  const [r, g, b] = rgb;
  return [
    { kind: MATERIAL.containerSide, r, g, b, seed, logo: logo ? 1 : 0 },
    { kind: MATERIAL.containerEnd, r, g, b, seed },
    { kind: MATERIAL.flat, r: r * 0.9, g: g * 0.9, b: b * 0.9, seed },
  ];
}

/** Adds the container stacks of the yard to the scene; returns nothing. */
export function containersAdd(b: SceneBuilder): void {
  const rng = b.rng;
  for (const blk of BLOCKS) {
    const tiers: number[][] = [];
    for (let r = 0; r < blk.rows; r++) {
      tiers.push([]);
      for (let c = 0; c < blk.bays; c++) {
        const empty = rng.next() < 0.06;
        tiers[r].push(empty ? 0 : blk.lo + rng.int(blk.hi - blk.lo + 1));
      }
    }
    for (let r = 0; r < blk.rows; r++) {
      for (let c = 0; c < blk.bays; c++) {
        const n = tiers[r][c];
        const twenty = rng.next() < 0.25;
        const x0 = blk.x0 + r * ROW_PITCH;
        const zBay = blk.z0 + c * BAY_PITCH;
        for (let k = 0; k < n; k++) {
          let hide = 0;
          if (k < n - 1) hide |= FACE.top;
          if (r > 0 && tiers[r - 1][c] > k) hide |= FACE.minusX;
          if (r < blk.rows - 1 && tiers[r + 1][c] > k) hide |= FACE.plusX;
          const parts = twenty ? [[zBay, zBay + SHORT], [zBay + LONG - SHORT, zBay + LONG]] : [[zBay, zBay + LONG]];
          for (const [z0, z1] of parts) addBox(b, x0, k * BOX_H, z0, z1, hide);
        }
      }
    }
  }
}

function addBox(b: SceneBuilder, x0: number, y0: number, z0: number, z1: number, hide: number): void {
  const rng = b.rng;
  const base = rng.pick(CONTAINER_COLORS);
  const j = 0.9 + 0.18 * rng.next();
  const [side, end, top] = containerLooks([base[0] * j, base[1] * j, base[2] * j], rng.int(1 << 30), rng.next() < 0.3);
  const x1 = x0 + BOX_W;
  const y1 = y0 + BOX_H;
  b.add({
    cls: DEMO_CLASS.container,
    x: (x0 + x1) / 2,
    y: (y0 + y1) / 2,
    z: (z0 + z1) / 2,
    r: Math.hypot(BOX_W, BOX_H, z1 - z0) / 2,
    draw(d, ox, oz) {
      d.box(x0 + ox, y0, z0 + oz, x1 + ox, y1, z1 + oz, side, end, top, hide);
    },
  });
}
