// Datasets laid out the way practitioners keep them on disk (invented names, classes and colours),
// built from fixed seeds for the CLI, reference and browser tests of README "Your data".
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelMapToPng, rgbaToPng } from '../../src/core/png/encode.ts';
import { randomPair } from './randomMaps.ts';

/** Five invented classes with ids 1..5; the truth stores other ids, predictions store 0..4. */
export const YARD_CLASSES = [
  { id: 1, name: 'slab', color: '#7a6e5d' },
  { id: 2, name: 'hawser', color: '#c2a13a' },
  { id: 3, name: 'skiff', color: '#2f7f9e' },
  { id: 4, name: 'beacon', color: '#d4553b' },
  { id: 5, name: 'kelp', color: '#3f8f4a' },
] as const;

/** Stored truth id per class (two stored ids for class 1) and the stored ids that mean void. */
const TRUTH_STORED: Record<number, number> = { 1: 13, 2: 16, 3: 19, 4: 22, 5: 25 };
const TRUTH_VOID = [0, 2, 255];
/** A stored prediction id that the class table leaves out (counted wrong, with a warning). */
export const PRED_UNLISTED = 200;

/** classes.json of the remapped datasets: truthIds many → one and many → void, predictionIds 0..4 → 1..5. */
export function yardClassesJson(): string {
  const truthIds: Record<string, number | null> = { '14': 1 };
  for (const [c, s] of Object.entries(TRUTH_STORED)) truthIds[String(s)] = Number(c);
  for (const v of TRUTH_VOID) truthIds[String(v)] = null;
  const predictionIds: Record<string, number> = {};
  for (const c of YARD_CLASSES) predictionIds[String(c.id - 1)] = c.id;
  return JSON.stringify({ ignore: 255, classes: YARD_CLASSES, truthIds, predictionIds }, null, 2);
}

export function fileWrite(path: string, bytes: Uint8Array | string): void {
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, bytes);
}

/** A frame of the remapped datasets: class-id maps (void 255) and the stored maps written to disk. */
export interface YardFrame {
  key: string;
  site: string;
  truth: LabelMap;
  pred: LabelMap;
  storedTruth: LabelMap;
  storedPred: LabelMap;
}

/** Returns `count` seeded frames of width × height with the stored maps the remapped datasets write. */
export function yardFrames(count: number, width: number, height: number, seed: number): YardFrame[] {
  const ids = YARD_CLASSES.map((c) => c.id);
  return Array.from({ length: count }, (_, i) => {
    const { truth, pred } = randomPair(width, height, seed + i, { classIds: ids, ignore: 255, voids: true, shapes: 8 + i });
    const storedTruth = truth.ids.map((v, j) => (v === 255 ? TRUTH_VOID[j % 3] : v === 1 && j % 5 === 0 ? 14 : TRUTH_STORED[v]));
    const storedPred = pred.ids.map((v) => v - 1);
    // A corner of every prediction holds an id the table does not list.
    for (let y = 0; y < 3; y++) for (let x = 0; x < 3; x++) storedPred[y * width + x] = PRED_UNLISTED;
    return {
      key: `berth${String(i + 1).padStart(3, '0')}`,
      site: i % 2 ? 'north' : 'south',
      truth,
      pred,
      storedTruth: { width, height, ids: storedTruth },
      storedPred: { width, height, ids: storedPred },
    };
  });
}

/** Returns a plain gray photo of the frame (its truth ids scaled), as RGBA. */
export function yardPhoto(f: YardFrame): Uint8Array {
  const { width, height } = f.truth;
  const rgba = new Uint8Array(width * height * 4);
  for (let i = 0; i < width * height; i++) {
    const v = (f.truth.ids[i] * 40) & 255;
    rgba.set([v, 255 - v, (v * 3) & 255, 255], i * 4);
  }
  return rgba;
}

/**
 * Writes the "suffixed" convention under `root`: `gt/<site>/<key>_gt_class.png` (stored ids) beside
 * `_gt_color.png` (colour-coded), `_gt_inst.png` (16-bit instance ids) and `_gt_shapes.json` per frame,
 * flat `preds/<key>_pred.png` (ids 0..4), flat `photos/<key>_photo.png`, and classes.json.
 */
export function suffixedWrite(root: string, frames: YardFrame[]): void {
  for (const f of frames) {
    const { width, height } = f.truth;
    const t = join(root, 'gt', f.site, f.key);
    fileWrite(`${t}_gt_class.png`, labelMapToPng(f.storedTruth, { kind: 'gray', bitDepth: 8 }));
    const rgba = new Uint8Array(width * height * 4);
    for (let i = 0; i < width * height; i++) rgba.set([(f.truth.ids[i] * 51) & 255, 90, 17, 255], i * 4);
    fileWrite(`${t}_gt_color.png`, rgbaToPng(width, height, rgba));
    const inst = new Uint16Array(width * height).map((_, i) => f.truth.ids[i] * 1000 + (i % 7));
    fileWrite(`${t}_gt_inst.png`, labelMapToPng({ width, height, ids: inst }, { kind: 'gray', bitDepth: 16 }));
    fileWrite(`${t}_gt_shapes.json`, JSON.stringify({ shapes: [{ label: 'slab', points: [[0, 0], [3, 0], [3, 3]] }] }));
    fileWrite(join(root, 'preds', `${f.key}_pred.png`), labelMapToPng(f.storedPred, { kind: 'gray', bitDepth: 8 }));
    fileWrite(join(root, 'photos', `${f.key}_photo.png`), rgbaToPng(width, height, yardPhoto(f)));
  }
  fileWrite(join(root, 'classes.json'), yardClassesJson());
}
