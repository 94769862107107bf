import { PNG_HEAD_BYTES, pngFileBound, pngHeadPixels } from '../core/png/fileBound.ts';
import { PNG_MAX_PIXELS_DEFAULT } from '../core/png/pixelsRead.ts';

/**
 * Returns the bytes of `blob` after checking its first bytes with pngFileBound, so a file far larger
 * than its PNG header allows is refused without being read into the page; throws with the reason.
 */
export async function blobBytesBounded(blob: Blob, maxPixels = PNG_MAX_PIXELS_DEFAULT): Promise<Uint8Array> {
  const head = new Uint8Array(await blob.slice(0, PNG_HEAD_BYTES).arrayBuffer());
  const bound = pngFileBound(head, blob.size, maxPixels);
  if (!bound.ok) throw new Error(bound.error);
  return new Uint8Array(await blob.arrayBuffer());
}

/** Returns the pixels the PNG in `blob` declares (its first 33 bytes), or null when it is not a PNG. */
export async function blobPngPixels(blob: Blob): Promise<number | null> {
  return pngHeadPixels(new Uint8Array(await blob.slice(0, PNG_HEAD_BYTES).arrayBuffer()));
}
