// The scorer's error-region and likely-label-mistake parts of the report: gathered frame by frame as
// results arrive (the maps are gone by then; only region summaries and small grids are kept), and
// ranked once every frame is in.
import type { FrameJobResult } from '../core/frameJob.ts';
import type { RegionKind } from '../core/regions/regionTypes.ts';
import {
  confidenceSumsAdd, frameGridsOf, suspectCandidates, type ConfidenceSums, type SuspectCandidate,
} from '../core/suspects/suspectCandidates.ts';
import { appearanceSumsAdd, type AppearanceSums } from '../core/suspects/appearanceModel.ts';
import { pairRecurrenceAdd, type PairRecurrence } from '../core/suspects/pairRecurrence.ts';
import { suspectQueue, type Suspect } from '../core/suspects/suspectQueue.ts';
import type { SuspectVerdictKind } from '../core/review/verdict.ts';
import { suspectsRerank } from '../core/suspects/verdictRerank.ts';
import { SUSPECT_DEFAULTS, type SuspectSettings } from '../core/suspects/suspectSettings.ts';
import type { FrameGrids } from '../core/suspects/temporalFlip.ts';

/** One listed region of the report's first run on a frame. */
export interface ReportRegion {
  kind: RegionKind;
  truthClass: number;
  predictedClass: number | null;
  area: number;
  bbox: [number, number, number, number];
}

/** The first run's void spill on a frame: pixels where the truth is void and it predicts a class, and those areas of at least minArea pixels. */
export interface ReportVoidSpill {
  pixels: number;
  regions: { predictedClass: number; area: number; bbox: [number, number, number, number] }[];
}

/** One entry of the report's `suspects`, keys as README "Scoring headless" lists them. */
export type ReportSuspect = Pick<Suspect, 'frame' | 'run' | 'bbox' | 'truthClass' | 'predictedClass' | 'kind' | 'score' | 'reasons' | 'contributions' | 'contributionsText'>;

/** What the scorer keeps per dataset for regions and suspects. */
export interface RegionGather {
  settings: SuspectSettings;
  candidates: SuspectCandidate[];
  grids: (FrameGrids | null)[];
  confidence: ConfidenceSums;
  /** How often each class pair shows per run (frames; additive over frames and shards). */
  recurrence: PairRecurrence;
  /** Each class's appearance in the photos (summed over frames and shards). */
  appearance: AppearanceSums;
  /** Per frame: the first run's listed regions, or null when it has none (failed, or no prediction). */
  lines: (ReportRegion[] | null)[];
  voidSpill: (ReportVoidSpill | null)[];
}

/** Returns an empty gatherer for `frames` frames with a queue of `queueMax` entries. */
export function regionGatherCreate(frames: number, queueMax: number): RegionGather {
  return {
    settings: { ...SUSPECT_DEFAULTS, queueMax }, candidates: [], grids: new Array(frames).fill(null), confidence: new Map(), recurrence: new Map(), appearance: new Map(),
    lines: new Array(frames).fill(null), voidSpill: new Array(frames).fill(null),
  };
}

/** Takes what the report needs from frame `index`'s result (`firstRun` names the report's run). */
export function regionGatherAdd(g: RegionGather, index: number, result: FrameJobResult, firstRun: string): void {
  g.candidates.push(...suspectCandidates(result, index, g.settings));
  confidenceSumsAdd(g.confidence, result);
  pairRecurrenceAdd(g.recurrence, result, g.settings);
  appearanceSumsAdd(g.appearance, result);
  g.grids[index] = frameGridsOf(result);
  const first = result.error ? null : result.runs.find((r) => r.run === firstRun);
  g.lines[index] = first?.regions
    ? first.regions.regions.map((r) => ({ kind: r.kind, truthClass: r.truthClass, predictedClass: r.predictedClass, area: r.area, bbox: r.bbox }))
    : null;
  g.voidSpill[index] = first?.regions ? { pixels: first.regions.voidSpill.pixels, regions: first.regions.voidSpill.regions } : null;
}

/**
 * Returns the likely-label-mistake queue over every run, best first, in the report's shape; re-ranked
 * by `verdicts` (by item key) as the app ranks it, each moved item's reason first among its reasons.
 */
export function regionGatherSuspects(g: RegionGather, className: (id: number) => string, verdicts: ReadonlyMap<string, SuspectVerdictKind> = new Map()): ReportSuspect[] {
  const queue = suspectQueue({ candidates: g.candidates, grids: g.grids, confidence: g.confidence, recurrence: g.recurrence, appearance: g.appearance, className }, g.settings);
  return suspectsRerank(queue, verdicts).map((s) => ({
    frame: s.frame, run: s.run, bbox: s.bbox, truthClass: s.truthClass, predictedClass: s.predictedClass, kind: s.kind,
    score: s.score, reasons: s.learnedReason ? [s.learnedReason, ...s.reasons] : s.reasons, contributions: s.contributions, contributionsText: s.contributionsText,
  }));
}
