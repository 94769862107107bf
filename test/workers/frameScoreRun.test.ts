import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { PNG } from 'pngjs';
import { afterAll, describe, expect, it } from 'vitest';
import { diskFileReader } from '../../src/cli/diskFiles.ts';
import { scoreFileJobs } from '../../src/cli/scoreFiles.ts';
import { classTableGenerated } from '../../src/core/classTable.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';
import { regionScratchCreate } from '../../src/core/regions/regionScratch.ts';
import { blobFileReader, fileBlobOf, type FileBlob } from '../../src/workers/blobFiles.ts';
import { frameScoreRun } from '../../src/workers/frameScoreRun.ts';
import { scoreJobs } from '../../src/workers/scoreJobs.ts';

// The one frame-job runner of the page (Blobs) and the command line (files): a ground truth, prediction,
// photo or confidence map that cannot be read is reported the same way on both paths,
// "<file>: could not be read (<reason>)". Label PNGs are written by pngjs (a second PNG implementation).

const W = 6, H = 4;
function grayPng(fill: (i: number) => number): Uint8Array {
  const p = new PNG({ width: W, height: H, colorType: 0, bitDepth: 8, inputColorType: 0, inputHasAlpha: false });
  p.data = Buffer.from(Array.from({ length: W * H }, (_, i) => fill(i)));
  return new Uint8Array(PNG.sync.write(p, { colorType: 0, bitDepth: 8, inputColorType: 0, inputHasAlpha: false }));
}
const truthPng = grayPng((i) => (i % W < 3 ? 0 : 1));
const predPng = grayPng((i) => (i % W < 2 ? 0 : 1));
const base = { name: 'x', table: classTableGenerated(-1, 255), settings: DEFAULT_SCORE_SETTINGS };
const blob = (b: Uint8Array) => new Blob([b as BlobPart]);
/** A Blob whose read fails, as a File removed from disk after it was dropped. */
const vanished = { size: 100, slice: () => vanished, arrayBuffer: () => Promise.reject(new Error('the file was removed')) } as unknown as Blob;

const dir = mkdtempSync(join(tmpdir(), 'hairline-frame-run-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('frameScoreRun (src/workers/frameScoreRun.ts) in the page: Blobs', () => {
  it('an unreadable prediction fails its run naming the file; photo and confidence only lose their evidence, with a warning', async () => {
    const r = await frameScoreRun({
      ...base,
      truth: { file: 'truth/x.png', blob: blob(truthPng) },
      preds: [
        { run: 'a', file: { file: 'predictions/a/x.png', blob: blob(predPng) } },
        { run: 'b', file: { file: 'predictions/b/x.png', blob: vanished } },
        // the source failed to give the file (a served dataset answering 404): the page keeps the reason
        { run: 'c', file: await fileBlobOf('predictions/c/x.png', () => Promise.reject(new Error('predictions/c/x.png: could not be read (HTTP 404)'))) },
      ],
      photo: { file: 'images/x.png', blob: vanished },
      confidence: [{ run: 'a', file: { file: 'confidence/a/x.png', blob: vanished } }],
    }, blobFileReader, scoreScratchCreate(), regionScratchCreate());
    expect(r.error).toBeNull();
    expect(r.runs.map((x) => [x.run, x.error])).toEqual([
      ['a', null],
      ['b', 'predictions/b/x.png: could not be read (the file was removed)'],
      ['c', 'predictions/c/x.png: could not be read (HTTP 404)'],
    ]);
    expect(r.runs[0].stats!.confusion.reduce((s, v) => s + v, 0)).toBe(W * H);
    expect(r.warnings!.slice(0, 2)).toEqual([
      'images/x.png: could not be read (the file was removed); image evidence not used on this frame',
      'confidence/a/x.png: could not be read (the file was removed); confidence of a not used on this frame',
    ]);
  });

  it('an unreadable ground truth fails the frame and every run with the reason (the worker\'s job table)', async () => {
    const truth: FileBlob = { file: 'truth/x.png', blob: null, error: 'Failed to fetch' };
    const out = await scoreJobs.frameScore({ ...base, truth, preds: [{ run: 'a', file: { file: 'predictions/a/x.png', blob: blob(predPng) } }], photo: null });
    expect(out.value.error).toBe('truth/x.png: could not be read (Failed to fetch)');
    expect(out.value.runs).toEqual([{ run: 'a', stats: null, error: 'truth/x.png: could not be read (Failed to fetch)' }]);
  });
});

describe('frameScoreRun on the command line: files', () => {
  mkdirSync(join(dir, 'truth'));
  writeFileSync(join(dir, 'truth', 'x.png'), truthPng);
  writeFileSync(join(dir, 'a.png'), predPng);
  const path = (file: string, p: string) => ({ file, path: join(dir, p) });

  it('reports the same things in the same words, the reason being the system error code', async () => {
    const r = await frameScoreRun({
      ...base,
      truth: path('truth/x.png', 'truth/x.png'),
      preds: [{ run: 'a', file: path('a/x.png', 'a.png') }, { run: 'b', file: path('b/x.png', 'gone.png') }],
      photo: path('images/x.png', 'gone-photo.png'),
      confidence: [{ run: 'a', file: path('confidence/a/x.png', 'gone-conf.png') }],
    }, diskFileReader(), scoreScratchCreate(), regionScratchCreate());
    expect(r.runs.map((x) => [x.run, x.error])).toEqual([['a', null], ['b', 'b/x.png: could not be read (ENOENT)']]);
    expect(r.warnings!.slice(0, 2)).toEqual([
      'images/x.png: could not be read (ENOENT); image evidence not used on this frame',
      'confidence/a/x.png: could not be read (ENOENT); confidence of a not used on this frame',
    ]);
  });

  it('an unreadable ground truth fails the frame (the thread\'s job table)', async () => {
    const out = await scoreFileJobs.frameScore({ ...base, truth: path('truth/y.png', 'truth/y.png'), preds: [{ run: 'a', file: null }], photo: null });
    expect(out.value.error).toBe('truth/y.png: could not be read (ENOENT)');
  });
});
