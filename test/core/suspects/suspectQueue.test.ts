import { describe, expect, it } from 'vitest';
import type { SuspectCandidate } from '../../../src/core/suspects/suspectCandidates.ts';
import { suspectQueue } from '../../../src/core/suspects/suspectQueue.ts';
import { SUSPECT_DEFAULTS, type SuspectSettings } from '../../../src/core/suspects/suspectSettings.ts';
import { candidateIndexBuild, steadyDisagreement } from '../../../src/core/suspects/steadyDisagreement.ts';
import { CONFIDENCE_BINS } from '../../../src/core/regions/regionTypes.ts';

// The queue's combination of signals, merging and wording, on hand-made candidates whose expected
// scores follow from the formulas in README "Likely label mistakes" worked by hand.

const S: SuspectSettings = { ...SUSPECT_DEFAULTS };
const NAMES: Record<number, string> = { 4: 'container', 5: 'crane', 6: 'truck', 2: 'quay' };
const className = (id: number) => NAMES[id] ?? String(id);

function candidate(over: Partial<SuspectCandidate>): SuspectCandidate {
  return {
    frameIndex: 0, frame: 'f0', run: 'a', regionId: 1, truthSegment: 1, kind: 'missedObject', truthClass: 4, predictedClass: 6,
    bbox: [10, 10, 30, 30], area: 400, thickness: 10, bandShare: 0.2, geometry: 0.9, agreement: null, agreementRuns: [],
    image: null, edges: null, confidenceHist: null, appearanceHist: null, cells: [], bound: 0.9, ...over,
  };
}
const queue = (cands: SuspectCandidate[], confidence = new Map(), settings = S) =>
  suspectQueue({ candidates: cands, grids: cands.map(() => null), confidence, className }, settings);

describe('suspectQueue', () => {
  it('score is the weighted mean of the signals a region has (geometry 1, agreement 2, image 1)', () => {
    const edges = { predicted: 30, truth: 12, inside: 8, outline: { predicted: 40, truth: 40, shared: 0 } };
    const [s] = queue([candidate({ geometry: 0.8, agreement: 0.9, agreementRuns: [{ run: 'b', share: 0.9 }], image: 0.6, edges })]);
    expect(s.score).toBeCloseTo((0.8 * 1 + 0.9 * 2 + 0.6 * 1) / 4, 12);
    expect(s.reasons).toEqual([
      // Strongest first by weight × value: agreement 1.8, geometry 0.8, image 0.6.
      'both runs agree on truck here (b on 90 % of it), the label says container',
      'thick (10 px) and away from label boundaries (80 % of it more than 3 px inside)',
      "the predicted outline follows image edges better than the label's (edge strength 30 vs 12)",
    ]);
  });

  it('confidence uses the run\'s per-class threshold from the dataset sums (confident learning)', () => {
    const hist = new Array(CONFIDENCE_BINS).fill(0);
    hist[15] = 80; // [0.9375, 1]
    hist[4] = 20; // [0.25, 0.3125)
    const sums = new Map([['a', new Map([[6, { sum: 70, count: 100 }]])]]); // t_truck = 0.7
    const [s] = queue([candidate({ geometry: 1, confidenceHist: hist })], sums);
    expect(s.signals.confidence).toBeCloseTo(0.8, 12);
    expect(s.score).toBeCloseTo((1 * 1 + 0.8 * 2) / 3, 12);
    expect(s.reasons.join(' ')).toMatch(/a is confident here: 80 % of it at or above its usual confidence for truck \(0\.70; confident learning/);
    // Without a threshold for the predicted class the signal is missing, not zero.
    const [t] = queue([candidate({ geometry: 1, confidenceHist: hist })]);
    expect(t.signals.confidence).toBeNull();
    expect(t.score).toBe(1);
  });

  it('thin slivers along label boundaries are scaled down by the geometry gate', () => {
    const thin = candidate({ regionId: 2, geometry: 0.1, agreement: 1, agreementRuns: [{ run: 'b', share: 1 }], frame: 'f1', frameIndex: 1 });
    const thick = candidate({ regionId: 3, geometry: 0.6, agreement: 0.7, agreementRuns: [{ run: 'b', share: 0.7 }], frame: 'f2', frameIndex: 2 });
    const q = queue([thin, thick]);
    expect(q.map((s) => s.regionId)).toEqual([3, 2]);
    expect(q[1].score).toBeCloseTo((0.1 / 0.5) * ((0.1 + 2) / 3), 12);
    expect(q[1].reasons.join(' ')).toMatch(/looks like boundary jitter/);
  });

  it('regions of one truth segment, or one class pair, near each other in a frame merge into the best (any run)', () => {
    const q = queue([
      candidate({ run: 'a', regionId: 1, bbox: [10, 10, 30, 30], geometry: 1 }),
      candidate({ run: 'b', regionId: 7, bbox: [12, 12, 31, 29], geometry: 0.95 }),
      candidate({ run: 'a', regionId: 2, truthSegment: 9, predictedClass: 2, bbox: [35, 10, 50, 30], geometry: 0.9 }),
      candidate({ run: 'a', regionId: 3, bbox: [200, 200, 210, 210], geometry: 0.9 }),
      candidate({ run: 'a', regionId: 4, frame: 'f1', frameIndex: 1, geometry: 0.9 }),
    ]);
    expect(q.map((s) => [s.frame, s.regionId, s.bbox])).toEqual([
      ['f0', 1, [10, 10, 31, 30]],
      ['f0', 2, [35, 10, 50, 30]],
      ['f0', 3, [200, 200, 210, 210]],
      ['f1', 4, [10, 10, 30, 30]],
    ]);
    expect(q[0].alsoRuns).toEqual(['b']);
    expect(q[0].merged).toEqual([{ run: 'b', regionId: 7 }]);
    expect(q[0].reasons).toContain('b finds it too');
  });

  it('the same disagreement in the frames around lowers the score (steady habit of a model)', () => {
    const frames = [0, 1, 2, 3, 4, 5, 6].map((f) => candidate({ frame: `f${f}`, frameIndex: f, bbox: [10 + f, 10, 30 + f, 30], geometry: 1 }));
    const index = candidateIndexBuild(frames);
    expect(steadyDisagreement(frames[3], index, 3, () => true)).toBe(1);
    expect(steadyDisagreement(frames[0], index, 3, (t) => t >= 0)).toBe(1);
    const lone = candidate({ frame: 'f9', frameIndex: 9, geometry: 1, bbox: [300, 300, 320, 320] });
    expect(steadyDisagreement(lone, candidateIndexBuild([...frames, lone]), 3, () => true)).toBe(0);
    const q = suspectQueue({ candidates: frames, grids: new Array(7).fill({ name: '', grid: { columns: 1, rows: 1, cell: 1, truth: new Uint16Array(1) }, runs: { a: new Uint16Array(1) } }), confidence: new Map(), className }, S);
    expect(q[0].score).toBeCloseTo(1 - S.weightSteady, 12);
    expect(q[0].reasons[q[0].reasons.length - 1]).toMatch(/steady habit of the model/);
  });

  it('queueMax caps the length; ties keep the larger region first', () => {
    const q = queue([0, 1, 2, 3].map((i) => candidate({ frame: `f${i}`, frameIndex: i, area: 100 * (i + 1), regionId: i })), new Map(), { ...S, queueMax: 2 });
    expect(q.map((s) => s.regionId)).toEqual([3, 2]);
  });
});
