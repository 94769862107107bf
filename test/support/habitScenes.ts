import { classTableGenerated } from '../../src/core/classTable.ts';
import { frameJobScore, type FrameJobResult } from '../../src/core/frameJob.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { paintEllipse, paintRect, rngCreate, rngInt, type Canvas } from './paint.ts';

/** An integer in [round(lo), round(hi)]: positions here are whole pixels. */
const ri = (rng: () => number, lo: number, hi: number) => rngInt(rng, Math.round(lo), Math.round(hi));

/**
 * Seeded yard scenes with planted label mistakes and model errors, for measuring the likely-label-
 * mistake ranking: each frame has a true scene (what the photo shows), a label (the true scene with at
 * most one planted mistake) and runs (the true scene with boundary wobble, independent blobs of wrong
 * classes and, where asked, a habit: every shed read as a container).
 */
export const SCENE_CLASS = { sky: 0, ground: 1, building: 2, container: 3, truck: 4, person: 5, tree: 6, shed: 2 } as const;
const C = SCENE_CLASS;
export const SCENE_VOID = 255;

export interface SceneOptions {
  seed: number;
  frames: number;
  runs: number;
  /** The habit: in frames drawn with this chance, the first habitRuns runs (default all) read the frame's shed (a building) as a container. */
  habitShare: number;
  habitRuns?: number;
  photos: boolean;
  width?: number;
  height?: number;
}

/** One planted label mistake: where it is and what the label says instead of the truth. */
export interface PlantedMistake {
  frame: string;
  bbox: [number, number, number, number];
  trueClass: number;
  labelledClass: number;
}

export interface HabitScene {
  results: FrameJobResult[];
  mistakes: PlantedMistake[];
  /** Frames and boxes of the habit (model errors every run makes while the label is right). */
  habits: { frame: string; bbox: [number, number, number, number] }[];
}

interface Obj { cls: number; x0: number; y0: number; x1: number; y1: number; shed?: boolean; round?: boolean; tint: number }

// Photo colours (sRGB) per class; containers come in several paints, as they do.
const PAINT: Record<number, [number, number, number][]> = {
  [C.sky]: [[150, 190, 225]], [C.ground]: [[118, 116, 110]], [C.building]: [[140, 112, 92]],
  [C.container]: [[200, 90, 40], [40, 90, 170], [180, 40, 40], [60, 140, 80]], [C.truck]: [[230, 200, 40]],
  [C.person]: [[210, 80, 140]], [C.tree]: [[60, 120, 50]],
};

function objects(rng: () => number, w: number, h: number): Obj[] {
  const horizon = Math.round(h * 0.35), out: Obj[] = [];
  const add = (o: Omit<Obj, 'tint'>) => out.push({ ...o, tint: ri(rng, 0, 3) });
  // A building across the back, a shed in front of it, containers, a truck, people, a tree.
  const bx = ri(rng, 0, w * 0.2);
  add({ cls: C.building, x0: bx, y0: horizon - ri(rng, 12, 24), x1: bx + ri(rng, w * 0.3, w * 0.45), y1: horizon + 10 });
  const sx = ri(rng, w * 0.05, w * 0.75);
  add({ cls: C.building, shed: true, x0: sx, y0: horizon - 6, x1: sx + ri(rng, 26, 36), y1: horizon + ri(rng, 16, 22) });
  for (let k = 0; k < 3; k++) {
    const x = ri(rng, 4, w - 40), y = ri(rng, horizon + 22, h - 30);
    add({ cls: C.container, x0: x, y0: y, x1: x + ri(rng, 22, 34), y1: y + ri(rng, 12, 16) });
  }
  const tx = ri(rng, 4, w - 34), ty = ri(rng, h - 28, h - 18);
  add({ cls: C.truck, x0: tx, y0: ty, x1: tx + ri(rng, 20, 28), y1: ty + 12 });
  for (let k = 0; k < 2; k++) {
    const x = ri(rng, 4, w - 10), y = ri(rng, horizon + 14, h - 20);
    add({ cls: C.person, x0: x, y0: y, x1: x + 6, y1: y + 14, round: true });
  }
  const gx = ri(rng, w * 0.8, w - 16);
  add({ cls: C.tree, x0: gx, y0: horizon - 16, x1: gx + 14, y1: horizon + 6, round: true });
  return out;
}

function paintObj(c: Canvas, o: Obj, cls: number): void {
  if (o.round) paintEllipse(c, (o.x0 + o.x1) / 2, (o.y0 + o.y1) / 2, (o.x1 - o.x0) / 2, (o.y1 - o.y0) / 2, cls);
  else paintRect(c, o.x0, o.y0, o.x1, o.y1, cls);
}

function background(w: number, h: number): Uint8Array {
  const ids = new Uint8Array(w * h).fill(C.ground);
  ids.fill(C.sky, 0, Math.round(h * 0.35) * w);
  return ids;
}

/** Renders the photo of a true map: class paint (the object's tint for containers) with class texture and frame lighting. */
function photoOf(truth: Uint8Array, inst: Int16Array, objs: Obj[], w: number, h: number, rng: () => number): Uint8Array {
  const rgba = new Uint8Array(w * h * 4);
  const light = 0.85 + 0.3 * rng();
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      const i = y * w + x, cls = truth[i], o = inst[i] >= 0 ? objs[inst[i]] : null;
      const paints = PAINT[cls];
      const base = paints[o ? o.tint % paints.length : 0];
      // Texture: windows on buildings, ribs on containers, grain elsewhere.
      let t = (rng() - 0.5) * 14;
      if (cls === C.building && (x % 6 < 2) && (y % 7 < 3)) t -= 45;
      if (cls === C.container && x % 4 === 0) t -= 25;
      if (cls === C.tree) t += (rng() - 0.5) * 40;
      for (let k = 0; k < 3; k++) rgba[i * 4 + k] = Math.max(0, Math.min(255, Math.round(base[k] * light + t)));
      rgba[i * 4 + 3] = 255;
    }
  }
  return rgba;
}

/** Returns the scored frames of a generated scene, its planted mistakes and the habit's places. */
export function habitSceneBuild(o: SceneOptions): HabitScene {
  const w = o.width ?? 192, h = o.height ?? 128;
  const rng = rngCreate(o.seed);
  const table = classTableGenerated(-1, SCENE_VOID);
  const png = (ids: Uint8Array) => labelMapToPng({ width: w, height: h, ids } as LabelMap, { kind: 'gray', bitDepth: 8 });
  const mistakes: PlantedMistake[] = [], habits: HabitScene['habits'] = [], results: FrameJobResult[] = [];
  // Which frames get a mistake, and of which sort, fixed by the seed.
  const kinds = ['containerAsBuilding', 'truckAsContainer', 'personMissed', 'containerMissed', 'treeAsBuilding', 'fakeTruck'] as const;
  for (let f = 0; f < o.frames; f++) {
    const name = `s${String(f).padStart(3, '0')}`;
    const objs = objects(rng, w, h);
    const truth = background(w, h), inst = new Int16Array(w * h).fill(-1);
    objs.forEach((ob, k) => {
      paintObj({ width: w, height: h, ids: truth }, ob, ob.cls);
      paintObj({ width: w, height: h, ids: inst as unknown as Uint16Array }, ob, k);
    });
    // Half the frames carry one planted mistake, cycling through the sorts.
    const label = truth.slice();
    if (f % 2 === 1) {
      const kind = kinds[((f - 1) / 2) % kinds.length];
      const pick = (cls: number) => objs.filter((x) => x.cls === cls && !x.shed)[0];
      const plant = (ob: Obj, as: number, trueClass: number) => {
        paintObj({ width: w, height: h, ids: label }, ob, as);
        mistakes.push({ frame: name, bbox: [ob.x0, ob.y0, ob.x1, ob.y1], trueClass, labelledClass: as });
      };
      if (kind === 'containerAsBuilding') plant(pick(C.container), C.building, C.container);
      else if (kind === 'truckAsContainer') plant(pick(C.truck), C.container, C.truck);
      else if (kind === 'personMissed') plant(pick(C.person), C.ground, C.person);
      else if (kind === 'containerMissed') plant(pick(C.container), C.ground, C.container);
      else if (kind === 'treeAsBuilding') plant(pick(C.tree), C.building, C.tree);
      else {
        // A truck drawn in the label where the yard is empty (the first free place of a few tried): the photo shows ground.
        for (let attempt = 0; attempt < 20; attempt++) {
          const x = ri(rng, 4, w - 28), y = ri(rng, h * 0.45, h - 14);
          let free = true;
          for (let yy = y - 2; yy < y + 14; yy++) for (let xx = x - 2; xx < x + 24; xx++) if (truth[yy * w + xx] !== C.ground) free = false;
          if (!free) continue;
          plant({ cls: C.truck, x0: x, y0: y, x1: x + 22, y1: y + 12, tint: 0 }, C.truck, C.ground);
          break;
        }
      }
    }
    // The habit strikes in scattered frames (not a steady run of neighbours, which the steady signal already catches).
    const habit = rng() < o.habitShare;
    const preds = Array.from({ length: o.runs }, (_, r) => {
      const p = background(w, h);
      const c: Canvas = { width: w, height: h, ids: p };
      const habitHere = habit && r < (o.habitRuns ?? o.runs);
      for (const ob of objs) paintObj(c, ob, habitHere && ob.shed ? C.container : ob.cls);
      // Boundary wobble: objects drawn a pixel larger or smaller now and then.
      for (const ob of objs) if (rng() < 0.3) paintRect(c, ob.x0 - 1, ob.y0, ob.x0, ob.y1, ob.cls);
      // Independent model errors: a few blobs of a wrong class, in places of this run's own.
      for (let k = 0; k < 2; k++) paintEllipse(c, ri(rng, 8, w - 8), ri(rng, h * 0.4, h - 8), ri(rng, 4, 7), ri(rng, 4, 6), ri(rng, 2, 6));
      return p;
    });
    if (habit) for (const ob of objs) if (ob.shed) habits.push({ frame: name, bbox: [ob.x0, ob.y0, ob.x1, ob.y1] });
    const photo = o.photos ? photoOf(truth, inst, objs, w, h, rng) : null;
    results.push(frameJobScore({
      name, truth: { file: `truth/${name}.png`, bytes: png(label) },
      preds: preds.map((p, r) => ({ run: `run-${r + 1}`, file: { file: `run-${r + 1}/${name}.png`, bytes: png(p) } })),
      photoRgba: photo ? { file: `images/${name}.png`, width: w, height: h, rgba: photo } : null,
      table, settings: { ...DEFAULT_SCORE_SETTINGS, ignore: SCENE_VOID },
    }));
  }
  return { results, mistakes, habits };
}

type Box = readonly number[];
const area = (b: Box) => (b[2] - b[0]) * (b[3] - b[1]);
const overlap = (a: Box, b: Box) => Math.max(0, Math.min(a[2], b[2]) - Math.max(a[0], b[0])) * Math.max(0, Math.min(a[3], b[3]) - Math.max(a[1], b[1]));

/** Whether a box finds a planted mistake: same frame and IoU ≥ 0.3, or 80 % of either box inside the other (the rule of test/cli/suspects.test.ts). */
export function boxFinds(frame: string, b: Box, m: { frame: string; bbox: Box }): boolean {
  if (frame !== m.frame) return false;
  const i = overlap(b, m.bbox);
  return i / (area(b) + area(m.bbox) - i) >= 0.3 || i >= 0.8 * area(b) || i >= 0.8 * area(m.bbox);
}

/** Precision among the top M (M = planted mistakes) and recall of the mistakes within the top 2M. */
export function rankingFigures(queue: readonly { frame: string; bbox: Box }[], mistakes: readonly PlantedMistake[]): { precision: number; recall: number; m: number } {
  const m = mistakes.length;
  const top = queue.slice(0, m), top2 = queue.slice(0, 2 * m);
  const precision = top.filter((q) => mistakes.some((k) => boxFinds(q.frame, q.bbox, k))).length / Math.max(1, top.length);
  const recall = mistakes.filter((k) => top2.some((q) => boxFinds(q.frame, q.bbox, k))).length / Math.max(1, m);
  return { precision, recall, m };
}
