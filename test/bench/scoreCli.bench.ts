/**
 * End-to-end benchmark of the headless scorer (`npm run score`): 2048×1024 frames with 12 classes,
 * PNG decode included, all worker threads; frames/s and peak RSS at 100 and 1000 frames (the same few
 * distinct frames hard-linked under many names, so every frame is read, decoded and scored for real).
 * Run: npx tsx test/bench/scoreCli.bench.ts [small=100] [large=1000]
 */
import { spawnSync } from 'node:child_process';
import { linkSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from '../support/harbourScene.ts';

const W = 2048, H = 1024, DISTINCT = 4;
const [small = 100, large = 1000] = process.argv.slice(2).map(Number);

function datasetMake(root: string, frames: number): void {
  mkdirSync(join(root, 'truth'), { recursive: true });
  mkdirSync(join(root, 'pred'), { recursive: true });
  const colors = ['#7aa6d8', '#1d5a82', '#9c9484', '#5b4a6e', '#c0623a', '#e0b336', '#2f9c8f', '#d94c6b', '#e8e05a', '#a58be0', '#7a5a3c', '#4f9b45'];
  writeFileSync(join(root, 'classes.json'), JSON.stringify({ ignore: 255, classes: HARBOUR_CLASSES.map((name, id) => ({ id, name, color: colors[id % colors.length] })) }));
  for (let d = 0; d < DISTINCT; d++) {
    const truth = harbourTruth(W, H, 2000 + d);
    writeFileSync(join(root, 'truth', `src${d}.png`), labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(root, 'pred', `src${d}.png`), labelMapToPng(harbourPrediction(truth, 2000 + d), { kind: 'gray', bitDepth: 8 }));
  }
  for (let i = 0; i < frames; i++) {
    for (const dir of ['truth', 'pred']) linkSync(join(root, dir, `src${i % DISTINCT}.png`), join(root, dir, `f${String(i).padStart(5, '0')}.png`));
  }
  for (let d = 0; d < DISTINCT; d++) for (const dir of ['truth', 'pred']) rmSync(join(root, dir, `src${d}.png`));
}

function run(root: string, frames: number): { seconds: number; fps: number; rssMb: number } {
  const t0 = process.hrtime.bigint();
  const r = spawnSync('/usr/bin/time', ['-f', '%M', process.execPath, '--import', 'tsx', 'src/cli/score.ts',
    '--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--classes', join(root, 'classes.json'), '--out', join(root, 'report.json')], { encoding: 'utf8' });
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`scorer failed (${r.status}): ${r.stderr}`);
  const rssKb = Number(r.stderr.trim().split('\n').pop());
  return { seconds, fps: frames / seconds, rssMb: rssKb / 1024 };
}

const root = mkdtempSync(join(tmpdir(), 'hairline-bench-cli-'));
try {
  console.log(`headless scorer, ${W}×${H}, ${HARBOUR_CLASSES.length} classes, ${availableParallelism()} worker threads, PNG decode included`);
  const rows: { frames: number; seconds: number; fps: number; rssMb: number }[] = [];
  for (const n of [small, large]) {
    const dir = join(root, String(n));
    datasetMake(dir, n);
    const r = run(dir, n);
    rows.push({ frames: n, ...r });
    console.log(`  ${String(n).padStart(5)} frames: ${r.seconds.toFixed(1)} s wall (start-up included), ${r.fps.toFixed(1)} frames/s, peak RSS ${r.rssMb.toFixed(0)} MB`);
  }
  const [a, b] = rows;
  console.log(`  peak RSS ratio ${b.frames}/${a.frames} frames: ${(b.rssMb / a.rssMb).toFixed(2)} (flat = 1.00); target ≥ 20 frames/s, ≤ 300 MB at 1000 frames`);
} finally {
  rmSync(root, { recursive: true, force: true });
}
