/**
 * Benchmark of error-region extraction on one thread: Kestrel Quay demo frames at 2048×1024 (two
 * runs, the photo for image evidence), timed per stage and for the whole of frameRegionsCompute,
 * beside frameScore on the same frames and a plain id-sum pass (how fast this machine runs the
 * simplest per-pixel loop right now; the machine is shared, so read the figures against it).
 * Run: npx tsx test/bench/regions.bench.ts [frames=3] [reps=5]
 */
import { frameScore } from '../../src/core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { frameRegionsCompute } from '../../src/core/regions/frameRegions.ts';
import { regionScratchCreate } from '../../src/core/regions/regionScratch.ts';
import { REGION_DEFAULTS } from '../../src/core/regions/regionSettings.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelCodesFill } from '../../src/core/metrics/codes.ts';
import { componentStatsFill } from '../../src/core/regions/componentStats.ts';
import { gridDominant, gridShape } from '../../src/core/regions/frameGrid.ts';
import { photoLuma } from '../../src/core/regions/photoEdges.ts';
import { regionScratchFit, regionScratchPhoto, regionScratchTables } from '../../src/core/regions/regionScratch.ts';
import { regionThickness } from '../../src/core/regions/regionThickness.ts';
import { RUN_KEEP, runsLabel } from '../../src/core/regions/runLabel.ts';
import { bandCountRun, bandReach, truthEdgeReach } from '../../src/core/regions/truthBand.ts';
import { DEMO_CLASS_COUNT } from '../../src/demo/classes.ts';
import { demoFrameRaster } from '../../src/demo/frame.ts';

const W = 2048, H = 1024;
const args = process.argv.slice(2);
const FRAMES = Number(args[0] ?? 3), REPS = Number(args[1] ?? 5);
const classIds = Array.from({ length: DEMO_CLASS_COUNT }, (_, i) => i);
const options = { width: W, height: H, frames: 48, seed: 1 };

process.stderr.write(`rendering ${FRAMES} demo frames at ${W}×${H}…\n`);
const frames = Array.from({ length: FRAMES }, (_, f) => {
  const r = demoFrameRaster(f * 7, options);
  const rgba = new Uint8Array(W * H * 4);
  for (let i = 0; i < W * H; i++) rgba.set([r.photo[i * 3], r.photo[i * 3 + 1], r.photo[i * 3 + 2], 255], i * 4);
  return { truth: r.truth, preds: r.preds, photo: { width: W, height: H, rgba } };
});

const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];
function idsSum(ids: Uint8Array | Uint16Array): number {
  let sum = 0;
  for (let i = 0; i < ids.length; i++) sum = (sum + ids[i]) | 0;
  return sum;
}

/** Runs the stages of frameRegionsCompute one by one with the same scratch, timing each. */
function stages(truth: LabelMap, preds: LabelMap[], photo: { width: number; height: number; rgba: Uint8Array }): void {
  const s = stageScratch, n = W * H, k = classIds.length;
  const shape = gridShape(W, H, REGION_DEFAULTS.gridColumns);
  regionScratchFit(s, W, H, preds.length, shape.columns * shape.rows);
  regionScratchTables(s, classIds, 255);
  timed('  stage: codes (truth + runs)', () => {
    labelCodesFill(truth.ids, s.truthTable, s.truthCodes, 0, n);
    preds.forEach((p, i) => labelCodesFill(p.ids, s.predTable, s.predCodes[i], 0, n));
  });
  timed('  stage: truth boundary reach', () => truthEdgeReach(s.truthCodes, W, H, s.edgeReach));
  timed('  stage: truth segments + grid', () => {
    runsLabel(s.truthCodes, null, null, W, H, k, RUN_KEEP.all, s.truthRuns);
    componentStatsFill(s.truthRuns, s.truthSegments);
    gridDominant(s.truthRuns, k, classIds, 255, shape);
  });
  timed('  stage: photo luma', () => photoLuma(photo.rgba, n, regionScratchPhoto(s).luma));
  for (let i = 0; i < preds.length; i++) {
    timed('  stage: prediction segments (per run)', () => {
      runsLabel(s.predCodes[i], null, s.truthCodes, W, H, k, RUN_KEEP.all, s.predRuns);
      componentStatsFill(s.predRuns, s.predSegments);
    });
    timed('  stage: pair runs + components (per run)', () => {
      runsLabel(s.truthCodes, s.predCodes[i], null, W, H, k, RUN_KEEP.pairs, s.pairRuns);
      componentStatsFill(s.pairRuns, s.pairs);
    });
    const reach = bandReach(REGION_DEFAULTS.bandWidth);
    timed('  stage: band counts (per run)', () => {
      const t = s.pairRuns;
      for (let r = 0; r < t.count; r++) if (s.pairs.area[t.comp[r]] >= REGION_DEFAULTS.minArea) bandCountRun(s.edgeReach, W, H, t.y[r], t.x0[r], t.x1[r], 3, reach);
    });
    timed('  stage: thickness of listed (per run)', () => {
      let listed = 0;
      for (let c = 0; c < s.pairs.count && listed < REGION_DEFAULTS.listMax; c++) {
        if (s.pairs.area[c] < REGION_DEFAULTS.minArea || s.pairs.a[c] >= k) continue;
        listed++;
        regionThickness(s.pairRuns, s.pairs, c, s.thickness);
      }
    });
  }
}
const stageScratch = regionScratchCreate();

const times: Record<string, number[]> = {};
function timed<T>(name: string, fn: () => T): T {
  const t0 = performance.now();
  const v = fn();
  (times[name] ??= []).push(performance.now() - t0);
  return v;
}
const scoreScratch = scoreScratchCreate();
const regionScratch = regionScratchCreate();
let sink = 0, regions = 0, pixels = 0;
for (let rep = 0; rep < REPS + 1; rep++) {
  if (rep === 1) for (const k of Object.keys(times)) times[k] = []; // the first pass warms up the JIT
  for (const f of frames) {
    sink += timed('id-sum pass', () => idsSum(f.truth.ids));
    timed('frameScore, 2 runs', () => {
      for (const run of ['run-a', 'run-b'] as const) frameScore(f.truth, f.preds[run], classIds, DEFAULT_SCORE_SETTINGS, scoreScratch);
    });
    const preds = (['run-a', 'run-b'] as const).map((run) => ({ run, map: f.preds[run], confidence: null }));
    const r = timed('frameRegionsCompute, 2 runs + photo', () =>
      frameRegionsCompute({ truth: f.truth, preds, classIds, ignore: 255, photo: f.photo }, { ...REGION_DEFAULTS }, regionScratch),
    );
    timed('frameRegionsCompute, 2 runs, no photo', () =>
      frameRegionsCompute({ truth: f.truth, preds, classIds, ignore: 255, photo: null }, { ...REGION_DEFAULTS }, regionScratch),
    );
    stages(f.truth, preds.map((p) => p.map), f.photo);
    if (r.ok && rep === 0) {
      for (const run of r.value.runs) {
        regions += run!.counts.all.regions;
        pixels += run!.counts.all.pixels;
      }
    }
  }
}
process.stdout.write(`${FRAMES} frames ${W}×${H}, ${REPS} reps, median ms per frame (sink ${sink & 1}):\n`);
// Per-run stages ran once per run and frame: their medians are per run.
for (const [k, v] of Object.entries(times)) process.stdout.write(`  ${k.padEnd(44)} ${median(v).toFixed(1).padStart(8)}\n`);
process.stdout.write(`  regions per run and frame: ${(regions / FRAMES / 2).toFixed(0)}, wrong pixels per run and frame: ${(pixels / FRAMES / 2).toFixed(0)}\n`);
