// Predicted label maps of a run: the true scene re-rendered with the run's object-level mistakes
// (misses, confusions, ghosts, classes over void), then degraded like a network's output, then a few
// blobs of ids outside the table. Made from the true scene, never from the injected label mistakes.
import type { DemoCamera } from './camera.ts';
import { DEMO_CLASS, DEMO_IGNORE } from './classes.ts';
import { labelsDegrade } from './degrade.ts';
import { DRAW_SKIP } from './draw.ts';
import { hash3, noise2 } from './random.ts';
import { sceneRender } from './render.ts';
import { flickersAt, MISSABLE, RUN_STYLES, stretchHas, type DemoRunName, type ObjectPick } from './runs.ts';
import type { DemoScene, SceneObject } from './scene.ts';

/** Inputs shared by both runs for one frame. */
export interface PredictionContext {
  scene: DemoScene;
  cam: DemoCamera;
  frames: number;
  /** Visible pixels per instance in the true render. */
  visible: Uint32Array;
  /** Instances the ground truth gets wrong in this frame; runs leave them alone so the mistake shows. */
  exempt: ReadonlySet<number>;
}

function picks(o: SceneObject, p: ObjectPick): boolean {
  return o.cls === p.cls && o.x >= p.x[0] && o.x <= p.x[1] && o.z >= p.z[0] && o.z <= p.z[1] && (p.maxY === undefined || o.y <= p.maxY);
}

/** Returns the instance→class table run `run` draws in this frame (DRAW_SKIP for what it misses). */
export function predictionClasses(run: DemoRunName, ctx: PredictionContext): Uint8Array {
  const style = RUN_STYLES[run];
  const { scene, cam, frames, visible, exempt } = ctx;
  const cls = scene.baseClass.slice();
  const areaScale = (cam.width * cam.height) / (1024 * 512);
  const index = cam.time;
  const flicker = flickersAt(style, index, frames);
  for (const o of scene.objects) {
    const i = o.inst;
    if (o.cls === DEMO_IGNORE) cls[i] = flicker ? style.flicker!.voidAs : o.voidAs;
    if (exempt.has(i) || o.ghostCls >= 0) continue;
    if (MISSABLE.includes(o.cls) && visible[i] < style.missBelow * areaScale) cls[i] = DRAW_SKIP;
    else if (style.farContainerAsBuildingBeyond !== null && o.cls === DEMO_CLASS.container) {
      const depth = (o.x - cam.x) * cam.sin + (o.z + o.vz * index - cam.z) * cam.cos;
      if (depth > style.farContainerAsBuildingBeyond) cls[i] = DEMO_CLASS.building;
    }
    for (const c of style.confusions) if (stretchHas(c.during, index, frames) && picks(o, c.pick)) cls[i] = c.as;
  }
  for (const g of style.ghosts) {
    const inst = scene.ghosts[g.name];
    if (stretchHas(g.during, index, frames)) cls[inst] = scene.objects[inst - 1].ghostCls;
  }
  return cls;
}

/** Returns the predicted label map (ids, width×height) of run `run` for this frame. */
export function predictionLabels(run: DemoRunName, ctx: PredictionContext): Uint8Array {
  const style = RUN_STYLES[run];
  const { scene, cam, frames } = ctx;
  const instClass = predictionClasses(run, ctx);
  const clean = sceneRender(scene, cam, { instClass, hoodClass: style.hoodAs ?? DRAW_SKIP, photo: false }).label;
  const k = cam.width / 1024;
  const gain = new Float32Array(16).fill(1);
  for (const [id, g] of Object.entries(style.gain)) gain[Number(id)] = g ?? 1;
  const out = labelsDegrade(clean, cam.width, cam.height, {
    stride: style.stride * k,
    wobble: style.wobble * k,
    gain,
    thin: [DEMO_CLASS.crane, DEMO_CLASS.lightMast, DEMO_CLASS.rail],
    thinBreak: style.thinBreak,
    jitter: style.jitter,
    seed: hash3(scene.seed, run === 'run-a' ? 1 : 2, 0x9e1d) & 0xffff,
    time: cam.time + (flickersAt(style, cam.time, frames) ? style.flicker!.timeStep : 0),
  });
  for (const b of style.invalid) if (stretchHas(b.during, cam.time, frames)) invalidBlob(out, cam, b.id, b.x, b.y, b.r);
  return out;
}

// Paints a ragged blob of `id`, drifting slowly with time, centred at shares (x, y) of the width.
function invalidBlob(out: Uint8Array, cam: DemoCamera, id: number, x: number, y: number, r: number): void {
  const { width, height } = cam;
  const cx = (x + 0.01 * Math.sin(cam.time * 0.3)) * width;
  const cy = y * height + 0.01 * width * Math.cos(cam.time * 0.25);
  const rad = r * width;
  const x0 = Math.max(0, Math.floor(cx - rad * 1.3));
  const x1 = Math.min(width, Math.ceil(cx + rad * 1.3));
  const y0 = Math.max(0, Math.floor(cy - rad * 1.3));
  const y1 = Math.min(height, Math.ceil(cy + rad * 1.3));
  for (let py = y0; py < y1; py++) {
    for (let px = x0; px < x1; px++) {
      const dx = px + 0.5 - cx;
      const dy = py + 0.5 - cy;
      const a = Math.atan2(dy, dx);
      const edge = rad * (0.75 + 0.5 * noise2(Math.cos(a) * 1.5 + 2, Math.sin(a) * 1.5 + cam.time * 0.1, id));
      if (dx * dx + dy * dy < edge * edge) out[py * width + px] = id;
    }
  }
}
