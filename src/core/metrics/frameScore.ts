import type { LabelMap } from '../labelMap.ts';
import { CLASSES_MAX } from '../classTable.ts';
import { fail, ok, type Result } from '../result.ts';
import { bandConfusionTotal, BAND_BINS, BAND_WIDTH_MAX } from './bandHistogram.ts';
import { boundaryFCounts } from './boundaryF.ts';
import { innerBandReset, innerBandRow, innerBandTail } from './boundaryIoU.ts';
import { classIdsCheck, labelCodesFill } from './codes.ts';
import { distanceBandRows } from './distanceBand.ts';
import { DISTANCE_LIMIT_MAX } from './distanceCapped.ts';
import { edgeRowScan } from './edgeRows.ts';
import { scoreScratchBinOffsets, scoreScratchCodeTable, scoreScratchCreate, scoreScratchFit, type ScoreScratch } from './scratch.ts';
import {
  boundaryFTolerance, boundaryIoUDilation, scoreSettingsCheck, squaredDistanceLimit, type ScoreSettings,
} from './settings.ts';

/**
 * Additive counts of one frame (pixels), plain typed arrays so they transfer between threads. Every
 * dataset total is their sum; every band width is a prefix sum of `band`. With K = classIds.length,
 * class index c is the position of its id in `classIds`, and prediction column K is "invalid"
 * (a value that is no class id, `ignore` included).
 */
export interface FrameStats {
  width: number;
  height: number;
  /** The K table ids scored, ascending. */
  classIds: number[];
  /** K × (K+1): row = truth class index, column = prediction class index or K. Void truth left out. */
  confusion: Uint32Array;
  /** BAND_BINS × K × (K+1): the confusion split by bin min(ceil(d), 65) of the truth-boundary distance. */
  band: Uint32Array;
  /** Per class: |G_d ∩ P_d| and |G_d ∪ P_d| (Boundary IoU). */
  biouInter: Uint32Array;
  biouUnion: Uint32Array;
  /** Per class: ∂P_c pixels within θ of ∂G_c, all ∂P_c pixels, ∂G_c pixels within θ of ∂P_c, all ∂G_c pixels. */
  bfPredMatched: Uint32Array;
  bfPredTotal: Uint32Array;
  bfTruthMatched: Uint32Array;
  bfTruthTotal: Uint32Array;
}


function frameInputCheck(truth: LabelMap, pred: LabelMap): Result<true> {
  const { width, height } = truth;
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    return fail('', `ground truth has size ${width}×${height}; expected a positive integer size`);
  }
  if (truth.ids.length !== width * height) {
    return fail('', `ground truth holds ${truth.ids.length} ids for ${width}×${height} (expected ${width * height})`);
  }
  if (pred.width !== width || pred.height !== height) {
    return fail('', `prediction is ${pred.width}×${pred.height} but ground truth is ${width}×${height}`);
  }
  if (pred.ids.length !== width * height) {
    return fail('', `prediction holds ${pred.ids.length} ids for ${width}×${height} (expected ${width * height})`);
  }
  return ok(true);
}

/**
 * Returns the additive counts of every src/docs/metrics.md score for one frame, or the problem with its input
 * (sizes that differ, a bad class list or settings). Truth ids outside the table are scored as void.
 * Pass one `scratch` per thread to reuse buffers across frames. `sameTruth`: the caller scores
 * another run against the truth (same ids array, unchanged) it scored last with this scratch, so the
 * truth-boundary distance transform is reused when class list, limit and size also match.
 */
export function frameScore(
  truth: LabelMap, pred: LabelMap, classIds: readonly number[], settings: ScoreSettings,
  scratch: ScoreScratch = scoreScratchCreate(), sameTruth = false,
): Result<FrameStats> {
  const input = frameInputCheck(truth, pred);
  if (!input.ok) return input;
  const checked = scoreSettingsCheck(settings);
  if (!checked.ok) return checked;
  const ids = classIdsCheck(classIds, settings.ignore);
  if (!ids.ok) return ids;
  const { width, height } = truth;
  const k = classIds.length;
  if (k > CLASSES_MAX) {
    const mb = Math.round((BAND_BINS * k * (k + 1) * 4) / 2 ** 20);
    return fail('', `${k} classes would need a ${mb} MB band histogram per frame; at most ${CLASSES_MAX} classes are scored`);
  }
  const s = scratch;
  scoreScratchFit(s, width, height);
  const table = scoreScratchCodeTable(s, classIds, settings.ignore);
  const { truthCodes: tc, predCodes: pc, edges } = s;

  // One capped distance transform serves the band (exact to 64) and, when θ fits, Boundary F precision.
  // The shortcut needs every squared distance up to r2 exact, so the cap must reach ceil(√r2).
  const r2 = squaredDistanceLimit(boundaryFTolerance(width, height, settings.bfTolerance));
  let r = Math.floor(Math.sqrt(r2));
  if (r * r < r2) r++;
  const limit = r <= DISTANCE_LIMIT_MAX ? Math.max(BAND_WIDTH_MAX, r) : BAND_WIDTH_MAX;
  const dil = boundaryIoUDilation(width, height, settings.biouDilationRatio);
  const biouInter = new Uint32Array(k);
  const biouUnion = new Uint32Array(k);

  // Forward sweep, row by row so each row is still in cache for every use: codes one row ahead
  // (edges look one row down), edges and column distances, then the Boundary IoU window scan.
  edges.nT = 0;
  edges.nP = 0;
  innerBandReset(s.innerBand, width);
  labelCodesFill(truth.ids, table, tc, 0, width);
  labelCodesFill(pred.ids, table, pc, 0, width);
  for (let y = 0; y < height; y++) {
    edgeRowScan(truth.ids, pred.ids, table, tc, pc, width, height, y, k, limit + 1, edges);
    innerBandRow(tc, pc, width, y, dil, k, s.innerBand, biouInter, biouUnion);
  }
  innerBandTail(tc, pc, width, height, dil, k, biouInter, biouUnion);

  const band = new Uint32Array(BAND_BINS * k * (k + 1));
  const binOffsets = scoreScratchBinOffsets(s, limit, k);
  // The distances depend on the truth alone: made once per frame, reused by its other runs.
  const distanceKey = `${s.codeKey}|${limit}|${width}x${height}`;
  const dist2Known = sameTruth && s.distanceIds === truth.ids && s.distanceKey === distanceKey;
  distanceBandRows(edges.fwd, tc, pc, width, height, k, limit, binOffsets, band, s.dist2, s.distance, dist2Known);
  s.distanceIds = truth.ids;
  s.distanceKey = distanceKey;
  const confusion = new Uint32Array(k * (k + 1));
  bandConfusionTotal(band, k, confusion);

  const bf = { predMatched: new Uint32Array(k), predTotal: new Uint32Array(k), truthMatched: new Uint32Array(k), truthTotal: new Uint32Array(k) };
  const shortcut = r <= limit ? s.dist2 : null;
  boundaryFCounts(tc, pc, edges, shortcut, width, height, k, r2, s.boundaryF, bf);

  return ok({
    width, height, classIds: [...classIds], confusion, band, biouInter, biouUnion,
    bfPredMatched: bf.predMatched, bfPredTotal: bf.predTotal, bfTruthMatched: bf.truthMatched, bfTruthTotal: bf.truthTotal,
  });
}
