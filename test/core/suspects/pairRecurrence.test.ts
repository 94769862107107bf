import { describe, expect, it } from 'vitest';
import { pairHabitOf, pairRecurrenceAdd, pairRecurrenceMerge, type PairRecurrence } from '../../../src/core/suspects/pairRecurrence.ts';
import type { SuspectCandidate, SuspectFrame } from '../../../src/core/suspects/suspectCandidates.ts';
import { suspectQueue } from '../../../src/core/suspects/suspectQueue.ts';
import { contributionsText, suspectScoreOf } from '../../../src/core/suspects/suspectScore.ts';
import { SUSPECT_DEFAULTS, suspectSettingsCheck, type SuspectSettings } from '../../../src/core/suspects/suspectSettings.ts';

// The dataset-wide tally of class pairs (src/core/suspects/pairRecurrence.ts, our own heuristic,
// README "Likely label mistakes") and the score's split into contributions, checked by hand.

const S: SuspectSettings = { ...SUSPECT_DEFAULTS };
type R = { kind: string; truthClass: number; predictedClass: number | null; thickness: number; evidence: { agreement: { run: string; share: number }[] } };
const frame = (name: string, runs: Record<string, R[]>): SuspectFrame =>
  ({ name, error: null, grid: null, runs: Object.entries(runs).map(([run, regions]) => ({ run, regions: { regions } })) }) as unknown as SuspectFrame;
const solid = (g: number, p: number, agree: number | null = 1): R =>
  ({ kind: 'classConfusion', truthClass: g, predictedClass: p, thickness: 6, evidence: { agreement: agree === null ? [] : [{ run: 'x', share: agree }] } });

/**
 * 20 frames: both runs read building (10) as container (4) together in frames 0..11; each run reads
 * truck (6) as quay (2) in frames 0..9, but in places of its own (the other run does not back it).
 */
function frames(): SuspectFrame[] {
  return Array.from({ length: 20 }, (_, f) =>
    frame(`f${f}`, {
      a: [...(f < 12 ? [solid(10, 4), solid(10, 4)] : []), ...(f < 10 ? [solid(6, 2, 0.1)] : []), { ...solid(2, 0), kind: 'boundary' }, { ...solid(2, 1), thickness: 2 }],
      b: [...(f < 12 ? [solid(10, 4)] : []), ...(f < 10 ? [solid(6, 2, 0)] : []), { ...solid(7, 8), predictedClass: null }],
    }),
  );
}

/** The same frames seen by run a alone (no other run to back or not). */
function framesOneRun(): SuspectFrame[] {
  return Array.from({ length: 20 }, (_, f) => frame(`f${f}`, { a: [...(f < 12 ? [solid(10, 4, null)] : []), ...(f < 10 ? [solid(6, 2, null)] : [])] }));
}

describe('pairRecurrence', () => {
  it('counts frames per run and pair the other runs back, leaving out boundary jitter, thin regions and no-class predictions', () => {
    const acc: PairRecurrence = new Map();
    for (const f of frames()) pairRecurrenceAdd(acc, f, S);
    expect(acc.get('a')!.frames).toBe(20);
    expect(Object.fromEntries(acc.get('a')!.pairs)).toEqual({ '10>4': 12 });
    expect(Object.fromEntries(acc.get('b')!.pairs)).toEqual({ '10>4': 12 });
    const one: PairRecurrence = new Map();
    for (const f of framesOneRun()) pairRecurrenceAdd(one, f, S);
    expect(Object.fromEntries(one.get('a')!.pairs)).toEqual({ '10>4': 12, '6>2': 10 });
  });

  it('is additive: shards merged give the tally of the whole dataset', () => {
    const whole: PairRecurrence = new Map(), s1: PairRecurrence = new Map(), s2: PairRecurrence = new Map();
    frames().forEach((f, i) => {
      pairRecurrenceAdd(whole, f, S);
      pairRecurrenceAdd(i % 3 === 0 ? s1 : s2, f, S);
    });
    pairRecurrenceMerge(s1, s2);
    expect([...s1.entries()].map(([r, e]) => [r, e.frames, Object.fromEntries(e.pairs)])).toEqual([...whole.entries()].map(([r, e]) => [r, e.frames, Object.fromEntries(e.pairs)]));
  });

  it('habit: the share in the run where the pair is rarest, 0 at 0.1, 1 at 0.3, none under 4 frames', () => {
    const acc: PairRecurrence = new Map();
    for (const f of frames()) pairRecurrenceAdd(acc, f, S);
    expect(pairHabitOf(acc, 10, 4, S)).toEqual({ share: 0.6, frames: 12, of: 20, habit: 1 });
    // Each run makes truck → quay errors of its own: no shared habit.
    expect(pairHabitOf(acc, 6, 2, S).habit).toBe(0);
    const one: PairRecurrence = new Map();
    for (const f of framesOneRun()) pairRecurrenceAdd(one, f, S);
    expect(pairHabitOf(one, 6, 2, S).habit).toBe(1);
    expect(pairHabitOf(one, 6, 2, { ...S, recurrenceFull: 0.6, recurrenceFrom: 0.4 }).habit).toBeCloseTo((0.5 - 0.4) / 0.2, 12);
    expect(pairHabitOf(one, 6, 2, { ...S, recurrenceMinFrames: 11 }).habit).toBe(0);
    expect(suspectSettingsCheck({ recurrenceFrom: 0.5, recurrenceFull: 0.4 }).ok).toBe(false);
  });
});

describe('suspectScoreOf: contributions', () => {
  const base = { geometry: 0.9, agreement: 1, confidence: null, image: 0.7, appearance: null, temporal: 0, steady: 0, habit: 0 };

  it('the parts add up to the score, each term w·(v − 0.5)/Σw', () => {
    for (const v of [base, { ...base, habit: 0.5, temporal: 0.4 }, { ...base, geometry: 0.2, steady: 0.6, habit: 1 }]) {
      const { score, contributions } = suspectScoreOf(v, S);
      expect(0.5 + Object.values(contributions).reduce((a, b) => a + b, 0)).toBeCloseTo(score, 12);
    }
    const { score, contributions } = suspectScoreOf(base, S);
    expect(score).toBeCloseTo((0.9 * 1 + 1 * 2 + 0.7 * 1) / 4, 12);
    expect(contributions.agreement).toBeCloseTo((2 * 0.5) / 4, 12);
    expect(contributions.geometry).toBeCloseTo(0.4 / 4, 12);
    expect(contributionsText(contributions)).toBe('run agreement +0.25, shape +0.10, image edges +0.05');
  });

  it("a full habit moves agreement's weight to a term of value 0", () => {
    const { score, contributions } = suspectScoreOf({ ...base, habit: 1 }, S);
    // Terms: geometry 0.9 (w 1), agreement (w 0), image 0.7 (w 1), common confusion 0 (w 2).
    expect(score).toBeCloseTo((0.9 + 0.7) / 4, 12);
    expect(contributions.habit).toBeCloseTo((2 * -0.5) / 4, 12);
    expect(contributions.agreement).toBe(0);
    expect(contributionsText(contributions)).toMatch(/^common confusion −0\.25/);
  });

  it('in the queue: a shared habit ranks below a lone mistake the runs agree on, and says why', () => {
    const acc: PairRecurrence = new Map();
    for (const f of frames()) pairRecurrenceAdd(acc, f, S);
    const cand = (over: Partial<SuspectCandidate>): SuspectCandidate => ({
      frameIndex: 0, frame: 'f0', run: 'a', regionId: 1, truthSegment: 1, kind: 'classConfusion', truthClass: 10, predictedClass: 4,
      bbox: [10, 10, 40, 40], area: 900, thickness: 8, bandShare: 0.1, geometry: 0.95, agreement: 1, agreementRuns: [{ run: 'b', share: 1 }],
      image: null, edges: null, confidenceHist: null, appearanceHist: null, cells: [], bound: 1, ...over,
    });
    const q = suspectQueue({
      candidates: [cand({}), cand({ frame: 'f5', frameIndex: 5, truthClass: 6, predictedClass: 4, regionId: 2 })],
      grids: new Array(20).fill(null), confidence: new Map(), recurrence: acc, className: (id) => ({ 10: 'building', 4: 'container', 6: 'truck' })[id] ?? String(id),
    }, S);
    expect(q.map((x) => x.frame)).toEqual(['f5', 'f0']);
    expect(q[0].score).toBeCloseTo((0.95 + 2) / 3, 12);
    expect(q[1].score).toBeCloseTo(0.95 / 3, 12);
    expect(q[1].reasons.join(' | ')).toMatch(/every run predicts container where the label says building in many frames \(12 of 20, 60 % in the run where it is rarest\): a common confusion of the models/);
    expect(q[1].contributionsText).toMatch(/common confusion −/);
  });
});
