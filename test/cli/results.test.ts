import { spawnSync } from 'node:child_process';
import { cpSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { tableRowGroups } from '../../src/cli/parquetTable.ts';
import { shardParse, shardRange } from '../../src/cli/shard.ts';
import { parquetRowsArrow } from '../support/parquetArrow.ts';
import { scoreCli } from './scoreRun.ts';

// Results folders (README "Large datasets") from the real CLI on a small Kestrel Quay demo with a
// confidence map for one run: the folder says what the JSON report says (the report is the
// reference here, itself checked against numpy/scipy in score.test.ts); its Parquet tables read the
// same with a second, independent reader (parquet-wasm, the Rust parquet crate, via Apache Arrow);
// shards merged equal one run on every number; bad merges are refused.

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
let dir = '';
let kq = '';
let tiny = '';

function run(args: string[], cmd = 'src/cli/score.ts') {
  const r = spawnSync(process.execPath, ['--import', 'tsx', cmd, ...args], { cwd: ROOT, encoding: 'utf8', timeout: 600_000 });
  if (r.error) throw r.error;
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
const merge = (args: string[]) => run(args, 'src/cli/merge.ts');
const dataArgs = (root: string) => [
  '--truth', join(root, 'truth'), '--pred', `a=${join(root, 'predictions', 'run-a')}`, '--pred', `b=${join(root, 'predictions', 'run-b')}`,
  '--confidence', `a=${join(root, 'confidence')}`, '--images', join(root, 'images'), '--instances', join(root, 'instances'), '--classes', join(root, 'classes.json'), '--workers', '2',
];
function scoreOk(args: string[]) {
  const r = scoreCli(args, 600_000);
  if (r.status !== 0) throw new Error(`score ${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  return r;
}
async function rows(path: string): Promise<Record<string, unknown>[]> {
  const out: Record<string, unknown>[] = [];
  for await (const g of tableRowGroups<Record<string, unknown>>(path)) out.push(...g);
  return out;
}
const summary = (d: string) => JSON.parse(readFileSync(join(d, 'summary.json'), 'utf8'));

/** Expects equal JSON values, numbers within `tol` (1e-12: the report sums frame means in float, the folder exactly). */
function expectClose(a: unknown, b: unknown, path = '', tol = 1e-12): void {
  if (typeof a === 'number' && typeof b === 'number') {
    expect(Math.abs(a - b), `${path}: ${a} vs ${b}`).toBeLessThanOrEqual(tol);
    return;
  }
  if (a && b && typeof a === 'object' && typeof b === 'object') {
    expect(Object.keys(a).sort(), path).toEqual(Object.keys(b).sort());
    for (const k of Object.keys(a)) expectClose((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`, tol);
    return;
  }
  expect(a, path).toEqual(b);
}

/** Writes an 8-bit confidence map per frame for run-a: high where run-a's prediction keeps its class over a 3×3 neighbourhood, lower elsewhere, with a seeded ripple. */
function confidenceWrite(root: string): void {
  const out = join(root, 'confidence');
  mkdirSync(out, { recursive: true });
  for (const name of readdirSync(join(root, 'predictions', 'run-a'))) {
    const m = labelMapFromPng(new Uint8Array(readFileSync(join(root, 'predictions', 'run-a', name))), { file: name });
    if (!m.ok) throw new Error(m.error);
    const { width, height, ids } = m.value;
    const conf = new Uint8Array(width * height);
    for (let y = 0; y < height; y++) {
      for (let x = 0; x < width; x++) {
        const i = y * width + x;
        const edge = x > 0 && x < width - 1 && y > 0 && y < height - 1 && (ids[i - 1] !== ids[i] || ids[i + width] !== ids[i]);
        conf[i] = (edge ? 90 : 200) + ((x * 7 + y * 13 + ids[i] * 5) % 50);
      }
    }
    writeFileSync(join(out, name), labelMapToPng({ width, height, ids: conf }, { kind: 'gray', bitDepth: 8 }));
  }
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'hairline-results-'));
  kq = join(dir, 'kq');
  const demo = run(['--out', kq, '--size', '256x128', '--frames', '24', '--threads', '2'], 'src/cli/demo.ts');
  if (demo.status !== 0) throw new Error(`demo failed: ${demo.stderr}`);
  confidenceWrite(kq);
  // A two-frame dataset, so that one of three shards is empty.
  tiny = join(dir, 'tiny');
  for (const sub of ['truth', 'predictions/run-a', 'predictions/run-b', 'confidence', 'images', 'instances']) {
    mkdirSync(join(tiny, sub), { recursive: true });
    for (const f of ['kq-0005.png', 'kq-0006.png']) cpSync(join(kq, sub, f), join(tiny, sub, f));
  }
  cpSync(join(kq, 'classes.json'), join(tiny, 'classes.json'));
  scoreOk([...dataArgs(kq), '--results', join(dir, 'all')]);
  scoreOk([...dataArgs(kq), '--out', join(dir, 'report.json')]);
}, 900_000);
afterAll(() => dir && rmSync(dir, { recursive: true, force: true }));

describe('npm run score -- --results DIR', () => {
  it('summary.json holds the JSON report\'s classes, settings and dataset block, for every run', () => {
    const s = summary(join(dir, 'all'));
    const report = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8'));
    expect(s.classes).toEqual(report.classes);
    expect(s.settings).toEqual(report.settings);
    expect(Object.keys(report.dataset)).toEqual(expect.arrayContaining(['flipBack', 'flipBackVoid', 'flipBackPerClass', 'objectsBySize', 'objectsBySizePerClass', 'smallObjectRecall', 'iIoU']));
    expectClose(s.dataset, report.dataset, 'dataset');
    for (const r of ['a', 'b']) expectClose(s.runs[r], report.runs[r], `runs.${r}`);
    expect(s.runNames).toEqual(['a', 'b']);
    expect(s.frames).toEqual({ total: 24, from: 0, to: 24, scored: 24, failed: 0 });
    expect(Object.keys(s.sums.confidence)).toEqual(['a']); // the confidence map was used
  });

  it('the frame, region and queue tables say what the report says', async () => {
    const report = JSON.parse(readFileSync(join(dir, 'report.json'), 'utf8'));
    const frames = await rows(join(dir, 'all', 'frames.parquet'));
    expect(frames.length).toBe(48);
    // The demo's run-a flickers on odd frames: rates are there, and null only at the sequence ends.
    expect(frames.filter((f) => f.run === 'a' && typeof f.flipBack === 'number' && f.flipBack > 0).length).toBeGreaterThan(5);
    expect(frames.filter((f) => f.flipBack === null).map((f) => f.frameIndex).sort()).toEqual([0, 0, 23, 23]);
    const firstRun = frames.filter((f) => f.run === 'a');
    expect(firstRun.map((f) => f.frame)).toEqual(report.frames.map((f: { name: string }) => f.name));
    firstRun.forEach((f, i) => {
      const line = report.frames[i];
      for (const k of ['meanIoU', 'pixelAccuracy', 'boundaryIoU', 'boundaryF', 'flipBack', 'flipBackVoid', 'smallObjectRecall'] as const) expectClose(f[k], line[k], `${line.name}.${k}`);
      expect(f.error).toBe(line.error);
    });
    const regions = (await rows(join(dir, 'all', 'regions.parquet'))).filter((r) => r.run === 'a');
    report.frames.forEach((line: { name: string; regions: { kind: string; truthClass: number; predictedClass: number | null; area: number; bbox: number[] }[]; voidSpill: { regions: { predictedClass: number; area: number; bbox: number[] }[] } }) => {
      const mine = regions.filter((r) => r.frame === line.name);
      expect(mine.filter((r) => r.kind !== 'voidSpill').map((r) => ({ kind: r.kind, truthClass: r.truthClass, predictedClass: r.predictedClass, area: r.area, bbox: [r.x0, r.y0, r.x1, r.y1] })), line.name).toEqual(line.regions);
      expect(mine.filter((r) => r.kind === 'voidSpill').map((r) => ({ predictedClass: r.predictedClass, area: r.area, bbox: [r.x0, r.y0, r.x1, r.y1] })), line.name).toEqual(line.voidSpill.regions);
    });
    const queue = await rows(join(dir, 'all', 'queue.parquet'));
    expect(queue.length).toBe(report.suspects.length);
    expect(queue.length).toBeGreaterThan(20);
    expect(queue.some((q) => q.confidence !== null)).toBe(true);
    expect(queue.some((q) => q.appearance !== null && q.image !== null)).toBe(true);
    queue.forEach((q, i) => {
      const r = report.suspects[i];
      expect({ frame: q.frame, run: q.run, bbox: [q.x0, q.y0, q.x1, q.y1], truthClass: q.truthClass, predictedClass: q.predictedClass, kind: q.kind }, `queue ${i}`)
        .toEqual({ frame: r.frame, run: r.run, bbox: r.bbox, truthClass: r.truthClass, predictedClass: r.predictedClass, kind: r.kind });
      expectClose(q.score, r.score, `queue ${i} score`);
      expect(JSON.parse(q.reasons as string), `queue ${i}`).toEqual(r.reasons);
      expect(q.rank).toBe(i + 1);
    });
  });

  it('a second Parquet reader (parquet-wasm + Apache Arrow) reads the same rows as hyparquet', async () => {
    for (const t of ['frames', 'regions', 'queue']) {
      const path = join(dir, 'all', `${t}.parquet`);
      const mine = await rows(path);
      const theirs = parquetRowsArrow(path);
      expect(theirs.length, t).toBe(mine.length);
      expect(theirs, t).toEqual(mine);
    }
  });

  it('refuses --shard without --results, a bad shard, and --out with --results', () => {
    expect(scoreCli([...dataArgs(kq), '--shard', '0/2']).stderr).toMatch(/--shard needs --results DIR/);
    const bad = scoreCli([...dataArgs(kq), '--results', join(dir, 'x'), '--shard', '2/2']);
    expect(bad.status).toBe(1);
    expect(bad.stderr).toMatch(/--shard: --shard 2\/2 does not name a shard K of N with 0 ≤ K < N/);
    expect(scoreCli([...dataArgs(kq), '--results', join(dir, 'x'), '--out', join(dir, 'x.json')]).stderr).toMatch(/leave out --out and --csv/);
  }, 120_000);
});

describe('--shard K/N and npm run merge', () => {
  it('shards of 2 and 3 (uneven), merged in any order, equal one run on every number and row', async () => {
    for (const n of [2, 3]) {
      const parts = Array.from({ length: n }, (_, k) => join(dir, `s${n}-${k}`));
      parts.forEach((p, k) => scoreOk([...dataArgs(kq), '--results', p, '--shard', `${k}/${n}`]));
      expect(summary(parts[0]).frames).toMatchObject({ from: 0, to: Math.floor(24 / n) });
      const out = join(dir, `m${n}`);
      const m = merge(['--out', out, ...[...parts].reverse()]);
      expect(m.status, m.stderr).toBe(0);
      expect(summary(out)).toEqual(summary(join(dir, 'all')));
      for (const t of ['frames', 'regions', 'queue']) expect(await rows(join(out, `${t}.parquet`)), `${n} shards: ${t}`).toEqual(await rows(join(dir, 'all', `${t}.parquet`)));
    }
  }, 600_000);

  it('an empty shard merges too (three shards of two frames)', async () => {
    scoreOk([...dataArgs(tiny), '--results', join(dir, 'tiny-all')]);
    const parts = [0, 1, 2].map((k) => join(dir, `tiny-${k}`));
    parts.forEach((p, k) => scoreOk([...dataArgs(tiny), '--results', p, '--shard', `${k}/3`]));
    expect(summary(parts[0]).frames).toEqual({ total: 2, from: 0, to: 0, scored: 0, failed: 0 });
    const m = merge(['--out', join(dir, 'tiny-m'), ...parts]);
    expect(m.status, m.stderr).toBe(0);
    expect(summary(join(dir, 'tiny-m'))).toEqual(summary(join(dir, 'tiny-all')));
    for (const t of ['frames', 'regions', 'queue']) expect(await rows(join(dir, 'tiny-m', `${t}.parquet`))).toEqual(await rows(join(dir, 'tiny-all', `${t}.parquet`)));
  }, 300_000);

  it('refuses missing and doubled shards, and parts of other settings, datasets or runs (exit 2, naming the difference)', () => {
    const p = (n: number, k: number) => join(dir, `s${n}-${k}`);
    const refused = (args: string[], pattern: RegExp) => {
      const r = merge(['--out', join(dir, 'refused'), ...args]);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr).toMatch(pattern);
    };
    refused([p(3, 0), p(3, 2)], /refused: shard 1\/3 missing/);
    refused([p(3, 0), p(3, 1), p(3, 1), p(3, 2)], /shard 1\/3 is given twice/);
    refused([p(3, 0), p(2, 1)], /is one of 3 shards/);
    refused([join(dir, 'tiny-0'), p(3, 1)], /differ in their dataset \(frame names and runs\): datasetId/);
    scoreOk([...dataArgs(kq), '--biou-ratio', '0.05', '--results', join(dir, 'ratio-1'), '--shard', '1/2']);
    refused([p(2, 0), join(dir, 'ratio-1')], /differ in their scoring settings: biouDilationRatio: 0\.02 vs 0\.05/);
    refused([p(2, 0), join(dir, 'all')], /holds every frame/);
    refused([p(2, 0), join(dir, 'kq')], /not a results folder/);
  }, 300_000);
});

describe('shardParse and shardRange', () => {
  it('reads K/N, a Slurm job array and a Kubernetes Indexed Job', () => {
    expect(shardParse('2/5', {})).toEqual({ index: 2, count: 5 });
    expect(shardParse('auto', { SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_COUNT: '4' })).toEqual({ index: 2, count: 4 });
    expect(shardParse('auto', { JOB_COMPLETION_INDEX: '0', HAIRLINE_SHARDS: '8' })).toEqual({ index: 0, count: 8 });
    expect(() => shardParse('auto', {})).toThrow(/not in a Slurm job array/);
    expect(() => shardParse('auto', { JOB_COMPLETION_INDEX: '1' })).toThrow(/HAIRLINE_SHARDS=\(unset\)/);
    expect(() => shardParse('1-4', {})).toThrow(/K\/N/);
    expect(() => shardParse('4/4', {})).toThrow(/0 ≤ K < N/);
  });

  it('splits frames into contiguous runs covering each frame once, sizes within one', () => {
    for (const [total, count] of [[24, 5], [2, 3], [100000, 7], [0, 2]]) {
      let next = 0;
      const sizes: number[] = [];
      for (let index = 0; index < count; index++) {
        const r = shardRange(total, { index, count });
        expect(r.from).toBe(next);
        next = r.to;
        sizes.push(r.to - r.from);
      }
      expect(next).toBe(total);
      expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
    }
  });
});
