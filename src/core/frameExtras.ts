import type { LabelMap } from './labelMap.ts';
import { instanceCountsAdd, instanceCountsCreate, type InstanceCounts } from './objects/instanceIoU.ts';
import { runObjectsOf, type RunObjects } from './objects/runObjects.ts';
import { truthObjectLabels } from './objects/truthObjects.ts';
import { flipBackCountsAdd, flipBackCountsCreate, type FlipBackCounts } from './temporal/flipBack.ts';

/**
 * One run's scores beyond the confusion matrix on one frame (src/docs/metrics.md "Flicker",
 * "Objects", "Instance-weighted IoU"), by class index of the frame's class ids. Each is additive.
 */
export interface RunExtras {
  objects: RunObjects;
  /** Null at a sequence end or when a neighbour's prediction is missing. */
  flicker: FlipBackCounts | null;
  /** Null without an instance map. */
  instances: InstanceCounts | null;
}

/** One run's maps on this frame: its prediction and, for flicker, its predictions at the neighbouring frames. */
export interface RunMaps {
  map: LabelMap | null;
  prev: LabelMap | null;
  next: LabelMap | null;
}

/**
 * Returns each run's extras (null for a run without a prediction). The truth's objects are labelled
 * once and shared by the runs; `codes` maps an id to its class index, k and above for void and ids
 * that are no class (src/core/metrics/codes.ts). All maps have the truth's size.
 */
export function frameExtrasCompute(
  truth: LabelMap, runs: readonly RunMaps[], instances: LabelMap | null, classIds: readonly number[], codes: Uint16Array,
): (RunExtras | null)[] {
  const k = classIds.length;
  const labels = truthObjectLabels(truth.ids, truth.width, truth.height, codes, k);
  return runs.map(({ map, prev, next }) => {
    if (!map) return null;
    return {
      objects: runObjectsOf(labels, map.ids, codes, classIds),
      flicker: prev && next ? flipBackCountsAdd(truth.ids, prev.ids, map.ids, next.ids, codes, k, flipBackCountsCreate(k)) : null,
      instances: instances ? instanceCountsAdd(truth.ids, map.ids, instances.ids, codes, k, instanceCountsCreate(k)) : null,
    };
  });
}
