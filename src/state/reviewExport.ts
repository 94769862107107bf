import type { ClassTable } from '../core/classTable.ts';
import type { TileMode } from '../core/export/tileBoxes.ts';
import { tilesExport, type TileExportSource, type TilesExportProgress, type TilesExportSummary } from '../core/export/tilesExport.ts';
import type { ZipSink } from '../core/export/zipStream.ts';
import { fail, type Result } from '../core/result.ts';
import type { Flag } from '../core/review/flag.ts';
import type { ViewPool } from '../workers/scorePool.ts';
import type { LoadedDataset } from './datasetSlice.ts';
import { frameCacheCreate } from './frameCache.ts';
import { reviewFileDataset } from './reviewSlice.ts';
import { scoringTableOf } from './scoringRun.ts';
import type { AppStore } from './store.ts';

/**
 * Returns a tile-export frame source over a loaded dataset: each frame decoded in the view pool the
 * viewer uses (label maps exact, photos by the browser), one frame held at a time.
 */
export function exportSourceFromDataset(dataset: LoadedDataset, table: ClassTable, pool: ViewPool): TileExportSource {
  const cache = frameCacheCreate(dataset, table, pool, 1);
  const index = new Map(dataset.pairing.frames.map((f, i) => [f.name, i]));
  return {
    async frameLoad(name) {
      const i = index.get(name);
      if (i === undefined) return fail('', `frame "${name}" is not in this dataset`);
      try {
        return await cache.get(i);
      } catch (e) {
        return fail('', `${name}: ${(e as Error)?.message ?? String(e)}`);
      }
    },
  };
}

/** What the app's export needs from the user: which flags, how to cut, where the ZIP goes. */
export interface ReviewTilesExportOptions {
  flags: readonly Flag[];
  mode: TileMode;
  sink: ZipSink;
  onProgress?: (p: TilesExportProgress) => void;
  signal?: AbortSignal;
}

/** Exports the given flags of the open dataset as a tile ZIP (every run, the scoring table, frames in dataset order). */
export function reviewTilesExport(store: AppStore, pool: ViewPool, o: ReviewTilesExportOptions): Promise<Result<TilesExportSummary>> {
  const s = store.getState();
  if (!s.dataset) return Promise.resolve(fail('', 'no dataset is open'));
  const table = scoringTableOf(s.dataset, s.settings);
  return tilesExport({
    dataset: reviewFileDataset(s)!, flags: o.flags, runs: s.dataset.pairing.runs, table, mode: o.mode,
    source: exportSourceFromDataset(s.dataset, table, pool), sink: o.sink, frameOrder: s.dataset.pairing.frames.map((f) => f.name),
    onProgress: o.onProgress, signal: o.signal, pause: () => new Promise((r) => setTimeout(r, 0)),
  });
}
