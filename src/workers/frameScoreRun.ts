import { fileBytesRead, type FileBytes, type FrameFileReader, type FrameFileRef } from '../core/frameFiles.ts';
import { frameJobScore, type FrameJobInput, type FrameJobResult, type PhotoPixels } from '../core/frameJob.ts';
import type { FrameStats } from '../core/metrics/frameScore.ts';
import type { ScoreScratch } from '../core/metrics/scratch.ts';
import type { RegionScratch } from '../core/regions/regionScratch.ts';
import { buffersOf } from './protocol.ts';

/** A frame-scoring job: FrameJobInput with the frame's files located by `F` (Blobs in the page, paths headless) instead of bytes. */
export interface FrameScoreFiles<F extends FrameFileRef> extends Omit<FrameJobInput, 'truth' | 'preds' | 'photoRgba' | 'confidence' | 'neighbours' | 'instances'> {
  truth: F;
  /** Per run: its prediction file, or null when the run has none for this frame. */
  preds: { run: string; file: F | null }[];
  /** The photo: sized against the label maps and decoded for the image evidence of error regions. */
  photo: F | null;
  /** Per run: its confidence map, if the dataset has one. */
  confidence?: { run: string; file: F | null }[];
  /** Per run: its predictions at the frame's neighbours in its sequence, for flicker; null at a sequence end. */
  neighbours?: { run: string; prev: F | null; next: F | null }[];
  /** The frame's instance map, for iIoU. */
  instances?: F | null;
}

/**
 * Reads a frame's files through `reader` and scores the frame (frameJobScore). The page's scoring
 * worker and the command line's threads both run this, so a file that cannot be read is reported the
 * same way in both ("<file>: could not be read (<reason>)"): ground truth fails the frame, a
 * prediction fails its run, and a photo or confidence map only loses its evidence, with a warning.
 */
export async function frameScoreRun<F extends FrameFileRef>(
  input: FrameScoreFiles<F>, reader: FrameFileReader<F>, scratch: ScoreScratch, regionScratch: RegionScratch,
): Promise<FrameJobResult> {
  const truth = await fileBytesRead(reader, input.truth);
  if (!truth.ok) {
    return { name: input.name, width: 0, height: 0, error: truth.error, runs: input.preds.map((p) => ({ run: p.run, stats: null, error: truth.error })) };
  }
  const warnings: string[] = [];
  const preds = await Promise.all(input.preds.map(async (p) => ({ run: p.run, read: p.file ? await fileBytesRead(reader, p.file) : null })));
  let photoRgba: PhotoPixels | null = null;
  if (input.photo) {
    const bytes = await fileBytesRead(reader, input.photo);
    const pixels = bytes.ok ? await reader.photo(input.photo, bytes.value.bytes) : bytes;
    if (pixels.ok) photoRgba = { file: input.photo.file, ...pixels.value };
    else warnings.push(`${pixels.error}; image evidence not used on this frame`);
  }
  const confidence = await Promise.all(
    (input.confidence ?? []).map(async (c) => {
      const read = c.file ? await fileBytesRead(reader, c.file) : null;
      if (read && !read.ok) warnings.push(`${read.error}; confidence of ${c.run} not used on this frame`);
      return { run: c.run, file: read?.ok ? read.value : null };
    }),
  );
  // Neighbours and instance maps only feed the flicker and iIoU counts: one that cannot be read loses those, with a warning.
  const optional = async (f: F | null | undefined, loses: string): Promise<FileBytes | null> => {
    if (!f) return null;
    const read = await fileBytesRead(reader, f);
    if (!read.ok) warnings.push(`${read.error}; ${loses} not computed on this frame`);
    return read.ok ? read.value : null;
  };
  const neighbours = await Promise.all((input.neighbours ?? []).map(async (n) => ({
    run: n.run, prev: await optional(n.prev, `flicker of ${n.run}`), next: await optional(n.next, `flicker of ${n.run}`),
  })));
  const instances = await optional(input.instances, 'instance-weighted IoU');
  const value = frameJobScore(
    {
      ...input, truth: truth.value, preds: preds.map((p) => ({ run: p.run, file: p.read?.ok ? p.read.value : null })), photoRgba, confidence,
      neighbours, instances,
    },
    scratch,
    regionScratch,
  );
  if (warnings.length) value.warnings = [...warnings, ...(value.warnings ?? [])];
  // A prediction that could not be read says so, rather than "no prediction file".
  if (!value.error) {
    for (const p of preds) {
      const r = value.runs.find((x) => x.run === p.run);
      if (r && p.read && !p.read.ok) r.error = p.read.error;
    }
  }
  return value;
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
