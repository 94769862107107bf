import type { LabelIds } from '../../../src/core/labelMap.ts';
import { flipBackCountsCreate, type FlipBackCounts } from '../../../src/core/temporal/flipBack.ts';

/**
 * Plain reference of flip-back counting (src/docs/metrics.md "Flicker"), one pixel at a time
 * straight from the definition: flip when pred[t-1] == pred[t+1] and pred[t] != pred[t-1]; truth
 * that is no class (code ≥ k) counts as void; per class by the t-1 prediction over non-void truth.
 */
export function flipBackPlain(truth: LabelIds, prev: LabelIds, cur: LabelIds, next: LabelIds, codes: Uint16Array, k: number): FlipBackCounts {
  const out = flipBackCountsCreate(k);
  for (let i = 0; i < truth.length; i++) {
    const flip = prev[i] === next[i] && cur[i] !== prev[i];
    if (codes[truth[i]] >= k) {
      out.pixelsVoid++;
      if (flip) out.flipsVoid++;
      continue;
    }
    out.pixels++;
    if (flip) out.flips++;
    const c = codes[prev[i]];
    if (c < k) {
      out.classPixels[c]++;
      if (flip) out.classFlips[c]++;
    }
  }
  return out;
}
