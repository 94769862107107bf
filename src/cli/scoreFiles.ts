import type { FrameJobResult } from '../core/frameJob.ts';
import { scoreScratchCreate } from '../core/metrics/scratch.ts';
import { regionScratchCreate } from '../core/regions/regionScratch.ts';
import { frameResultBuffers, frameScoreRun, type FrameScoreFiles } from '../workers/frameScoreRun.ts';
import type { JobOutput } from '../workers/protocol.ts';
import { diskFileReader, type FilePath } from './diskFiles.ts';
import './nodeInflate.ts'; // zlib's inflate for every PNG this thread reads

/** Input of the scoring thread's `frameScore`: the frame's files as paths (PNG and JPEG photos decoded). */
export type FrameScorePaths = FrameScoreFiles<FilePath>;

const scratch = scoreScratchCreate();
const regionScratch = regionScratchCreate();

/** The headless scorer's command table (served by scoreThread.ts): the browser's frameScoreRun over files on disk. */
export const scoreFileJobs = {
  async frameScore(input: FrameScorePaths): Promise<JobOutput<FrameJobResult>> {
    const value = await frameScoreRun(input, diskFileReader({ maxPixels: input.maxPixels }), scratch, regionScratch);
    return { value, transfer: frameResultBuffers(value) };
  },
};

export type ScoreFileJobs = typeof scoreFileJobs;
