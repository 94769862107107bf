import type { CompositeFrame } from '../core/composite/compositeFrame.ts';
import type { CompositePalette } from '../core/composite/compositePalette.ts';
import { frameComposite } from '../core/composite/frameComposite.ts';
import type { LayerSettings } from '../core/composite/layerSettings.ts';
import { frameDecode, type DecodedFrame, type FrameDecodeInput } from '../core/decodedFrame.ts';
import type { Result } from '../core/result.ts';
import { blobFileReader, type FileBlob } from './blobFiles.ts';
import { buffersOf, type JobOutput } from './protocol.ts';

/** Commands the view worker answers. */
export const VIEW_COMMANDS = { frameDecode: 'frameDecode', frameComposite: 'frameComposite' } as const;

/** Input of `frameComposite`: the colouring done off the main thread where WebGL is unavailable. */
export interface FrameCompositeRequest {
  frame: CompositeFrame;
  layers: LayerSettings;
  palette: CompositePalette;
}

/** Input of `frameDecode`: the frame's files as Blobs; band bins are always computed (the viewer's band layer). */
export type FrameDecodeRequest = Omit<FrameDecodeInput<FileBlob>, 'bandBins'>;

/** The view worker's command table. */
export const viewJobs = {
  async [VIEW_COMMANDS.frameDecode](input: FrameDecodeRequest): Promise<JobOutput<Result<DecodedFrame>>> {
    const r = await frameDecode({ ...input, bandBins: true }, blobFileReader);
    if (!r.ok) return { value: r };
    const f = r.value;
    return { value: r, transfer: buffersOf(f.truth.ids, f.photo, f.bandBins, ...Object.values(f.preds).map((m) => m.ids)) };
  },

  [VIEW_COMMANDS.frameComposite](input: FrameCompositeRequest): JobOutput<Uint8Array> {
    const r = frameComposite(input.frame, input.layers, input.palette);
    if (!r.ok) throw new Error(r.error);
    return { value: r.value, transfer: buffersOf(r.value) };
  },
};

export type ViewJobs = typeof viewJobs;
