/**
 * Benchmark of the scoring engine on one thread: seeded 2048×1024 "Kestrel Quay" frames with 12
 * classes (large regions, stacked containers, crane lattices, thin poles, small blobs, void), timed
 * per stage and for the whole of frameScore, against the numpy/scipy reference (metrics_ref.py
 * --time) on the same frames. Run: npx tsx test/bench/metrics.bench.ts [frames=3] [reps=7] [--no-python]
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { BAND_BINS } from '../../src/core/metrics/bandHistogram.ts';
import { boundaryFCounts } from '../../src/core/metrics/boundaryF.ts';
import { innerBandReset, innerBandRow, innerBandTail } from '../../src/core/metrics/boundaryIoU.ts';
import { labelCodesFill } from '../../src/core/metrics/codes.ts';
import { distanceBandRows } from '../../src/core/metrics/distanceBand.ts';
import { edgeRowScan } from '../../src/core/metrics/edgeRows.ts';
import { frameScore } from '../../src/core/metrics/frameScore.ts';
import { scoreScratchBinOffsets, scoreScratchCodeTable, scoreScratchCreate, scoreScratchFit } from '../../src/core/metrics/scratch.ts';
import { boundaryFTolerance, boundaryIoUDilation, DEFAULT_SCORE_SETTINGS, squaredDistanceLimit } from '../../src/core/metrics/settings.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from '../support/harbourScene.ts';
import { METRICS_REF_SCRIPT } from '../reference/pythonRef.ts';

const W = 2048, H = 1024, N = W * H, K = HARBOUR_CLASSES.length;
const args = process.argv.slice(2).filter((a) => !a.startsWith('--'));
const FRAMES = Number(args[0] ?? 3), REPS = Number(args[1] ?? 7);
const classIds = HARBOUR_CLASSES.map((_, i) => i);
const settings = DEFAULT_SCORE_SETTINGS;
const frames = Array.from({ length: FRAMES }, (_, f) => {
  const truth = harbourTruth(W, H, 1000 + f);
  return { truth, pred: harbourPrediction(truth, 1000 + f) };
});

const wall: Record<string, number[]> = {};
const cpu: Record<string, number[]> = {};
function timed(name: string, fn: () => void): void {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  fn();
  const t = performance.now() - t0;
  const c = process.cpuUsage(c0);
  (wall[name] ??= []).push(t);
  (cpu[name] ??= []).push((c.user + c.system) / 1000);
}
const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];

/** A plain pass summing the ids: how fast this machine runs the simplest per-pixel loop right now. */
function idsSum(ids: Uint8Array | Uint16Array): number {
  let sum = 0;
  for (let i = 0; i < ids.length; i++) sum = (sum + ids[i]) | 0;
  return sum;
}
let sink = 0;

const s = scoreScratchCreate();
scoreScratchFit(s, W, H);
const table = scoreScratchCodeTable(s, classIds, settings.ignore);
const dil = boundaryIoUDilation(W, H, settings.biouDilationRatio);
const r2 = squaredDistanceLimit(boundaryFTolerance(W, H, settings.bfTolerance));
for (let rep = 0; rep < REPS + 1; rep++) {
  for (const { truth, pred } of frames) {
    timed('plain id-sum pass (speed)', () => { sink ^= idsSum(truth.ids); });
    // Stages in pipeline order, on the same buffers frameScore uses.
    const { truthCodes: tc, predCodes: pc, edges } = s;
    edges.nT = edges.nP = 0;
    timed('codes, edges, column dist.', () => {
      labelCodesFill(truth.ids, table, tc, 0, W);
      labelCodesFill(pred.ids, table, pc, 0, W);
      for (let y = 0; y < H; y++) edgeRowScan(truth.ids, pred.ids, table, tc, pc, W, H, y, K, 65, edges);
    });
    const inter = new Uint32Array(K), union = new Uint32Array(K);
    timed('Boundary IoU scan', () => {
      innerBandReset(s.innerBand, W);
      for (let y = 0; y < H; y++) innerBandRow(tc, pc, W, y, dil, K, s.innerBand, inter, union);
      innerBandTail(tc, pc, W, H, dil, K, inter, union);
    });
    const band = new Uint32Array(BAND_BINS * K * (K + 1));
    timed('distance rows + band', () => distanceBandRows(edges.fwd, tc, pc, W, H, K, 64, scoreScratchBinOffsets(s, 64, K), band, s.dist2, s.distance));
    const bf = { predMatched: new Uint32Array(K), predTotal: new Uint32Array(K), truthMatched: new Uint32Array(K), truthTotal: new Uint32Array(K) };
    timed('Boundary F queries', () => boundaryFCounts(tc, pc, edges, s.dist2, W, H, K, r2, s.boundaryF, bf));
    timed('frameScore (all scores)', () => {
      if (!frameScore(truth, pred, classIds, settings, s).ok) throw new Error('frameScore failed');
    });
  }
  if (rep === 0) for (const k of Object.keys(wall)) wall[k].length = cpu[k].length = 0; // warm-up round
}

console.log(`Hairline scoring benchmark: ${FRAMES} frames ${W}×${H}, ${K} classes, ${REPS} reps, one thread (median per frame)`);
for (const k of Object.keys(wall)) {
  const mw = median(wall[k]), mc = median(cpu[k]);
  console.log(`  ${k.padEnd(26)} ${mw.toFixed(1).padStart(7)} ms wall  ${mc.toFixed(1).padStart(7)} ms cpu  ${((mw * 1e6) / N).toFixed(1).padStart(6)} ns/px`);
}
const tsTotal = median(wall['frameScore (all scores)']);
console.log(`frameScore = ${(tsTotal / median(wall['plain id-sum pass (speed)'])).toFixed(0)}× one plain id-sum pass on this machine now (checksum ${sink & 1})`);

if (!process.argv.includes('--no-python')) {
  const dir = mkdtempSync(join(tmpdir(), 'hairline-bench-'));
  try {
    const entries = frames.map((f, i) => {
      writeFileSync(join(dir, `t${i}.u16`), Buffer.from(Uint16Array.from(f.truth.ids).buffer));
      writeFileSync(join(dir, `p${i}.u16`), Buffer.from(Uint16Array.from(f.pred.ids).buffer));
      return { name: `frame${i}`, width: W, height: H, truthFile: `t${i}.u16`, predFile: `p${i}.u16` };
    });
    const classes = HARBOUR_CLASSES.map((name, id) => ({ id, name }));
    writeFileSync(join(dir, 'frames.json'), JSON.stringify({ classes, ...settings, frames: entries }));
    const r = spawnSync('python3', [METRICS_REF_SCRIPT, '--frames', join(dir, 'frames.json'), '--time', '1'], { encoding: 'utf8', maxBuffer: 1 << 26 });
    if (r.status !== 0) throw new Error(`metrics_ref.py failed: ${r.error?.message ?? r.stderr}`);
    const timing = (JSON.parse(r.stdout) as { timing: Record<string, number> }).timing;
    console.log('numpy/scipy reference (metrics_ref.py --time 1, median per frame):');
    for (const [k, v] of Object.entries(timing)) console.log(`  ${k.padEnd(26)} ${v.toFixed(1).padStart(9)} ms${k === 'cpuTotal' ? ' cpu' : ' wall'}`);
    const tsCpu = median(cpu['frameScore (all scores)']);
    console.log(`ratio reference / frameScore: ${(timing.total / tsTotal).toFixed(1)}× wall, ${(timing.cpuTotal / tsCpu).toFixed(1)}× cpu`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
