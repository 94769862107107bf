// Turns world-space primitives (boxes, quads, billboards, round members) into screen polygons for the
// rasteriser: camera transform, near-plane clipping, projection and the surface frame for shading.
// Per primitive, not per pixel: scratch arrays are module-level so drawing allocates nothing.
import type { DemoCamera } from './camera.ts';
import { drawState, faceState, memberState, rasterFacePolygon, rasterMemberPolygon, type RasterTarget } from './raster.ts';
import { shadeState } from './shade.ts';

/** Class value in an instance→class table meaning "do not draw this instance". */
export const DRAW_SKIP = 254;

/** A surface look: material kind (see MATERIAL), base colour 0..255 and a noise seed. */
export interface Material {
  kind: number;
  r: number;
  g: number;
  b: number;
  seed: number;
  logo?: number;
}

/** Box faces that can be hidden by a neighbour (bit mask for `box`). */
export const FACE = { top: 1, minusX: 2, plusX: 4, minusZ: 8, plusZ: 16 } as const;

const NEAR = 0.25;
/** Thinnest a member is drawn, in pixels either side of its axis, so thin steel never breaks apart. */
const MIN_HALF_WIDTH = 0.6;
const AMBIENT = 0.55;
const DIFFUSE = 0.5;
// Unit vector towards the sun: behind the camera on the left, so faces towards the lens are lit.
const SUN_X = -0.56;
const SUN_Y = 0.7;
const SUN_Z = -0.44;

const wx = new Float64Array(512);
const wy = new Float64Array(512);
const wz = new Float64Array(512);
const qx = new Float64Array(520);
const qy = new Float64Array(520);
const qz = new Float64Array(520);
const sx = new Float64Array(520);
const sy = new Float64Array(520);
const local = new Float64Array(12);
const scratchPts = new Float64Array(512 * 3);

/** Draws primitives of one frame into a target; `instClass` maps instance id → class id or DRAW_SKIP. */
export class Drawer {
  constructor(
    readonly cam: DemoCamera,
    readonly target: RasterTarget,
    readonly instClass: Uint8Array,
  ) {
    drawState.f = cam.f;
    drawState.cx = cam.cx;
    drawState.cy = cam.cy;
  }

  /** Returns false when instance `inst` is not drawn in this render; else makes it current. */
  begin(inst: number): boolean {
    const cls = this.instClass[inst];
    if (cls === DRAW_SKIP) return false;
    drawState.cls = cls;
    drawState.inst = inst;
    return true;
  }

  /** Returns camera-space depth (m) of world point (x, z) on the ground. */
  depthOf(x: number, z: number): number {
    return (x - this.cam.x) * this.cam.sin + (z - this.cam.z) * this.cam.cos;
  }

  /** Draws an axis-aligned box (long sides along Z) with side, end and top looks; `hide` masks faces. */
  box(x0: number, y0: number, z0: number, x1: number, y1: number, z1: number, side: Material, end: Material, top: Material, hide = 0): void {
    const c = this.cam;
    const l = local;
    if (!(hide & FACE.top) && c.y > y1) {
      quadSet(l, x0, y1, z0, x1, y1, z0, x1, y1, z1, x0, y1, z1);
      this.face(l, 4, x0, y1, z0, 1, 0, 0, 0, 0, 1, 0, 1, 0, top, x1 - x0, z1 - z0);
    }
    if (!(hide & FACE.minusX) && c.x < x0) {
      quadSet(l, x0, y0, z0, x0, y0, z1, x0, y1, z1, x0, y1, z0);
      this.face(l, 4, x0, y0, z0, 0, 0, 1, 0, 1, 0, -1, 0, 0, side, z1 - z0, y1 - y0);
    }
    if (!(hide & FACE.plusX) && c.x > x1) {
      quadSet(l, x1, y0, z0, x1, y0, z1, x1, y1, z1, x1, y1, z0);
      this.face(l, 4, x1, y0, z0, 0, 0, 1, 0, 1, 0, 1, 0, 0, side, z1 - z0, y1 - y0);
    }
    if (!(hide & FACE.minusZ) && c.z < z0) {
      quadSet(l, x0, y0, z0, x1, y0, z0, x1, y1, z0, x0, y1, z0);
      this.face(l, 4, x0, y0, z0, 1, 0, 0, 0, 1, 0, 0, 0, -1, end, x1 - x0, y1 - y0);
    }
    if (!(hide & FACE.plusZ) && c.z > z1) {
      quadSet(l, x0, y0, z1, x1, y0, z1, x1, y1, z1, x0, y1, z1);
      this.face(l, 4, x0, y0, z1, 1, 0, 0, 0, 1, 0, 0, 0, 1, end, x1 - x0, y1 - y0);
    }
  }

  /** Draws a flat polygon lying on the plane y = `y` (points are x,z pairs). */
  ground(xz: ArrayLike<number>, n: number, y: number, mat: Material): void {
    const pts = scratchPts;
    for (let i = 0; i < n; i++) {
      pts[i * 3] = xz[i * 2];
      pts[i * 3 + 1] = y;
      pts[i * 3 + 2] = xz[i * 2 + 1];
    }
    this.face(pts, n, xz[0], y, xz[1], 1, 0, 0, 0, 0, 1, 0, 1, 0, mat, 1, 1);
  }

  /** Draws a flat outline standing at (x, y, z) and turned to face the camera; `pts` are right,up pairs (m). */
  billboard(x: number, y: number, z: number, pts: ArrayLike<number>, n: number, mat: Material, hgt: number): void {
    let dx = x - this.cam.x;
    let dz = z - this.cam.z;
    const d = Math.hypot(dx, dz) || 1;
    dx /= d;
    dz /= d;
    const world = scratchPts;
    for (let i = 0; i < n; i++) {
      world[i * 3] = x + dz * pts[i * 2];
      world[i * 3 + 1] = y + pts[i * 2 + 1];
      world[i * 3 + 2] = z - dx * pts[i * 2];
    }
    this.face(world, n, x, y, z, dz, 0, -dx, 0, 1, 0, -dx, 0, -dz, mat, 1, hgt);
  }

  /** Draws a polygon (n world points) with surface frame origin O, axes U, V and outward normal N. */
  face(
    pts: ArrayLike<number>, n: number,
    ox: number, oy: number, oz: number,
    ux: number, uy: number, uz: number,
    vx: number, vy: number, vz: number,
    nx: number, ny: number, nz: number,
    mat: Material, len: number, hgt: number,
  ): void {
    const c = this.cam;
    for (let i = 0; i < n; i++) {
      const dx = pts[i * 3] - c.x;
      const dz = pts[i * 3 + 2] - c.z;
      wx[i] = dx * c.cos - dz * c.sin;
      wy[i] = pts[i * 3 + 1] - c.y;
      wz[i] = dx * c.sin + dz * c.cos;
    }
    const m = clipNear(n);
    if (m < 3) return;
    if (!project(c, m)) return;
    const s = faceState;
    const odx = ox - c.x;
    const odz = oz - c.z;
    const ocx = odx * c.cos - odz * c.sin;
    const ocy = oy - c.y;
    const ocz = odx * c.sin + odz * c.cos;
    s.nx = nx * c.cos - nz * c.sin;
    s.ny = ny;
    s.nz = nx * c.sin + nz * c.cos;
    s.nd = s.nx * ocx + s.ny * ocy + s.nz * ocz;
    s.ux = ux * c.cos - uz * c.sin;
    s.uy = uy;
    s.uz = ux * c.sin + uz * c.cos;
    s.ou = s.ux * ocx + s.uy * ocy + s.uz * ocz;
    s.vx = vx * c.cos - vz * c.sin;
    s.vy = vy;
    s.vz = vx * c.sin + vz * c.cos;
    s.ov = s.vx * ocx + s.vy * ocy + s.vz * ocz;
    if (this.target.rgb) {
      // light from the side facing the camera, whichever way the normal was given
      const toward = s.nd < 0 ? 1 : -1;
      const lambert = toward * (nx * SUN_X + ny * SUN_Y + nz * SUN_Z);
      setMaterial(mat, AMBIENT + DIFFUSE * Math.max(0, lambert), len, hgt);
    }
    rasterFacePolygon(this.target, sx, sy, m);
  }

  /** Draws a round member of `radius` m from A to B (world points). */
  member(ax: number, ay: number, az: number, bx: number, by: number, bz: number, radius: number, mat: Material): void {
    const c = this.cam;
    let dx = ax - c.x;
    let dz = az - c.z;
    let xa = dx * c.cos - dz * c.sin;
    let ya = ay - c.y;
    let za = dx * c.sin + dz * c.cos;
    dx = bx - c.x;
    dz = bz - c.z;
    let xb = dx * c.cos - dz * c.sin;
    let yb = by - c.y;
    let zb = dx * c.sin + dz * c.cos;
    if (za < NEAR && zb < NEAR) return;
    if (za < NEAR || zb < NEAR) {
      const k = (NEAR - za) / (zb - za);
      const xn = xa + (xb - xa) * k;
      const yn = ya + (yb - ya) * k;
      if (za < NEAR) (xa = xn), (ya = yn), (za = NEAR);
      else (xb = xn), (yb = yn), (zb = NEAR);
    }
    const m = memberState;
    m.ax = c.cx + (c.f * xa) / za;
    m.ay = c.cy - (c.f * ya) / za;
    m.bx = c.cx + (c.f * xb) / zb;
    m.by = c.cy - (c.f * yb) / zb;
    m.iza = 1 / za;
    m.izb = 1 / zb;
    m.ha = Math.max(MIN_HALF_WIDTH, (c.f * radius) / za);
    m.hb = Math.max(MIN_HALF_WIDTH, (c.f * radius) / zb);
    m.len = Math.hypot(xb - xa, yb - ya, zb - za);
    let ex = m.bx - m.ax;
    let ey = m.by - m.ay;
    const el = Math.hypot(ex, ey) || 1;
    ex /= el;
    ey /= el;
    // square caps half a width long, so members of a lattice meet without gaps at the joints
    sx[0] = m.ax - ex * m.ha - ey * m.ha;
    sy[0] = m.ay - ey * m.ha + ex * m.ha;
    sx[1] = m.bx + ex * m.hb - ey * m.hb;
    sy[1] = m.by + ey * m.hb + ex * m.hb;
    sx[2] = m.bx + ex * m.hb + ey * m.hb;
    sy[2] = m.by + ey * m.hb - ex * m.hb;
    sx[3] = m.ax - ex * m.ha + ey * m.ha;
    sy[3] = m.ay - ey * m.ha - ex * m.ha;
    if (!onScreen(c, 4)) return;
    if (this.target.rgb) setMaterial(mat, 1, m.len, 1);
    rasterMemberPolygon(this.target, sx, sy, 4);
  }
}

// Writes four points into `l` without building a temporary array.
function quadSet(
  l: Float64Array,
  a0: number, a1: number, a2: number, b0: number, b1: number, b2: number,
  c0: number, c1: number, c2: number, d0: number, d1: number, d2: number,
): void {
  l[0] = a0; l[1] = a1; l[2] = a2; l[3] = b0; l[4] = b1; l[5] = b2;
  l[6] = c0; l[7] = c1; l[8] = c2; l[9] = d0; l[10] = d1; l[11] = d2;
}

function setMaterial(mat: Material, light: number, len: number, hgt: number): void {
  const s = shadeState;
  s.kind = mat.kind;
  s.r = mat.r;
  s.g = mat.g;
  s.b = mat.b;
  s.seed = mat.seed;
  s.logo = mat.logo ?? 0;
  s.light = light;
  s.len = len;
  s.hgt = hgt;
}

// Sutherland–Hodgman against z = NEAR, from (wx, wy, wz) into (qx, qy, qz); returns the vertex count.
function clipNear(n: number): number {
  let m = 0;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const inI = wz[i] >= NEAR;
    const inJ = wz[j] >= NEAR;
    if (inI) (qx[m] = wx[i]), (qy[m] = wy[i]), (qz[m] = wz[i]), m++;
    if (inI !== inJ) {
      const k = (NEAR - wz[i]) / (wz[j] - wz[i]);
      qx[m] = wx[i] + (wx[j] - wx[i]) * k;
      qy[m] = wy[i] + (wy[j] - wy[i]) * k;
      qz[m] = NEAR;
      m++;
    }
  }
  return m;
}

function project(c: DemoCamera, m: number): boolean {
  for (let i = 0; i < m; i++) {
    sx[i] = c.cx + (c.f * qx[i]) / qz[i];
    sy[i] = c.cy - (c.f * qy[i]) / qz[i];
  }
  return onScreen(c, m);
}

function onScreen(c: DemoCamera, m: number): boolean {
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
  for (let i = 0; i < m; i++) {
    if (sx[i] < x0) x0 = sx[i];
    if (sx[i] > x1) x1 = sx[i];
    if (sy[i] < y0) y0 = sy[i];
    if (sy[i] > y1) y1 = sy[i];
  }
  return x1 >= 0 && x0 <= c.width && y1 >= 0 && y0 <= c.height;
}
