// For each cell of a run's confusion matrix (truth class, predicted class or "not a class"), the few
// frames with the most pixels in it, kept as frames land: what the confusion map lists when a cell is
// clicked, without keeping any frame's matrix.
import type { FrameCounts } from '../core/metrics/frameSummary.ts';

/** Frames listed per cell. */
export const CONFUSION_FRAMES_MAX = 12;

/** Per run, per cell key `${truthId}>${predictedId}` (predicted −1 = not a class): frames by pixels, most first. */
export type ConfusionFrames = Map<string, Map<string, { index: number; pixels: number }[]>>;

/** Returns the key of a cell. */
export const confusionCellKey = (truthId: number, predictedId: number) => `${truthId}>${predictedId}`;

/** Adds frame `index`'s confusion for `run` (in place). */
export function confusionFramesAdd(acc: ConfusionFrames, run: string, index: number, s: Pick<FrameCounts, 'classIds' | 'confusion'>): void {
  let cells = acc.get(run);
  if (!cells) acc.set(run, (cells = new Map()));
  const k = s.classIds.length;
  for (let g = 0; g < k; g++) {
    for (let p = 0; p <= k; p++) {
      const v = s.confusion[g * (k + 1) + p];
      if (v <= 0) continue;
      const key = confusionCellKey(s.classIds[g], p === k ? -1 : s.classIds[p]);
      let list = cells.get(key);
      if (!list) cells.set(key, (list = []));
      if (list.length >= CONFUSION_FRAMES_MAX && list[list.length - 1].pixels >= v) continue;
      let at = list.length;
      while (at > 0 && (list[at - 1].pixels < v || (list[at - 1].pixels === v && list[at - 1].index > index))) at--;
      list.splice(at, 0, { index, pixels: v });
      if (list.length > CONFUSION_FRAMES_MAX) list.pop();
    }
  }
}

/** Returns the frames with the most pixels of truth `truthId` predicted as `predictedId` (−1: not a class) for `run`, most first. */
export function confusionFramesOf(acc: ConfusionFrames, run: string, truthId: number, predictedId: number): { index: number; pixels: number }[] {
  return acc.get(run)?.get(confusionCellKey(truthId, predictedId)) ?? [];
}
