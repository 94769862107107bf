import type { LabelMap } from './labelMap.ts';

function isBoundary(ids: LabelMap['ids'], w: number, h: number, x: number, y: number): boolean {
  const i = y * w + x;
  const v = ids[i];
  return (x > 0 && ids[i - 1] !== v) || (x + 1 < w && ids[i + 1] !== v) || (y > 0 && ids[i - w] !== v) || (y + 1 < h && ids[i + w] !== v);
}

/**
 * Returns the exact Euclidean distance (pixels, between centres) from (x, y) to the nearest
 * ground-truth boundary pixel (src/docs/metrics.md), or null when none lies within `maxDistance`. For one
 * pixel under the cursor: scans squares of growing radius and stops once no closer pixel can remain.
 */
export function truthBoundaryDistanceAt(truth: LabelMap, x: number, y: number, maxDistance = 64): number | null {
  const { width: w, height: h, ids } = truth;
  if (x < 0 || y < 0 || x >= w || y >= h) return null;
  let best = Infinity;
  for (let r = 0; r <= maxDistance; r++) {
    if (r > Math.sqrt(best)) break;
    for (let dy = -r; dy <= r; dy++) {
      const yy = y + dy;
      if (yy < 0 || yy >= h) continue;
      const edge = dy === -r || dy === r;
      for (let dx = -r; dx <= r; dx += edge ? 1 : 2 * r || 1) {
        const xx = x + dx;
        if (xx < 0 || xx >= w) continue;
        const d2 = dx * dx + dy * dy;
        if (d2 < best && isBoundary(ids, w, h, xx, yy)) best = d2;
      }
    }
  }
  const d = Math.sqrt(best);
  return d <= maxDistance ? d : null;
}
