/**
 * End-to-end speed against an OpenCV peer, in one run on the same frames (2048×1024 "Kestrel Quay"
 * label maps, 12 classes + void, 8-bit gray PNG). The peer (opencv_peer.py: cv2.imread +
 * OpenCV/numpy scores, one thread) reads the same PNG files and must produce the same counts as
 * Hairline's frameScore, checked here before any time is compared. Prints, per target, Hairline's
 * figure, the peer's and the ratio:
 *   - headless end to end, one worker (`npm run score -- --workers 1`: PNG decode, scores, error
 *     regions), per frame, against the peer's decode + scores: target ≥ 4× faster;
 *   - all per-frame scores, one thread (frameScore): target ≤ 20 ns/px;
 *   - headless end to end, 2 workers: target ≥ 20 frames/s.
 * Per-frame CLI figures are marginal (two runs of different lengths, start-up cancels out).
 * Needs python3-opencv (Debian): installed here when running as root, else it says so and prints
 * Hairline's figures alone. Run: npx tsx test/bench/endToEnd.bench.ts [reps=5] [--markdown] [--no-cli: in-process and peer only]
 */
import { spawnSync } from 'node:child_process';
import { linkSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { classTableFromJson } from '../../src/core/classTable.ts';
import { frameJobScore } from '../../src/core/frameJob.ts';
import { labelMapRead } from '../../src/core/labelRead.ts';
import { frameScore, type FrameStats } from '../../src/core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { regionScratchCreate } from '../../src/core/regions/regionScratch.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES, HARBOUR_VOID } from '../support/harbourScene.ts';
import '../../src/cli/nodeInflate.ts'; // decode as the command line's threads do

const W = 2048, H = 1024, N = W * H, DISTINCT = 4;
const args = process.argv.slice(2).filter((a) => !a.startsWith('--'));
const REPS = Number(args[0] ?? 5);
const PEER = fileURLToPath(new URL('./opencv_peer.py', import.meta.url));
const median = (v: number[]) => [...v].sort((a, b) => a - b)[v.length >> 1];
const settings = { ...DEFAULT_SCORE_SETTINGS, ignore: HARBOUR_VOID };
const classIds = HARBOUR_CLASSES.map((_, i) => i);
const colors = ['#7aa6d8', '#1d5a82', '#9c9484', '#5b4a6e', '#c0623a', '#e0b336', '#2f9c8f', '#d94c6b', '#e8e05a', '#a58be0', '#7a5a3c', '#4f9b45'];
const classesJson = { ignore: HARBOUR_VOID, classes: HARBOUR_CLASSES.map((name, id) => ({ id, name, color: colors[id % colors.length] })) };

/** Returns a python3 that imports cv2, installing Debian's python3-opencv when root; null (said loudly) when none. */
function opencvPython(): string | null {
  const works = (py: string) => spawnSync(py, ['-c', 'import cv2, numpy'], { encoding: 'utf8' }).status === 0;
  const candidates = ['python3', '/usr/bin/python3'];
  for (const py of candidates) if (works(py)) return py;
  if (process.getuid?.() === 0) {
    console.log('installing python3-opencv (Debian) for the OpenCV peer…');
    const apt = (a: string[]) => spawnSync('apt-get', a, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } }).status === 0;
    if (!apt(['install', '-y', '-qq', 'python3-opencv'])) {
      apt(['update', '-qq']);
      apt(['install', '-y', '-qq', 'python3-opencv']);
    }
    for (const py of candidates) if (works(py)) return py;
  }
  console.log('\n!!!! OpenCV PEER NOT RUN: no python3 here imports cv2. Install it with `apt-get install python3-opencv`');
  console.log('!!!! (as root); without it the peer ratios below are missing.\n');
  return null;
}

function datasetMake(root: string): void {
  mkdirSync(join(root, 'truth'), { recursive: true });
  mkdirSync(join(root, 'pred'), { recursive: true });
  writeFileSync(join(root, 'classes.json'), JSON.stringify(classesJson));
  for (let d = 0; d < DISTINCT; d++) {
    const truth = harbourTruth(W, H, 2000 + d);
    writeFileSync(join(root, 'truth', `src${d}.png`), labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(root, 'pred', `src${d}.png`), labelMapToPng(harbourPrediction(truth, 2000 + d), { kind: 'gray', bitDepth: 8 }));
  }
}

/** A dataset folder of `frames` frames, hard links to the distinct ones (every frame still read and decoded). */
function linkedDataset(root: string, frames: number): string {
  const dir = join(root, `n${frames}`);
  mkdirSync(join(dir, 'truth'), { recursive: true });
  mkdirSync(join(dir, 'pred'), { recursive: true });
  for (let i = 0; i < frames; i++) {
    for (const side of ['truth', 'pred']) linkSync(join(root, side, `src${i % DISTINCT}.png`), join(dir, side, `f${String(i).padStart(5, '0')}.png`));
  }
  return dir;
}

/** Seconds of `0m1.234s` as bash's `times` prints them. */
const timesSeconds = (t: string) => {
  const m = /^(\d+)m([\d.]+)s$/.exec(t);
  if (!m) throw new Error(`cannot read times output "${t}"`);
  return Number(m[1]) * 60 + Number(m[2]);
};

/**
 * Wall seconds and CPU seconds (user + system of the scorer and its threads, from bash's `times`) of
 * one `npm run score` over `dir` with `workers` threads. The CPU figure is what a frame costs however
 * busy the machine is; the wall figure is what the targets are about.
 */
function cliRun(root: string, dir: string, workers: number): { wall: number; cpu: number } {
  const args = ['--import', 'tsx', 'src/cli/score.ts', '--truth', join(dir, 'truth'), '--pred', join(dir, 'pred'),
    '--classes', join(root, 'classes.json'), '--out', join(dir, 'report.json'), '--workers', String(workers)];
  const t0 = process.hrtime.bigint();
  const r = spawnSync('bash', ['-c', '"$0" "$@" >/dev/null; rc=$?; times; exit $rc', process.execPath, ...args], { encoding: 'utf8' });
  const wall = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`scorer failed (${r.status}): ${r.stderr}`);
  const children = r.stdout.trim().split('\n').at(-1)!.trim().split(/\s+/);
  return { wall, cpu: timesSeconds(children[0]) + timesSeconds(children[1]) };
}

/**
 * Marginal ms per frame of the CLI with `workers` threads: median over `reps` of (t(big) − t(small)) / (big − small),
 * in wall time and in CPU time.
 */
function cliPerFrame(root: string, workers: number, small: number, big: number, reps: number): { wall: number; cpu: number } {
  const a = linkedDataset(root, small), b = linkedDataset(root, big);
  const wall: number[] = [], cpu: number[] = [];
  for (let i = 0; i < reps; i++) {
    const tb = cliRun(root, b, workers), ta = cliRun(root, a, workers);
    wall.push(((tb.wall - ta.wall) * 1000) / (big - small));
    cpu.push(((tb.cpu - ta.cpu) * 1000) / (big - small));
  }
  rmSync(a, { recursive: true });
  rmSync(b, { recursive: true });
  return { wall: median(wall), cpu: median(cpu) };
}

const STATS_KEYS = ['confusion', 'band', 'biouInter', 'biouUnion', 'bfPredMatched', 'bfPredTotal', 'bfTruthMatched', 'bfTruthTotal'] as const;

function countsDiffer(ours: FrameStats, peer: Record<string, number[]>): string | null {
  for (const k of STATS_KEYS) {
    const a = ours[k], b = peer[k];
    if (a.length !== b.length) return `${k}: length ${a.length} vs ${b.length}`;
    for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return `${k}[${i}]: ${a[i]} vs ${b[i]}`;
  }
  return null;
}

type Row = { target: string; ours: string; peer: string; ratio: string; met: boolean | null };
const rows: Row[] = [];

const root = mkdtempSync(join(tmpdir(), 'hairline-bench-e2e-'));
try {
  const py = opencvPython();
  datasetMake(root);
  const table = (() => {
    const t = classTableFromJson(classesJson);
    if (!t.ok) throw new Error(t.error);
    return t.value;
  })();
  const files = Array.from({ length: DISTINCT }, (_, d) => ({
    truth: { file: `truth/src${d}.png`, bytes: new Uint8Array(readFileSync(join(root, 'truth', `src${d}.png`))) },
    pred: { file: `pred/src${d}.png`, bytes: new Uint8Array(readFileSync(join(root, 'pred', `src${d}.png`))) },
  }));

  // Hairline in one thread, in process: decode, frameScore, and the whole frame job (decode + scores + regions).
  const scratch = scoreScratchCreate(), regionScratch = regionScratchCreate();
  const t = { decode: [] as number[], scores: [] as number[], job: [] as number[] };
  const stats: FrameStats[] = [];
  for (let rep = 0; rep <= REPS; rep++) {
    for (const f of files) {
      const t0 = performance.now();
      const truth = labelMapRead(f.truth.bytes, { file: f.truth.file, table, role: 'truth' });
      const pred = labelMapRead(f.pred.bytes, { file: f.pred.file, table, role: 'prediction' });
      const t1 = performance.now();
      if (!truth.ok || !pred.ok) throw new Error('decode failed');
      const s = frameScore(truth.value, pred.value, classIds, settings, scratch);
      const t2 = performance.now();
      if (!s.ok) throw new Error(s.error);
      const job = frameJobScore({ name: 'f', truth: f.truth, preds: [{ run: 'r', file: f.pred }], table, settings }, scratch, regionScratch);
      const t3 = performance.now();
      if (job.error || job.runs[0].error) throw new Error(job.error ?? job.runs[0].error ?? '');
      if (rep === 0) {
        stats.push(s.value);
        continue;
      }
      t.decode.push(t1 - t0);
      t.scores.push(t2 - t1);
      t.job.push(t3 - t2);
    }
  }
  const [decodeMs, scoresMs, jobMs] = [median(t.decode), median(t.scores), median(t.job)];
  console.log(`Hairline, one thread in process, ${W}×${H}, ${classIds.length} classes, ${DISTINCT} frames × ${REPS} reps (median per frame):`);
  console.log(`  decode both PNGs ${decodeMs.toFixed(1)} ms, frameScore ${scoresMs.toFixed(1)} ms (${((scoresMs * 1e6) / N).toFixed(1)} ns/px), ` +
    `frame job (decode + scores + regions) ${jobMs.toFixed(1)} ms`);

  let peer: { decode: number; scores: number; total: number } | null = null;
  if (py) {
    const manifest = join(root, 'peer.json');
    writeFileSync(manifest, JSON.stringify({
      classes: classIds, ...settings,
      frames: files.map((_, d) => ({ truth: join(root, 'truth', `src${d}.png`), pred: join(root, 'pred', `src${d}.png`) })),
    }));
    const r = spawnSync(py, [PEER, '--frames', manifest, '--reps', String(REPS)], { encoding: 'utf8', maxBuffer: 1 << 28, env: { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1' } });
    if (r.status !== 0) throw new Error(`opencv_peer.py failed: ${r.error?.message ?? r.stderr}`);
    const out = JSON.parse(r.stdout) as { opencv: string; numpy: string; frames: Record<string, number[]>[]; timing: { decode: number; scores: number; total: number } };
    for (let d = 0; d < DISTINCT; d++) {
      const diff = countsDiffer(stats[d], out.frames[d]);
      if (diff) throw new Error(`OpenCV peer and frameScore disagree on frame ${d}: ${diff}`);
    }
    peer = out.timing;
    console.log(`OpenCV peer (opencv_peer.py, OpenCV ${out.opencv}, numpy ${out.numpy}, one thread; every count equal to frameScore's on all ${DISTINCT} frames):`);
    console.log(`  decode both PNGs ${peer.decode.toFixed(1)} ms, scores ${peer.scores.toFixed(1)} ms (${((peer.scores * 1e6) / N).toFixed(1)} ns/px), decode + scores ${peer.total.toFixed(1)} ms`);
  }

  if (!process.argv.includes('--no-cli')) {
    const run1 = cliPerFrame(root, 1, 4, 20, Math.max(1, Math.min(3, REPS)));
    const run2 = cliPerFrame(root, 2, 8, 40, Math.max(1, Math.min(3, REPS)));
    const cli1 = run1.wall, cli2 = run2.wall;
    console.log(`Hairline CLI (npm run score, decode + scores + regions, marginal per frame): 1 worker ${cli1.toFixed(1)} ms, 2 workers ${cli2.toFixed(1)} ms (${(1000 / cli2).toFixed(1)} frames/s)`);
    console.log(`  CPU time per frame (all threads, user + system): 1 worker ${run1.cpu.toFixed(1)} ms, 2 workers ${run2.cpu.toFixed(1)} ms; ` +
      `load average ${loadavg().map((v) => v.toFixed(1)).join(' ')} (a wall figure well above the CPU figure means the machine was busy)`);

    rows.push({
      target: 'headless end to end, 1 worker, per frame vs peer decode + scores: ≥ 4× faster',
      ours: `${cli1.toFixed(0)} ms`, peer: peer ? `${peer.total.toFixed(0)} ms` : 'not run',
      ratio: peer ? `${(peer.total / cli1).toFixed(2)}×` : '—', met: peer ? peer.total / cli1 >= 4 : null,
    });
    rows.push({
      target: 'all per-frame scores, one thread: ≤ 20 ns/px',
      ours: `${((scoresMs * 1e6) / N).toFixed(1)} ns/px (${scoresMs.toFixed(0)} ms)`, peer: peer ? `${((peer.scores * 1e6) / N).toFixed(1)} ns/px (${peer.scores.toFixed(0)} ms)` : 'not run',
      ratio: peer ? `${(peer.scores / scoresMs).toFixed(2)}×` : '—', met: (scoresMs * 1e6) / N <= 20,
    });
    rows.push({
      target: 'headless end to end, 2 workers, scores + regions + decode: ≥ 20 frames/s',
      ours: `${(1000 / cli2).toFixed(1)} frames/s`, peer: peer ? `${(1000 / peer.total).toFixed(1)} frames/s (1 thread)` : 'not run',
      ratio: peer ? `${(peer.total / cli2).toFixed(2)}×` : '—', met: 1000 / cli2 >= 20,
    });
    console.log('\ntarget | Hairline | OpenCV peer | peer / Hairline | met');
    for (const r of rows) console.log(`${r.target} | ${r.ours} | ${r.peer} | ${r.ratio} | ${r.met === null ? '?' : r.met ? 'MET' : 'MISSED'}`);
    if (process.argv.includes('--markdown')) {
      console.log('\n| target | Hairline | OpenCV peer | peer / Hairline | met |\n|---|---|---|---|---|');
      for (const r of rows) console.log(`| ${r.target} | ${r.ours} | ${r.peer} | ${r.ratio} | ${r.met === null ? '?' : r.met ? 'yes' : 'no'} |`);
    }
  }
} finally {
  rmSync(root, { recursive: true, force: true });
}
