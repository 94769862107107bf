import type { ClassTable } from '../core/classTable.ts';
import type { DecodedFrame } from '../core/decodedFrame.ts';
import type { Result } from '../core/result.ts';
import type { ViewPool } from '../workers/scorePool.ts';
import { VIEW_COMMANDS, type FrameDecodeRequest } from '../workers/viewJobs.ts';
import type { LoadedDataset } from './datasetSlice.ts';
import { frameBlobOf } from './scoringRun.ts';

/** Decoded frames kept around the cursor: a small LRU, so memory stays flat however long the dataset. */
export interface FrameCache {
  /** Returns the decoded frame or why its ground truth cannot be used (from the cache, or decoded in a view worker). */
  get(index: number): Promise<Result<DecodedFrame>>;
  /** Starts decoding `index` in the background if it is not cached. */
  prefetch(index: number): void;
  /** Indices currently held. */
  held(): number[];
}

/** Returns an LRU cache of at most `capacity` decoded frames of `dataset`. */
export function frameCacheCreate(dataset: LoadedDataset, table: ClassTable, pool: ViewPool, capacity = 5): FrameCache {
  const entries = new Map<number, Promise<Result<DecodedFrame>>>();

  async function decode(index: number): Promise<Result<DecodedFrame>> {
    const frame = dataset.pairing.frames[index];
    const req: FrameDecodeRequest = {
      name: frame.name,
      truth: (await frameBlobOf(dataset.source, 'truth', frame.truth))!,
      preds: await Promise.all(dataset.pairing.runs.map(async (run) => ({ run, file: await frameBlobOf(dataset.source, `predictions/${run}`, frame.predictions[run]) }))),
      photo: await frameBlobOf(dataset.source, 'images', frame.image),
      table,
    };
    return pool.run(VIEW_COMMANDS.frameDecode, req);
  }

  function touch(index: number): Promise<Result<DecodedFrame>> {
    let p = entries.get(index);
    if (p) {
      entries.delete(index);
      entries.set(index, p);
      return p;
    }
    p = decode(index);
    entries.set(index, p);
    // A failed decode is not kept, so a retry can succeed (e.g. after a file is fixed).
    p.catch(() => entries.get(index) === p && entries.delete(index));
    while (entries.size > capacity) entries.delete(entries.keys().next().value!);
    return p;
  }

  return {
    get: (index) => touch(index),
    prefetch(index) {
      if (index < 0 || index >= dataset.pairing.frames.length || entries.has(index)) return;
      touch(index).catch(() => {});
    },
    held: () => [...entries.keys()],
  };
}
