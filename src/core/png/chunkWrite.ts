import { upngCrc } from './upng.ts';

/** One PNG chunk to write: its four-letter type and its data. */
export interface PngChunk {
  type: string;
  data: Uint8Array;
}

const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

/** Returns the bytes of a PNG file: the signature, then each chunk with its length and CRC (ISO/IEC 15948 §5.3). */
export function pngFromChunks(chunks: PngChunk[]): Uint8Array {
  let size = 8;
  for (const c of chunks) size += 12 + c.data.length;
  const out = new Uint8Array(size);
  out.set(SIGNATURE, 0);
  const view = new DataView(out.buffer);
  let off = 8;
  for (const c of chunks) {
    view.setUint32(off, c.data.length);
    for (let i = 0; i < 4; i++) out[off + 4 + i] = c.type.charCodeAt(i);
    out.set(c.data, off + 8);
    view.setUint32(off + 8 + c.data.length, upngCrc(out, off + 4, 4 + c.data.length));
    off += 12 + c.data.length;
  }
  return out;
}

/** Returns the 13 data bytes of an IHDR chunk (compression 0, filter 0). */
export function ihdrBytes(width: number, height: number, bitDepth: number, colorType: number, interlace: 0 | 1): Uint8Array {
  const d = new Uint8Array(13);
  const view = new DataView(d.buffer);
  view.setUint32(0, width);
  view.setUint32(4, height);
  d[8] = bitDepth;
  d[9] = colorType;
  d[12] = interlace;
  return d;
}
