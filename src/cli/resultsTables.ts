// The columns of a results folder's tables (README "Large datasets" lists them with their meaning).
import type { FrameRow, RegionRow } from '../core/results/resultRows.ts';
import type { SuspectSignals } from '../core/suspects/suspectReasons.ts';
import type { ColumnSpec } from './parquetTable.ts';

/** File names inside a results folder. */
export const RESULTS_FILES = { summary: 'summary.json', frames: 'frames.parquet', regions: 'regions.parquet', queue: 'queue.parquet' } as const;

const cols = <R>(spec: { [K in keyof R]-?: [ColumnSpec['type'], boolean?] }): ColumnSpec[] =>
  Object.entries(spec).map(([name, v]) => {
    const [type, required] = v as [ColumnSpec['type'], boolean?];
    return { name, type, required: required ?? false };
  });

export const FRAME_COLUMNS = cols<FrameRow>({
  frameIndex: ['int', true], frame: ['string', true], run: ['string', true], error: ['string'], width: ['int', true], height: ['int', true],
  meanIoU: ['double'], pixelAccuracy: ['double'], bandIoU: ['double'], boundaryIoU: ['double'], boundaryF: ['double'],
  errorPixels: ['int'], validPixels: ['int'], classIds: ['intList'], confusion: ['intList'], bandClass: ['intList'],
  biouInter: ['intList'], biouUnion: ['intList'], bfPredMatched: ['intList'], bfPredTotal: ['intList'], bfTruthMatched: ['intList'], bfTruthTotal: ['intList'],
  regions: ['int'], regionPixels: ['int'], voidSpillPixels: ['int'], flipBack: ['double'], flipBackVoid: ['double'], smallObjectRecall: ['double'],
});

export const REGION_COLUMNS = cols<RegionRow>({
  frameIndex: ['int', true], frame: ['string', true], run: ['string', true], regionId: ['int'], kind: ['string', true], truthClass: ['int'],
  predictedClass: ['int'], area: ['int', true], x0: ['int', true], y0: ['int', true], x1: ['int', true], y1: ['int', true],
  thickness: ['double'], bandShare: ['double'], severity: ['double'], truthSegment: ['int'], candidate: ['boolean', true], bound: ['double'],
  geometry: ['double'], agreement: ['double'], agreementRuns: ['string'], image: ['double'], edgePredicted: ['double'], edgeTruth: ['double'],
  edgeInside: ['double'], outlinePredicted: ['int'], outlineTruth: ['int'], outlineShared: ['int'], confidenceHist: ['intList'], appearanceHist: ['intList'],
  temporal: ['double'], flipBefore: ['string'], flipAfter: ['string'], steady: ['double'],
});

/** One row of queue.parquet: an entry of the likely-label-mistake queue, best first, with its signals. */
export type QueueRow = QueueEntryRow & SuspectSignals;

interface QueueEntryRow {
  rank: number;
  frameIndex: number;
  frame: string;
  run: string;
  regionId: number;
  kind: string;
  truthClass: number;
  predictedClass: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  score: number;
  /** JSON list of sentences, strongest evidence first. */
  reasons: string;
  /** JSON object: what each signal added to the score (score = 0.5 + their sum), and the same in words. */
  contributions: string;
  contributionsText: string;
  /** JSON lists: other runs that find it, and the regions merged into it ({ run, regionId }). */
  alsoRuns: string;
  merged: string;
}

export const QUEUE_COLUMNS = cols<QueueRow>({
  rank: ['int', true], frameIndex: ['int', true], frame: ['string', true], run: ['string', true], regionId: ['int', true], kind: ['string', true],
  truthClass: ['int', true], predictedClass: ['int', true], x0: ['int', true], y0: ['int', true], x1: ['int', true], y1: ['int', true],
  score: ['double', true], reasons: ['string', true], geometry: ['double', true], agreement: ['double'], confidence: ['double'], image: ['double'],
  temporal: ['double', true], steady: ['double', true], habit: ['double', true], appearance: ['double'], contributions: ['string', true], contributionsText: ['string', true], alsoRuns: ['string', true], merged: ['string', true],
});
