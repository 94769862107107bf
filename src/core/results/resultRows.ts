// The rows of a results folder's tables (README "Large datasets"), built from one frame's result as
// it arrives: one frame row per run (every per-frame score and the counts that answer every band
// width and class), one region row per listed error region and void-spill area, with the evidence
// the label-mistake queue is ranked from.
import type { FrameJobResult } from '../frameJob.ts';
import { digestBandScores, frameDigestOf } from '../metrics/frameDigest.ts';
import { extrasFrameLine } from '../metrics/extrasTotals.ts';
import { frameSummaryOf } from '../metrics/frameSummary.ts';
import type { SuspectCandidate } from '../suspects/suspectCandidates.ts';
import type { TemporalFlip } from '../suspects/temporalFlip.ts';

/** Band width (pixels) of the frame table's `bandIoU` column, as the CSV export and the frame list. */
export const ROW_BAND_WIDTH = 3;

/** One row of frames.parquet: a frame scored against one run. Count lists are null when the run failed. */
export interface FrameRow {
  frameIndex: number;
  frame: string;
  run: string;
  error: string | null;
  width: number;
  height: number;
  meanIoU: number | null;
  pixelAccuracy: number | null;
  bandIoU: number | null;
  boundaryIoU: number | null;
  boundaryF: number | null;
  errorPixels: number | null;
  validPixels: number | null;
  classIds: number[] | null;
  /** K × (K+1) confusion, row = truth class index, last column "not a class". */
  confusion: number[] | null;
  /** (64 + 1) × K × 3: per band width and class, cumulative [true positives, truth pixels, predicted pixels] in Band(w). */
  bandClass: number[] | null;
  biouInter: number[] | null;
  biouUnion: number[] | null;
  bfPredMatched: number[] | null;
  bfPredTotal: number[] | null;
  bfTruthMatched: number[] | null;
  bfTruthTotal: number[] | null;
  /** Regions of disagreement (tiny ones included), their pixels, and void-spill pixels; null without regions. */
  regions: number | null;
  regionPixels: number | null;
  voidSpillPixels: number | null;
  /** Flip-back rates over non-void and void truth, and small-object recall (src/docs/metrics.md "Flicker", "Objects"); null where the report has null. */
  flipBack: number | null;
  flipBackVoid: number | null;
  smallObjectRecall: number | null;
}

/** One row of regions.parquet: a listed error region of one run on one frame, or a void-spill area. */
export interface RegionRow {
  frameIndex: number;
  frame: string;
  run: string;
  /** Region id in the run's regions of the frame; null for void spill. */
  regionId: number | null;
  /** A region kind, or "voidSpill". */
  kind: string;
  truthClass: number | null;
  predictedClass: number | null;
  area: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
  thickness: number | null;
  bandShare: number | null;
  severity: number | null;
  truthSegment: number | null;
  /** Whether the queue ranks it (a predicted class, and among the frame's best perFrameMax of its run). */
  candidate: boolean;
  bound: number | null;
  geometry: number | null;
  agreement: number | null;
  /** JSON list of { run, share }: the other runs' agreement. */
  agreementRuns: string | null;
  image: number | null;
  edgePredicted: number | null;
  edgeTruth: number | null;
  edgeInside: number | null;
  outlinePredicted: number | null;
  outlineTruth: number | null;
  outlineShared: number | null;
  confidenceHist: number[] | null;
  /** Appearance histogram of the region in the photo (colour then texture bins); null without a photo. */
  appearanceHist: number[] | null;
  /** Temporal evidence (share of cells with a label flip, bracketing frames) and steady disagreement. */
  temporal: number | null;
  flipBefore: string | null;
  flipAfter: string | null;
  steady: number | null;
}

const list = (a: ArrayLike<number>) => Array.from(a);

/** Returns the frame rows of one frame's result, one per run in the result's order. */
export function frameRowsOf(frameIndex: number, result: FrameJobResult): FrameRow[] {
  return result.runs.map((r): FrameRow => {
    const error = result.error ?? r.error;
    const stats = error ? null : r.stats;
    const regions = error ? null : r.regions ?? null;
    const digest = stats ? frameDigestOf(stats) : null;
    const s = digest ? frameSummaryOf(digest, digestBandScores(digest, ROW_BAND_WIDTH).meanIoU) : null;
    return {
      frameIndex, frame: result.name, run: r.run, error: error ?? (stats ? null : 'not scored'), width: result.width, height: result.height,
      meanIoU: s?.meanIoU ?? null, pixelAccuracy: s?.pixelAccuracy ?? null, bandIoU: s?.bandIoU ?? null, boundaryIoU: s?.boundaryIoU ?? null,
      boundaryF: s?.boundaryF ?? null, errorPixels: s?.errorPixels ?? null, validPixels: s?.validPixels ?? null,
      classIds: digest ? [...digest.classIds] : null, confusion: digest ? list(digest.confusion) : null, bandClass: digest ? list(digest.bandClass) : null,
      biouInter: digest ? list(digest.biouInter) : null, biouUnion: digest ? list(digest.biouUnion) : null,
      bfPredMatched: digest ? list(digest.bfPredMatched) : null, bfPredTotal: digest ? list(digest.bfPredTotal) : null,
      bfTruthMatched: digest ? list(digest.bfTruthMatched) : null, bfTruthTotal: digest ? list(digest.bfTruthTotal) : null,
      regions: regions ? regions.counts.all.regions : null, regionPixels: regions ? regions.counts.all.pixels : null,
      voidSpillPixels: regions ? regions.voidSpill.pixels : null,
      ...extrasFrameLine(error ? null : r.extras),
    };
  });
}

/** What the queue adds to a candidate region once its neighbouring frames are in. */
export interface CandidateEvidence {
  flip: TemporalFlip;
  steady: number;
}

/**
 * Returns the region rows of one frame's result: every listed region of every run (with the queue's
 * evidence where `evidence` has the region as a candidate, keyed by run and region id) and the void-spill areas.
 */
export function regionRowsOf(
  frameIndex: number, result: FrameJobResult, candidates: readonly SuspectCandidate[], evidence: readonly CandidateEvidence[], ignore: number,
): RegionRow[] {
  const out: RegionRow[] = [];
  if (result.error) return out;
  const byRegion = new Map(candidates.map((c, i) => [`${c.run}\n${c.regionId}`, i]));
  for (const r of result.runs) {
    if (!r.regions || r.error) continue;
    for (const g of r.regions.regions) {
      const i = byRegion.get(`${r.run}\n${g.id}`);
      const c = i === undefined ? null : candidates[i];
      const e = i === undefined ? null : evidence[i];
      const edges = g.evidence.edges;
      out.push({
        frameIndex, frame: result.name, run: r.run, regionId: g.id, kind: g.kind, truthClass: g.truthClass, predictedClass: g.predictedClass, area: g.area,
        x0: g.bbox[0], y0: g.bbox[1], x1: g.bbox[2], y1: g.bbox[3], thickness: g.thickness, bandShare: g.bandShare, severity: g.severity,
        truthSegment: g.truthSegment.id, candidate: c !== null, bound: c?.bound ?? null, geometry: c?.geometry ?? null, agreement: c?.agreement ?? null,
        agreementRuns: JSON.stringify(g.evidence.agreement), image: c?.image ?? null,
        edgePredicted: edges?.predicted ?? null, edgeTruth: edges?.truth ?? null, edgeInside: edges?.inside ?? null,
        outlinePredicted: edges?.outline.predicted ?? null, outlineTruth: edges?.outline.truth ?? null, outlineShared: edges?.outline.shared ?? null,
        confidenceHist: g.evidence.confidence ? [...g.evidence.confidence] : null, appearanceHist: g.evidence.appearance ? [...g.evidence.appearance] : null,
        temporal: e?.flip.share ?? null, flipBefore: e?.flip.before ?? null, flipAfter: e?.flip.after ?? null, steady: e?.steady ?? null,
      });
    }
    for (const v of r.regions.voidSpill.regions) {
      out.push({
        frameIndex, frame: result.name, run: r.run, regionId: null, kind: 'voidSpill', truthClass: ignore, predictedClass: v.predictedClass, area: v.area,
        x0: v.bbox[0], y0: v.bbox[1], x1: v.bbox[2], y1: v.bbox[3], thickness: null, bandShare: null, severity: null, truthSegment: null,
        candidate: false, bound: null, geometry: null, agreement: null, agreementRuns: null, image: null, edgePredicted: null, edgeTruth: null,
        edgeInside: null, outlinePredicted: null, outlineTruth: null, outlineShared: null, confidenceHist: null, appearanceHist: null, temporal: null, flipBefore: null,
        flipAfter: null, steady: null,
      });
    }
  }
  return out;
}

/** Returns the candidate (without its grid cells, which the stored evidence replaces) and its evidence from a region row, or null when the row is not a candidate. */
export function candidateOfRow(row: RegionRow): { c: SuspectCandidate; evidence: CandidateEvidence } | null {
  if (!row.candidate || row.predictedClass === null || row.truthClass === null || row.regionId === null) return null;
  const edges = row.outlineShared === null
    ? null
    : {
      predicted: row.edgePredicted, truth: row.edgeTruth, inside: row.edgeInside,
      outline: { predicted: row.outlinePredicted ?? 0, truth: row.outlineTruth ?? 0, shared: row.outlineShared },
    };
  const c: SuspectCandidate = {
    frameIndex: row.frameIndex, frame: row.frame, run: row.run, regionId: row.regionId, truthSegment: row.truthSegment ?? -1, kind: row.kind as SuspectCandidate['kind'],
    truthClass: row.truthClass, predictedClass: row.predictedClass, bbox: [row.x0, row.y0, row.x1, row.y1], area: row.area, thickness: row.thickness ?? 0,
    bandShare: row.bandShare ?? 0, geometry: row.geometry ?? 0, agreement: row.agreement, agreementRuns: row.agreementRuns ? JSON.parse(row.agreementRuns) : [],
    image: row.image, edges, confidenceHist: row.confidenceHist, appearanceHist: row.appearanceHist, cells: [], bound: row.bound ?? 0,
  };
  return { c, evidence: { flip: { share: row.temporal ?? 0, before: row.flipBefore, after: row.flipAfter }, steady: row.steady ?? 0 } };
}
