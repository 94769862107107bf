import { labelMapFromPng } from '../png/decodeLabel.ts';
import { fail, ok, type Result } from '../result.ts';
import { CONFIDENCE_BINS } from './regionTypes.ts';

/** A per-pixel confidence map of one run: raw gray samples, `value / max` is the confidence 0..1 (high = confident). */
export interface ConfidenceMap {
  width: number;
  height: number;
  values: Uint8Array | Uint16Array;
  /** Largest sample of the bit depth: 255 for 8-bit, 65535 for 16-bit. */
  max: number;
}

/**
 * Returns a confidence map from grayscale PNG bytes, read byte-exactly like a label map (8- or
 * 16-bit; 1/2/4-bit gray scale the same way), or a message naming the file and the problem.
 */
export function confidenceFromPng(bytes: Uint8Array, options: { file: string; maxPixels?: number }): Result<ConfidenceMap> {
  const r = labelMapFromPng(bytes, { file: options.file, maxPixels: options.maxPixels });
  if (!r.ok) {
    // labelMapFromPng's wording speaks of label maps; colour files need their own hint here.
    if (/colour-coded|unsupported for label maps/.test(r.error)) {
      return fail(options.file, 'is not a grayscale PNG; confidence maps must be 8- or 16-bit grayscale (high = confident)');
    }
    return r;
  }
  const m = r.value;
  if (m.encoding.kind !== 'gray') {
    return fail(options.file, `is a ${m.encoding.kind} PNG; confidence maps must be 8- or 16-bit grayscale (high = confident)`);
  }
  return ok({ width: m.width, height: m.height, values: m.ids, max: (1 << m.encoding.bitDepth) - 1 });
}

/** Returns the sample → histogram bin table of a map (bin = floor(confidence · CONFIDENCE_BINS), 1 in the last bin). */
export function confidenceBinTable(max: number): Uint8Array {
  const out = new Uint8Array(max + 1);
  for (let v = 0; v <= max; v++) out[v] = Math.min(CONFIDENCE_BINS - 1, Math.floor((v / max) * CONFIDENCE_BINS));
  return out;
}
