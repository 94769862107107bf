/**
 * Memory of the headless scorer writing a results folder (`--results`, README "Large datasets")
 * against the JSON report (`--out`) on the same data in the same run: peak RSS of the whole process
 * (worker threads included) at two dataset sizes, and the growth between them. Frames are 128×64
 * with 12 classes and two runs; a few distinct frames are hard-linked under many names, so every
 * frame is read, decoded, scored and its regions found for real. Target (issue): RSS growth ≤ 40 MB
 * from 600 to 6,000 frames.
 * Run: npm run bench -- resultsMemory   (or npx tsx test/bench/resultsMemory.bench.ts [small=600] [large=6000])
 */
import { spawnSync } from 'node:child_process';
import { linkSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from '../support/harbourScene.ts';

const W = 128, H = 64, DISTINCT = 8;
const [small = 600, large = 6000] = process.argv.slice(2).map(Number);

function datasetMake(root: string, frames: number): void {
  for (const d of ['truth', 'pred-a', 'pred-b']) mkdirSync(join(root, d), { recursive: true });
  writeFileSync(join(root, 'classes.json'), JSON.stringify({ ignore: 255, classes: HARBOUR_CLASSES.map((name, id) => ({ id, name, color: `#${(id * 20 + 16).toString(16)}8040` })) }));
  for (let d = 0; d < DISTINCT; d++) {
    const truth = harbourTruth(W, H, 3000 + d);
    writeFileSync(join(root, 'truth', `src${d}.png`), labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(root, 'pred-a', `src${d}.png`), labelMapToPng(harbourPrediction(truth, 3000 + d), { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(root, 'pred-b', `src${d}.png`), labelMapToPng(harbourPrediction(truth, 4000 + d, 1), { kind: 'gray', bitDepth: 8 }));
  }
  for (let i = 0; i < frames; i++) {
    for (const dir of ['truth', 'pred-a', 'pred-b']) linkSync(join(root, dir, `src${i % DISTINCT}.png`), join(root, dir, `f${String(i).padStart(6, '0')}.png`));
  }
  for (let d = 0; d < DISTINCT; d++) for (const dir of ['truth', 'pred-a', 'pred-b']) rmSync(join(root, dir, `src${d}.png`));
}

function run(root: string, mode: 'results' | 'report'): { seconds: number; rssMb: number } {
  const out = mode === 'results' ? ['--results', join(root, 'results')] : ['--out', join(root, 'report.json')];
  const t0 = process.hrtime.bigint();
  const r = spawnSync('/usr/bin/time', ['-f', '%M', process.execPath, '--import', 'tsx', 'src/cli/score.ts',
    '--truth', join(root, 'truth'), '--pred', `a=${join(root, 'pred-a')}`, '--pred', `b=${join(root, 'pred-b')}`, '--classes', join(root, 'classes.json'),
    '--workers', '2', ...out], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0) throw new Error(`scorer failed (${r.status}): ${r.stderr.slice(-2000)}`);
  return { seconds, rssMb: Number(r.stderr.trim().split('\n').pop()) / 1024 };
}

const dir = mkdtempSync(join(tmpdir(), 'hairline-bench-results-'));
try {
  const figures: Record<string, Record<number, { seconds: number; rssMb: number }>> = { results: {}, report: {} };
  for (const n of [small, large]) {
    const root = join(dir, String(n));
    datasetMake(root, n);
    for (const mode of ['results', 'report'] as const) {
      figures[mode][n] = run(root, mode);
      const f = figures[mode][n];
      console.log(`${mode.padEnd(8)} ${String(n).padStart(6)} frames: peak RSS ${f.rssMb.toFixed(1)} MB, ${f.seconds.toFixed(1)} s (${(n / f.seconds).toFixed(0)} frames/s)`);
    }
    rmSync(root, { recursive: true, force: true });
  }
  for (const mode of ['results', 'report'] as const) {
    const a = figures[mode][small], b = figures[mode][large];
    console.log(`${mode.padEnd(8)} RSS growth ${small} → ${large} frames: ${(b.rssMb - a.rssMb).toFixed(1)} MB (${(((b.rssMb - a.rssMb) * 1024) / (large - small)).toFixed(2)} kB per frame)`);
  }
  console.log(`target: --results RSS growth ≤ 40 MB from 600 to 6,000 frames`);
} finally {
  rmSync(dir, { recursive: true, force: true });
}
