// Scanline rasteriser shared by the photo and the label maps, so a photo edge and a label edge are
// the same pixels. Hot loops: flat typed arrays, module-level scratch state, no allocation or
// closures per pixel or per span. A pixel belongs to a primitive when its centre is inside it.
import { shadeFace as shadeFaceImported, shadeIn as shadeInImported, shadeMember as shadeMemberImported } from './shade.ts';

// Module-local copies: some loaders turn imported bindings into getters, far too slow per pixel.
const shadeFace = shadeFaceImported;
const shadeMember = shadeMemberImported;
const shadeIn = shadeInImported;

/** Buffers one render writes: class ids, instance ids, camera depth (m) and, for photos, linear RGB. */
export interface RasterTarget {
  width: number;
  height: number;
  label: Uint8Array;
  inst: Uint16Array;
  depth: Float32Array;
  /** Three floats per pixel in 0..255, or null for a label-only render. */
  rgb: Float32Array | null;
}

/** Returns empty buffers for a width×height render (depth at infinity). */
export function rasterTargetCreate(width: number, height: number, photo: boolean): RasterTarget {
  const n = width * height;
  const depth = new Float32Array(n);
  depth.fill(Infinity);
  return { width, height, label: new Uint8Array(n), inst: new Uint16Array(n), depth, rgb: photo ? new Float32Array(n * 3) : null };
}

const scratch = new Map<string, RasterTarget>();

/**
 * Returns a reusable target for width×height (one per `slot`), reset to empty depth and instances;
 * labels and colours are left as they are because every render writes every pixel of them. Saves
 * allocating and collecting megabytes per render; the caller must copy out what it keeps.
 */
export function rasterScratch(width: number, height: number, photo: boolean, slot: number): RasterTarget {
  const key = `${width}x${height}/${photo ? 1 : 0}/${slot}`;
  let t = scratch.get(key);
  if (!t) {
    if (scratch.size >= 8) scratch.clear();
    t = rasterTargetCreate(width, height, photo);
    scratch.set(key, t);
    return t;
  }
  t.depth.fill(Infinity);
  t.inst.fill(0);
  return t;
}

/** The plane and surface frame of the face being drawn, in camera space (metres). */
export const faceState = { nx: 0, ny: 0, nz: 1, nd: 1, ux: 1, uy: 0, uz: 0, ou: 0, vx: 0, vy: 1, vz: 0, ov: 0 };
/** The segment being drawn: screen end points (px), inverse depths (1/m), half-widths (px), length (m). */
export const memberState = { ax: 0, ay: 0, bx: 0, by: 0, iza: 1, izb: 1, ha: 1, hb: 1, len: 1 };
/** Camera intrinsics and what is being drawn (class id, instance id). */
export const drawState = { f: 1, cx: 0, cy: 0, cls: 0, inst: 0 };

const PRIM_FACE = 0;
const PRIM_MEMBER = 1;
const crossings = new Float64Array(256);

/** Fills the screen polygon (xs, ys, n vertices, px) as the current face; returns nothing. */
export function rasterFacePolygon(t: RasterTarget, xs: Float64Array, ys: Float64Array, n: number): void {
  polygonScan(t, xs, ys, n, PRIM_FACE);
}

/** Fills the screen polygon (xs, ys, n vertices, px) as the current member; returns nothing. */
export function rasterMemberPolygon(t: RasterTarget, xs: Float64Array, ys: Float64Array, n: number): void {
  polygonScan(t, xs, ys, n, PRIM_MEMBER);
}

// Even-odd fill: works for the concave outlines of trees, hills and people as well as for quads.
function polygonScan(t: RasterTarget, xs: Float64Array, ys: Float64Array, n: number, prim: number): void {
  let ymin = Infinity;
  let ymax = -Infinity;
  for (let i = 0; i < n; i++) {
    if (ys[i] < ymin) ymin = ys[i];
    if (ys[i] > ymax) ymax = ys[i];
  }
  const y0 = Math.max(0, Math.ceil(ymin - 0.5));
  const y1 = Math.min(t.height, Math.ceil(ymax - 0.5));
  for (let y = y0; y < y1; y++) {
    const yc = y + 0.5;
    let k = 0;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      const yi = ys[i];
      const yj = ys[j];
      if (yi <= yc !== yj <= yc) {
        const x = xs[i] + ((yc - yi) * (xs[j] - xs[i])) / (yj - yi);
        // insertion sort: polygons have few crossings per row
        let m = k++;
        while (m > 0 && crossings[m - 1] > x) {
          crossings[m] = crossings[m - 1];
          m--;
        }
        crossings[m] = x;
      }
    }
    for (let c = 0; c + 1 < k; c += 2) {
      const xa = Math.max(0, Math.ceil(crossings[c] - 0.5));
      const xb = Math.min(t.width, Math.ceil(crossings[c + 1] - 0.5));
      if (xb <= xa) continue;
      if (prim === PRIM_FACE) spanFace(t, y, xa, xb);
      else spanMember(t, y, xa, xb);
    }
  }
}

function spanFace(t: RasterTarget, y: number, xa: number, xb: number): void {
  const s = faceState;
  const { f, cx, cy, cls, inst } = drawState;
  const dy = -(y + 0.5 - cy) / f;
  const ax = (0.5 - cx) / f;
  const bx = 1 / f;
  const den0 = s.nx * ax + s.ny * dy + s.nz;
  const den1 = s.nx * bx;
  const u0 = s.ux * ax + s.uy * dy + s.uz;
  const u1 = s.ux * bx;
  const v0 = s.vx * ax + s.vy * dy + s.vz;
  const v1 = s.vx * bx;
  const { depth, label } = t;
  const ids = t.inst;
  const rgb = t.rgb;
  let i = y * t.width + xa;
  for (let x = xa; x < xb; x++, i++) {
    const den = den0 + den1 * x;
    const z = s.nd / den;
    if (!(z > 0) || z >= depth[i]) continue;
    depth[i] = z;
    label[i] = cls;
    ids[i] = inst;
    if (rgb !== null) {
      shadeIn[0] = z * (u0 + u1 * x) - s.ou;
      shadeIn[1] = z * (v0 + v1 * x) - s.ov;
      shadeIn[2] = z;
      shadeFace(rgb, i * 3);
    }
  }
}

function spanMember(t: RasterTarget, y: number, xa: number, xb: number): void {
  const m = memberState;
  const { cls, inst } = drawState;
  const ex = m.bx - m.ax;
  const ey = m.by - m.ay;
  const l2 = ex * ex + ey * ey || 1e-9;
  const il = 1 / Math.sqrt(l2);
  const py = y + 0.5 - m.ay;
  const { depth, label } = t;
  const ids = t.inst;
  const rgb = t.rgb;
  let i = y * t.width + xa;
  for (let x = xa; x < xb; x++, i++) {
    const px = x + 0.5 - m.ax;
    let lam = (px * ex + py * ey) / l2;
    lam = lam < 0 ? 0 : lam > 1 ? 1 : lam;
    const z = 1 / (m.iza + (m.izb - m.iza) * lam);
    if (z >= depth[i]) continue;
    depth[i] = z;
    label[i] = cls;
    ids[i] = inst;
    if (rgb !== null) {
      const across = ((px * ey - py * ex) * il) / (m.ha + (m.hb - m.ha) * lam);
      shadeIn[0] = lam * m.len;
      shadeIn[1] = across;
      shadeIn[2] = z;
      shadeMember(rgb, i * 3);
    }
  }
}
