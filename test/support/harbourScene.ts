import type { LabelMap } from '../../src/core/labelMap.ts';
import { paintEllipse, paintLine, paintPolygon, paintRect, rngCreate, rngInt, type Canvas } from './paint.ts';

/**
 * Label maps of the invented "Kestrel Quay" harbour yard for benchmarks and tests: large regions
 * (sky, water, quay), stacked containers with thin gaps, crane lattices, thin poles, small blobs
 * (bollards, people), markings, and void (a foreground strip, blobs, outlines).
 */
export const HARBOUR_CLASSES = [
  'sky', 'water', 'quay', 'shed', 'container', 'crane', 'ship', 'bollard', 'pole', 'person', 'vehicle', 'marking',
] as const;
/** Void id of the harbour scenes. */
export const HARBOUR_VOID = 255;

const C = Object.fromEntries(HARBOUR_CLASSES.map((name, id) => [name, id])) as Record<(typeof HARBOUR_CLASSES)[number], number>;

/** Returns a seeded harbour ground-truth map of width × height (8-bit ids 0..11, void 255). */
export function harbourTruth(width: number, height: number, seed: number): LabelMap {
  const rng = rngCreate(seed);
  const c: Canvas = { width, height, ids: new Uint8Array(width * height) };
  const horizon = (x: number) => height * 0.34 + 18 * Math.sin(x / 170 + seed) + 6 * Math.sin(x / 37);
  const shore = (y: number) => width * 0.42 + 50 * Math.sin(y / 90 + seed) + 12 * Math.sin(y / 23);
  for (let y = 0; y < height; y++) {
    const sx = shore(y);
    for (let x = 0; x < width; x++) c.ids[y * width + x] = y < horizon(x) ? C.sky : x < sx ? C.water : C.quay;
  }
  const ground = (x: number) => Math.round(horizon(x));
  for (let j = 0; j < 6; j++) {
    const x0 = rngInt(rng, 0, width - 200), w = rngInt(rng, 80, 260), h = rngInt(rng, 60, 160), g = ground(x0) + 10;
    paintRect(c, x0, g - h, x0 + w, g, C.shed);
    paintPolygon(c, [x0, g - h, x0 + w / 2, g - h - rngInt(rng, 10, 50), x0 + w, g - h], C.shed);
  }
  const hull = width * 0.1, hy = height * 0.55;
  paintPolygon(c, [hull, hy, hull + width * 0.25, hy, hull + width * 0.23, hy + 70, hull + 30, hy + 70], C.ship);
  paintRect(c, hull + 60, hy - 60, hull + 200, hy + 1, C.ship);
  for (let s = 0; s < 5; s++) {
    const x0 = width * 0.5 + s * width * 0.09, base = height * 0.78, cols = rngInt(rng, 1, 3);
    for (let r = 0; r < rngInt(rng, 2, 5); r++) {
      for (let q = 0; q < cols; q++) paintRect(c, x0 + q * 62, base - (r + 1) * 34, x0 + q * 62 + 60, base - r * 34 - 2, C.container);
    }
  }
  for (let k = 0; k < 2; k++) {
    const x0 = width * (0.55 + 0.25 * k), top = height * 0.12, foot = height * 0.7;
    paintRect(c, x0, top, x0 + 9, foot, C.crane);
    paintRect(c, x0 + 90, top, x0 + 99, foot, C.crane);
    paintRect(c, x0 - 260, top, x0 + 160, top + 7, C.crane);
    for (let b = 0; b < 6; b++) paintLine(c, x0 + 4, top + b * 60, x0 + 94, top + (b + 1) * 60, 3, C.crane);
  }
  for (let j = 0; j < 16; j++) {
    const x = rngInt(rng, width * 0.45, width - 5), foot = rngInt(rng, height * 0.6, height * 0.95);
    paintRect(c, x, foot - rngInt(rng, 100, 320), x + rngInt(rng, 2, 3), foot, C.pole);
  }
  for (let j = 0; j < 24; j++) paintEllipse(c, rngInt(rng, width * 0.46, width), rngInt(rng, height * 0.8, height), 5, 5, C.bollard);
  for (let j = 0; j < 26; j++) paintEllipse(c, rngInt(rng, width * 0.46, width), rngInt(rng, height * 0.6, height), 4, 11, C.person);
  for (let j = 0; j < 8; j++) {
    const x = rngInt(rng, width * 0.5, width - 80), y = rngInt(rng, height * 0.8, height - 40);
    paintRect(c, x, y, x + 70, y + 28, C.vehicle);
  }
  for (let j = 0; j < 40; j++) {
    const x = rngInt(rng, width * 0.46, width - 40), y = rngInt(rng, height * 0.72, height);
    paintRect(c, x, y, x + 36, y + 4, C.marking);
  }
  paintRect(c, 0, height - Math.round(height * 0.03), width, height, HARBOUR_VOID);
  for (let j = 0; j < 5; j++) paintEllipse(c, rngInt(rng, 0, width), rngInt(rng, 0, height), rngInt(rng, 8, 40), rngInt(rng, 8, 30), HARBOUR_VOID);
  paintLine(c, hull, hy, hull + width * 0.25, hy, 2, HARBOUR_VOID);
  return { width, height, ids: c.ids };
}

/**
 * Returns a seeded prediction for `truth`: the truth under a smooth displacement of a few pixels
 * (boundaries drift), void filled with the class beside it, wrong-class blobs, and a few pixels
 * of an id outside the table (200) and of void, which count as invalid predictions.
 */
export function harbourPrediction(truth: LabelMap, seed: number, amplitude = 3): LabelMap {
  const { width, height } = truth;
  const rng = rngCreate(seed ^ 0x5bd1e995);
  const p1 = rng() * 6, p2 = rng() * 6, p3 = rng() * 6;
  const ids = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const dx = Math.round(amplitude * Math.sin(x / 83 + p1) * Math.cos(y / 57 + p2));
      const dy = Math.round(amplitude * Math.sin(y / 71 + p3) * Math.cos(x / 49 + p1));
      const sx = Math.min(width - 1, Math.max(0, x + dx)), sy = Math.min(height - 1, Math.max(0, y + dy));
      let v = truth.ids[sy * width + sx];
      if (v === HARBOUR_VOID) v = C.quay;
      ids[y * width + x] = v;
    }
  }
  const c: Canvas = { width, height, ids };
  for (let j = 0; j < 40; j++) {
    const r = rngInt(rng, 3, Math.max(4, Math.round(width / 50)));
    paintEllipse(c, rngInt(rng, 0, width), rngInt(rng, 0, height), r, rngInt(rng, 3, r + 3), rngInt(rng, 0, 11));
  }
  paintEllipse(c, width * 0.3, height * 0.5, 12, 6, 200);
  paintRect(c, width * 0.7, height * 0.2, width * 0.7 + 9, height * 0.2 + 5, HARBOUR_VOID);
  return { width, height, ids };
}
