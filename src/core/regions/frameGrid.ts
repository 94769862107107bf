import { GRID_NOT_A_CLASS } from './regionTypes.ts';
import type { RunTable } from './runLabel.ts';

/** Cell layout of a frame's coarse grid. */
export interface GridShape {
  columns: number;
  rows: number;
  /** Cell side, pixels. */
  cell: number;
}

/** Returns the grid of square cells for a width × height frame with about `columns` columns. */
export function gridShape(width: number, height: number, columns: number): GridShape {
  const cell = Math.max(1, Math.ceil(width / columns));
  return { columns: Math.ceil(width / cell), rows: Math.ceil(height / cell), cell };
}

/**
 * Returns the most common value per cell of a map, from its runs (runsLabel with every run kept, `a`
 * the code: 0..k-1 classes, k void or "not a class", anything above k "other"), written as ids:
 * `classIds[c]` for a class, `voidValue` for k and GRID_NOT_A_CLASS for other. Ties go to the smaller
 * code. Works one cell row at a time from run lengths, so it costs the runs, not the pixels, and the
 * histogram stays columns × (k+2) counts however many classes there are.
 */
export function gridDominant(t: RunTable, k: number, classIds: readonly number[], voidValue: number, g: GridShape): Uint16Array {
  const bins = k + 2;
  const { cell, columns } = g;
  const hist = new Uint32Array(columns * bins);
  const out = new Uint16Array(columns * g.rows);
  for (let gy = 0; gy < g.rows; gy++) {
    hist.fill(0);
    const yEnd = Math.min(t.height, (gy + 1) * cell);
    for (let r = t.rowStart[gy * cell], end = t.rowStart[yEnd]; r < end; r++) {
      const code = t.a[r] < bins ? t.a[r] : bins - 1;
      const x0 = t.x0[r], x1 = t.x1[r];
      for (let gx = (x0 / cell) | 0, last = ((x1 - 1) / cell) | 0; gx <= last; gx++) {
        const a = gx * cell > x0 ? gx * cell : x0, b = (gx + 1) * cell < x1 ? (gx + 1) * cell : x1;
        hist[gx * bins + code] += b - a;
      }
    }
    for (let gx = 0; gx < columns; gx++) {
      const h = gx * bins;
      let best = 0;
      for (let c = 1; c < bins; c++) if (hist[h + c] > hist[h + best]) best = c;
      out[gy * columns + gx] = best < k ? classIds[best] : best === k ? voidValue : GRID_NOT_A_CLASS;
    }
  }
  return out;
}
