import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { rngCreate } from '../support/paint.ts';
import { randomPair } from '../support/randomMaps.ts';

// Seeded sequences and the runner of test/reference/objects_ref.py (scipy.ndimage.label with a 3×3
// structure for objects, numpy readings of the flip-back rate and of Cordts et al., CVPR 2016, §3.2).

const SCRIPT = fileURLToPath(new URL('./objects_ref.py', import.meta.url));
export const CLASS_IDS = [0, 1, 2, 3, 5];
export const IGNORE = 255;

export interface Frame { name: string; truth: LabelMap; pred: LabelMap; instances: Uint16Array }

export function sequenceMake(names: string[], w: number, h: number, seed: number, salt = 0): Frame[] {
  const { truth, pred } = randomPair(w, h, seed, { classIds: CLASS_IDS, ignore: IGNORE, invalidIds: [4, 200], voids: true, shapes: 14 });
  // Salt: single pixels of other classes, so objects touch only at corners (8- versus 4-connectivity).
  const saltRng = rngCreate(seed + 3);
  for (let i = 0; i < truth.ids.length; i++) if (saltRng() < salt) truth.ids[i] = CLASS_IDS[Math.floor(saltRng() * CLASS_IDS.length)];
  const other = randomPair(w, h, seed + 1, { classIds: CLASS_IDS, ignore: IGNORE, invalidIds: [4], voids: false, shapes: 10 }).pred;
  const rng = rngCreate(seed + 2);
  // Instances: blocks of 8×8 pixels numbered 1..6 over classes 1 and 2, none elsewhere.
  const instances = new Uint16Array(w * h).map((_, i) => (truth.ids[i] === 1 || truth.ids[i] === 2 ? 1 + (((i % w) >> 3) + ((i / w) >> 3) * 7) % 6 : 0));
  return names.map((name) => {
    const ids = pred.ids.map((v, i) => (rng() < 0.15 ? other.ids[i] : v));
    return { name, truth, pred: { width: w, height: h, ids }, instances };
  });
}

export function objectsRefRun(frames: Frame[]): Record<string, unknown> {
  const input = JSON.stringify({
    classIds: CLASS_IDS, ignore: IGNORE,
    frames: frames.map((f) => ({ name: f.name, width: f.truth.width, height: f.truth.height, truth: [...f.truth.ids], pred: [...f.pred.ids], instances: [...f.instances] })),
  });
  const r = spawnSync('python3', [SCRIPT], { input, encoding: 'utf8', maxBuffer: 1 << 28 });
  if (r.error || r.status !== 0) throw new Error(`objects_ref.py failed: ${r.error?.message ?? r.stderr}`);
  return JSON.parse(r.stdout) as Record<string, unknown>;
}

