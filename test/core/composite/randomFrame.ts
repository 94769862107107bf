// Seeded random frames for the composite and viewer tests: blobby label maps (so there are real
// boundaries and void regions), predictions that are the truth with wrong, invalid and void blobs
// painted in, a noisy photo, and exact band bins.
import { classTableFromJson, type ClassTable } from '../../../src/core/classTable.ts';
import type { CompositeFrame } from '../../../src/core/composite/compositeFrame.ts';
import type { LabelIds, LabelMap } from '../../../src/core/labelMap.ts';
import { seededRandom } from '../png/seeded.ts';
import { bandBinsOf } from './bandBinsBrute.ts';

export interface RandomFrame {
  frame: CompositeFrame;
  table: ClassTable;
  /** Ids painted into predictions that are not classes (besides the ignore id). */
  strayIds: number[];
}

const COLORS = ['#3d7a9e', '#c9b458', '#6d4f8f', '#8fbf6a', '#b0463c', '#4a4a52', '#d98c5f'];

/** Returns a table of classes with the given ids (colours from a fixed list) and `ignore`. */
export function tableOf(ids: number[], ignore: number): ClassTable {
  const r = classTableFromJson({
    ignore,
    classes: ids.map((id, i) => ({ id, name: `c${id}`, color: COLORS[i % COLORS.length] })),
  });
  if (!r.ok) throw new Error(r.error);
  return r.value;
}

function blobs(ids: LabelIds, width: number, height: number, rnd: () => number, count: number, pick: () => number): void {
  for (let k = 0; k < count; k++) {
    const id = pick();
    const cx = rnd() * width, cy = rnd() * height;
    const rx = 2 + rnd() * width * 0.25, ry = 2 + rnd() * height * 0.25;
    const square = rnd() < 0.4;
    const y0 = Math.max(0, Math.floor(cy - ry)), y1 = Math.min(height, Math.ceil(cy + ry));
    const x0 = Math.max(0, Math.floor(cx - rx)), x1 = Math.min(width, Math.ceil(cx + rx));
    for (let y = y0; y < y1; y++) {
      for (let x = x0; x < x1; x++) {
        const u = (x + 0.5 - cx) / rx, v = (y + 0.5 - cy) / ry;
        if (square || u * u + v * v <= 1) ids[y * width + x] = id;
      }
    }
  }
}

/** Returns a random frame of `width`×`height` with `runs` prediction runs; 16-bit ids when `wide`. */
export function frameRandom(
  seed: number,
  width: number,
  height: number,
  opts: { wide?: boolean; runs?: number; photo?: boolean; bins?: boolean; around?: boolean } = {},
): RandomFrame {
  const rnd = seededRandom(seed);
  const wide = opts.wide ?? false;
  const classIds = wide ? [0, 7, 300, 1000, 40000, 65000] : [0, 1, 2, 3, 5, 7];
  const ignore = wide ? 65535 : 255;
  const strayIds = wide ? [20000, 511] : [9, 200];
  const table = tableOf(classIds, ignore);
  const make = () => (wide ? new Uint16Array(width * height) : new Uint8Array(width * height));
  const pickClass = () => classIds[Math.floor(rnd() * classIds.length)];
  const truthIds = make();
  truthIds.fill(classIds[0]);
  const area = width * height;
  blobs(truthIds, width, height, rnd, 4 + Math.floor(area / 400), pickClass);
  blobs(truthIds, width, height, rnd, 1 + Math.floor(area / 3000), () => ignore);
  const truth: LabelMap = { width, height, ids: truthIds };
  const preds: Record<string, LabelMap> = {};
  for (let k = 0; k < (opts.runs ?? 2); k++) {
    const ids = make();
    ids.set(truthIds);
    blobs(ids, width, height, rnd, 2 + Math.floor(area / 600), pickClass);
    blobs(ids, width, height, rnd, 1 + Math.floor(area / 2500), () => (rnd() < 0.5 ? ignore : strayIds[Math.floor(rnd() * strayIds.length)]));
    // Scattered single-pixel errors, as noisy models make.
    for (let i = 0; i < area / 50; i++) ids[Math.floor(rnd() * area)] = pickClass();
    preds[`run${k + 1}`] = { width, height, ids };
  }
  let photo: Uint8Array | null = null;
  if (opts.photo ?? true) {
    photo = new Uint8Array(area * 4);
    for (let i = 0; i < area; i++) {
      const x = i % width, y = (i / width) | 0;
      photo[i * 4] = (x * 255) / Math.max(1, width - 1) * 0.7 + rnd() * 76;
      photo[i * 4 + 1] = (y * 255) / Math.max(1, height - 1) * 0.7 + rnd() * 76;
      photo[i * 4 + 2] = rnd() * 255;
      photo[i * 4 + 3] = rnd() < 0.1 ? Math.floor(rnd() * 255) : 255; // alpha is ignored by design
    }
  }
  const bandBins = (opts.bins ?? true) ? bandBinsOf(truth) : null;
  // Neighbouring frames' predictions (flicker): each run's map with a few blobs changed, and a
  // share of its pixels copied from the other neighbour so that flips back occur.
  let around: CompositeFrame['around'] = null;
  if (opts.around ?? true) {
    const prev: Record<string, LabelMap> = {}, next: Record<string, LabelMap> = {};
    for (const [run, map] of Object.entries(preds)) {
      const a = make(), b = make();
      a.set(truthIds);
      blobs(a, width, height, rnd, 2 + Math.floor(area / 500), pickClass);
      b.set(a);
      blobs(b, width, height, rnd, 1 + Math.floor(area / 1500), () => (rnd() < 0.3 ? ignore : pickClass()));
      for (let i = 0; i < area; i++) if (rnd() < 0.1) b[i] = map.ids[i];
      prev[run] = { width, height, ids: a };
      next[run] = { width, height, ids: b };
    }
    around = { prev, next };
  }
  return { frame: { photo, truth, preds, bandBins, around }, table, strayIds };
}
