// The GPU textures of recent frames, kept by the bytes they were made from: a decoded frame's arrays
// (truth ids, photo, band bins, each run's ids) are the same objects each time the frame cache hands
// the frame out, and a neighbour's prediction shown by the flicker layer is the very array of that
// neighbour's frame. So stepping to a frame that was prefetched, going back to the last one, or
// drawing flicker from maps already shown uploads nothing. Bounded by bytes: the least recently used
// entries that are not pinned (the frame on screen) are freed first.
import type { TextureSource } from 'pixi.js';

interface Entry {
  layout: string;
  textures: TextureSource[];
  bytes: number;
}

/** Bytes of textures kept by default: the frame on screen and about five 2048×1024 frames around it. */
export const TEXTURE_KEEP_BYTES = 96 * 1024 * 1024;

export class TextureKeep {
  private readonly entries = new Map<object, Entry>();
  private total = 0;
  private pinned = new Set<object>();

  constructor(private readonly budget = TEXTURE_KEEP_BYTES) {}

  /**
   * Returns the textures of `bytes` cut as `layout` (a string naming the frame size and tiling),
   * made with `make` when not kept, and marks them most recently used.
   */
  get(bytes: ArrayBufferView, layout: string, make: () => TextureSource[]): TextureSource[] {
    const e = this.entries.get(bytes);
    if (e && e.layout === layout) {
      this.entries.delete(bytes);
      this.entries.set(bytes, e);
      return e.textures;
    }
    if (e) this.drop(bytes, e);
    const made = { layout, textures: make(), bytes: bytes.byteLength };
    this.entries.set(bytes, made);
    this.total += made.bytes;
    this.evict(bytes);
    return made.textures;
  }

  /** Protects the textures of these arrays from eviction (the frame on screen), releasing the former set. */
  pin(sources: Iterable<object>): void {
    this.pinned = new Set(sources);
    this.evict();
  }

  /** Bytes held now. */
  held(): number {
    return this.total;
  }

  /** Frees least recently used entries until within budget, never a pinned one nor `spare` (just made). */
  private evict(spare: object | null = null): void {
    for (const [key, e] of this.entries) {
      if (this.total <= this.budget) return;
      if (key !== spare && !this.pinned.has(key)) this.drop(key, e);
    }
  }

  private drop(key: object, e: Entry): void {
    this.entries.delete(key);
    this.total -= e.bytes;
    for (const t of e.textures) t.destroy();
  }

  /** Frees every texture. */
  clear(): void {
    for (const [key, e] of [...this.entries]) this.drop(key, e);
  }
}
