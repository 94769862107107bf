// The two prediction runs against the true scene: the errors each run is meant to make, measured
// with simple pixel counts over the whole sequence.
import { beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CLASS, DEMO_CLASS_COUNT, DEMO_IGNORE } from '../../src/demo/classes.ts';
import { demoFrameRaster, type DemoFrameRaster } from '../../src/demo/frame.ts';
import { DEMO_RUNS, type DemoRunName } from '../../src/demo/runs.ts';
import { demoScene } from '../../src/demo/scene.ts';

const O = { width: 512, height: 256, frames: 48, seed: 1 };
const W = O.width;
const H = O.height;
let seq: DemoFrameRaster[] = [];

beforeAll(() => {
  seq = Array.from({ length: O.frames }, (_, i) => demoFrameRaster(i, O));
});

/** Pixels within `r` px (chessboard) of a 4-neighbour class change of `ids`: the boundary band (trimap, common practice). */
function band(ids: ArrayLike<number>, r: number): Uint8Array {
  const edge = new Uint8Array(W * H);
  for (let y = 0; y < H; y++) {
    for (let x = 0; x < W; x++) {
      const i = y * W + x;
      if ((x + 1 < W && ids[i] !== ids[i + 1]) || (y + 1 < H && ids[i] !== ids[i + W])) {
        edge[i] = 1;
        if (x + 1 < W) edge[i + 1] = 1;
        if (y + 1 < H) edge[i + W] = 1;
      }
    }
  }
  const rows = new Uint8Array(W * H);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) for (let k = -r; k <= r; k++) if (edge[y * W + Math.min(W - 1, Math.max(0, x + k))]) rows[y * W + x] = 1;
  const out = new Uint8Array(W * H);
  for (let y = 0; y < H; y++) for (let x = 0; x < W; x++) for (let k = -r; k <= r; k++) if (rows[Math.min(H - 1, Math.max(0, y + k)) * W + x]) out[y * W + x] = 1;
  return out;
}

function confusion(run: DemoRunName, from: number, to: number): number {
  let n = 0;
  for (const f of seq) for (let i = 0; i < W * H; i++) if (f.scene.ids[i] === from && f.preds[run].ids[i] === to) n++;
  return n;
}

describe('boundaries and small objects', () => {
  it('run-b is sharper: fewer wrong pixels within 3 px of a boundary than run-a', () => {
    const wrong: Record<string, number> = { 'run-a': 0, 'run-b': 0 };
    for (const f of seq.filter((_, i) => i % 3 === 0)) {
      const b = band(f.scene.ids, 3);
      for (const run of DEMO_RUNS) {
        for (let i = 0; i < W * H; i++) if (b[i] && f.scene.ids[i] !== DEMO_IGNORE && f.preds[run].ids[i] !== f.scene.ids[i]) wrong[run]++;
      }
    }
    expect(wrong['run-b']).toBeLessThan(wrong['run-a'] * 0.75);
  });

  it('run-b misses more small objects (people, bollards) than run-a', () => {
    const scene = demoScene(O.seed);
    const missed: Record<string, number> = { 'run-a': 0, 'run-b': 0 };
    let objects = 0;
    for (const f of seq) {
      const area = new Uint32Array(scene.baseClass.length);
      const hit: Record<string, Uint32Array> = { 'run-a': new Uint32Array(area.length), 'run-b': new Uint32Array(area.length) };
      for (let i = 0; i < W * H; i++) {
        const inst = f.instances[i];
        const cls = scene.baseClass[inst];
        if (inst === 0 || (cls !== DEMO_CLASS.person && cls !== DEMO_CLASS.bollard) || f.truth.ids[i] !== cls) continue;
        area[inst]++;
        for (const run of DEMO_RUNS) if (f.preds[run].ids[i] === cls) hit[run][inst]++;
      }
      for (let inst = 1; inst < area.length; inst++) {
        if (area[inst] < 12) continue;
        objects++;
        for (const run of DEMO_RUNS) if (hit[run][inst] < 0.25 * area[inst]) missed[run]++;
      }
    }
    expect(objects).toBeGreaterThan(100);
    expect(missed['run-b']).toBeGreaterThan(missed['run-a'] + 20);
    expect(missed['run-a']).toBeLessThan(objects * 0.2);
  });

  it('thin structures break up: run-a finds far less of the masts and crane steel than of the containers', () => {
    const recall = (run: DemoRunName, cls: number) => confusion(run, cls, cls) / seq.reduce((n, f) => n + f.scene.ids.filter((v) => v === cls).length, 0);
    expect(recall('run-a', DEMO_CLASS.lightMast)).toBeLessThan(0.75);
    expect(recall('run-a', DEMO_CLASS.crane)).toBeLessThan(recall('run-a', DEMO_CLASS.container) - 0.05);
    expect(recall('run-a', DEMO_CLASS.rail)).toBeLessThan(0.6);
  });
});

describe('confusions, hallucinations, void and invalid ids', () => {
  it('confuses look-alikes: far containers as buildings (run-a), the warehouse as containers (run-b), a truck as a container (run-a)', () => {
    const perFrame = W * H / 1000;
    expect(confusion('run-a', DEMO_CLASS.container, DEMO_CLASS.building)).toBeGreaterThan(perFrame);
    expect(confusion('run-b', DEMO_CLASS.building, DEMO_CLASS.container)).toBeGreaterThan(perFrame);
    expect(confusion('run-a', DEMO_CLASS.truck, DEMO_CLASS.container)).toBeGreaterThan(perFrame);
    expect(confusion('run-b', DEMO_CLASS.container, DEMO_CLASS.truck)).toBeGreaterThan(perFrame);
  });

  it('hallucinates objects away from any real one', () => {
    // predicted person / truck pixels at least 6 px from every true pixel of that class
    const far = (run: DemoRunName, cls: number) => {
      let n = 0;
      for (const f of seq) {
        const near = band(Array.from(f.scene.ids, (v) => (v === cls ? 1 : 0)), 6);
        for (let i = 0; i < W * H; i++) if (f.preds[run].ids[i] === cls && f.scene.ids[i] !== cls && !near[i]) n++;
      }
      return n;
    };
    expect(far('run-a', DEMO_CLASS.person)).toBeGreaterThan(50);
    expect(far('run-b', DEMO_CLASS.truck)).toBeGreaterThan(200);
  });

  it('puts real classes over void (the hood, clutter) and a few ids outside the table', () => {
    for (const run of DEMO_RUNS) {
      let voidPx = 0;
      let real = 0;
      let invalid = 0;
      for (const f of seq) {
        for (let i = 0; i < W * H; i++) {
          const p = f.preds[run].ids[i];
          if (p >= DEMO_CLASS_COUNT) invalid++;
          if (f.scene.ids[i] !== DEMO_IGNORE) continue;
          voidPx++;
          if (p < DEMO_CLASS_COUNT) real++;
        }
      }
      expect(real / voidPx, run).toBeGreaterThan(0.98);
      expect(invalid, run).toBeGreaterThan(0);
      expect(invalid / (W * H * seq.length), run).toBeLessThan(0.005);
    }
  });
});

describe('over time', () => {
  it('errors are coherent from frame to frame, not per-frame noise', () => {
    for (const run of DEMO_RUNS) {
      let sum = 0;
      for (let t = 0; t + 1 < seq.length; t += 4) {
        const a = seq[t];
        const b = seq[t + 1];
        let inter = 0;
        let union = 0;
        for (let i = 0; i < W * H; i++) {
          const ea = a.scene.ids[i] !== DEMO_IGNORE && a.preds[run].ids[i] !== a.scene.ids[i];
          const eb = b.scene.ids[i] !== DEMO_IGNORE && b.preds[run].ids[i] !== b.scene.ids[i];
          if (ea && eb) inter++;
          if (ea || eb) union++;
        }
        sum += inter / union;
      }
      // independent noise at these error rates (a few per cent) would overlap by a few per cent
      expect(sum / 12, run).toBeGreaterThan(0.3);
    }
  });
});
