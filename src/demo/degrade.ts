// Model-like degradation of a clean label map: class shares are pooled over stride×stride cells (a
// network's output grid), weighted per class, upsampled bilinearly at positions pushed about by a
// smooth displacement field, and the strongest class wins. Corners round off, edges wobble, thin
// members lose cells and break up; everything varies slowly over time, never per-pixel noise.
// Hot loops: flat typed arrays, no allocation per pixel.
import { noise2 as noise2Imported } from './random.ts';

const noise2 = noise2Imported;
const SLOTS = 16;
const GRID = 16;
const INV_GRID = 1 / GRID;
const PURE_NONE = 255;

// Per-cell buffers reused across calls (megabytes each at 2048 px); zeroed where they need it.
let countBuf = new Uint32Array(0);
let shareBuf = new Float32Array(0);
function scratchCount(n: number): Uint32Array {
  if (countBuf.length < n) countBuf = new Uint32Array(n);
  const c = countBuf.subarray(0, n);
  c.fill(0);
  return c;
}
function scratchShare(n: number): Float32Array {
  if (shareBuf.length < n) shareBuf = new Float32Array(n);
  return shareBuf.subarray(0, n);
}

/** How one prediction run degrades the clean map. Lengths in pixels of the output. */
export interface DegradeSettings {
  stride: number;
  wobble: number;
  /** Weight per class id 0..15 (over 1 favours the class at boundaries and in small regions). */
  gain: Float32Array;
  /** Class ids of thin structures that lose cells. */
  thin: readonly number[];
  /** Share 0..1 of cells in which thin classes are suppressed. */
  thinBreak: number;
  /** Relative jitter of class shares in mixed cells (ragged edges). */
  jitter: number;
  seed: number;
  time: number;
}

/** Returns the degraded copy of `src` (ids 0..15), width×height, as the settings say. */
export function labelsDegrade(src: Uint8Array, width: number, height: number, s: DegradeSettings): Uint8Array {
  const st = Math.max(1, Math.round(s.stride));
  const cw = Math.ceil(width / st);
  const ch = Math.ceil(height / st);
  const count = scratchCount(cw * ch * SLOTS);
  for (let y = 0; y < height; y++) {
    const base = ((y / st) | 0) * cw * SLOTS;
    const row = y * width;
    for (let x0 = 0, o = base; x0 < width; x0 += st, o += SLOTS) {
      const x1 = x0 + st < width ? x0 + st : width;
      for (let x = row + x0, e = row + x1; x < e; x++) count[o + (src[x] & 15)]++;
    }
  }
  const share = scratchShare(cw * ch * SLOTS);
  // dom[c]: a class holding more than half of the cell's weight, else none. Where all four cells
  // around a sample share it, bilinear weights keep it above every other class: no per-class sum.
  const dom = new Uint8Array(cw * ch);
  const present = new Uint16Array(cw * ch); // bit k: class k has a share in the cell
  const isThin = new Uint8Array(SLOTS);
  for (const c of s.thin) isThin[c] = 1;
  for (let j = 0; j < ch; j++) {
    for (let i = 0; i < cw; i++) {
      const c = j * cw + i;
      const o = c * SLOTS;
      let n = 0;
      let kinds = 0;
      let bits = 0;
      for (let k = 0; k < SLOTS; k++) if (count[o + k] > 0) (n += count[o + k]), kinds++, (bits |= 1 << k);
      present[c] = bits;
      const broken = kinds > 1 && noise2(i * 0.45, j * 0.45 + s.time * 0.05, s.seed + 3) < s.thinBreak;
      let sum = 0;
      let top = 0;
      let topW = -1;
      for (let k = 0; k < SLOTS; k++) {
        if (count[o + k] === 0) {
          share[o + k] = 0;
          continue;
        }
        let w = (count[o + k] / n) * s.gain[k];
        if (kinds > 1) {
          w *= 1 + s.jitter * (noise2(i * 0.6 + k * 7.3, j * 0.6 + s.time * 0.08, s.seed + 4) - 0.5);
          if (isThin[k] && broken) w *= 0.1;
        }
        share[o + k] = w;
        sum += w;
        if (w > topW) (topW = w), (top = k);
      }
      dom[c] = topW > sum - topW ? top : PURE_NONE;
    }
  }
  // displacement field on a coarse grid, bilinear in between
  const gw = Math.ceil(width / GRID) + 2;
  const gh = Math.ceil(height / GRID) + 2;
  const gdx = new Float32Array(gw * gh);
  const gdy = new Float32Array(gw * gh);
  for (let j = 0; j < gh; j++) {
    for (let i = 0; i < gw; i++) {
      gdx[j * gw + i] = s.wobble * (2 * noise2(i * 0.4 + s.time * 0.03, j * 0.4, s.seed + 1) - 1);
      gdy[j * gw + i] = s.wobble * (2 * noise2(i * 0.4, j * 0.4 + s.time * 0.03, s.seed + 2) - 1);
    }
  }
  // cells whose 2×2 neighbourhood shares one dominant class: every pixel sampling there gets it
  const block = new Uint8Array(cw * ch).fill(PURE_NONE);
  for (let j = 0; j < ch; j++) {
    const j1 = j + 1 < ch ? j + 1 : j;
    for (let i = 0; i < cw; i++) {
      const i1 = i + 1 < cw ? i + 1 : i;
      const p = dom[j * cw + i];
      if (p !== PURE_NONE && dom[j * cw + i1] === p && dom[j1 * cw + i] === p && dom[j1 * cw + i1] === p) block[j * cw + i] = p;
    }
  }
  const out = new Uint8Array(width * height);
  const inv = 1 / st;
  for (let y = 0; y < height; y++) {
    const gy = y / GRID;
    const gj = gy | 0;
    const fy = gy - gj;
    const row = y * width;
    for (let gi = 0, xs = 0; xs < width; gi++, xs += GRID) {
      // the displacement is linear along x inside one grid column: step it
      const g = gj * gw + gi;
      const dxL = gdx[g] * (1 - fy) + gdx[g + gw] * fy;
      const dxR = gdx[g + 1] * (1 - fy) + gdx[g + gw + 1] * fy;
      const dyL = gdy[g] * (1 - fy) + gdy[g + gw] * fy;
      const dyR = gdy[g + 1] * (1 - fy) + gdy[g + gw + 1] * fy;
      const xe = xs + GRID < width ? xs + GRID : width;
      for (let x = xs; x < xe; x++) {
        const fx = (x - xs) * INV_GRID;
        let u = (x + 0.5 + dxL + (dxR - dxL) * fx) * inv - 0.5;
        let v = (y + 0.5 + dyL + (dyR - dyL) * fx) * inv - 0.5;
        u = u < 0 ? 0 : u > cw - 1 ? cw - 1 : u;
        v = v < 0 ? 0 : v > ch - 1 ? ch - 1 : v;
        const i0 = u | 0;
        const j0 = v | 0;
        const c00 = j0 * cw + i0;
        const p = block[c00];
        if (p !== PURE_NONE) {
          out[row + x] = p;
          continue;
        }
        const i1 = i0 + 1 < cw ? i0 + 1 : i0;
        const j1 = j0 + 1 < ch ? j0 + 1 : j0;
        const wu = u - i0;
        const wv = v - j0;
        const w00 = (1 - wu) * (1 - wv);
        const w10 = wu * (1 - wv);
        const w01 = (1 - wu) * wv;
        const w11 = wu * wv;
        const c10 = j0 * cw + i1;
        const c01 = j1 * cw + i0;
        const c11 = j1 * cw + i1;
        const o00 = c00 * SLOTS;
        const o10 = c10 * SLOTS;
        const o01 = c01 * SLOTS;
        const o11 = c11 * SLOTS;
        let bits = present[c00] | present[c10] | present[c01] | present[c11];
        let best = 0;
        let bestW = -1;
        while (bits !== 0) {
          const k = 31 - Math.clz32(bits);
          bits ^= 1 << k;
          const w = w00 * share[o00 + k] + w10 * share[o10 + k] + w01 * share[o01 + k] + w11 * share[o11 + k];
          if (w > bestW) (bestW = w), (best = k);
        }
        out[row + x] = best;
      }
    }
  }
  return out;
}
