import type { FrameJobResult } from '../core/frameJob.ts';
import { scoreScratchCreate } from '../core/metrics/scratch.ts';
import { regionScratchCreate } from '../core/regions/regionScratch.ts';
import { blobFileReader, type FileBlob } from './blobFiles.ts';
import { frameResultBuffers, frameScoreRun, type FrameScoreFiles } from './frameScoreRun.ts';
import type { JobOutput } from './protocol.ts';

/** Commands the scoring worker answers. */
export const SCORE_COMMANDS = { frameScore: 'frameScore' } as const;

/** Input of `frameScore` in the browser: the frame's files as Blobs (shared with the worker, not copied). */
export type FrameScoreRequest = FrameScoreFiles<FileBlob>;

const scratch = scoreScratchCreate();
const regionScratch = regionScratchCreate();

/** The scoring worker's command table; the command line's threads run the same frameScoreRun over files. */
export const scoreJobs = {
  async [SCORE_COMMANDS.frameScore](input: FrameScoreRequest): Promise<JobOutput<FrameJobResult>> {
    const value = await frameScoreRun(input, blobFileReader, scratch, regionScratch);
    return { value, transfer: frameResultBuffers(value) };
  },
};

export type ScoreJobs = typeof scoreJobs;
