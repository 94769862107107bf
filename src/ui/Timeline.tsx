import { useEffect, useMemo, useRef } from 'react';
import { frameTableColumn, higherIsBetter } from '../state/frameRows.ts';
import { frameTableSel } from '../state/selectors.ts';
import type { FrameScoreKey } from '../state/viewSlice.ts';
import { scoreColor } from './format.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/** One row of the timeline: per frame a badness 0..1 (1 worst; NaN without a value) and whether it failed. */
interface StripRow {
  bad: Float64Array;
  failed: Uint8Array;
  color: (bad: number) => string;
}

const FAILED_COLOR = '#ff3b30';

/** The score the strip is coloured by, in words (the legend). */
const SCORE_WORDS: Record<FrameScoreKey, string> = {
  meanIoU: 'mean IoU', bandIoU: 'band IoU', boundaryIoU: 'Boundary IoU', boundaryF: 'Boundary F', errorPixels: 'wrong pixels', flipBack: 'flip-back', smallObjectRecall: 'small-object recall',
};

/**
 * Returns the score strip's row: each frame's chosen score placed between the dataset's worst and best
 * scored frames (so differences show even when every frame scores high).
 */
function scoreRow(values: Float64Array, failed: Uint8Array, higherIsBetter: boolean): StripRow {
  let lo = Infinity, hi = -Infinity;
  for (const v of values) {
    if (Number.isNaN(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  const bad = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    const t = hi > lo ? (values[i] - lo) / (hi - lo) : 1;
    bad[i] = Number.isNaN(values[i]) ? NaN : higherIsBetter ? 1 - t : t;
  }
  return { bad, failed, color: (b) => scoreColor(1 - b) };
}

/** Returns a flicker row: dark at no flicker, brighter amber the closer to the sequence's worst frame. */
function flickerRow(values: Float64Array): StripRow {
  let max = 0;
  for (const v of values) if (v > max) max = v;
  const bad = values.map((v) => (Number.isNaN(v) ? NaN : max > 0 ? Math.min(1, v / max) : 0));
  const color = (t: number) => (Number.isNaN(t) ? '#23272d' : `rgb(${Math.round(40 + 215 * t)}, ${Math.round(36 + 140 * t)}, ${Math.round(30 + 10 * t)})`);
  return { bad, failed: new Uint8Array(values.length), color };
}

/**
 * Draws `rows` into `c` (top to bottom, equal heights), one rect per frame while frames are wider than
 * a device pixel, else one rect per pixel column showing the worst frame under it (a failed one first),
 * so 10^5 frames cost one pass over the values and a canvas width of rects; the current frame outlined.
 */
function cellsDraw(c: HTMLCanvasElement, rows: StripRow[], n: number, current: number): void {
  const w = Math.round(c.clientWidth * devicePixelRatio);
  const h = Math.round(c.clientHeight * devicePixelRatio);
  c.width = w;
  c.height = h;
  const ctx = c.getContext('2d')!;
  ctx.clearRect(0, 0, w, h);
  if (n === 0 || w === 0) return;
  const cells = Math.min(n, w);
  rows.forEach((row, r) => {
    const y0 = Math.round((r * h) / rows.length), y1 = Math.round(((r + 1) * h) / rows.length);
    for (let k = 0; k < cells; k++) {
      // Frames a..b-1 fall in cell k.
      const a = Math.floor((k * n) / cells), b = Math.max(a + 1, Math.floor(((k + 1) * n) / cells));
      let worst = NaN, failed = false;
      for (let i = a; i < b; i++) {
        if (row.failed[i]) failed = true;
        const v = row.bad[i];
        if (!Number.isNaN(v) && !(v <= worst)) worst = v;
      }
      const x0 = Math.floor((k * w) / cells);
      const x1 = Math.max(x0 + 1, Math.floor(((k + 1) * w) / cells) - (w / cells > 4 ? 1 : 0));
      ctx.fillStyle = failed ? FAILED_COLOR : row.color(worst);
      ctx.fillRect(x0, y0, x1 - x0, y1 - y0 - (r < rows.length - 1 ? 1 : 0));
    }
  });
  const x0 = Math.floor((current * w) / n);
  const x1 = Math.max(x0 + 2, Math.floor(((current + 1) * w) / n));
  ctx.strokeStyle = '#ffffff';
  ctx.lineWidth = 2 * devicePixelRatio;
  ctx.strokeRect(x0 + 1, 1, x1 - x0 - 2, h - 2);
}

/**
 * A strip of every frame coloured by the chosen score, and under it the flicker row (run A's
 * flip-back rate over non-void and over void ground truth, each against its worst frame); click or
 * drag either to jump, with play controls.
 */
export function Timeline() {
  const run = useCommand();
  const key = useApp((s) => s.frameScore);
  const current = useApp((s) => s.frameIndex);
  const playing = useApp((s) => s.playing);
  const rate = useApp((s) => s.playRate);
  const table = useApp(frameTableSel);
  const count = useApp((s) => s.dataset?.pairing.frames.length ?? 0);
  const canvas = useRef<HTMLCanvasElement>(null);
  const flickerCanvas = useRef<HTMLCanvasElement>(null);

  const strip = useMemo(() => {
    const failed = new Uint8Array(table.count);
    for (let i = 0; i < table.count; i++) failed[i] = table.error(i) === null ? 0 : 1;
    return scoreRow(frameTableColumn(table, key), failed, higherIsBetter(key));
  }, [table, key]);
  const flicker = useMemo(() => [flickerRow(frameTableColumn(table, 'flipBack')), flickerRow(frameTableColumn(table, 'flipBackVoid'))], [table]);

  useEffect(() => {
    if (canvas.current) cellsDraw(canvas.current, [strip], table.count, current);
    if (flickerCanvas.current) cellsDraw(flickerCanvas.current, flicker, table.count, current);
  }, [strip, flicker, table, current]);

  useEffect(() => {
    if (!playing) return;
    const timer = setInterval(() => run('play.step'), 1000 / rate);
    return () => clearInterval(timer);
  }, [playing, rate, run]);

  const jump = (e: React.PointerEvent<HTMLCanvasElement>) => {
    if (count === 0) return;
    const rect = e.currentTarget.getBoundingClientRect();
    run('frame.go', Math.floor(((e.clientX - rect.left) / rect.width) * count));
  };

  return (
    <div className="timeline">
      <button className="tl-play" onClick={() => run('play.toggle')} title={`Play / pause (${commandKeys('play.toggle')[0].toLowerCase()})`} aria-label={playing ? 'pause' : 'play'}>
        {playing ? '❚❚' : '▶'}
      </button>
      <select className="tl-rate" value={rate} onChange={(e) => run('play.rate', Number(e.currentTarget.value))} title="Frames per second">
        {[1, 2, 4, 8, 15, 30].map((r) => (
          <option key={r} value={r}>
            {r} fps
          </option>
        ))}
      </select>
      <div className="tl-rows">
        {[canvas, flickerCanvas].map((ref, i) => (
          <canvas
            key={i}
            ref={ref}
            className={i === 0 ? 'tl-strip' : 'tl-flicker'}
            data-testid={i === 0 ? 'timeline-strip' : 'timeline-flicker'}
            title={i === 0 ? undefined : 'Flicker of run A: flip-back rate over non-void (top) and void (bottom) ground truth; brighter is more'}
            onPointerDown={(e) => {
              e.currentTarget.setPointerCapture(e.pointerId);
              jump(e);
            }}
            onPointerMove={(e) => e.buttons & 1 && jump(e)}
          />
        ))}
      </div>
      <span className="tl-scale" data-testid="timeline-scale" title={`Each cell is a frame, coloured by ${SCORE_WORDS[key]} of run A between the dataset's worst and best frames; a red cell failed. The row under it: run A's flicker over non-void and void truth, brighter is more.`}>
        <span className="tl-scale-end">worst</span>
        <span className="tl-scale-bar" style={{ background: `linear-gradient(to right, ${[0, 0.25, 0.45, 0.6, 0.75, 0.9, 1].map((t) => scoreColor(t)).join(', ')})` }} />
        <span className="tl-scale-end">best</span>
        <span className="tl-scale-key">{SCORE_WORDS[key]}</span>
      </span>
      <span className="tl-pos">
        {count ? current + 1 : 0} / {count}
      </span>
    </div>
  );
}
