import { truthBandBins } from './bandBins.ts';
import type { ClassTable } from './classTable.ts';
import type { LabelMap } from './labelMap.ts';
import { fileBytesRead, type FrameFileReader, type FrameFileRef } from './frameFiles.ts';
import { labelMapRead, type ReadLabelMap } from './labelRead.ts';
import { photoFit, predictionFit } from './labelScale.ts';
import { ok, type Result } from './result.ts';

/**
 * One frame decoded: its label maps as ids with their source encodings, the photo as RGBA, the band
 * bins, and why any part is missing. The viewer draws it, the tile export cuts it; their frame types
 * are Picks of this one. `Map` is the label map type: the composite needs ids only, the export and the
 * viewer's readout the source encodings too.
 */
export interface DecodedFrame<Map extends LabelMap = ReadLabelMap> {
  name: string;
  width: number;
  height: number;
  truth: Map;
  /** Runs that have a usable prediction on this frame, by name. */
  preds: Record<string, Map>;
  /** RGBA bytes, width·height·4 (alpha is not used: photos are drawn opaque), or null for none. */
  photo: Uint8Array | null;
  /** Per pixel min(ceil(d), 65), d = distance to the nearest truth boundary pixel (src/docs/metrics.md), or null. */
  bandBins: Uint8Array | null;
  /** Why a run's prediction or the photo is missing from the frame. */
  notes: string[];
}

/** What frameDecode reads: the frame's files as the caller locates them, and the table colour-coded maps need. */
export interface FrameDecodeInput<F extends FrameFileRef> {
  name: string;
  truth: F;
  /** Per run: its prediction file, or null when the run has none for this frame. */
  preds: { run: string; file: F | null }[];
  photo: F | null;
  table: ClassTable;
  /** Computes the band bins (the viewer's band layer); off by default. */
  bandBins?: boolean;
}

/**
 * Returns the decoded frame, or why its ground truth cannot be used. A prediction or photo that
 * cannot be read, decoded or that differs in size only leaves the frame, with a note naming the file
 * and the problem. The viewer (Blobs, the browser's image decoder) and the command-line tile export
 * (files, PNG photos) both decode frames here.
 */
export async function frameDecode<F extends FrameFileRef>(input: FrameDecodeInput<F>, reader: FrameFileReader<F>): Promise<Result<DecodedFrame>> {
  const truthBytes = await fileBytesRead(reader, input.truth);
  if (!truthBytes.ok) return truthBytes;
  const t = labelMapRead(truthBytes.value.bytes, { file: input.truth.file, table: input.table, role: 'truth' });
  if (!t.ok) return t;
  const truth = t.value;
  const { width, height } = truth;
  const frame: DecodedFrame = { name: input.name, width, height, truth, preds: {}, photo: null, bandBins: null, notes: [] };
  for (const p of input.preds) {
    if (!p.file) {
      frame.notes.push(`run "${p.run}" has no prediction for this frame`);
      continue;
    }
    const b = await fileBytesRead(reader, p.file);
    const m = b.ok ? labelMapRead(b.value.bytes, { file: p.file.file, table: input.table, role: 'prediction' }) : b;
    const fit = m.ok ? predictionFit({ file: input.truth.file, width, height }, { file: p.file.file, map: m.value }) : m;
    if (!fit.ok) frame.notes.push(fit.error);
    else {
      frame.preds[p.run] = fit.value.map;
      if (fit.value.factor > 1) frame.notes.push(`${p.file.file}: scaled up ×${fit.value.factor} to the label's size by nearest neighbour`);
    }
  }
  if (input.photo) {
    const photo = await reader.photo(input.photo);
    const fit = photo.ok ? photoFit({ file: input.truth.file, width, height }, { file: input.photo.file, ...photo.value }) : photo;
    if (!fit.ok) frame.notes.push(fit.error);
    else {
      frame.photo = fit.value.rgba;
      if (fit.value.note) frame.notes.push(fit.value.note);
    }
  }
  if (input.bandBins) frame.bandBins = truthBandBins(truth);
  return ok(frame);
}
