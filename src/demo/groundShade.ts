// Looks of the background: sky with clouds on a plane high above, and the concrete deck with slab
// seams, wheel tracks, painted lines and flush rails. Called once per pixel; no allocation. Thin
// painted lines use box-filter coverage of the pixel footprint, so they fade instead of breaking up.
import type { DemoCamera } from './camera.ts';
import { DEMO_CLASS } from './classes.ts';
import { CRANE_RAIL_X, LANE_X, QUAY_EDGE_X } from './layout.ts';
import { fbm2 as fbm2Imported, noise2 as noise2Imported } from './random.ts';

// Module-local copies: some loaders turn imported bindings into getters, far too slow per pixel.
const fbm2 = fbm2Imported;
const noise2 = noise2Imported;
const WATER = DEMO_CLASS.water;
const VEGETATION = DEMO_CLASS.vegetation;
const RAIL = DEMO_CLASS.rail;
const EDGE_X = QUAY_EDGE_X;
const RAIL_A = CRANE_RAIL_X[0];
const RAIL_B = CRANE_RAIL_X[1];
const LANE_A = LANE_X.underCrane;
const LANE_B = LANE_X.ours;
const LANE_C = LANE_X.oncoming;

const CLOUD_HEIGHT = 1500;
const HAZE_R = 198;
const HAZE_G = 208;
const HAZE_B = 216;

/** Returns the share 0..1 of a `foot`-wide pixel at p covered by lines of `width` repeating every `period`. */
export function lineCover(p: number, foot: number, period: number, width: number, offset: number): number {
  const q = p - offset;
  const c = period * Math.round(q / period);
  const d = q - c;
  const reach = (foot + width) * 0.5;
  if (d >= reach || d <= -reach) return 0;
  const lo = Math.max(q - foot / 2, c - width / 2);
  const hi = Math.min(q + foot / 2, c + width / 2);
  return hi > lo ? (hi - lo) / foot : 0;
}

/** Returns the share 0..1 of a `foot`-wide pixel at p inside [a, b]. */
export function spanCover(p: number, foot: number, a: number, b: number): number {
  const lo = Math.max(p - foot / 2, a);
  const hi = Math.min(p + foot / 2, b);
  return hi > lo ? Math.min(1, (hi - lo) / foot) : 0;
}

/** Writes the sky colour of pixel (x, y) into rgb[o..o+2]. */
export function shadeSky(rgb: Float32Array, o: number, cam: DemoCamera, x: number, y: number, seed: number): void {
  const e = (cam.cy - y - 0.5) / cam.f; // tangent of elevation
  const w = Math.sqrt(Math.min(1, Math.max(0, e / 0.75)));
  let r = 206 + (70 - 206) * w;
  let g = 218 + (124 - 218) * w;
  let b = 230 + (194 - 230) * w;
  if (e > 0.004) {
    const dx = (x + 0.5 - cam.cx) / cam.f;
    const k = CLOUD_HEIGHT / e;
    const px = cam.x + k * (dx * cam.cos + cam.sin);
    const pz = cam.z + k * (cam.cos - dx * cam.sin);
    const n = fbm2(px / 2600 + cam.time * 0.003, pz / 1900, seed + 31, 4);
    let a = (n - 0.47) / 0.2;
    a = a < 0 ? 0 : a > 1 ? 1 : a;
    a *= Math.min(1, e / 0.06);
    const shade = 0.78 + 0.3 * noise2(px / 700, pz / 520, seed + 37);
    r += (238 * shade - r) * a;
    g += (240 * shade - g) * a;
    b += (244 * shade - b) * a;
  }
  rgb[o] = r;
  rgb[o + 1] = g;
  rgb[o + 2] = b;
}

// Darkening 0..1 of the two wheel tracks either side of a lane centre at distance dx m.
function wheelTrack(dx: number): number {
  const d = Math.abs(Math.abs(dx) - 0.95);
  return d < 0.6 ? 1 - 0.1 * (1 - d / 0.6) : 1;
}

/**
 * Per-pixel inputs of shadeDeck: world X, Z (m), depth z (m), footprint X and Z (m), haze 0..1 and
 * the deck tone. A typed array, because double arguments to a call that is not inlined are boxed.
 */
export const deckIn = new Float64Array(7);

/** Returns the brightness factor of the concrete at world (X, Z), depth z m: stains, grain, wheel tracks. */
export function deckTone(X: number, Z: number, z: number, seed: number): number {
  let k = 0.86 + 0.24 * noise2(X * 0.045, Z * 0.045, seed + 9);
  if (z < 60) k *= 1 + (1 - z / 60) * 0.14 * (noise2(X * 2.3, Z * 2.3, seed + 10) - 0.5);
  if (X > LANE_A - 2 && X < LANE_C + 2) k *= wheelTrack(X - LANE_A) * wheelTrack(X - LANE_B) * wheelTrack(X - LANE_C);
  return k;
}

/**
 * Writes the colour of ground class `cls` at the point described by deckIn into rgb[o..o+2]; the tone
 * there is deckTone's (smooth, so callers may interpolate it between samples).
 */
export function shadeDeck(rgb: Float32Array, o: number, cls: number, seed: number): void {
  const X = deckIn[0];
  const Z = deckIn[1];
  const z = deckIn[2];
  const footX = deckIn[3];
  const footZ = deckIn[4];
  const haze = deckIn[5];
  const tone = deckIn[6];
  let r = 0;
  let g = 0;
  let b = 0;
  if (cls === WATER) {
    r = 36;
    g = 70;
    b = 84;
  } else if (cls === VEGETATION) {
    const n = noise2(X * 0.05, Z * 0.05, seed + 6);
    r = 84 + 20 * n;
    g = 104 + 22 * n;
    b = 78 + 10 * n;
  } else if (cls === RAIL) {
    const n = noise2(Z * 0.5, X, seed + 8);
    r = 150 + 40 * n;
    g = 150 + 40 * n;
    b = 156 + 40 * n;
  } else {
    let k = tone;
    if (z < 60) k *= 1 - 0.35 * (lineCover(X, footX, 6, 0.04, 0) + lineCover(Z, footZ, 6, 0.04, 3)); // slab seams
    if (Math.abs(X - RAIL_A) < 0.32 || Math.abs(X - RAIL_B) < 0.32) k *= 0.55; // rail channel
    r = 152 * k;
    g = 147 * k;
    b = 138 * k;
    // painted lines: yellow dashed lane edges, a white yard line, the yellow quay-edge line, a crossing
    const reach = footX + 0.6;
    let yel = 0;
    let wht = 0;
    let edge = 0;
    if (Math.abs(X + 3.8) < reach) yel += spanCover(X, footX, -3.875, -3.725) * lineCover(Z, footZ, 6, 3, 0);
    if (Math.abs(X - 3.4) < reach) yel += spanCover(X, footX, 3.325, 3.475) * lineCover(Z, footZ, 6, 3, 0);
    if (X < EDGE_X + 0.6 + footX) {
      yel += spanCover(X, footX, EDGE_X + 0.25, EDGE_X + 0.55);
      edge = spanCover(X, footX, EDGE_X, EDGE_X + 0.25);
    }
    if (Math.abs(X - 9.6) < reach) wht += spanCover(X, footX, 9.525, 9.675);
    if (Z > 25 && Z < 31 && X > -5 && X < 10) wht += lineCover(X, footX, 1, 0.5, 0) * spanCover(Z, footZ, 26, 30) * spanCover(X, footX, -4, 9);
    if (yel > 0 || wht > 0 || edge > 0) {
      yel = Math.min(1, yel) * (0.8 + 0.2 * k);
      wht = Math.min(1, wht) * (0.8 + 0.2 * k);
      r += (204 - r) * yel + (214 - r) * wht + (60 - r) * edge;
      g += (168 - g) * yel + (214 - g) * wht + (60 - g) * edge;
      b += (52 - b) * yel + (206 - b) * wht + (62 - b) * edge;
    }
  }
  rgb[o] = r + (HAZE_R - r) * haze;
  rgb[o + 1] = g + (HAZE_G - g) * haze;
  rgb[o + 2] = b + (HAZE_B - b) * haze;
}
