// Last steps of a frame: the vehicle's own hood across the bottom (void in the ground truth), then
// the camera look (a slight lens blur, vignette and sensor noise) into 8-bit RGB. Hot loops over
// flat arrays, no allocation per pixel.
import type { DemoCamera } from './camera.ts';
import { DRAW_SKIP } from './draw.ts';
import type { RasterTarget } from './raster.ts';
import { hash3 as hash3Imported } from './random.ts';

// Module-local copy: some loaders turn imported bindings into getters, far too slow per pixel.
const hash3 = hash3Imported;

/** Returns the row (px, fractional) where the hood starts in column x. */
export function hoodTop(cam: DemoCamera, x: number): number {
  const q = (x + 0.5 - cam.cx) / cam.cx;
  return cam.height * (0.885 + 0.07 * q * q);
}

/** Draws the hood over the bottom of the frame with class `cls` (DRAW_SKIP: leave the scene). */
export function hoodPass(t: RasterTarget, cam: DemoCamera, cls: number): void {
  if (cls === DRAW_SKIP) return;
  const { width, height, label, inst, depth } = t;
  const rgb = t.rgb;
  const y0 = Math.floor(cam.height * 0.885);
  for (let x = 0; x < width; x++) {
    const top = hoodTop(cam, x);
    const q = (x + 0.5 - cam.cx) / cam.cx;
    const spec = 34 * Math.exp(-(((q + 0.32) / 0.22) ** 2));
    for (let y = Math.max(y0, Math.ceil(top - 0.5)); y < height; y++) {
      const i = y * width + x;
      label[i] = cls;
      inst[i] = 0;
      depth[i] = 0;
      if (rgb) {
        const e = y + 0.5 - top;
        const fall = 1 - Math.min(1, e / (height - top + 1));
        const rim = 46 * Math.exp(-e / 2.2);
        const o = i * 3;
        rgb[o] = 40 + 14 * fall + spec * fall + rim;
        rgb[o + 1] = 46 + 16 * fall + spec * fall + rim;
        rgb[o + 2] = 56 + 20 * fall + spec * fall + rim;
      }
    }
  }
}

/** Returns 8-bit RGB of the photo: a soft 5-tap lens blur, vignette and sensor noise seeded by (seed, frame). */
export function photoFinish(rgb: Float32Array, width: number, height: number, seed: number, frame: number): Uint8Array {
  const w3 = width * 3;
  const out = new Uint8ClampedArray(width * height * 3);
  const cx = width / 2;
  const cy = height / 2;
  const norm = 0.22 / (cx * cx + cy * cy);
  const colFall = new Float32Array(width);
  for (let x = 0; x < width; x++) colFall[x] = (x + 0.5 - cx) ** 2 * norm;
  const fseed = hash3(seed, frame, 77);
  for (let y = 0; y < height; y++) {
    const up = (y > 0 ? -w3 : 0);
    const down = (y < height - 1 ? w3 : 0);
    const rowFall = (y + 0.5 - cy) ** 2 * norm;
    let o = y * w3;
    for (let x = 0; x < width; x++, o += 3) {
      const left = x > 0 ? -3 : 0;
      const right = x < width - 1 ? 3 : 0;
      const v = (1 - rowFall - colFall[x]) * 0.125; // taps weigh 4 + 1 + 1 + 1 + 1
      const h = hash3(x, y, fseed);
      // sum of two uniforms: a cheap bell-shaped grain, luminance mostly, a little chroma
      const lum = (((h & 255) + ((h >>> 8) & 255)) / 255 - 1) * 5;
      for (let k = 0; k < 3; k++) {
        const c = o + k;
        const blur = 4 * rgb[c] + rgb[c + left] + rgb[c + right] + rgb[c + up] + rgb[c + down];
        out[c] = blur * v + lum + (((h >>> (16 + 5 * k)) & 31) - 15.5) * 0.08;
      }
    }
  }
  return new Uint8Array(out.buffer);
}
