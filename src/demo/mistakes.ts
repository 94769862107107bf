// Applies the planned label mistakes to a frame's ground truth and reports each one as the answer
// key states it: kind, the box of the pixels it changed, the true class and the class labelled.
import type { DemoCamera } from './camera.ts';
import { DEMO_IGNORE } from './classes.ts';
import { DRAW_SKIP } from './draw.ts';
import type { MistakeKind, PlannedMistake } from './mistakePlan.ts';
import type { RasterTarget } from './raster.ts';
import { sceneRender } from './render.ts';
import type { DemoScene } from './scene.ts';

/** One entry of `answer-key.json`; bbox in pixels [x0, y0, x1, y1], end exclusive. */
export interface DemoMistake {
  frame: string;
  kind: MistakeKind;
  bbox: [number, number, number, number];
  trueClass: number;
  labelledClass: number;
}

/** Fewest changed pixels (at 1024 px wide) for a mistake to count. */
const MIN_CHANGED = 60;

/** A local window of the frame: origin, size and a 0/1 mask over it. */
interface Window {
  x0: number;
  y0: number;
  w: number;
  h: number;
  mask: Uint8Array;
}

/** Returns the window around instance `inst` grown by `margin` px, with its pixels marked; null if unseen. */
function instanceWindow(inst: Uint16Array, width: number, height: number, id: number, margin: number): Window | null {
  let x0 = width, y0 = height, x1 = -1, y1 = -1;
  for (let y = 0; y < height; y++) {
    const row = y * width;
    for (let x = 0; x < width; x++) {
      if (inst[row + x] !== id) continue;
      if (x < x0) x0 = x;
      if (x > x1) x1 = x;
      if (y < y0) y0 = y;
      if (y > y1) y1 = y;
    }
  }
  if (x1 < 0) return null;
  x0 = Math.max(0, x0 - margin);
  y0 = Math.max(0, y0 - margin);
  x1 = Math.min(width - 1, x1 + margin);
  y1 = Math.min(height - 1, y1 + margin);
  const w = x1 - x0 + 1;
  const h = y1 - y0 + 1;
  const mask = new Uint8Array(w * h);
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) mask[y * w + x] = inst[(y + y0) * width + x + x0] === id ? 1 : 0;
  return { x0, y0, w, h, mask };
}

/** Returns `mask` (w×h) shifted by (sx, sy) and dilated by a (2r+1)² square; separable running counts. */
export function maskShiftDilate(mask: Uint8Array, w: number, h: number, sx: number, sy: number, r: number): Uint8Array {
  // rowPass is indexed by mask row: any mask pixel in that row within r of column x − sx
  const rowPass = new Uint8Array(w * h);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let on = 0;
      for (let k = -r; k <= r && !on; k++) {
        const xs = x - sx + k;
        if (xs >= 0 && xs < w && mask[y * w + xs]) on = 1;
      }
      rowPass[y * w + x] = on;
    }
  }
  const out = new Uint8Array(w * h);
  for (let y = 0; y < h; y++) {
    for (let x = 0; x < w; x++) {
      let on = 0;
      for (let k = -r; k <= r && !on; k++) {
        const ys = y - sy + k;
        if (ys >= 0 && ys < h && rowPass[ys * w + x]) on = 1;
      }
      out[y * w + x] = on;
    }
  }
  return out;
}

function majority(counts: Uint32Array): number {
  let best = 0;
  for (let c = 1; c < counts.length; c++) if (counts[c] > counts[best]) best = c;
  return best;
}

/**
 * Applies `planned` (this frame's mistakes) to `truth` in place; `clean` is the true render (labels and
 * instances). Returns the answer-key entries of the mistakes that changed at least one pixel.
 */
export function mistakesApply(
  truth: Uint8Array, clean: RasterTarget, planned: readonly PlannedMistake[], scene: DemoScene, cam: DemoCamera, name: string,
): DemoMistake[] {
  const { width, height } = clean;
  const k = width / 1024;
  const out: DemoMistake[] = [];
  for (const p of planned) {
    const cls = scene.baseClass[p.inst];
    // an outline "several pixels off" stays several pixels off in small frames too
    const ks = Math.max(k, 0.6);
    const sx = Math.round(p.dx * ks);
    const sy = Math.round(p.dy * ks);
    const r = Math.max(1, Math.round(2 * k));
    const win = instanceWindow(clean.inst, width, height, p.inst, Math.abs(sx) + Math.abs(sy) + r + 1);
    if (!win) continue;
    let bg: Uint8Array | null = null;
    if (p.kind === 'unlabelled' || p.kind === 'sloppy-outline') {
      const instClass = scene.baseClass.slice();
      instClass[p.inst] = DRAW_SKIP;
      bg = sceneRender(scene, cam, { instClass, hoodClass: DEMO_IGNORE, photo: false }).label;
    }
    const grown =
      p.kind === 'sloppy-outline' ? maskShiftDilate(win.mask, win.w, win.h, sx, sy, r)
      : p.kind === 'void-over-object' ? maskShiftDilate(win.mask, win.w, win.h, 0, 0, r)
      : win.mask;
    const counts = new Uint32Array(256);
    let changed = 0;
    let bx0 = width, by0 = height, bx1 = -1, by1 = -1;
    for (let y = 0; y < win.h; y++) {
      for (let x = 0; x < win.w; x++) {
        const m = y * win.w + x;
        const i = (y + win.y0) * width + x + win.x0;
        const truthBefore = clean.label[i];
        let v = -1;
        if (p.kind === 'sloppy-outline') {
          if (grown[m] && !win.mask[m] && truthBefore !== DEMO_IGNORE && truthBefore !== cls) (v = cls), counts[truthBefore]++;
          else if (win.mask[m] && !grown[m]) v = bg![i];
        } else if (p.kind === 'unlabelled') {
          if (win.mask[m]) v = bg![i];
        } else if (grown[m] && truthBefore !== DEMO_IGNORE) v = p.labelledClass;
        if (v < 0 || v === truthBefore) continue;
        if (p.kind === 'unlabelled') counts[v]++;
        changed++;
        truth[i] = v;
        const gx = x + win.x0;
        const gy = y + win.y0;
        if (gx < bx0) bx0 = gx;
        if (gx > bx1) bx1 = gx;
        if (gy < by0) by0 = gy;
        if (gy > by1) by1 = gy;
      }
    }
    // a mistake of a handful of pixels is not one a reviewer could find: leave it out of the key
    if (changed < MIN_CHANGED * k * k) continue;
    const trueClass = p.kind === 'sloppy-outline' ? majority(counts) : cls;
    const labelledClass = p.kind === 'sloppy-outline' ? cls : p.kind === 'unlabelled' ? majority(counts) : p.labelledClass;
    out.push({ frame: name, kind: p.kind, bbox: [bx0, by0, bx1 + 1, by1 + 1], trueClass, labelledClass });
  }
  return out;
}
