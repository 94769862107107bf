import type { FrameGrid } from '../regions/regionTypes.ts';

/** One frame's coarse grids as the dataset pass keeps them: the truth's and each run's. */
export interface FrameGrids {
  name: string;
  grid: FrameGrid;
  runs: Record<string, Uint16Array>;
}

/** Temporal evidence of one region: the share of its cells where the label flips, and the frames bracketing a flip. */
export interface TemporalFlip {
  /** Share 0..1 of the region's cells with a bracketed flip. */
  share: number;
  /** Names of the nearest frames before and after where the label says the predicted class (from the first such cell). */
  before: string | null;
  after: string | null;
}

function sameShape(a: FrameGrid, b: FrameGrid): boolean {
  return a.columns === b.columns && a.rows === b.rows && a.cell === b.cell;
}

/**
 * Returns whether, within `reach` cells (chessboard) of cell c, the label says `g` in frame `t` in a
 * cell where it did not say g in frame `here`: the class moved next door (as a thin object does when
 * the camera moves) rather than flipped. Cells that held g in both frames are the scene around it.
 */
function labelMovedNear(t: FrameGrid, here: FrameGrid, c: number, reach: number, g: number): boolean {
  const cx = c % t.columns, cy = (c - cx) / t.columns;
  for (let y = Math.max(0, cy - reach); y <= Math.min(t.rows - 1, cy + reach); y++) {
    for (let x = Math.max(0, cx - reach); x <= Math.min(t.columns - 1, cx + reach); x++) {
      const i = y * t.columns + x;
      if (t.truth[i] === g && here.truth[i] !== g) return true;
    }
  }
  return false;
}

/**
 * Walks from frame f in direction `step` (±1) up to `window` frames through cell `c`: the label may
 * keep saying `g`, the run must keep predicting `p`; returns the index of the first frame where the
 * label says `p` instead and g has not moved into a cell within `reach`, or -1 (the run changes its
 * mind, the label says a third class, g moved, a frame is missing or sized differently, or the window ends).
 */
function flipEnd(
  frames: readonly (FrameGrids | null)[], f: number, step: number, window: number, run: string, c: number, g: number, p: number, reach: number,
): number {
  const here = frames[f]!.grid;
  for (let d = 1; d <= window; d++) {
    const t = frames[f + d * step];
    if (!t || !sameShape(t.grid, here) || !t.runs[run]) return -1;
    if (t.runs[run][c] !== p) return -1;
    const label = t.grid.truth[c];
    if (label === p) return labelMovedNear(t.grid, here, c, reach, g) ? -1 : f + d * step;
    if (label !== g) return -1;
  }
  return -1;
}

/**
 * Returns the temporal evidence of a region of run `run` in frame `f` (index into `frames`, the
 * dataset in order; null where a frame has no grids), labelled `g` and predicted `p`, over its grid
 * `cells`: a cell counts when in this frame the label says g and the run p there, and within `window`
 * frames on both sides the label says p (and g did not just move next door) while the run says p in every
 * frame between: the label flips for a few frames and the prediction does not. Our own heuristic; it
 * reads only the small per-frame grids, never neighbouring frames' full maps.
 */
export function temporalFlip(
  frames: readonly (FrameGrids | null)[], f: number, run: string, cells: readonly number[], g: number, p: number, window: number, reach = 1,
): TemporalFlip {
  const none = { share: 0, before: null, after: null };
  const here = frames[f];
  if (!here || !here.runs[run] || cells.length === 0 || window < 1) return none;
  let hits = 0;
  let before: string | null = null, after: string | null = null;
  for (const c of cells) {
    if (here.grid.truth[c] !== g || here.runs[run][c] !== p) continue;
    const a = flipEnd(frames, f, -1, Math.min(window, f), run, c, g, p, reach);
    if (a < 0) continue;
    const b = flipEnd(frames, f, 1, Math.min(window, frames.length - 1 - f), run, c, g, p, reach);
    if (b < 0) continue;
    hits++;
    if (before === null) {
      before = frames[a]!.name;
      after = frames[b]!.name;
    }
  }
  return { share: hits / cells.length, before, after };
}
