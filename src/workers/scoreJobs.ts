import type { ClassTable } from '../core/classTable.ts';
import { frameJobScore, type FileBytes, type FrameJobResult, type PhotoPixels } from '../core/frameJob.ts';
import type { FrameStats } from '../core/metrics/frameScore.ts';
import { scoreScratchCreate } from '../core/metrics/scratch.ts';
import { regionScratchCreate } from '../core/regions/regionScratch.ts';
import type { ScoreSettings } from '../core/metrics/settings.ts';
import { blobBytesBounded } from './blobBounded.ts';
import type { FileBlob } from './blobFiles.ts';
import { photoDecode } from './photoDecode.ts';
import { buffersOf, type JobOutput } from './protocol.ts';

/** Commands the scoring worker answers. */
export const SCORE_COMMANDS = { frameScore: 'frameScore' } as const;

/** Input of `frameScore` in the browser: the frame's files as Blobs (shared with the worker, not copied). */
export interface FrameScoreRequest {
  name: string;
  truth: FileBlob;
  preds: { run: string; file: FileBlob | null }[];
  photo: FileBlob | null;
  /** Per run: its confidence map, if the dataset has one. */
  confidence?: { run: string; file: FileBlob | null }[];
  table: ClassTable;
  settings: ScoreSettings;
}

/** Returns the ArrayBuffers of a frame's counts, to move them back by transfer. */
export function frameStatsBuffers(stats: FrameStats): ArrayBuffer[] {
  return buffersOf(
    stats.confusion, stats.band, stats.biouInter, stats.biouUnion,
    stats.bfPredMatched, stats.bfPredTotal, stats.bfTruthMatched, stats.bfTruthTotal,
  );
}

/** Returns the transfer list of a whole frame result: counts, region grids and confidence sums. */
export function frameResultBuffers(result: FrameJobResult): ArrayBuffer[] {
  const regionArrays = result.runs.flatMap((r) => (r.regions ? [r.regions.grid, r.regions.confidence?.sum, r.regions.confidence?.count] : []));
  return [
    ...result.runs.flatMap((r) => (r.stats ? frameStatsBuffers(r.stats) : [])),
    ...buffersOf(result.grid?.truth, ...regionArrays),
  ];
}

async function bytesOf(f: FileBlob): Promise<FileBytes> {
  return { file: f.file, bytes: await blobBytesBounded(f.blob) };
}

const scratch = scoreScratchCreate();
const regionScratch = regionScratchCreate();

/** The scoring worker's command table; the same core job runs in the CLI's worker threads. */
export const scoreJobs = {
  async [SCORE_COMMANDS.frameScore](input: FrameScoreRequest): Promise<JobOutput<FrameJobResult>> {
    let truth: FileBytes;
    try {
      truth = await bytesOf(input.truth);
    } catch (e) {
      const error = `${input.truth.file}: could not be read (${(e as Error).message})`;
      return { value: { name: input.name, width: 0, height: 0, error, runs: input.preds.map((p) => ({ run: p.run, stats: null, error })) } };
    }
    const preds = await Promise.all(
      input.preds.map(async (p) => ({ run: p.run, file: p.file ? await bytesOf(p.file).catch(() => null) : null })),
    );
    const photo = input.photo ? await bytesOf(input.photo).catch(() => null) : null;
    // The photo's pixels feed the image evidence of error regions; a photo the browser cannot decode
    // only loses that evidence (the job says so in its warnings).
    const warnings: string[] = [];
    let photoRgba: PhotoPixels | null = null;
    if (input.photo) {
      try {
        photoRgba = { file: input.photo.file, ...(await photoDecode(input.photo.blob)) };
      } catch {
        warnings.push(`${input.photo.file}: the browser could not decode this image; no image evidence for this frame`);
      }
    }
    const confidence = await Promise.all(
      (input.confidence ?? []).map(async (c) => ({ run: c.run, file: c.file ? await bytesOf(c.file).catch(() => null) : null })),
    );
    const value = frameJobScore(
      { name: input.name, truth, preds, photo, photoRgba, confidence, table: input.table, settings: input.settings },
      scratch,
      regionScratch,
    );
    if (warnings.length) value.warnings = [...(value.warnings ?? []), ...warnings];
    return { value, transfer: frameResultBuffers(value) };
  },
};

export type ScoreJobs = typeof scoreJobs;
