// Worker thread of the headless scorer: reads a frame's files from disk and runs the same core job
// as the browser's scoring worker.
import { frameJobScore, type FileBytes, type FrameJobInput, type FrameJobResult } from '../core/frameJob.ts';
import { scoreScratchCreate } from '../core/metrics/scratch.ts';
import { photoFromPng } from '../core/png/decodePhoto.ts';
import { regionScratchCreate } from '../core/regions/regionScratch.ts';
import type { JobOutput } from '../workers/protocol.ts';
import { frameResultBuffers } from '../workers/scoreJobs.ts';
import { workerServe } from '../workers/serve.ts';
import { fileReadBounded } from './fileReadBounded.ts';
import { threadEndpoint } from './threadPort.ts';

/** A file to read: its path on disk and the name used in messages. */
export interface FilePath {
  file: string;
  path: string;
}

/** Input of the thread's `frameScore`: like FrameJobInput, with paths instead of bytes. */
export interface FrameScorePaths extends Omit<FrameJobInput, 'truth' | 'preds' | 'photo' | 'photoRgba' | 'confidence'> {
  truth: FilePath;
  preds: { run: string; file: FilePath | null }[];
  /** The photo: its PNG header is checked against the label maps; decoded for image evidence when `photoPixels`. */
  photo: FilePath | null;
  photoPixels?: boolean;
  confidence?: { run: string; file: FilePath | null }[];
}

async function bytesOf(f: FilePath): Promise<FileBytes | string> {
  try {
    return { file: f.file, bytes: await fileReadBounded(f.path) };
  } catch (e) {
    return `${f.file}: could not be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`;
  }
}

const scratch = scoreScratchCreate();
const regionScratch = regionScratchCreate();

/** Returns the photo's pixels for image evidence, or the reason it cannot be used (headless, only PNG photos are decoded). */
function photoPixelsOf(photo: FileBytes, maxPixels: number | undefined): FrameJobInput['photoRgba'] | string {
  if (!/\.png$/i.test(photo.file)) return `${photo.file}: only PNG photos are decoded headless; image evidence not used on this frame`;
  const r = photoFromPng(photo.bytes, { file: photo.file, maxPixels });
  return r.ok ? { file: photo.file, ...r.value } : `${r.error}; image evidence not used on this frame`;
}
/** The scoring thread's command table. */
const scoreThreadJobs = {
  async frameScore(input: FrameScorePaths): Promise<JobOutput<FrameJobResult>> {
    const truth = await bytesOf(input.truth);
    if (typeof truth === 'string') {
      return { value: { name: input.name, width: 0, height: 0, error: truth, runs: input.preds.map((p) => ({ run: p.run, stats: null, error: truth })) } };
    }
    const preds = await Promise.all(
      input.preds.map(async (p) => {
        if (!p.file) return { run: p.run, file: null, error: null };
        const b = await bytesOf(p.file);
        return typeof b === 'string' ? { run: p.run, file: null, error: b } : { run: p.run, file: b, error: null };
      }),
    );
    const photo = input.photo ? await bytesOf(input.photo) : null;
    const warnings: string[] = [];
    let photoRgba: FrameJobInput['photoRgba'] = null;
    if (typeof photo === 'string') warnings.push(`${photo}; image evidence not used on this frame`);
    else if (photo && input.photoPixels) {
      const px = photoPixelsOf(photo, input.maxPixels);
      if (typeof px === 'string') warnings.push(px);
      else photoRgba = px;
    }
    const confidence = await Promise.all(
      (input.confidence ?? []).map(async (c) => {
        if (!c.file) return { run: c.run, file: null };
        const b = await bytesOf(c.file);
        if (typeof b === 'string') warnings.push(`${b}; confidence of ${c.run} not used on this frame`);
        return { run: c.run, file: typeof b === 'string' ? null : b };
      }),
    );
    const value = frameJobScore(
      { ...input, truth, preds: preds.map((p) => ({ run: p.run, file: p.file })), photo: typeof photo === 'string' ? null : photo, photoRgba, confidence },
      scratch,
      regionScratch,
    );
    if (warnings.length) value.warnings = [...warnings, ...(value.warnings ?? [])];
    // A prediction that could not be read says so, rather than "no prediction file".
    for (const p of preds) {
      const r = value.runs.find((x) => x.run === p.run);
      if (r && p.error && !value.error) r.error = p.error;
    }
    return { value, transfer: frameResultBuffers(value) };
  },
};

export type ScoreThreadJobs = typeof scoreThreadJobs;

workerServe(await threadEndpoint(), scoreThreadJobs);
