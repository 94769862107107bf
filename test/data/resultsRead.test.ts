// The page's reader of results folders (src/data/results/resultsRead.ts), run in Node over a folder
// written by the real writer, against the same tables read back row by row with hyparquet.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parquetReadObjects } from 'hyparquet';
import { datasetIdOf } from '../../src/cli/scoreResults.ts';
import { datasetIdOfNames, pickedResultsFiles, rangeBatched, resultsRead, type ResultsFiles } from '../../src/data/results/resultsRead.ts';
import { resultsSynthesize, synthName } from '../support/resultsSynth.ts';

const FRAMES = 300;
let tmp: string;
let data: Awaited<ReturnType<typeof resultsSynthesize>>;
const names = Array.from({ length: FRAMES }, (_, i) => synthName(i));

/** The folder's files as the page gets them from a picked folder (Blobs under "results/NAME"). */
function picked(dir: string, change: Record<string, string> = {}): ResultsFiles {
  const files = readdirSync(dir).map((name) => ({ path: `results/${name}`, file: new Blob([change[name] ?? readFileSync(join(dir, name))]) }));
  return pickedResultsFiles(files)!;
}

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'hairline-results-read-'));
  data = await resultsSynthesize(tmp, { frames: FRAMES, runs: ['a', 'b'], classes: 6 });
}, 120_000);
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('results folder read in the page', () => {
  it('computes the dataset identity exactly as the scorer does', async () => {
    const runs = ['a', 'b'];
    expect(await datasetIdOfNames(runs, names)).toBe(datasetIdOf({ pairing: { runs, frames: names.map((name) => ({ name })) } }));
    expect(await datasetIdOfNames(runs, names)).toBe(data.summary.datasetId);
  });

  it('reads every frame row into the columns, the sums and the queue', async () => {
    const stored = await resultsRead(picked(data.results), { runs: ['a', 'b'], frameNames: names });
    expect(stored.frames).toBe(FRAMES);
    const buf = readFileSync(join(data.results, 'frames.parquet'));
    const rows = (await parquetReadObjects({ file: buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.byteLength) })) as Record<string, number | string | null>[];
    expect(rows.length).toBe(FRAMES * 2);
    for (const r of rows) {
      const c = stored.runs[r.run as string];
      const i = r.frameIndex as number;
      expect(c.present[i]).toBe(1);
      for (const k of ['meanIoU', 'pixelAccuracy', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels', 'validPixels', 'flipBack', 'flipBackVoid', 'smallObjectRecall'] as const) expect(c[k][i]).toBe(r[k] ?? NaN);
    }
    expect(stored.totals.a.frames).toBe(FRAMES);
    expect(stored.queue.length).toBe(data.summary.rows.queue);
    const q = (await parquetReadObjects({ file: (() => { const b = readFileSync(join(data.results, 'queue.parquet')); return b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength); })() })) as Record<string, unknown>[];
    expect(stored.queue[0]).toMatchObject({ frame: q[0].frame, run: q[0].run, score: q[0].score, bbox: [q[0].x0, q[0].y0, q[0].x1, q[0].y1] });
    expect(stored.settings).toEqual(data.summary.settings);
  });

  it('refuses the results of another dataset, a single shard, and a folder that is no results folder, naming them', async () => {
    await expect(resultsRead(picked(data.results), { runs: ['a', 'b'], frameNames: names.slice(1) })).rejects.toThrow(`results holds the results of ${FRAMES} frames, the open dataset has ${FRAMES - 1}`);
    await expect(resultsRead(picked(data.results), { runs: ['a', 'c'], frameNames: names })).rejects.toThrow('results was scored with runs a, b; the open dataset has a, c');
    await expect(resultsRead(picked(data.results), { runs: ['a', 'b'], frameNames: names.map((n) => `x${n}`) })).rejects.toThrow('holds the results of other frames');
    const summary = JSON.parse(readFileSync(join(data.results, 'summary.json'), 'utf8'));
    const shard = JSON.stringify({ ...summary, shard: { index: 1, count: 3 }, frames: { ...summary.frames, from: 100, to: 200 } });
    await expect(resultsRead(picked(data.results, { 'summary.json': shard }), { runs: ['a', 'b'], frameNames: names })).rejects.toThrow('holds shard 1/3 only (frames 100..199); merge the shards first');
    await expect(resultsRead(picked(data.results, { 'summary.json': '{"format":"other"' }), { runs: ['a', 'b'], frameNames: names })).rejects.toThrow('results/summary.json: not valid JSON');
    expect(pickedResultsFiles([{ path: 'x/truth/a.png', file: new Blob(['']) }])).toBeNull();
    const broken = join(tmp, 'broken');
    rmSync(broken, { recursive: true, force: true });
    (await import('node:fs')).mkdirSync(broken);
    writeFileSync(join(broken, 'summary.json'), readFileSync(join(data.results, 'summary.json')));
    await expect(resultsRead(picked(broken), { runs: ['a', 'b'], frameNames: names })).rejects.toThrow('results/frames.parquet: missing from the results folder');
  });

  it('joins reads issued together into few range reads, each slice its own bytes', async () => {
    const bytes = new Uint8Array(1000).map((_, i) => i % 251);
    const reads: [number, number][] = [];
    const buf = rangeBatched(bytes.length, async (s, e) => (reads.push([s, e]), bytes.slice(s, e).buffer), 100, 600);
    const want: [number, number][] = [[0, 10], [50, 60], [500, 520], [900, 1000], [20, 30]];
    const got = await Promise.all(want.map(([s, e]) => buf.slice(s, e)));
    got.forEach((g, i) => expect([...new Uint8Array(g)]).toEqual([...bytes.slice(...want[i])]));
    // 0..60 joined (gaps under 100), 500..520 alone (gap 440), 900..1000 alone.
    expect(reads).toEqual([[0, 60], [500, 520], [900, 1000]]);
  });
});
