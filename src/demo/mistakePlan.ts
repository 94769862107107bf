// Which label mistakes the ground truth gets, planned once per sequence from the seed: kinds spread
// over the frames, each aimed at an object that is plainly visible there. Visibility comes from a
// small label-only render of every frame, so the plan is the same whichever worker builds a frame.
import { demoCamera } from './camera.ts';
import { DEMO_CLASS } from './classes.ts';
import type { DemoOptions } from './options.ts';
import { Rng } from './random.ts';
import { sceneRender } from './render.ts';
import { demoScene } from './scene.ts';

/** Kinds of label mistake, as written in the answer key. */
export const MISTAKE_KINDS = ['wrong-class', 'unlabelled', 'sloppy-outline', 'void-over-object', 'class-swap'] as const;
export type MistakeKind = (typeof MISTAKE_KINDS)[number];

/** One planned mistake: frame index, kind, target instance and, where fixed in advance, the wrong class. */
export interface PlannedMistake {
  frame: number;
  kind: MistakeKind;
  inst: number;
  /** Class painted on the object (wrong-class, class-swap, void-over-object); -1 when found on applying. */
  labelledClass: number;
  /** Shift of a sloppy outline, in pixels at 1024 px wide (never under 4 px at any size). */
  dx: number;
  dy: number;
}

const PLAN_WIDTH = 256;
const C = DEMO_CLASS;
/** The class an annotator mistakes each class for. */
export const LOOK_ALIKE: Partial<Record<number, number>> = {
  [C.container]: C.building, [C.building]: C.container, [C.truck]: C.container, [C.vegetation]: C.building,
  [C.crane]: C.lightMast, [C.lightMast]: C.crane, [C.person]: C.bollard, [C.bollard]: C.person,
};

// Target classes per kind and visible size limits in pixels of the 256-wide planning render.
const TARGETS: Record<MistakeKind, { classes: number[]; min: number; max: number }> = {
  'wrong-class': { classes: [C.truck, C.building, C.container, C.vegetation, C.crane], min: 30, max: 2500 },
  // objects whose background is another class (a stacked box has more boxes behind it) and that
  // both runs can see (thin masts are broken up by run-a anyway)
  unlabelled: { classes: [C.person, C.truck, C.bollard], min: 8, max: 500 },
  // objects large enough that an outline several pixels off stands out from a model's rounded edge
  'sloppy-outline': { classes: [C.truck, C.container, C.building, C.vegetation], min: 24, max: 1200 },
  'void-over-object': { classes: [C.person, C.bollard, C.truck, C.container], min: 5, max: 700 },
  'class-swap': { classes: [C.truck, C.container], min: 20, max: 2500 },
};

const cache = new Map<string, PlannedMistake[]>();

/** Returns the planned mistakes of the sequence (cached per seed, length and aspect ratio). */
export function demoMistakePlan(o: DemoOptions): PlannedMistake[] {
  const ph = Math.max(16, Math.round((PLAN_WIDTH * o.height) / o.width));
  const key = `${o.seed}/${o.frames}/${ph}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const scene = demoScene(o.seed);
  const visible: Uint32Array[] = [];
  for (let f = 0; f < o.frames; f++) {
    const t = sceneRender(scene, demoCamera(f, o.frames, PLAN_WIDTH, ph), { instClass: scene.baseClass, hoodClass: 255, photo: false });
    const v = new Uint32Array(scene.baseClass.length);
    for (let i = 0; i < t.inst.length; i++) v[t.inst[i]]++;
    visible.push(v);
  }
  const plan = planMistakes(o.frames, o.seed, visible, (inst) => scene.baseClass[inst]);
  if (cache.size > 8) cache.delete(cache.keys().next().value!);
  cache.set(key, plan);
  return plan;
}

function planMistakes(frames: number, seed: number, visible: Uint32Array[], clsOf: (inst: number) => number): PlannedMistake[] {
  const rng = new Rng(seed ^ 0x51a7e);
  const out: PlannedMistake[] = [];
  const used = new Set<string>();
  // Candidates of the first class (in the kind's order, starting at `turn`) that has any, so the
  // mistakes do not all land on the yard's many containers.
  const candidates = (f: number, kind: MistakeKind, turn = 0) => {
    const t = TARGETS[kind];
    for (let c = 0; c < t.classes.length; c++) {
      const cls = t.classes[(c + turn) % t.classes.length];
      const list: number[] = [];
      for (let inst = 1; inst < visible[f].length; inst++) {
        const n = visible[f][inst];
        if (n >= t.min && n <= t.max && clsOf(inst) === cls && !used.has(`${f}/${inst}`)) list.push(inst);
      }
      if (list.length > 0) return list;
    }
    return [];
  };
  const add = (frame: number, kind: MistakeKind, inst: number) => {
    used.add(`${frame}/${inst}`);
    const cls = clsOf(inst);
    const labelledClass = kind === 'void-over-object' ? 255 : kind === 'wrong-class' || kind === 'class-swap' ? LOOK_ALIKE[cls]! : -1;
    const a = rng.range(0, Math.PI * 2);
    const len = rng.range(6, 9);
    out.push({ frame, kind, inst, labelledClass, dx: Math.round(Math.cos(a) * len), dy: Math.round(Math.sin(a) * len) });
  };
  // class swaps: one 3-frame run, and a 2-frame run in longer sequences
  const runs = frames >= 24 ? [3, 2] : frames >= 3 ? [3] : [];
  for (const [r, len] of runs.entries()) {
    for (let tries = 0; tries < 40; tries++) {
      const start = rng.int(frames - len + 1);
      const all = candidates(start, 'class-swap', r).filter((inst) => {
        for (let f = start; f < start + len; f++) if (visible[f][inst] < TARGETS['class-swap'].min || used.has(`${f}/${inst}`)) return false;
        return true;
      });
      if (all.length === 0) continue;
      const inst = rng.pick(all);
      for (let f = start; f < start + len; f++) add(f, 'class-swap', inst);
      break;
    }
  }
  const singles = Math.max(Math.min(frames, 4), Math.round((15 * frames) / 48));
  const kinds: MistakeKind[] = ['wrong-class', 'unlabelled', 'sloppy-outline', 'void-over-object'];
  for (let k = 0; k < singles; k++) {
    const kind = kinds[k % kinds.length];
    const lo = Math.floor((k * frames) / singles);
    const hi = Math.max(lo + 1, Math.floor(((k + 1) * frames) / singles));
    for (let tries = 0; tries < 12; tries++) {
      const f = tries < 6 ? lo + rng.int(hi - lo) : rng.int(frames);
      const list = candidates(f, kind, Math.floor(k / kinds.length));
      if (list.length === 0) continue;
      add(f, kind, rng.pick(list));
      break;
    }
  }
  return out.sort((a, b) => a.frame - b.frame || a.inst - b.inst);
}
