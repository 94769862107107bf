// What a class looks like in the photos: a histogram of CIELAB colour (D65) and of gradient energy,
// gathered over pixels where the label and every run agree, and the same histogram of one region, so
// the dataset pass can ask whether a region looks like its labelled or its predicted class.
import { converter } from 'culori';
import type { ComponentStats } from './componentStats.ts';
import { gradientAt } from './photoEdges.ts';
import type { RunTable } from './runLabel.ts';

/** Bin edges of L* (0..100) and of a* and b*: 4 × 6 × 6 colour bins. */
const L_EDGES = [25, 50, 75] as const;
const AB_EDGES = [-25, -10, 0, 10, 25] as const;
/** Colour bins: L index · 36 + a index · 6 + b index. */
export const COLOUR_BINS = 4 * 6 * 6;
/** Bin edges of the Sobel gradient magnitude (luma levels per pixel, gradientAt): 7 texture bins. */
const TEXTURE_EDGES = [2, 4, 8, 16, 32, 64] as const;
export const TEXTURE_BINS = TEXTURE_EDGES.length + 1;
/** Length of an appearance histogram: colour bins, then texture bins. */
export const APPEARANCE_BINS = COLOUR_BINS + TEXTURE_BINS;
/** Pixels a label boundary must be away (along rows, and two rows up and down) for a pixel to describe its class. */
const APPEARANCE_BOUNDARY_GAP = 1;

function binOf(v: number, edges: readonly number[]): number {
  let i = 0;
  while (i < edges.length && v >= edges[i]) i++;
  return i;
}

/** Returns the colour bin 0..COLOUR_BINS-1 of a CIELAB colour. */
export function labBinOf(l: number, a: number, b: number): number {
  return binOf(l, L_EDGES) * 36 + binOf(a, AB_EDGES) * 6 + binOf(b, AB_EDGES);
}

/** Returns the texture bin 0..TEXTURE_BINS-1 of a gradient magnitude. */
export function textureBinOf(g: number): number {
  return binOf(g, TEXTURE_EDGES);
}

let table: Uint8Array | null = null;

/**
 * Returns the colour bin of every sRGB colour at 5 bits per channel (index (r>>3)<<10 | (g>>3)<<5 | b>>3),
 * from the CIELAB (D65) of the cell's centre as culori converts it (sRGB companding of IEC 61966-2-1,
 * CIE 1976 L*a*b*), built once: a photo is then binned with one look-up per pixel.
 */
export function labBinTable(): Uint8Array {
  if (table) return table;
  const toLab = converter('lab65');
  const t = new Uint8Array(32768);
  for (let r = 0; r < 32; r++) {
    for (let g = 0; g < 32; g++) {
      for (let b = 0; b < 32; b++) {
        const lab = toLab({ mode: 'rgb', r: (r * 8 + 4) / 255, g: (g * 8 + 4) / 255, b: (b * 8 + 4) / 255 });
        t[(r << 10) | (g << 5) | b] = labBinOf(lab.l, lab.a, lab.b);
      }
    }
  }
  return (table = t);
}

/**
 * Writes the colour bin of every pixel of an RGBA photo into `out` (alpha ignored).
 * Hot loop: flat typed arrays, one table read per pixel.
 */
export function photoLabBins(rgba: Uint8Array, pixels: number, out: Uint8Array): void {
  const t = labBinTable();
  for (let i = 0, o = 0; i < pixels; i++, o += 4) out[i] = t[((rgba[o] & 0xf8) << 7) | ((rgba[o + 1] & 0xf8) << 2) | (rgba[o + 2] >> 3)];
}

/** The photo maps appearance reads: colour bins, luma and its gradient computed so far (gradientAt). */
export interface AppearancePhoto {
  bins: Uint8Array;
  luma: Uint8Array;
  gradient: Uint8Array;
}

/** Per class (same order as classIds): its appearance histogram, counts of sampled pixels (k × APPEARANCE_BINS, colour then texture). */
export interface ClassAppearance {
  classIds: number[];
  counts: Uint32Array;
}

/**
 * Returns the appearance histograms of one frame's classes over the pixels on even rows and columns
 * where the label says class code c < k, every run given predicts c too, and no label boundary lies
 * within APPEARANCE_BOUNDARY_GAP along the row or on the rows two above and below (edgeReach, truthEdgeReach):
 * pixels whose class nobody doubts. Hot loop: flat typed arrays, no allocation per pixel.
 */
export function classAppearanceOfFrame(
  width: number, height: number, tc: Uint16Array, preds: readonly Uint16Array[], edgeReach: Uint8Array, photo: AppearancePhoto, classIds: readonly number[],
): ClassAppearance {
  const k = classIds.length;
  const counts = new Uint32Array(k * APPEARANCE_BINS);
  const gap = APPEARANCE_BOUNDARY_GAP;
  for (let y = 0; y < height; y += 2) {
    const o = y * width;
    const up = y >= 2 ? o - 2 * width : o, down = y + 2 < height ? o + 2 * width : o;
    for (let x = 0; x < width; x += 2) {
      const i = o + x, c = tc[i];
      if (c >= k || edgeReach[i] <= gap || edgeReach[up + x] <= gap || edgeReach[down + x] <= gap) continue;
      let agree = true;
      for (let r = 0; r < preds.length; r++) if (preds[r][i] !== c) (agree = false), (r = preds.length);
      if (!agree) continue;
      const base = c * APPEARANCE_BINS;
      counts[base + photo.bins[i]]++;
      counts[base + COLOUR_BINS + textureBinOf(gradientAt(photo.luma, photo.gradient, width, height, x, y))]++;
    }
  }
  return { classIds: [...classIds], counts };
}

/**
 * Returns the appearance histogram of component `c` (its pixels on even rows and columns: colour bin
 * and texture bin of each), or null when it has none there.
 */
export function regionAppearance(t: RunTable, s: ComponentStats, c: number, photo: AppearancePhoto, width: number, height: number): number[] | null {
  const hist = new Array<number>(APPEARANCE_BINS).fill(0);
  let n = 0;
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const y = t.y[r];
    if (y & 1) continue;
    const o = y * width;
    for (let x = t.x0[r] + (t.x0[r] & 1); x < t.x1[r]; x += 2) {
      hist[photo.bins[o + x]]++;
      hist[COLOUR_BINS + textureBinOf(gradientAt(photo.luma, photo.gradient, width, height, x, y))]++;
      n++;
    }
  }
  return n ? hist : null;
}
