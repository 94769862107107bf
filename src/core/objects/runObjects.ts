import { OBJECT_DETECTED_RECALL, objectSizeCountsAdd, objectSizeCountsCreate, SMALL_OBJECT_AREA, smallObjectRecall, type ObjectSizeCounts } from './objectsBySize.ts';
import { truthObjectsHit, type TruthObjectLabels } from './truthObjects.ts';
import type { LabelIds } from '../labelMap.ts';

/** A small ground-truth object a run missed (recall below 0.5): class id, pixels, recall 0..1, box [x0, y0, x1, y1] inclusive. */
export interface MissedObject {
  classId: number;
  area: number;
  recall: number;
  box: [number, number, number, number];
}

/** One run's object scores on one frame (src/docs/metrics.md "Objects"). */
export interface RunObjects {
  /** Counts by class index of the frame's class ids and size bin (additive). */
  counts: ObjectSizeCounts;
  /** Mean recall of the objects under SMALL_OBJECT_AREA pixels, or null. */
  smallRecall: number | null;
  /** The largest missed small objects, largest first, at most MISSED_OBJECTS_MAX. */
  missed: MissedObject[];
}

/** Most missed small objects kept per frame and run (enough to review, bounded for huge frames). */
export const MISSED_OBJECTS_MAX = 50;

/** Returns one run's object scores against the truth's objects (labelled once per frame and shared by the runs). */
export function runObjectsOf(
  labels: TruthObjectLabels, pred: LabelIds, codes: Uint16Array, classIds: readonly number[],
): RunObjects {
  const objects = truthObjectsHit(labels, pred, codes);
  const counts = objectSizeCountsAdd(objectSizeCountsCreate(classIds.length), objects);
  const missed: MissedObject[] = [];
  for (let o = 0; o < objects.count; o++) {
    const area = objects.area[o];
    const recall = objects.hits[o] / area;
    if (area >= SMALL_OBJECT_AREA || recall >= OBJECT_DETECTED_RECALL) continue;
    missed.push({ classId: classIds[objects.classIndex[o]], area, recall, box: [objects.x0[o], objects.y0[o], objects.x1[o], objects.y1[o]] });
  }
  missed.sort((a, b) => b.area - a.area || a.box[1] - b.box[1] || a.box[0] - b.box[0]);
  return { counts, smallRecall: smallObjectRecall(objects), missed: missed.slice(0, MISSED_OBJECTS_MAX) };
}
