// Plain reference of labelsDegrade: the same model written the obvious way (every class summed at
// every pixel, the displacement interpolated per pixel), to check the fast version against.
import type { DegradeSettings } from '../../src/demo/degrade.ts';
import { noise2 } from '../../src/demo/random.ts';

/** Returns the degraded map and, per pixel, the margin between the best and second-best class weight. */
export function labelsDegradeReference(src: Uint8Array, width: number, height: number, s: DegradeSettings): { ids: Uint8Array; margin: Float64Array } {
  const st = Math.max(1, Math.round(s.stride));
  const cw = Math.ceil(width / st);
  const ch = Math.ceil(height / st);
  const weight: number[][] = [];
  for (let j = 0; j < ch; j++) {
    for (let i = 0; i < cw; i++) {
      const counts = new Array(16).fill(0);
      let n = 0;
      for (let y = j * st; y < Math.min(height, (j + 1) * st); y++) {
        for (let x = i * st; x < Math.min(width, (i + 1) * st); x++) {
          counts[src[y * width + x] & 15]++;
          n++;
        }
      }
      const kinds = counts.filter((c) => c > 0).length;
      const broken = kinds > 1 && noise2(i * 0.45, j * 0.45 + s.time * 0.05, s.seed + 3) < s.thinBreak;
      weight.push(
        counts.map((c, k) => {
          if (c === 0) return 0;
          let w = (c / n) * s.gain[k];
          if (kinds > 1) {
            w *= 1 + s.jitter * (noise2(i * 0.6 + k * 7.3, j * 0.6 + s.time * 0.08, s.seed + 4) - 0.5);
            if (s.thin.includes(k) && broken) w *= 0.1;
          }
          return w;
        }),
      );
    }
  }
  const grid = 16;
  const disp = (gi: number, gj: number, axis: 0 | 1) =>
    axis === 0
      ? s.wobble * (2 * noise2(gi * 0.4 + s.time * 0.03, gj * 0.4, s.seed + 1) - 1)
      : s.wobble * (2 * noise2(gi * 0.4, gj * 0.4 + s.time * 0.03, s.seed + 2) - 1);
  const ids = new Uint8Array(width * height);
  const margin = new Float64Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const gx = x / grid;
      const gy = y / grid;
      const gi = Math.floor(gx);
      const gj = Math.floor(gy);
      const fx = gx - gi;
      const fy = gy - gj;
      const bil = (axis: 0 | 1) =>
        (disp(gi, gj, axis) * (1 - fx) + disp(gi + 1, gj, axis) * fx) * (1 - fy) + (disp(gi, gj + 1, axis) * (1 - fx) + disp(gi + 1, gj + 1, axis) * fx) * fy;
      const u = Math.min(cw - 1, Math.max(0, (x + 0.5 + bil(0)) / st - 0.5));
      const v = Math.min(ch - 1, Math.max(0, (y + 0.5 + bil(1)) / st - 0.5));
      const i0 = Math.floor(u);
      const j0 = Math.floor(v);
      const i1 = Math.min(cw - 1, i0 + 1);
      const j1 = Math.min(ch - 1, j0 + 1);
      const wu = u - i0;
      const wv = v - j0;
      const total = new Array(16).fill(0).map(
        (_, k) =>
          (1 - wu) * (1 - wv) * weight[j0 * cw + i0][k] + wu * (1 - wv) * weight[j0 * cw + i1][k] +
          (1 - wu) * wv * weight[j1 * cw + i0][k] + wu * wv * weight[j1 * cw + i1][k],
      );
      let best = 0;
      for (let k = 1; k < 16; k++) if (total[k] > total[best]) best = k;
      const second = Math.max(...total.filter((_, k) => k !== best));
      ids[y * width + x] = best;
      margin[y * width + x] = total[best] - second;
    }
  }
  return { ids, margin };
}
