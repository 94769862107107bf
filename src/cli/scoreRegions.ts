// The scorer's error-region and likely-label-mistake parts of the report: gathered frame by frame as
// results arrive (the maps are gone by then; only region summaries and small grids are kept), and
// ranked once every frame is in.
import type { FrameJobResult } from '../core/frameJob.ts';
import { reportRegionsOf, reportSuspectsOf, type ReportRegion, type ReportSuspect, type ReportVoidSpill } from '../core/report/reportParts.ts';
import {
  confidenceSumsAdd, frameGridsOf, suspectCandidates, type ConfidenceSums, type SuspectCandidate,
} from '../core/suspects/suspectCandidates.ts';
import { appearanceSumsAdd, type AppearanceSums } from '../core/suspects/appearanceModel.ts';
import { pairRecurrenceAdd, type PairRecurrence } from '../core/suspects/pairRecurrence.ts';
import { suspectQueue } from '../core/suspects/suspectQueue.ts';
import type { SuspectVerdictKind } from '../core/review/verdict.ts';
import { suspectsRerank } from '../core/suspects/verdictRerank.ts';
import { SUSPECT_DEFAULTS, type SuspectSettings } from '../core/suspects/suspectSettings.ts';
import type { FrameGrids } from '../core/suspects/temporalFlip.ts';

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
  const lines = reportRegionsOf(result.error ? null : result.runs.find((r) => r.run === firstRun));
  g.lines[index] = lines.regions;
  g.voidSpill[index] = lines.voidSpill;
}

/**
 * Returns the likely-label-mistake queue over every run, best first, in the report's shape; re-ranked
 * by `verdicts` (by item key) as the app ranks it, each moved item's reason first among its reasons.
 */
export function regionGatherSuspects(g: RegionGather, className: (id: number) => string, verdicts: ReadonlyMap<string, SuspectVerdictKind> = new Map()): ReportSuspect[] {
  const queue = suspectQueue({ candidates: g.candidates, grids: g.grids, confidence: g.confidence, recurrence: g.recurrence, appearance: g.appearance, className }, g.settings);
  return reportSuspectsOf(suspectsRerank(queue, verdicts));
}
