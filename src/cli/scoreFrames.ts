// The scorer's frame loop: frames from..to−1 scored in a pool of worker threads, each result handed
// to `take` as it arrives (in any order). A frame whose worker fails gets a failed result naming it.
import type { ClassTable } from '../core/classTable.ts';
import type { FrameJobResult } from '../core/frameJob.ts';
import { SCORE_PIXEL_BUDGET, workerPoolCreate } from '../workers/pool.ts';
import type { ScoreOptions } from './scoreArgs.ts';
import { scoreJobOf, type ScoreDataset } from './scoreDataset.ts';
import type { FrameScorePaths, ScoreFileJobs } from './scoreFiles.ts';
import { threadPortCreate } from './threadPort.ts';
import { filePngPixels } from './fileReadBounded.ts';

const THREAD = new URL('./scoreThread.ts', import.meta.url);

/** Scores frames from..to−1 of the dataset, calling `take(index, result)` for each. */
export async function framesScore(
  ds: ScoreDataset, options: ScoreOptions, table: ClassTable, from: number, to: number, take: (index: number, result: FrameJobResult) => void,
): Promise<void> {
  const n = to - from;
  if (n <= 0) return;
  const { pairing } = ds;
  // A watchdog deadline and a memory budget from each frame's size (its ground truth's PNG header).
  const pool = workerPoolCreate<ScoreFileJobs>(() => threadPortCreate(THREAD), Math.min(options.workers, n), {
    jobPixels: (_cmd, input) => filePngPixels((input as FrameScorePaths).truth.path),
    pixelBudget: SCORE_PIXEL_BUDGET,
  });
  try {
    let next = from;
    // A bounded window keeps memory flat: at most two frames per thread are read or in flight.
    const lane = async () => {
      while (next < to) {
        const index = next++;
        let result: FrameJobResult;
        try {
          result = await pool.run('frameScore', scoreJobOf(ds, options, table, index));
        } catch (e) {
          const error = `${pairing.frames[index].name}: ${(e as Error).message}`;
          result = { name: pairing.frames[index].name, width: 0, height: 0, error, runs: pairing.runs.map((r) => ({ run: r, stats: null, error })) };
        }
        take(index, result);
      }
    };
    await Promise.all(Array.from({ length: Math.min(n, pool.size * 2) }, lane));
  } finally {
    pool.destroy();
  }
}
