// GPU textures of one frame, per tile: label maps as integer ids (r8 for 8-bit maps, rg8 low byte
// first for 16-bit maps), the photo as rgba8, band bins as r8. Made once per frame; a prediction run
// is uploaded the first time it is shown and then kept, so switching runs only rebinds textures.
import { BufferImageSource, type TextureSource } from 'pixi.js';
import { aroundOf, type CompositeFrame, type FrameAround } from '../core/composite/compositeFrame.ts';
import type { PixelBox } from '../core/composite/layerSettings.ts';
import type { LabelMap } from '../core/labelMap.ts';
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

/** Returns one texture per tile of `map`. */
export function labelTextures(map: LabelMap, tiles: PixelBox[]): TextureSource[] {
  const { bytes, bpp, format } = labelBytes(map);
  return tiles.map((t) => textureRaw(tileBytes(bytes, map.width, bpp, t), t.width, t.height, format));
}

/** Textures of one frame, per tile. */
export class FrameTextures {
  readonly truth: TextureSource[];
  readonly photo: TextureSource[] | null;
  readonly bins: TextureSource[] | null;
  private readonly runs = new Map<string, TextureSource[]>();
  private readonly arounds = new Map<string, { prev: TextureSource[]; next: TextureSource[] } | null>();

  constructor(
    private frame: CompositeFrame,
    readonly tiles: PixelBox[],
  ) {
    const w = frame.truth.width;
    this.truth = labelTextures(frame.truth, tiles);
    const photo = frame.photo;
    this.photo = photo ? tiles.map((t) => textureRaw(tileBytes(photo, w, 4, t), t.width, t.height, 'rgba8unorm')) : null;
    const bins = frame.bandBins;
    this.bins = bins ? tiles.map((t) => textureRaw(tileBytes(bins, w, 1, t), t.width, t.height, 'r8unorm')) : null;
  }

  /** Returns the tiles of prediction `run`, made on first use. */
  run(run: string): TextureSource[] {
    let t = this.runs.get(run);
    if (!t) {
      t = labelTextures(this.frame.preds[run], this.tiles);
      this.runs.set(run, t);
    }
    return t;
  }

  /** Returns the tiles of `run` at the neighbouring frames (for flicker), made on first use; null when the frame has none. */
  around(run: string): { prev: TextureSource[]; next: TextureSource[] } | null {
    if (!this.arounds.has(run)) {
      const maps = aroundOf(this.frame, run);
      this.arounds.set(run, maps && { prev: labelTextures(maps.prev, this.tiles), next: labelTextures(maps.next, this.tiles) });
    }
    return this.arounds.get(run)!;
  }

  /** Takes new neighbours for the frame; the textures of the old ones are freed. */
  aroundSet(around: FrameAround | null): void {
    this.aroundFree();
    this.frame = { ...this.frame, around };
  }

  private aroundFree(): void {
    for (const a of this.arounds.values()) for (const s of a ? [...a.prev, ...a.next] : []) s.destroy();
    this.arounds.clear();
  }

  /** Frees every texture of the frame on the GPU. */
  destroy(): void {
    this.aroundFree();
    for (const list of [this.truth, this.photo ?? [], this.bins ?? [], ...this.runs.values()]) for (const s of list) s.destroy();
    this.runs.clear();
  }
}
