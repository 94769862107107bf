// Surface looks of the photo: a few procedural materials in face coordinates (s along, t up, metres).
// Called once per covered pixel; plain arithmetic on module-level state, no allocation.
import { fbm2 as fbm2Imported, noise2 as noise2Imported } from './random.ts';

// Module-local copies: some loaders turn imported bindings into getters, far too slow per pixel.
const fbm2 = fbm2Imported;
const noise2 = noise2Imported;

/** Materials the photo knows. */
export const MATERIAL = {
  flat: 0,
  containerSide: 1,
  containerEnd: 2,
  corrugated: 3,
  windows: 4,
  glass: 5,
  foliage: 6,
  hills: 7,
  hivis: 8,
} as const;

/**
 * Per-pixel inputs of shadeFace (s, t, z) and shadeMember (along, across, z). Passed through a typed
 * array because double arguments to a call that is not inlined are boxed: one allocation each, per
 * pixel, and the young-generation collections that follow.
 */
export const shadeIn = new Float64Array(3);

/** The material being drawn: kind, base colour (0..255), face size (m), sun factor, noise seed. */
export const shadeState = { kind: 0, r: 128, g: 128, b: 128, len: 1, hgt: 1, light: 1, seed: 0, logo: 0 };

const HAZE_R = 198;
const HAZE_G = 208;
const HAZE_B = 216;
/** Metres over which haze reaches 63 %: a light coastal haze. */
const HAZE_DISTANCE = 1700;

function frac(x: number): number {
  return x - Math.floor(x);
}

/** Writes the colour of the current face at surface point (s, t) m and depth z m (shadeIn) into rgb[o..o+2]. */
export function shadeFace(rgb: Float32Array, o: number): void {
  const s = shadeIn[0];
  const t = shadeIn[1];
  const z = shadeIn[2];
  const m = shadeState;
  let k = m.light;
  let r = m.r;
  let g = m.g;
  let b = m.b;
  const near = z < 120 ? 1 - z / 120 : 0; // fine detail fades before it would alias
  switch (m.kind) {
    case MATERIAL.containerSide: {
      const rib = Math.abs(frac(s / 0.3) - 0.5) * 2 - 0.5;
      k *= 1 + near * 0.2 * rib;
      if (t < 0.16 || t > m.hgt - 0.12) k *= 0.74;
      else if (s < 0.14 || s > m.len - 0.14) k *= 0.7;
      k *= 0.86 + 0.22 * fbm2(s * 0.6, t * 1.8, m.seed, 2);
      if (m.logo > 0 && t > m.hgt * 0.42 && t < m.hgt * 0.68 && s > m.len * 0.28 && s < m.len * 0.72) {
        r = g = b = 225;
        if (frac(s / 0.9) < 0.35) (r = m.r), (g = m.g), (b = m.b);
      }
      if (noise2(s * 2.5, 0.5, m.seed + 7) > 0.78 && t > m.hgt * 0.35) (r *= 0.78), (g *= 0.62), (b *= 0.5);
      break;
    }
    case MATERIAL.containerEnd: {
      const u = s / m.len;
      if (t < 0.16 || t > m.hgt - 0.14 || u < 0.05 || u > 0.95) k *= 0.7;
      else if (Math.abs(u - 0.5) < 0.012) k *= 0.55;
      else if (Math.abs(frac(u * 4 + 0.5) - 0.5) < 0.03 + 0.02 * (1 - near)) k *= 0.62;
      else k *= 1 + near * 0.08 * (Math.abs(frac(t / 0.35) - 0.5) * 2 - 0.5);
      k *= 0.88 + 0.18 * fbm2(s * 1.3, t * 1.3, m.seed, 2);
      break;
    }
    case MATERIAL.corrugated: {
      k *= 1 + near * 0.14 * (Math.abs(frac(s / 0.25) - 0.5) * 2 - 0.5);
      k *= 0.9 + 0.16 * fbm2(s * 0.08, t * 0.4, m.seed, 2);
      if (t > m.hgt - 3.2 && t < m.hgt - 1.9 && frac(s / 5) < 0.7) (r = 60), (g = 74), (b = 88);
      else if (t < 5.5 && frac((s - 4) / 24) < 0.22) {
        r = 176;
        g = 178;
        b = 172;
        k *= 0.9 + 0.1 * Math.abs(frac(t / 0.3) - 0.5);
      }
      break;
    }
    case MATERIAL.windows: {
      const far = z > 260 ? Math.min(1, (z - 260) / 400) : 0;
      const fl = frac(t / 3.4);
      const isWin = t > 3.4 && fl > 0.28 && fl < 0.8 && frac(s / 2.3) > 0.14 && frac(s / 2.3) < 0.86;
      if (isWin) {
        const w = 1 - far * 0.6;
        const sky = 0.35 + 0.5 * fl;
        r += (40 + 90 * sky - r) * w;
        g += (55 + 100 * sky - g) * w;
        b += (70 + 110 * sky - b) * w;
      } else {
        k *= 0.92 + 0.12 * noise2(s * 0.3, t * 0.3, m.seed);
      }
      break;
    }
    case MATERIAL.glass: {
      const q = t / m.hgt;
      r = 34 + 70 * q;
      g = 44 + 80 * q;
      b = 56 + 92 * q;
      break;
    }
    case MATERIAL.foliage: {
      const n = fbm2(s * 0.9, t * 0.9, m.seed, 3);
      k *= (0.55 + 0.75 * n) * (0.75 + 0.25 * Math.min(1, t / Math.max(1, m.hgt)));
      break;
    }
    case MATERIAL.hills: {
      k *= 0.82 + 0.3 * fbm2(s * 0.012, t * 0.05, m.seed, 3);
      break;
    }
    case MATERIAL.hivis: {
      const q = t / m.hgt;
      if (Math.abs(q - 0.45) < 0.06 || Math.abs(q - 0.7) < 0.05) (r = 215), (g = 220), (b = 212);
      break;
    }
    default:
      k *= 0.93 + 0.14 * noise2(s * 1.7, t * 1.7, m.seed);
  }
  const h = 1 - Math.exp(-z / HAZE_DISTANCE);
  rgb[o] = r * k + (HAZE_R - r * k) * h;
  rgb[o + 1] = g * k + (HAZE_G - g * k) * h;
  rgb[o + 2] = b * k + (HAZE_B - b * k) * h;
}

/** Writes the colour of the current round member at `along` m, `across` −1..1 and depth z m (shadeIn). */
export function shadeMember(rgb: Float32Array, o: number): void {
  const along = shadeIn[0];
  const across = shadeIn[1];
  const z = shadeIn[2];
  const m = shadeState;
  const a = across < -1 ? -1 : across > 1 ? 1 : across;
  // A lit cylinder: bright towards the sun side, dark rim on the other.
  const k = m.light * (0.6 + 0.32 * Math.sqrt(1 - a * a) - 0.16 * a) * (0.95 + 0.1 * noise2(along * 0.7, 0.3, m.seed));
  const h = 1 - Math.exp(-z / HAZE_DISTANCE);
  rgb[o] = m.r * k + (HAZE_R - m.r * k) * h;
  rgb[o + 1] = m.g * k + (HAZE_G - m.g * k) * h;
  rgb[o + 2] = m.b * k + (HAZE_B - m.b * k) * h;
}
