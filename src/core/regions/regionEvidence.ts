import { regionAppearance, type AppearancePhoto } from './appearance.ts';
import type { ComponentStats } from './componentStats.ts';
import type { GridShape } from './frameGrid.ts';
import { gradientNear } from './photoEdges.ts';
import { CONFIDENCE_BINS, type RegionEvidence } from './regionTypes.ts';
import type { RunTable } from './runLabel.ts';

/** What one run's regions are read against on one frame: code maps, the photo's luma, the confidence map. */
export interface EvidenceContext {
  width: number;
  height: number;
  /** Truth codes and this run's prediction codes (0..k, k = not a class). */
  tc: Uint16Array;
  pc: Uint16Array;
  /** The other runs with a map of this frame. */
  others: { run: string; pc: Uint16Array }[];
  /** The photo's colour bins, luma and its gradient magnitudes computed so far (gradientAt), or null without a photo. */
  photo: AppearancePhoto | null;
  /** Chessboard radius (pixels) searched for the strongest edge around each outline pixel. */
  edgeTolerance: number;
  confidence: { values: Uint8Array | Uint16Array; bins: Uint8Array } | null;
  grid: GridShape;
  /** Per-cell pixel counts, all zero between calls (sized columns × rows). */
  cellCount: Int32Array;
  /** Cell indices touched by the current region (sized like cellCount). */
  cellTouched: Int32Array;
  gridCellShare: number;
}

/** Walks the region's runs over the grid cells: counts its pixels per cell, returns the cells it fills to gridCellShare (none for slivers). */
function regionCells(t: RunTable, s: ComponentStats, c: number, ctx: EvidenceContext): number[] {
  const { cell, columns } = ctx.grid;
  const { cellCount, cellTouched } = ctx;
  let touched = 0;
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const rowBase = ((t.y[r] / cell) | 0) * columns;
    for (let gx = (t.x0[r] / cell) | 0, last = ((t.x1[r] - 1) / cell) | 0; gx <= last; gx++) {
      const n = Math.min(t.x1[r], (gx + 1) * cell) - Math.max(t.x0[r], gx * cell);
      const ci = rowBase + gx;
      if (cellCount[ci] === 0) cellTouched[touched++] = ci;
      cellCount[ci] += n;
    }
  }
  const out: number[] = [];
  for (let j = 0; j < touched; j++) {
    const ci = cellTouched[j];
    const gx = ci % columns, gy = (ci - gx) / columns;
    const area = (Math.min(ctx.width, (gx + 1) * cell) - gx * cell) * (Math.min(ctx.height, (gy + 1) * cell) - gy * cell);
    if (cellCount[ci] >= ctx.gridCellShare * area) out.push(ci);
  }
  for (let j = 0; j < touched; j++) cellCount[cellTouched[j]] = 0;
  return out.sort((a, b) => a - b);
}

/**
 * Returns the evidence of component `c` (a region with truth code g = s.a[c], prediction code
 * p = s.b[c]): agreement of the other runs, edge strength (the strongest photo gradient within
 * edgeTolerance px) along the prediction-only and truth-only parts of its outline and inside it
 * (every other row and column), its confidence histogram and its grid cells.
 * An outline pixel is a region pixel with a 4-neighbour inside the image that is not in the region;
 * the neighbour tells which map changes class there (the image border is no outline).
 * Hot loop: flat typed arrays over the region's runs, no allocation per pixel.
 */
export function regionEvidence(t: RunTable, s: ComponentStats, c: number, ctx: EvidenceContext): RegionEvidence {
  const { width, height, tc, pc, photo, edgeTolerance } = ctx;
  const g = s.a[c], p = s.b[c];
  const agree = new Float64Array(ctx.others.length);
  const hist = ctx.confidence ? new Array<number>(CONFIDENCE_BINS).fill(0) : null;
  let sumP = 0, nP = 0, sumT = 0, nT = 0, sumI = 0, nI = 0, nS = 0;
  for (let j = s.runStart[c], end = s.runStart[c + 1]; j < end; j++) {
    const r = s.order[j];
    const y = t.y[r], o = y * width;
    const i0 = o + t.x0[r], i1 = o + t.x1[r];
    for (let k = 0; k < ctx.others.length; k++) {
      const opc = ctx.others[k].pc;
      let n = 0;
      for (let i = i0; i < i1; i++) if (opc[i] === p) n++;
      agree[k] += n;
    }
    if (ctx.confidence && hist) {
      const { values, bins } = ctx.confidence;
      for (let i = i0; i < i1; i++) hist[bins[values[i]]]++;
    }
    if (!photo) continue;
    const up = y > 0 ? -width : 0, down = y < height - 1 ? width : 0;
    for (let i = i0; i < i1; i++) {
      const x = i - o;
      // Four neighbours inside the image (an offset of 0 is the pixel itself: no change). Each sets
      // bit (truth changes) + 2·(prediction changes): bit 1 truth only, bit 2 prediction only, bit 3 both.
      const l = x > 0 ? i - 1 : i, rr = x < width - 1 ? i + 1 : i;
      const seen =
        (1 << ((tc[l] !== g ? 1 : 0) | (pc[l] !== p ? 2 : 0))) | (1 << ((tc[rr] !== g ? 1 : 0) | (pc[rr] !== p ? 2 : 0))) |
        (1 << ((tc[i + up] !== g ? 1 : 0) | (pc[i + up] !== p ? 2 : 0))) | (1 << ((tc[i + down] !== g ? 1 : 0) | (pc[i + down] !== p ? 2 : 0)));
      const truthOnly = (seen & 2) !== 0, predOnly = (seen & 4) !== 0, outline = (seen & 14) !== 0;
      if (outline && !predOnly && !truthOnly) {
        nS++;
        continue;
      }
      // The inside is sampled on every other row and column: it is a baseline, not a measurement.
      if (!outline && ((x | y) & 1) !== 0) continue;
      const m = gradientNear(photo.luma, photo.gradient, width, height, x, y, edgeTolerance);
      if (!outline) (sumI += m), nI++;
      if (predOnly) (sumP += m), nP++;
      if (truthOnly) (sumT += m), nT++;
    }
  }
  const area = s.area[c];
  return {
    agreement: ctx.others.map((x, k) => ({ run: x.run, share: agree[k] / area })),
    edges: photo
      ? { predicted: nP ? sumP / nP : null, truth: nT ? sumT / nT : null, inside: nI ? sumI / nI : null, outline: { predicted: nP, truth: nT, shared: nS } }
      : null,
    confidence: hist,
    appearance: photo ? regionAppearance(t, s, c, photo, width, height) : null,
    cells: regionCells(t, s, c, ctx),
  };
}
