// Water look, drawn after everything else: the rows above the horizon mirrored into the basin, broken
// up by ripples, mixed with the water's own colour by a grazing-angle reflectance. Hot loop over flat
// arrays, no allocation per pixel.
import type { DemoCamera } from './camera.ts';
import { DEMO_CLASS } from './classes.ts';
import type { RasterTarget } from './raster.ts';
import { noise2 as noise2Imported } from './random.ts';

// Module-local copies: some loaders turn imported bindings into getters, far too slow per pixel.
const noise2 = noise2Imported;
const WATER = DEMO_CLASS.water;

/** Replaces the colour of background water pixels with rippled reflections; returns nothing. */
export function waterPass(t: RasterTarget, cam: DemoCamera, seed: number): void {
  const rgb = t.rgb;
  if (!rgb) return;
  const { width, height, label, inst } = t;
  const { f, cx, cy } = cam;
  const top = Math.max(0, Math.floor(cy));
  const mirrorMax = Math.floor(cy) - 1;
  const scale = f / 573; // ripple sizes were tuned at 1024 px wide
  for (let y = top; y < height; y++) {
    const below = y + 0.5 - cy;
    if (below <= 0.02) continue;
    const zc = (cam.y * f) / below;
    const amp = Math.min(9 * scale, (f * 0.9) / zc + 0.6);
    const refl = 0.22 + 0.62 * Math.exp(-below / (0.07 * f));
    const xc0 = ((0.5 - cx) * zc) / f;
    const dxc = zc / f;
    const X0 = cam.x + xc0 * cam.cos + zc * cam.sin;
    const Z0 = cam.z - xc0 * cam.sin + zc * cam.cos;
    const row = y * width;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      if (label[i] !== WATER || inst[i] !== 0) continue;
      const X = X0 + dxc * cam.cos * x;
      const Z = Z0 - dxc * cam.sin * x;
      const n1 = noise2(X * 0.45, Z * 0.09 + cam.time * 0.12, seed + 51);
      const n2 = 0.5 + 0.5 * Math.sin(X * 1.9 + Z * 0.37 + n1 * 6 - cam.time * 0.4);
      const ripple = n1 * 0.7 + n2 * 0.3;
      let mx = Math.round(x + (ripple - 0.5) * amp * 2.2);
      mx = mx < 0 ? 0 : mx >= width ? width - 1 : mx;
      const my = Math.round(2 * cy - y - 0.5 + (n2 - 0.5) * amp);
      let r = 0;
      let g = 0;
      let b = 0;
      if (my < 0) {
        r = 88;
        g = 138;
        b = 198;
      } else {
        const m = ((my > mirrorMax ? mirrorMax : my) * width + mx) * 3;
        r = rgb[m];
        g = rgb[m + 1];
        b = rgb[m + 2];
      }
      const o = i * 3;
      const k = refl * (0.72 + 0.5 * (ripple - 0.5));
      const dark = 0.9 + 0.2 * n2;
      rgb[o] = (rgb[o] + (r * 0.82 - rgb[o]) * k) * dark;
      rgb[o + 1] = (rgb[o + 1] + (g * 0.85 - rgb[o + 1]) * k) * dark;
      rgb[o + 2] = (rgb[o + 2] + (b * 0.88 - rgb[o + 2]) * k) * dark;
    }
  }
}
