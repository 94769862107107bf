// Background: every pixel gets sky, water, quay deck, rail or far land from a ray–plane hit before
// objects are drawn; after them, only the pixels still showing background are coloured. Hot loops:
// per row the world point is linear in x; flat arrays, no allocation per pixel.
import type { DemoCamera } from './camera.ts';
import { DEMO_CLASS } from './classes.ts';
import {
  CRANE_RAIL_HALF, CRANE_RAIL_X, QUAY_EDGE_X, QUAY_END_Z, RAIL_END_Z, RAIL_START_Z,
  SHORE_FAR_Z, SHORE_LEFT_X, TRACK_RAIL_HALF, TRACK_RAIL_X,
} from './layout.ts';
import type { RasterTarget } from './raster.ts';
import {
  deckIn as deckInImported, deckTone as deckToneImported, shadeDeck as shadeDeckImported, shadeSky as shadeSkyImported,
} from './groundShade.ts';

// Module-local copies: some loaders turn imported bindings into getters, far too slow per pixel.
const shadeDeck = shadeDeckImported;
const shadeSky = shadeSkyImported;
const deckTone = deckToneImported;
const deckIn = deckInImported;
const VEGETATION = DEMO_CLASS.vegetation;
const WATER = DEMO_CLASS.water;
const RAIL = DEMO_CLASS.rail;
const QUAY = DEMO_CLASS.quay;
const SKY = DEMO_CLASS.sky;
const EDGE_X = QUAY_EDGE_X;
const END_Z = QUAY_END_Z;
const LEFT_X = SHORE_LEFT_X;
const FAR_Z = SHORE_FAR_Z;
const R_END = RAIL_END_Z;
const R_START = RAIL_START_Z;
const CR0 = CRANE_RAIL_X[0];
const CR1 = CRANE_RAIL_X[1];
const CR_HALF = CRANE_RAIL_HALF;
const TR0 = TRACK_RAIL_X[0];
const TR1 = TRACK_RAIL_X[1];
const TR_HALF = TRACK_RAIL_HALF;
/** Rows closer than this (px) to the horizon count as sky. */
const HORIZON_EPS = 0.02;
/** Sky and deck tone vary slowly across a row: sampled every this many pixels and interpolated. */
const SKY_STEP = 4;
const HAZE_DISTANCE = 1700;

/** Returns the ground class at world (x, z) for a pixel `foot` m wide: rails never thinner than a pixel. */
export function groundClassAt(x: number, z: number, foot: number): number {
  if (x <= LEFT_X || z >= FAR_Z) return VEGETATION;
  if (x < EDGE_X || z > END_Z) return WATER;
  if (z < R_END && z > R_START) {
    const half = foot * 0.5;
    const hc = CR_HALF > half ? CR_HALF : half;
    if (Math.abs(x - CR0) < hc || Math.abs(x - CR1) < hc) return RAIL;
    const ht = TR_HALF > half ? TR_HALF : half;
    if (Math.abs(x - TR0) < ht || Math.abs(x - TR1) < ht) return RAIL;
  }
  return QUAY;
}

/** Per row: depth zc, pixel footprint dxc, world point (X0, Z0) of column 0 and its step (dX, dZ) per column. */
type RowRay = Float64Array;
const RAY_ZC = 0, RAY_DXC = 1, RAY_X0 = 2, RAY_Z0 = 3, RAY_DX = 4, RAY_DZ = 5;

/**
 * Writes into `ray` the ground hit of the row `below` pixels under the horizon: the world point of pixel x
 * is P = P0 + x * dP (the camera looks along (sin, cos), right is (cos, -sin)); returns nothing.
 */
function rowRay(ray: RowRay, cam: DemoCamera, below: number): void {
  const { f, cx } = cam;
  const zc = (cam.y * f) / below;
  const xc0 = ((0.5 - cx) * zc) / f;
  const dxc = zc / f;
  ray[RAY_ZC] = zc;
  ray[RAY_DXC] = dxc;
  ray[RAY_X0] = cam.x + xc0 * cam.cos + zc * cam.sin;
  ray[RAY_Z0] = cam.z - xc0 * cam.sin + zc * cam.cos;
  ray[RAY_DX] = dxc * cam.cos;
  ray[RAY_DZ] = -dxc * cam.sin;
}

/** Sets class and depth of every pixel of `t` to the background seen by `cam` (no colour); returns nothing. */
export function groundPass(t: RasterTarget, cam: DemoCamera): void {
  const { width, height, label, depth } = t;
  const { cy } = cam;
  const ray: RowRay = new Float64Array(6);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    const below = y + 0.5 - cy;
    if (below <= HORIZON_EPS) {
      label.fill(SKY, row, row + width);
      continue;
    }
    rowRay(ray, cam, below);
    const zc = ray[RAY_ZC], dxc = ray[RAY_DXC], X0 = ray[RAY_X0], Z0 = ray[RAY_Z0], dX = ray[RAY_DX], dZ = ray[RAY_DZ];
    depth.fill(zc, row, row + width);
    // groundClassAt, written out: a call per pixel with float arguments would box them (measured:
    // ~20 MB of short-lived numbers per 1024×512 frame when the call is not inlined)
    const half = dxc * 0.5;
    const hc = CR_HALF > half ? CR_HALF : half;
    const ht = TR_HALF > half ? TR_HALF : half;
    for (let x = 0; x < width; x++) {
      const X = X0 + dX * x;
      const Z = Z0 + dZ * x;
      let cls: number = QUAY;
      if (X <= LEFT_X || Z >= FAR_Z) cls = VEGETATION;
      else if (X < EDGE_X || Z > END_Z) cls = WATER;
      else if (Z < R_END && Z > R_START) {
        if (Math.abs(X - CR0) < hc || Math.abs(X - CR1) < hc || Math.abs(X - TR0) < ht || Math.abs(X - TR1) < ht) cls = RAIL;
      }
      label[row + x] = cls;
    }
  }
}

/** Colours the pixels no object covered (instance 0): sky, deck, rails, far land; returns nothing. */
export function backgroundShade(t: RasterTarget, cam: DemoCamera, seed: number): void {
  const rgb = t.rgb;
  if (!rgb) return;
  const { width, height, label, inst } = t;
  const { f, cy } = cam;
  const ray: RowRay = new Float64Array(6);
  const sky = new Float32Array((Math.ceil(width / SKY_STEP) + 3) * 3);
  const tone = new Float32Array(Math.ceil(width / SKY_STEP) + 3);
  for (let y = 0; y < height; y++) {
    const row = y * width;
    const below = y + 0.5 - cy;
    if (below <= HORIZON_EPS) {
      // the sky is smooth: shade every SKY_STEP-th column and interpolate between them
      for (let k = 0, x = 0; x <= width + SKY_STEP; k++, x += SKY_STEP) shadeSky(sky, k * 3, cam, x, y, seed);
      for (let x = 0; x < width; x++) {
        const i = row + x;
        if (inst[i] !== 0) continue;
        const k = (x / SKY_STEP) | 0;
        const w = (x - k * SKY_STEP) / SKY_STEP;
        const a = k * 3;
        const o = i * 3;
        rgb[o] = sky[a] + (sky[a + 3] - sky[a]) * w;
        rgb[o + 1] = sky[a + 1] + (sky[a + 4] - sky[a + 1]) * w;
        rgb[o + 2] = sky[a + 2] + (sky[a + 5] - sky[a + 2]) * w;
      }
      continue;
    }
    rowRay(ray, cam, below);
    const zc = ray[RAY_ZC], dxc = ray[RAY_DXC], X0 = ray[RAY_X0], Z0 = ray[RAY_Z0], dX = ray[RAY_DX], dZ = ray[RAY_DZ];
    const footZ = (zc * zc) / (f * cam.y);
    const haze = 1 - Math.exp(-zc / HAZE_DISTANCE);
    for (let k = 0, x = 0; x <= width + SKY_STEP; k++, x += SKY_STEP) tone[k] = deckTone(X0 + dX * x, Z0 + dZ * x, zc, seed);
    deckIn[2] = zc;
    deckIn[3] = dxc;
    deckIn[4] = footZ;
    deckIn[5] = haze;
    for (let x = 0; x < width; x++) {
      const i = row + x;
      if (inst[i] !== 0) continue;
      const k = (x / SKY_STEP) | 0;
      deckIn[0] = X0 + dX * x;
      deckIn[1] = Z0 + dZ * x;
      deckIn[6] = tone[k] + (tone[k + 1] - tone[k]) * ((x - k * SKY_STEP) / SKY_STEP);
      shadeDeck(rgb, i * 3, label[i], seed);
    }
  }
}

