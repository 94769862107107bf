import { describe, expect, it } from 'vitest';
import { CONFIDENCE_BINS } from '../../../src/core/regions/regionTypes.ts';
import { SUSPECT_DEFAULTS, type SuspectSettings } from '../../../src/core/suspects/suspectSettings.ts';
import {
  histogramShareAtLeast, signalAgreement, signalConfidence, signalGeometry, signalImage,
} from '../../../src/core/suspects/suspectSignals.ts';

// Hand-worked values of each signal from its definition (README "Likely label mistakes"); the
// confidence signal is the confident-learning count (Northcutt, Jiang, Chuang, JAIR 70, 2021: a
// sample counts towards the class whose per-class threshold t_j its predicted probability reaches).

const S: SuspectSettings = { ...SUSPECT_DEFAULTS };
const hist = (entries: [number, number][]) => {
  const h = new Array(CONFIDENCE_BINS).fill(0);
  for (const [b, n] of entries) h[b] = n;
  return h;
};

describe('suspect signals, hand-worked', () => {
  it('geometry: thin and on the boundary 0, thick and inside 1, linear in thickness between 1 and 3 px', () => {
    expect(signalGeometry({ thickness: 1, bandShare: 1 }, S)).toBe(0);
    expect(signalGeometry({ thickness: 3, bandShare: 0 }, S)).toBe(1);
    expect(signalGeometry({ thickness: 2, bandShare: 0.5 }, S)).toBe(0.5);
    expect(signalGeometry({ thickness: 40, bandShare: 0.2 }, S)).toBeCloseTo(0.9, 12);
  });

  it('agreement: the mean share over the other runs; none without another run', () => {
    expect(signalAgreement([])).toBeNull();
    expect(signalAgreement([{ share: 0.9 }, { share: 0.5 }])).toBeCloseTo(0.7, 12);
  });

  it('confidence: share of pixels at or above the threshold, the bin holding it taken in proportion', () => {
    // 10 pixels in bin 8 = [0.5, 0.5625), 30 in bin 15: threshold in the middle of bin 8 takes half of it.
    expect(histogramShareAtLeast(hist([[8, 10], [15, 30]]), 0.53125)).toBeCloseTo(35 / 40, 12);
    expect(histogramShareAtLeast(hist([[8, 10], [15, 30]]), 0.5)).toBe(1);
    expect(histogramShareAtLeast(hist([[8, 10], [15, 30]]), 0.9375)).toBeCloseTo(30 / 40, 12);
    expect(histogramShareAtLeast(hist([]), 0.5)).toBe(0);
    // Confident learning: with t_j = 0.75 (the run's mean confidence where label and prediction are j),
    // the 30 pixels in [0.9375, 1] count, the 10 in [0.5, 0.5625) do not.
    expect(signalConfidence(hist([[8, 10], [15, 30]]), 0.75)).toBeCloseTo(0.75, 12);
    expect(signalConfidence(null, 0.75)).toBeNull();
    expect(signalConfidence(hist([[8, 1]]), null)).toBeNull();
  });

  it('image: contrast of prediction-only against truth-only edge strength, weighed by the unshared outline', () => {
    const e = (predicted: number | null, truth: number | null, inside: number | null, own: [number, number], shared: number) => ({
      predicted, truth, inside, outline: { predicted: own[0], truth: own[1], shared },
    });
    // (41 − 11) / (41 + 11) / 2 = 0.288…, all of the outline its own.
    expect(signalImage(e(40, 10, 5, [10, 10], 0), S)).toBeCloseTo(0.5 + 30 / 52 / 2, 12);
    // Half the outline shared by label and prediction: half the contrast.
    expect(signalImage(e(40, 10, 5, [10, 10], 20), S)).toBeCloseTo(0.5 + 30 / 52 / 4, 12);
    // The label draws no edge here (no truth-only outline): the prediction's edges are compared with the inside.
    expect(signalImage(e(40, null, 5, [10, 0], 0), S)).toBeCloseTo(0.5 + 35 / 47 / 2, 12);
    // The label's outline lies on edges, the prediction's does not: below 0.5.
    expect(signalImage(e(3, 60, 5, [10, 10], 0), S)).toBeLessThan(0.1);
    expect(signalImage(e(null, null, 5, [0, 0], 30), S)).toBeNull();
    expect(signalImage(null, S)).toBeNull();
  });
});
