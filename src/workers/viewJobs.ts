import { truthBandBins } from '../core/bandBins.ts';
import type { ClassTable } from '../core/classTable.ts';
import { frameSizesCheck } from '../core/frameCheck.ts';
import type { LabelMap } from '../core/labelMap.ts';
import { labelMapFromPng, type LabelSourceEncoding } from '../core/png/decodeLabel.ts';
import type { CompositeFrame } from '../core/composite/compositeFrame.ts';
import type { CompositePalette } from '../core/composite/compositePalette.ts';
import { frameComposite } from '../core/composite/frameComposite.ts';
import type { LayerSettings } from '../core/composite/layerSettings.ts';
import { photoDecode } from './photoDecode.ts';
import { buffersOf, type JobOutput } from './protocol.ts';
import type { FileBlob } from './scoreJobs.ts';

/** Commands the view worker answers. */
export const VIEW_COMMANDS = { frameDecode: 'frameDecode', frameComposite: 'frameComposite' } as const;

/** Input of `frameComposite`: the colouring done off the main thread where WebGL is unavailable. */
export interface FrameCompositeRequest {
  frame: CompositeFrame;
  layers: LayerSettings;
  palette: CompositePalette;
}

export interface FrameDecodeRequest {
  name: string;
  truth: FileBlob;
  preds: { run: string; file: FileBlob | null }[];
  photo: FileBlob | null;
  table: ClassTable;
}

/** A frame decoded for the viewer: label maps as ids, the photo as RGBA, band bins, and per-part errors. */
export interface DecodedFrame {
  name: string;
  width: number;
  height: number;
  /** Set when the frame cannot be shown at all (its ground truth failed). */
  error: string | null;
  truth: (LabelMap & { encoding: LabelSourceEncoding }) | null;
  preds: Record<string, LabelMap & { encoding: LabelSourceEncoding }>;
  /** Why a run's prediction (or the photo) is missing from this frame. */
  notes: string[];
  photo: Uint8Array | null;
  bandBins: Uint8Array | null;
}

async function bytes(f: FileBlob): Promise<Uint8Array> {
  return new Uint8Array(await f.blob.arrayBuffer());
}

/** The view worker's command table. */
export const viewJobs = {
  async [VIEW_COMMANDS.frameDecode](input: FrameDecodeRequest): Promise<JobOutput<DecodedFrame>> {
    const empty: DecodedFrame = { name: input.name, width: 0, height: 0, error: null, truth: null, preds: {}, notes: [], photo: null, bandBins: null };
    const t = labelMapFromPng(await bytes(input.truth).catch(() => new Uint8Array(0)), { file: input.truth.file, table: input.table });
    if (!t.ok) return { value: { ...empty, error: t.error } };
    const truth = t.value;
    const { width, height } = truth;
    const out: DecodedFrame = { ...empty, width, height, truth };
    for (const p of input.preds) {
      if (!p.file) {
        out.notes.push(`run "${p.run}" has no prediction for this frame`);
        continue;
      }
      const r = labelMapFromPng(await bytes(p.file).catch(() => new Uint8Array(0)), { file: p.file.file, table: input.table });
      if (!r.ok) {
        out.notes.push(r.error);
        continue;
      }
      const sizes = frameSizesCheck([{ file: input.truth.file, width, height }, { file: p.file.file, width: r.value.width, height: r.value.height }]);
      if (!sizes.ok) out.notes.push(sizes.error);
      else out.preds[p.run] = r.value;
    }
    if (input.photo) {
      try {
        const photo = await photoDecode(input.photo.blob);
        const sizes = frameSizesCheck([{ file: input.truth.file, width, height }, { file: input.photo.file, width: photo.width, height: photo.height }]);
        if (sizes.ok) out.photo = photo.rgba;
        else out.notes.push(sizes.error);
      } catch {
        out.notes.push(`${input.photo.file}: the browser could not decode this image`);
      }
    }
    out.bandBins = truthBandBins(truth);
    const transfer = buffersOf(truth.ids, out.photo, out.bandBins, ...Object.values(out.preds).map((m) => m.ids));
    return { value: out, transfer };
  },

  [VIEW_COMMANDS.frameComposite](input: FrameCompositeRequest): JobOutput<Uint8Array> {
    const r = frameComposite(input.frame, input.layers, input.palette);
    if (!r.ok) throw new Error(r.error);
    return { value: r.value, transfer: buffersOf(r.value) };
  },
};


export type ViewJobs = typeof viewJobs;
