// One demo frame, generated alone from its index: photo, true scene, ground truth with the planned
// label mistakes, and both runs' predictions; then the same as PNG file bytes.
import { zlibSync } from 'fflate';
import { labelMapToPng, type ZlibCompress } from '../core/png/encode.ts';
import type { LabelMap } from '../core/labelMap.ts';
import { demoCamera } from './camera.ts';
import { demoPalette, DEMO_CLASS, DEMO_IGNORE } from './classes.ts';
import { photoFinish } from './finish.ts';
import { demoMistakePlan } from './mistakePlan.ts';
import { mistakesApply, type DemoMistake } from './mistakes.ts';
import { demoFrameName, type DemoOptions } from './options.ts';
import { photoRgbToPng } from './photoPng.ts';
import { predictionLabels } from './predict.ts';
import { sceneRender } from './render.ts';
import { DEMO_RUNS, type DemoRunName } from './runs.ts';
import { demoScene } from './scene.ts';

/** A frame as pixels: RGB photo, label maps and the truth's mistakes. */
export interface DemoFrameRaster {
  name: string;
  width: number;
  height: number;
  /** 8-bit RGB, width*height*3. */
  photo: Uint8Array;
  /** The true scene's classes, before label mistakes (what predictions are made from). */
  scene: LabelMap;
  /** Instance id per pixel of the true scene (0 = ground, sky, water). */
  instances: Uint16Array;
  /** The ground truth as written: the true scene with the label mistakes. */
  truth: LabelMap;
  preds: Record<DemoRunName, LabelMap>;
  mistakes: DemoMistake[];
}

/** A frame as file bytes. */
export interface DemoFrame {
  name: string;
  photoPng: Uint8Array;
  truthPng: Uint8Array;
  /** 16-bit instance ids of the true scene (0 = ground, sky, water), for instance-weighted IoU. */
  instancesPng: Uint8Array;
  predPngs: Record<DemoRunName, Uint8Array>;
  mistakes: DemoMistake[];
}

/** Label maps are long runs: fflate's fastest level is quick on them and runs anywhere. */
const labelZlib: ZlibCompress = (data) => zlibSync(data, { level: 1 });

/** Compressors for the frame's files: photos (noisy, little to match) and label maps (long runs). */
export interface DemoZlib {
  photo?: ZlibCompress;
  labels?: ZlibCompress;
}

/** Palette entries of run-b's PNGs: every class and the out-of-table ids the runs emit. */
const PRED_PALETTE_ENTRIES = 16;

function indexCheck(index: number, o: DemoOptions): void {
  if (!Number.isInteger(index) || index < 0 || index >= o.frames) {
    throw new RangeError(`demo frame index ${index} is outside 0..${o.frames - 1}`);
  }
}

/** Returns frame `index` (0-based) of the demo as pixels; options must be checked (demoOptionsCheck). */
export function demoFrameRaster(index: number, o: DemoOptions): DemoFrameRaster {
  indexCheck(index, o);
  const scene = demoScene(o.seed);
  const cam = demoCamera(index, o.frames, o.width, o.height);
  const name = demoFrameName(index);
  const render = sceneRender(scene, cam, { instClass: scene.baseClass, hoodClass: DEMO_IGNORE, photo: true });
  const photo = photoFinish(render.rgb!, o.width, o.height, o.seed, index);
  const clean = { ...render, label: render.label.slice(), inst: render.inst.slice() };
  const planned = demoMistakePlan(o).filter((m) => m.frame === index);
  const truth = clean.label.slice();
  const mistakes = mistakesApply(truth, clean, planned, scene, cam, name);
  const visible = new Uint32Array(scene.baseClass.length);
  for (let i = 0; i < clean.inst.length; i++) visible[clean.inst[i]]++;
  const ctx = { scene, cam, frames: o.frames, visible, exempt: new Set(planned.map((m) => m.inst)) };
  const map = (ids: Uint8Array): LabelMap => ({ width: o.width, height: o.height, ids });
  const preds = {} as Record<DemoRunName, LabelMap>;
  for (const run of DEMO_RUNS) preds[run] = map(predictionLabels(run, ctx));
  return { name, width: o.width, height: o.height, photo, scene: map(clean.label), instances: clean.inst, truth: map(truth), preds, mistakes };
}

/** Returns the answer-key entries of frame `index`, rendering labels only (no photo, no predictions). */
export function demoFrameMistakes(index: number, o: DemoOptions): DemoMistake[] {
  indexCheck(index, o);
  const planned = demoMistakePlan(o).filter((m) => m.frame === index);
  if (planned.length === 0) return [];
  const scene = demoScene(o.seed);
  const cam = demoCamera(index, o.frames, o.width, o.height);
  const render = sceneRender(scene, cam, { instClass: scene.baseClass, hoodClass: DEMO_IGNORE, photo: false });
  const clean = { ...render, label: render.label.slice(), inst: render.inst.slice() };
  return mistakesApply(clean.label.slice(), clean, planned, scene, cam, demoFrameName(index));
}

/**
 * Returns frame `index` as PNG bytes: RGB photo, 8-bit gray truth and run-a, 8-bit palette run-b
 * (so both label encodings are exercised). `zlib` may swap in other compressors (Node's own) for
 * the photo and the label maps; the portable defaults run anywhere.
 */
export function demoFrame(index: number, o: DemoOptions, zlib: DemoZlib = {}): DemoFrame {
  const r = demoFrameRaster(index, o);
  const labels = zlib.labels ?? labelZlib;
  return {
    name: r.name,
    photoPng: photoRgbToPng(r.width, r.height, r.photo, zlib.photo),
    truthPng: labelMapToPng(r.truth, { kind: 'gray', bitDepth: 8 }, labels),
    instancesPng: labelMapToPng({ width: r.width, height: r.height, ids: thingInstances(r) }, { kind: 'gray', bitDepth: 16 }, labels),
    predPngs: {
      'run-a': labelMapToPng(r.preds['run-a'], { kind: 'gray', bitDepth: 8 }, labels),
      'run-b': labelMapToPng(r.preds['run-b'], { kind: 'palette', colors: demoPalette(PRED_PALETTE_ENTRIES) }, labels),
    },
    mistakes: r.mistakes,
  };
}

/** Classes whose objects are countable things with instances; sky, water, quay and rail are surfaces. */
const DEMO_THING_CLASSES: ReadonlySet<number> = new Set([
  DEMO_CLASS.container, DEMO_CLASS.crane, DEMO_CLASS.truck, DEMO_CLASS.person, DEMO_CLASS.bollard,
  DEMO_CLASS.lightMast, DEMO_CLASS.building, DEMO_CLASS.vegetation,
]);

/** Returns the frame's instance ids where the ground truth says a thing class (0 elsewhere), as an instance map is written. */
function thingInstances(r: DemoFrameRaster): Uint16Array {
  return r.instances.map((v, i) => (DEMO_THING_CLASSES.has(r.truth.ids[i]) ? v : 0));
}

/** Returns every answer-key entry of the sequence, in frame order. */
export function demoAnswerKey(o: DemoOptions): DemoMistake[] {
  const out: DemoMistake[] = [];
  for (let i = 0; i < o.frames; i++) out.push(...demoFrameMistakes(i, o));
  return out;
}
