import { REGION_DEFAULTS } from '../regions/regionSettings.ts';
import type { RegionKind } from '../regions/regionTypes.ts';
import { confidenceSumsAdd, frameGridsOf, suspectCandidates, type ConfidenceSums, type SuspectCandidate, type SuspectFrame } from './suspectCandidates.ts';
import { appearanceEvidenceOf, appearanceSumsAdd, signalAppearance, type AppearanceSums } from './appearanceModel.ts';
import { pairHabitOf, pairRecurrenceAdd, type PairHabit, type PairRecurrence } from './pairRecurrence.ts';
import { contributionsText, suspectScoreOf, type SuspectContributions } from './suspectScore.ts';
import { suspectReasons, type SuspectSignals } from './suspectReasons.ts';
import type { SuspectSettings } from './suspectSettings.ts';
import { candidateIndexBuild, steadyDisagreement } from './steadyDisagreement.ts';
import { signalConfidence } from './suspectSignals.ts';
import { temporalFlip, type FrameGrids, type TemporalFlip } from './temporalFlip.ts';

/** One entry of the likely-label-mistake queue. */
export interface Suspect {
  frame: string;
  run: string;
  /** [x0, y0, x1, y1], end exclusive, pixels. */
  bbox: [number, number, number, number];
  truthClass: number;
  predictedClass: number;
  kind: RegionKind;
  /** 0..1, higher: more like a label mistake. */
  score: number;
  reasons: string[];
  /** Index of the frame in the dataset order, and the region's id in that run's regions of the frame. */
  frameIndex: number;
  regionId: number;
  signals: SuspectSignals;
  /** What each signal added to the score (score = 0.5 + their sum), and the same in words. */
  contributions: SuspectContributions;
  contributionsText: string;
  /** Why the reviewer's verdicts moved it (verdictRerank.ts), or null / absent when they did not. */
  learnedReason?: string | null;
  /** Other runs whose regions were merged into this entry. */
  alsoRuns: string[];
  /** Regions merged into this entry besides its own (any run), with their region ids per run. */
  merged: { run: string; regionId: number }[];
}

/** Inputs of the dataset pass: candidates from every frame, the frames' grids in dataset order, confidence sums. */
export interface SuspectQueueInput {
  candidates: readonly SuspectCandidate[];
  grids: readonly (FrameGrids | null)[];
  confidence: ConfidenceSums;
  /** How often each class pair shows in each run's frames (absent: no pair is taken as a habit). */
  recurrence?: PairRecurrence;
  /** Each class's appearance in the dataset's photos (absent: no appearance signal). */
  appearance?: AppearanceSums;
  className: (id: number) => string;
  /** Band width the regions' band shares were measured at (REGION_DEFAULTS.bandWidth unless changed). */
  bandWidth?: number;
}

/** Returns whether two end-exclusive boxes come within `gap` pixels of each other. */
function boxesNear(a: readonly number[], b: readonly number[], gap: number): boolean {
  return a[0] - gap < b[2] && b[0] - gap < a[2] && a[1] - gap < b[3] && b[1] - gap < a[3];
}

/** Returns the gap (pixels) within which box b joins a suspect with box a. */
function mergeGapOf(a: readonly number[], b: readonly number[], s: SuspectSettings): number {
  const long = (x: readonly number[]) => Math.max(x[2] - x[0], x[3] - x[1]);
  return Math.max(s.mergeGap, s.mergeReach * Math.min(long(a), long(b)));
}

/** Returns the IoU 0..1 of two end-exclusive boxes. */
export function bboxIoU(a: readonly number[], b: readonly number[]): number {
  const iw = Math.max(0, Math.min(a[2], b[2]) - Math.max(a[0], b[0]));
  const ih = Math.max(0, Math.min(a[3], b[3]) - Math.max(a[1], b[1]));
  const inter = iw * ih;
  const union = (a[2] - a[0]) * (a[3] - a[1]) + (b[2] - b[0]) * (b[3] - b[1]) - inter;
  return union > 0 ? inter / union : 0;
}

/** A candidate with its signals, its score, the confidence threshold used and its temporal evidence. */
export interface ScoredCandidate {
  c: SuspectCandidate;
  signals: SuspectSignals;
  score: number;
  threshold: number | null;
  flip: TemporalFlip;
  /** How common its class pair is across the dataset (absent: not known). */
  pair?: PairHabit;
}

/** Returns a candidate's score 0..1 from its signals (suspectScoreOf, src/core/suspects/suspectScore.ts). */
export function suspectScore(signals: SuspectSignals, s: SuspectSettings): number {
  return suspectScoreOf(signals, s).score;
}

/** The dataset-wide sums a candidate's signals read (confidence thresholds, class-pair habits, class appearance). */
export type SuspectSums = Pick<SuspectQueueInput, 'confidence' | 'recurrence' | 'appearance'>;

/** Returns a candidate scored from its own evidence, its temporal evidence (flip, steady) and the dataset-wide sums. */
export function suspectScored(c: SuspectCandidate, flip: TemporalFlip, steady: number, sums: SuspectSums, s: SuspectSettings): ScoredCandidate {
  const e = sums.confidence.get(c.run)?.get(c.predictedClass);
  const threshold = e && e.count > 0 ? e.sum / e.count : null;
  const pair = pairHabitOf(sums.recurrence ?? new Map(), c.truthClass, c.predictedClass, s);
  const signals: SuspectSignals = {
    geometry: c.geometry, agreement: c.agreement, confidence: signalConfidence(c.confidenceHist, threshold), image: c.image,
    appearance: sums.appearance ? signalAppearance(appearanceEvidenceOf(c.appearanceHist, c.truthClass, c.predictedClass, sums.appearance, s), s) : null,
    temporal: flip.share, steady, habit: pair.habit,
  };
  return { c, signals, score: suspectScore(signals, s), threshold, flip, pair };
}

/** The queue's order: higher score first, then larger area, then earlier frame. */
export function suspectOrder(a: Pick<ScoredCandidate, 'c' | 'score'>, b: Pick<ScoredCandidate, 'c' | 'score'>): number {
  return b.score - a.score || b.c.area - a.c.area || a.c.frameIndex - b.c.frameIndex;
}

/**
 * Returns the queue of likely label mistakes over all runs, best first (see suspectScore); nearby
 * regions of one truth segment or one class pair (any run) merged into the best of them; at most
 * `queueMax` entries.
 */
export function suspectQueue(input: SuspectQueueInput, s: SuspectSettings): Suspect[] {
  const index = candidateIndexBuild(input.candidates);
  const scoredFrame = (t: number, run: string) => t >= 0 && t < input.grids.length && !!input.grids[t]?.runs[run];
  const scored = input.candidates.map((c) => {
    const flip = temporalFlip(input.grids, c.frameIndex, c.run, c.cells, c.truthClass, c.predictedClass, s.temporalWindow, s.temporalReach);
    return suspectScored(c, flip, steadyDisagreement(c, index, s.temporalWindow, scoredFrame), input, s);
  });
  return suspectRank(scored, input, s);
}

/**
 * Returns the queue from scored candidates (sorted here by suspectOrder): each candidate joins an
 * earlier entry of its frame in the same truth segment or with the same class pair whose box is near
 * and whose score it reaches mergeScoreShare of, or starts an entry while fewer than `queueMax` exist.
 * Merging never crosses frames, so the queue of a dataset is the best `queueMax` entries of its frames' queues.
 */
export function suspectRank(scored: ScoredCandidate[], input: Pick<SuspectQueueInput, 'className' | 'bandWidth'>, s: SuspectSettings): Suspect[] {
  const weights = {
    geometry: s.weightGeometry, agreement: s.weightAgreement, confidence: s.weightConfidence, image: s.weightImage, temporal: s.weightTemporal, steady: s.weightSteady,
    habit: s.weightAgreement, appearance: s.weightAppearance,
  };
  scored.sort(suspectOrder);
  const out: Suspect[] = [];
  const segmentOf = new Map<Suspect, number>();
  for (const x of scored) {
    const c = x.c;
    const twin = out.find(
      (o) => o.frameIndex === c.frameIndex && (segmentOf.get(o) === c.truthSegment || (o.truthClass === c.truthClass && o.predictedClass === c.predictedClass)) &&
        x.score >= s.mergeScoreShare * o.score && boxesNear(o.bbox, c.bbox, mergeGapOf(o.bbox, c.bbox, s)),
    );
    if (twin) {
      twin.bbox = [Math.min(twin.bbox[0], c.bbox[0]), Math.min(twin.bbox[1], c.bbox[1]), Math.max(twin.bbox[2], c.bbox[2]), Math.max(twin.bbox[3], c.bbox[3])];
      twin.merged.push({ run: c.run, regionId: c.regionId });
      if (c.run !== twin.run && !twin.alsoRuns.includes(c.run)) twin.alsoRuns.push(c.run);
      continue;
    }
    if (out.length >= s.queueMax) continue;
    const reasons = suspectReasons(c, x.signals, weights, { className: input.className, threshold: x.threshold, flip: x.flip, bandWidth: input.bandWidth ?? REGION_DEFAULTS.bandWidth, pair: x.pair });
    const { contributions } = suspectScoreOf(x.signals, s);
    out.push({
      frame: c.frame, run: c.run, bbox: c.bbox, truthClass: c.truthClass, predictedClass: c.predictedClass, kind: c.kind, score: x.score,
      reasons, frameIndex: c.frameIndex, regionId: c.regionId, signals: x.signals, contributions,
      contributionsText: contributionsText(contributions), alsoRuns: [], merged: [],
    });
    segmentOf.set(out[out.length - 1], c.truthSegment);
  }
  for (const o of out) {
    if (o.alsoRuns.length) o.reasons.push(`${o.alsoRuns.join(', ')} ${o.alsoRuns.length === 1 ? 'finds' : 'find'} it too`);
    const more = o.merged.length;
    if (more) o.reasons.push(`${more} more region${more === 1 ? '' : 's'} nearby in the same label segment or with the same classes ${more === 1 ? 'is' : 'are'} part of it`);
  }
  return out;
}

/** Returns the queue from frame results in dataset order (missing frames undefined): the same pass the scorer runs. */
export function suspectQueueOfResults(
  results: readonly (SuspectFrame | undefined)[], className: (id: number) => string, s: SuspectSettings, bandWidth?: number,
): Suspect[] {
  const candidates: SuspectCandidate[] = [];
  const confidence: ConfidenceSums = new Map();
  const recurrence: PairRecurrence = new Map();
  const appearance: AppearanceSums = new Map();
  const grids = results.map((r, i) => {
    if (!r) return null;
    candidates.push(...suspectCandidates(r, i, s));
    confidenceSumsAdd(confidence, r);
    pairRecurrenceAdd(recurrence, r, s);
    appearanceSumsAdd(appearance, r);
    return frameGridsOf(r);
  });
  return suspectQueue({ candidates, grids, confidence, recurrence, appearance, className, bandWidth }, s);
}
