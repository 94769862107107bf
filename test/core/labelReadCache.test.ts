import { describe, expect, it } from 'vitest';
import { classTableGenerated } from '../../src/core/classTable.ts';
import { frameJobScore, type FrameJobInput } from '../../src/core/frameJob.ts';
import { labelMapRead } from '../../src/core/labelRead.ts';
import { labelMapReadCached, labelReadCacheCreate } from '../../src/core/labelReadCache.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { PNG } from 'pngjs';
import { harbourPrediction, harbourTruth } from '../support/harbourScene.ts';

// The per-thread cache of decoded predictions (flicker reads each prediction for three frames): a
// hit is only the same bytes under the same name, and frames scored through one shared scratch give
// what each frame scored alone gives. Decoded maps are checked against pngjs (a second PNG decoder).
const W = 64, H = 40;
const table = classTableGenerated(-1, 255);
const truth = harbourTruth(W, H, 5);
const preds = [0, 1, 2, 3, 4].map((s) => harbourPrediction(truth, 10 + s, 3));
const png = (ids: Uint8Array) => labelMapToPng({ width: W, height: H, ids }, { kind: 'gray', bitDepth: 8 });
const opts = (file: string) => ({ file, table, role: 'prediction' as const });

describe('labelMapReadCached', () => {
  it('returns the same map as decoding, and pngjs reads the same ids', () => {
    const cache = labelReadCacheCreate(2);
    const bytes = png(preds[0].ids as Uint8Array);
    const first = labelMapReadCached(cache, bytes, opts('p/0.png'));
    const again = labelMapReadCached(cache, bytes.slice(), opts('p/0.png')); // equal bytes, another buffer: a hit
    expect(first.ok && again.ok && again.value === first.value).toBe(true);
    const plain = labelMapRead(bytes, opts('p/0.png'));
    if (!plain.ok || !first.ok) throw new Error('decode failed');
    expect([...first.value.ids]).toEqual([...plain.value.ids]);
    const ref = PNG.sync.read(Buffer.from(bytes), { skipRescale: true });
    expect([...first.value.ids]).toEqual([...ref.data.filter((_, i) => i % 4 === 0)]);
  });

  it('decodes again when the bytes, name or role differ, keeps at most `capacity` maps and no errors', () => {
    const cache = labelReadCacheCreate(2);
    const a = png(preds[0].ids as Uint8Array), b = png(preds[1].ids as Uint8Array);
    const ra = labelMapReadCached(cache, a, opts('p/x.png'));
    const rb = labelMapReadCached(cache, b, opts('p/x.png')); // same name, other content
    if (!ra.ok || !rb.ok) throw new Error('decode failed');
    expect(rb.value).not.toBe(ra.value);
    expect([...rb.value.ids]).toEqual([...preds[1].ids]);
    const asTruth = labelMapReadCached(cache, b, { ...opts('p/x.png'), role: 'truth' });
    expect(asTruth.ok && asTruth.value !== rb.value).toBe(true);
    labelMapReadCached(cache, a, opts('p/y.png'));
    expect(cache.entries.length).toBe(2);
    const bad = labelMapReadCached(cache, a.subarray(0, 40), opts('p/z.png'));
    expect(bad.ok).toBe(false);
    expect(cache.entries.some((e) => e.key.includes('p/z.png'))).toBe(false);
  });
});

describe('frameJobScore over a sequence through one scratch', () => {
  it('gives every frame the scores, flicker and regions it gets scored alone', () => {
    const files = preds.map((p, i) => ({ file: `predictions/r/f${i}.png`, bytes: png(p.ids as Uint8Array) }));
    const truthFile = { file: 'truth/t.png', bytes: labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }) };
    const job = (i: number): FrameJobInput => ({
      name: `f${i}`, truth: truthFile, preds: [{ run: 'r', file: files[i] }], table, settings: DEFAULT_SCORE_SETTINGS,
      neighbours: [{ run: 'r', prev: i > 0 ? files[i - 1] : null, next: i < files.length - 1 ? files[i + 1] : null }],
    });
    const shared = scoreScratchCreate();
    let flickerSeen = 0;
    for (let i = 0; i < files.length; i++) {
      const together = frameJobScore(job(i), shared);
      const alone = frameJobScore(job(i));
      expect(together).toEqual(alone);
      if (together.runs[0].extras?.flicker?.flips) flickerSeen++;
    }
    expect(flickerSeen).toBeGreaterThan(0);
    expect(shared.reads.entries.length).toBeLessThanOrEqual(4);
  });
});
