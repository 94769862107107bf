import { open } from 'node:fs/promises';
import { PNG_HEAD_BYTES, pngFileBound, pngHeadPixels } from '../core/png/fileBound.ts';
import { PNG_MAX_PIXELS_DEFAULT } from '../core/png/pixelsRead.ts';

/**
 * Returns the bytes of the file at `path` after checking its first bytes with pngFileBound, so a
 * file far larger than its PNG header allows is refused without being read; throws with the reason.
 */
export async function fileReadBounded(path: string, maxPixels = PNG_MAX_PIXELS_DEFAULT): Promise<Uint8Array> {
  const fh = await open(path, 'r');
  try {
    const { size } = await fh.stat();
    const head = new Uint8Array(Math.min(size, PNG_HEAD_BYTES));
    await fh.read(head, 0, head.length, 0);
    const bound = pngFileBound(head, size, maxPixels);
    if (!bound.ok) throw new Error(bound.error);
    const out = new Uint8Array(size);
    let at = 0;
    while (at < size) {
      const { bytesRead } = await fh.read(out, at, size - at, at);
      if (bytesRead === 0) break;
      at += bytesRead;
    }
    return at === size ? out : out.subarray(0, at);
  } finally {
    await fh.close();
  }
}

/** Returns the pixels the PNG at `path` declares (its first 33 bytes), or null when it is not a PNG or cannot be read. */
export async function filePngPixels(path: string): Promise<number | null> {
  const fh = await open(path, 'r').catch(() => null);
  if (!fh) return null;
  try {
    const head = new Uint8Array(PNG_HEAD_BYTES);
    const { bytesRead } = await fh.read(head, 0, PNG_HEAD_BYTES, 0);
    return pngHeadPixels(head.subarray(0, bytesRead));
  } finally {
    await fh.close();
  }
}
