/** Seeded generator of uniform numbers in [0, 1) (mulberry32), so every fixture is reproducible. */
export function rngCreate(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Returns an integer in [lo, hi] drawn from `rng`. */
export function rngInt(rng: () => number, lo: number, hi: number): number {
  return lo + Math.floor(rng() * (hi - lo + 1));
}

/** A label canvas for painting fixtures: row-major ids, painter's order. */
export interface Canvas {
  width: number;
  height: number;
  ids: Uint8Array | Uint16Array;
}

/** Paints the axis-aligned rectangle [x0, x1) × [y0, y1) (clipped) with `id`. */
export function paintRect(c: Canvas, x0: number, y0: number, x1: number, y1: number, id: number): void {
  const xa = Math.max(0, Math.floor(x0)), xb = Math.min(c.width, Math.floor(x1));
  const ya = Math.max(0, Math.floor(y0)), yb = Math.min(c.height, Math.floor(y1));
  for (let y = ya; y < yb; y++) c.ids.fill(id, y * c.width + xa, y * c.width + Math.max(xa, xb));
}

/** Paints the ellipse with centre (cx, cy) and radii (rx, ry) (pixel centres inside, clipped) with `id`. */
export function paintEllipse(c: Canvas, cx: number, cy: number, rx: number, ry: number, id: number): void {
  const ya = Math.max(0, Math.ceil(cy - ry)), yb = Math.min(c.height - 1, Math.floor(cy + ry));
  for (let y = ya; y <= yb; y++) {
    const t = (y - cy) / ry;
    const h = rx * Math.sqrt(Math.max(0, 1 - t * t));
    paintRect(c, Math.ceil(cx - h), y, Math.floor(cx + h) + 1, y + 1, id);
  }
}

/** Paints the polygon `pts` (flat x,y list; even-odd rule at pixel centres, clipped) with `id`. */
export function paintPolygon(c: Canvas, pts: number[], id: number): void {
  const m = pts.length / 2;
  let ymin = Infinity, ymax = -Infinity;
  for (let j = 0; j < m; j++) {
    ymin = Math.min(ymin, pts[2 * j + 1]);
    ymax = Math.max(ymax, pts[2 * j + 1]);
  }
  const xs: number[] = [];
  for (let y = Math.max(0, Math.ceil(ymin)); y <= Math.min(c.height - 1, Math.floor(ymax)); y++) {
    xs.length = 0;
    for (let j = 0; j < m; j++) {
      const ax = pts[2 * j], ay = pts[2 * j + 1];
      const bx = pts[(2 * j + 2) % (2 * m)], by = pts[(2 * j + 3) % (2 * m)];
      if ((ay <= y && by > y) || (by <= y && ay > y)) xs.push(ax + ((y - ay) / (by - ay)) * (bx - ax));
    }
    xs.sort((a, b) => a - b);
    for (let j = 0; j + 1 < xs.length; j += 2) paintRect(c, Math.ceil(xs[j]), y, Math.floor(xs[j + 1]) + 1, y + 1, id);
  }
}

/** Paints a straight stroke from (x0, y0) to (x1, y1) of `thickness` pixels with `id`. */
export function paintLine(c: Canvas, x0: number, y0: number, x1: number, y1: number, thickness: number, id: number): void {
  const len = Math.hypot(x1 - x0, y1 - y0) || 1;
  const nx = (-(y1 - y0) / len) * (thickness / 2), ny = ((x1 - x0) / len) * (thickness / 2);
  paintPolygon(c, [x0 + nx, y0 + ny, x1 + nx, y1 + ny, x1 - nx, y1 - ny, x0 - nx, y0 - ny], id);
}
