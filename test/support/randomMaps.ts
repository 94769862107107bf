import type { LabelMap } from '../../src/core/labelMap.ts';
import { paintEllipse, paintRect, rngCreate, rngInt, type Canvas } from './paint.ts';

/** Options for randomPair: the ids to paint, the void id, and ids outside the table for predictions. */
export interface RandomPairOptions {
  classIds: number[];
  ignore: number;
  /** Ids that are no class, painted into predictions as blobs (they count as invalid). */
  invalidIds?: number[];
  /** Paint void blobs, strips and a frame edge into the truth. */
  voids?: boolean;
  sixteenBit?: boolean;
  /** Number of shapes per map. */
  shapes?: number;
}

function paintShapes(c: Canvas, rng: () => number, ids: number[], count: number): void {
  const { width, height } = c;
  for (let j = 0; j < count; j++) {
    const id = ids[rngInt(rng, 0, ids.length - 1)];
    const kind = rngInt(rng, 0, 3);
    // Shapes may start outside the image so masks touch and cross the border.
    const x = rngInt(rng, -3, width + 2), y = rngInt(rng, -3, height + 2);
    if (kind === 0) paintRect(c, x, y, x + rngInt(rng, 1, width / 2 + 1), y + rngInt(rng, 1, height / 2 + 1), id);
    else if (kind === 1) paintEllipse(c, x, y, rngInt(rng, 1, width / 3 + 1), rngInt(rng, 1, height / 3 + 1), id);
    else if (kind === 2) paintRect(c, x, 0, x + rngInt(rng, 1, 2), height, id); // thin pole
    else paintRect(c, x, y, x + rngInt(rng, 1, 3), y + rngInt(rng, 1, 3), id); // speck
  }
}

/**
 * Returns a seeded truth/prediction pair of width × height: random rectangles, ellipses, thin poles
 * and specks (shapes crossing the border), void blobs and strips in the truth, and a prediction
 * made of the truth with shifted and extra shapes and invalid-id blobs.
 */
export function randomPair(width: number, height: number, seed: number, o: RandomPairOptions): { truth: LabelMap; pred: LabelMap } {
  const rng = rngCreate(seed);
  const make = () => (o.sixteenBit ? new Uint16Array(width * height) : new Uint8Array(width * height));
  const t: Canvas = { width, height, ids: make() };
  t.ids.fill(o.classIds[0]);
  const shapes = o.shapes ?? 12;
  paintShapes(t, rng, o.classIds, shapes);
  if (o.voids) {
    paintEllipse(t, rngInt(rng, 0, width), rngInt(rng, 0, height), rngInt(rng, 1, 4), rngInt(rng, 1, 4), o.ignore);
    paintRect(t, 0, height - rngInt(rng, 1, 3), width, height, o.ignore); // strip along the bottom border
    const sx = rngInt(rng, 0, width - 1);
    paintRect(t, sx, 0, sx + 1, height, o.ignore); // one-pixel vertical void line
  }
  const p: Canvas = { width, height, ids: make() };
  const dx = rngInt(rng, -2, 2), dy = rngInt(rng, -2, 2);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const sx = Math.min(width - 1, Math.max(0, x + dx)), sy = Math.min(height - 1, Math.max(0, y + dy));
      const v = t.ids[sy * width + sx];
      p.ids[y * width + x] = v === o.ignore ? o.classIds[0] : v;
    }
  }
  paintShapes(p, rng, o.classIds, Math.ceil(shapes / 3));
  for (const id of o.invalidIds ?? []) paintEllipse(p, rngInt(rng, 0, width), rngInt(rng, 0, height), rngInt(rng, 1, 3), rngInt(rng, 1, 3), id);
  return { truth: { width, height, ids: t.ids }, pred: { width, height, ids: p.ids } };
}
