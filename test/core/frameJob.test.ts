import { describe, expect, it } from 'vitest';
import { classTableGenerated } from '../../src/core/classTable.ts';
import { frameJobScore, type FrameJobInput } from '../../src/core/frameJob.ts';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { DEFAULT_SCORE_SETTINGS } from '../../src/core/metrics/settings.ts';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { PNG } from 'pngjs';
import { paintRect } from '../support/paint.ts';
import { harbourPrediction, harbourTruth } from '../support/harbourScene.ts';
import { frameScore } from '../../src/core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';

// The scoring job's error-region part: regions beside the scores for every run, confidence maps read
// like label maps (encoded here by our encoder and by pngjs, a second PNG implementation), unusable
// optional inputs reported without losing the scores.

const W = 40, H = 30;
const table = classTableGenerated(-1, 255);
const png = (m: LabelMap) => labelMapToPng(m, { kind: 'gray', bitDepth: 8 });

function frame(): FrameJobInput {
  const truth: LabelMap = { width: W, height: H, ids: new Uint8Array(W * H) };
  paintRect(truth, 10, 10, 20, 20, 1);
  const a: LabelMap = { width: W, height: H, ids: new Uint8Array(W * H) };
  paintRect(a, 22, 10, 32, 20, 2);
  const b: LabelMap = { width: W, height: H, ids: new Uint8Array(W * H) };
  paintRect(b, 10, 10, 20, 20, 1);
  paintRect(b, 22, 10, 32, 20, 2);
  return {
    name: 'x', truth: { file: 'truth/x.png', bytes: png(truth) },
    preds: [{ run: 'a', file: { file: 'a/x.png', bytes: png(a) } }, { run: 'b', file: { file: 'b/x.png', bytes: png(b) } }],
    table, settings: DEFAULT_SCORE_SETTINGS,
  };
}

/** A 16-bit gray PNG written by pngjs (its own encoder), all pixels `value`. */
function gray16(w: number, h: number, value: number): Uint8Array {
  const p = new PNG({ width: w, height: h, colorType: 0, bitDepth: 16, inputColorType: 0, inputHasAlpha: false });
  const data = Buffer.alloc(w * h * 2);
  for (let i = 0; i < w * h; i++) data.writeUInt16BE(value, i * 2);
  p.data = data;
  return new Uint8Array(PNG.sync.write(p, { colorType: 0, bitDepth: 16, inputColorType: 0, inputHasAlpha: false }));
}

describe('frameJobScore: error regions', () => {
  it('every run gets its regions beside its scores, with the others as agreement evidence', () => {
    const r = frameJobScore(frame());
    expect(r.error).toBeNull();
    expect(r.warnings).toEqual([]);
    expect(r.grid!.truth.length).toBe(r.grid!.columns * r.grid!.rows);
    const a = r.runs[0].regions!, b = r.runs[1].regions!;
    // run a: missed the object of class 1 and predicted a false object of class 2; run b only the false object.
    // Worst first: the false object lies further from the truth's boundaries (fewer Band(3) pixels).
    expect(a.regions.map((x) => [x.kind, x.truthClass, x.predictedClass, x.area])).toEqual([['falseObject', 0, 2, 100], ['missedObject', 1, 0, 100]]);
    expect(a.regions[0].severity).toBeGreaterThan(a.regions[1].severity);
    expect(b.regions.map((x) => [x.kind, x.truthClass, x.predictedClass, x.area])).toEqual([['falseObject', 0, 2, 100]]);
    expect(a.regions[0].evidence.agreement).toEqual([{ run: 'b', share: 1 }]);
    expect(a.regions[1].evidence.agreement).toEqual([{ run: 'b', share: 0 }]);
    expect(r.runs[0].stats).not.toBeNull();
  });

  it('regions: false keeps the old result shape (scores only)', () => {
    const r = frameJobScore({ ...frame(), regions: false });
    expect(r.runs.every((x) => x.regions === undefined)).toBe(true);
    expect(r.grid).toBeUndefined();
  });

  it('a 16-bit confidence map (pngjs) is read; its per-class sums are where label and prediction agree', () => {
    const r = frameJobScore({ ...frame(), confidence: [{ run: 'b', file: { file: 'confidence/b/x.png', bytes: gray16(W, H, 52428) } }] });
    expect(r.warnings).toEqual([]);
    expect(r.runs[0].regions!.confidence).toBeNull();
    const c = r.runs[1].regions!.confidence!;
    // run b agrees with the truth everywhere but its false object: 1200 − 100 − 100 class-0 pixels, 100 class-1 pixels.
    expect(c.classIds).toEqual([0, 1, 2]);
    expect(Array.from(c.count)).toEqual([1000, 100, 0]);
    expect(c.sum[1]).toBeCloseTo(100 * (52428 / 65535), 9);
    expect(r.runs[1].regions!.regions[0].evidence.confidence![12]).toBe(100); // 0.8 → bin 12 of 16
  });

  it('an unusable confidence map loses only its evidence: a warning names the file and the problem', () => {
    const palette = labelMapToPng({ width: W, height: H, ids: new Uint8Array(W * H) }, { kind: 'palette', colors: new Uint8Array(3 * 4) });
    const wrongSize = png({ width: W + 1, height: H, ids: new Uint8Array((W + 1) * H) });
    const r = frameJobScore({
      ...frame(),
      confidence: [{ run: 'a', file: { file: 'confidence/a/x.png', bytes: palette } }, { run: 'b', file: { file: 'confidence/b/x.png', bytes: wrongSize } }],
    });
    expect(r.error).toBeNull();
    expect(r.warnings).toHaveLength(2);
    expect(r.warnings![0]).toMatch(/^confidence\/a\/x\.png: is a palette PNG; confidence maps must be 8- or 16-bit grayscale.*confidence of a not used/);
    expect(r.warnings![1]).toMatch(/^confidence\/b\/x\.png: is 41×30 pixels but truth\/x\.png is 40×30/);
    expect(r.runs.every((x) => x.regions && x.regions.confidence === null && x.stats)).toBe(true);
  });

  it('a decoded photo of a size that does not fit is left out with a warning; the scores stand; twice the size is averaged down', () => {
    const r = frameJobScore({ ...frame(), photoRgba: { file: 'images/x.jpg', width: W, height: H + 2, rgba: new Uint8Array(W * (H + 2) * 4) } });
    expect(r.error).toBeNull();
    expect(r.warnings).toEqual([`images/x.jpg: is 40×32 pixels but truth/x.png is 40×30; a photo must have the label's size, a whole multiple or a whole fraction of it (same in both directions); no image evidence on this frame`]);
    expect(r.runs.every((x) => x.stats && x.regions)).toBe(true);
    const twice = frameJobScore({ ...frame(), photoRgba: { file: 'images/x.jpg', width: W * 2, height: H * 2, rgba: new Uint8Array(W * H * 16).fill(90) } });
    expect([twice.error, twice.warnings]).toEqual([null, ["images/x.jpg: averaged down ×2 to the label's size"]]);
  });

  it('a run whose prediction fails has no regions and is nobody\'s agreement evidence', () => {
    const f = frame();
    f.preds[1].file = { file: 'b/x.png', bytes: new Uint8Array([1, 2, 3]) };
    const r = frameJobScore(f);
    expect(r.runs[1].error).toMatch(/^b\/x\.png: /);
    expect(r.runs[1].regions).toBeNull();
    expect(r.runs[0].regions!.regions.every((x) => x.evidence.agreement.length === 0)).toBe(true);
  });
});

describe('frameJobScore: the truth made once per frame', () => {
  it('every run of a many-run frame (distance transform shared) scores as frameScore does alone with fresh buffers', () => {
    const truth = harbourTruth(160, 96, 5);
    const preds = [11, 12, 13].map((seed) => harbourPrediction(truth, seed, 4));
    const input: FrameJobInput = {
      name: 'h', truth: { file: 'truth/h.png', bytes: png(truth) },
      preds: preds.map((p, i) => ({ run: `r${i}`, file: { file: `r${i}/h.png`, bytes: png(p) } })),
      table, settings: DEFAULT_SCORE_SETTINGS, regions: false,
    };
    const job = frameJobScore(input);
    const classIds = job.runs[0].stats!.classIds;
    job.runs.forEach((r, i) => {
      const alone = frameScore(truth, preds[i], classIds, DEFAULT_SCORE_SETTINGS);
      if (!alone.ok) throw new Error(alone.error);
      expect(r.stats).toEqual(alone.value);
    });
    // And a reused truth is only trusted for the same ids array: another frame's truth in the same buffers is recomputed.
    const other = harbourTruth(160, 96, 6);
    const shared = scoreScratchCreate();
    frameScore(truth, preds[0], classIds, DEFAULT_SCORE_SETTINGS, shared);
    expect(frameScore(other, preds[1], classIds, DEFAULT_SCORE_SETTINGS, shared, true)).toEqual(frameScore(other, preds[1], classIds, DEFAULT_SCORE_SETTINGS));
  });
});
