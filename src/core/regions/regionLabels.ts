import type { LabelMap } from '../labelMap.ts';
import { labelCodesFill } from '../metrics/codes.ts';
import { fail, ok, type Result } from '../result.ts';
import { regionScratchCreate, regionScratchTables } from './regionScratch.ts';
import { RUN_KEEP, runsLabel, runTableCreate, type RunTable } from './runLabel.ts';

/** Writes into `out` (width × height) the component id of every pixel of a labelled run table, -1 where no kept run lies. */
function runsPaint(t: RunTable, out: Int32Array): Int32Array {
  out.fill(-1);
  for (let r = 0; r < t.count; r++) {
    const o = t.y[r] * t.width;
    out.fill(t.comp[r], o + t.x0[r], o + t.x1[r]);
  }
  return out;
}

/**
 * Returns the region id of every pixel of one run on a frame (-1 where truth and prediction agree
 * or the truth is void with no class predicted): the same ids as ErrorRegion.id and the void-spill
 * areas share the numbering. For painting the regions of the frame on screen; the scoring job
 * returns no per-pixel maps.
 */
export function regionLabelMap(truth: LabelMap, pred: LabelMap, classIds: readonly number[], ignore: number): Result<Int32Array> {
  const { width, height } = truth;
  if (pred.width !== width || pred.height !== height) return fail('', `prediction is ${pred.width}×${pred.height} but the ground truth is ${width}×${height}`);
  const s = regionScratchCreate();
  regionScratchTables(s, classIds, ignore);
  const n = width * height;
  const tc = new Uint16Array(n), pc = new Uint16Array(n);
  labelCodesFill(truth.ids, s.truthTable, tc, 0, n);
  labelCodesFill(pred.ids, s.predTable, pc, 0, n);
  const t = runTableCreate();
  runsLabel(tc, pc, null, width, height, classIds.length, RUN_KEEP.pairs, t);
  return ok(runsPaint(t, new Int32Array(n)));
}

/**
 * Returns the segment id of every pixel of a map (8-connected same-value components, every value
 * not a class merged into one for predictions): the ids RegionSegment.id refers to, for the truth
 * (`role` 'truth') or a prediction.
 */
export function segmentLabelMap(map: LabelMap, classIds: readonly number[], ignore: number, role: 'truth' | 'prediction'): Int32Array {
  const s = regionScratchCreate();
  regionScratchTables(s, classIds, ignore);
  const n = map.width * map.height;
  const codes = new Uint16Array(n);
  labelCodesFill(map.ids, role === 'truth' ? s.truthTable : s.predTable, codes, 0, n);
  const t = runTableCreate();
  runsLabel(codes, null, null, map.width, map.height, classIds.length, RUN_KEEP.all, t);
  return runsPaint(t, new Int32Array(n));
}
