// GPU textures of one frame, per tile: label maps as integer ids (r8 for 8-bit maps, rg8 low byte
// first for 16-bit maps), the photo as rgba8, band bins as r8. They come from a TextureKeep, so a
// frame seen before (or prefetched) and maps shared with neighbouring frames are not uploaded again;
// a prediction run is made the first time it is shown.
import { BufferImageSource, type TextureSource } from 'pixi.js';
import { aroundOf, type CompositeFrame, type FrameAround } from '../core/composite/compositeFrame.ts';
import type { PixelBox } from '../core/composite/layerSettings.ts';
import type { LabelMap } from '../core/labelMap.ts';
import type { TextureKeep } from './textureKeep.ts';
import { tileBytes } from './tiles.ts';

type Format = 'r8unorm' | 'rg8unorm' | 'rgba8unorm';

/** Returns a texture source holding `bytes` as-is: no premultiplying, nearest sampling, no mipmaps, never collected. */
export function textureRaw(bytes: Uint8Array, width: number, height: number, format: Format): TextureSource {
  return new BufferImageSource({
    resource: bytes,
    width,
    height,
    format,
    alphaMode: 'no-premultiply-alpha',
    scaleMode: 'nearest',
    autoGenerateMipmaps: false,
    autoGarbageCollect: false,
  });
}

function labelBytes(map: LabelMap): { bytes: Uint8Array; bpp: number; format: Format } {
  const ids = map.ids;
  // Uint16 ids seen as bytes are low byte first on little-endian hosts, which is every browser we target.
  if (ids instanceof Uint16Array) return { bytes: new Uint8Array(ids.buffer, ids.byteOffset, ids.length * 2), bpp: 2, format: 'rg8unorm' };
  return { bytes: ids, bpp: 1, format: 'r8unorm' };
}

/** Returns a name for a frame size cut into `tiles`: textures are shared only between frames cut alike. */
export function layoutOf(width: number, height: number, tiles: PixelBox[]): string {
  return `${width}x${height}/${tiles.map((t) => `${t.x},${t.y},${t.width},${t.height}`).join(';')}`;
}

/** Textures of one frame, per tile, taken from `keep`. */
export class FrameTextures {
  readonly truth: TextureSource[];
  readonly photo: TextureSource[] | null;
  readonly bins: TextureSource[] | null;
  private readonly layout: string;

  constructor(
    private frame: CompositeFrame,
    readonly tiles: PixelBox[],
    private readonly keep: TextureKeep,
  ) {
    const w = frame.truth.width;
    this.layout = layoutOf(w, frame.truth.height, tiles);
    this.truth = this.label(frame.truth);
    const photo = frame.photo;
    this.photo = photo ? keep.get(photo, this.layout, () => tiles.map((t) => textureRaw(tileBytes(photo, w, 4, t), t.width, t.height, 'rgba8unorm'))) : null;
    const bins = frame.bandBins;
    this.bins = bins ? keep.get(bins, this.layout, () => tiles.map((t) => textureRaw(tileBytes(bins, w, 1, t), t.width, t.height, 'r8unorm'))) : null;
  }

  private label(map: LabelMap): TextureSource[] {
    return this.keep.get(map.ids, this.layout, () => {
      const { bytes, bpp, format } = labelBytes(map);
      return this.tiles.map((t) => textureRaw(tileBytes(bytes, map.width, bpp, t), t.width, t.height, format));
    });
  }

  /** Returns the tiles of prediction `run`, made on first use. */
  run(run: string): TextureSource[] {
    return this.label(this.frame.preds[run]);
  }

  /** Returns the tiles of `run` at the neighbouring frames (for flicker); null when the frame has none. */
  around(run: string): { prev: TextureSource[]; next: TextureSource[] } | null {
    const maps = aroundOf(this.frame, run);
    return maps && { prev: this.label(maps.prev), next: this.label(maps.next) };
  }

  /** Takes new neighbours for the frame. */
  aroundSet(around: FrameAround | null): void {
    this.frame = { ...this.frame, around };
  }

  /** The frame these textures are of (with its current neighbours). */
  get of(): CompositeFrame {
    return this.frame;
  }

  /** Every texture made so far for this frame's own arrays, for uploading ahead. */
  all(runs: string[]): TextureSource[] {
    return [...this.truth, ...(this.photo ?? []), ...(this.bins ?? []), ...runs.filter((r) => Object.hasOwn(this.frame.preds, r)).flatMap((r) => this.run(r))];
  }

}

/** The arrays whose textures `frame` draws from with these runs shown (to pin in the keep while it is on screen). */
export function frameSources(frame: CompositeFrame, runs: (string | null)[]): object[] {
  const out: object[] = [frame.truth.ids];
  if (frame.photo) out.push(frame.photo);
  if (frame.bandBins) out.push(frame.bandBins);
  for (const r of runs) {
    if (r === null) continue;
    if (Object.hasOwn(frame.preds, r)) out.push(frame.preds[r].ids);
    const a = aroundOf(frame, r);
    if (a) out.push(a.prev.ids, a.next.ids);
  }
  return out;
}
