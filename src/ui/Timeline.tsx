import { useEffect, useMemo, useRef } from 'react';
import { higherIsBetter, rowValue } from '../state/frameRows.ts';
import { frameRowsSel } from '../state/selectors.ts';
import { scoreColor } from './format.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/**
 * Returns a colour per frame: its chosen score placed between the dataset's worst and best scored
 * frames (so differences show even when every frame scores high), gray while unscored, dark red
 * stripes for frames that failed.
 */
function stripColors(values: (number | null)[], failed: boolean[], higherIsBetter: boolean): string[] {
  const defined = values.filter((v): v is number => v !== null);
  const lo = Math.min(...defined);
  const hi = Math.max(...defined);
  return values.map((v, i) => {
    if (failed[i]) return '#ff3b30';
    if (v === null) return scoreColor(null);
    const t = hi > lo ? (v - lo) / (hi - lo) : 1;
    return scoreColor(higherIsBetter ? t : 1 - t);
  });
}

/** Colour of a flicker cell: dark at no flicker, brighter amber the closer to the sequence's worst `max`. */
function flickerColor(v: number | null, max: number): string {
  if (v === null) return '#23272d';
  const t = max > 0 ? Math.min(1, v / max) : 0;
  return `rgb(${Math.round(40 + 215 * t)}, ${Math.round(36 + 140 * t)}, ${Math.round(30 + 10 * t)})`;
}

/** Draws one cell per frame into `c` in rows (top to bottom, equal heights), with the current frame outlined. */
function cellsDraw(c: HTMLCanvasElement, rows: string[][], current: number): void {
  const w = c.clientWidth * devicePixelRatio;
  const h = c.clientHeight * devicePixelRatio;
  c.width = w;
  c.height = h;
  const ctx = c.getContext('2d')!;
  ctx.clearRect(0, 0, w, h);
  const n = rows[0]?.length ?? 0;
  rows.forEach((colors, r) => {
    const y0 = Math.round((r * h) / rows.length), y1 = Math.round(((r + 1) * h) / rows.length);
    for (let i = 0; i < n; i++) {
      const x0 = Math.floor((i * w) / n);
      const x1 = Math.max(x0 + 1, Math.floor(((i + 1) * w) / n) - (w / n > 4 ? 1 : 0));
      ctx.fillStyle = colors[i];
      ctx.fillRect(x0, y0, x1 - x0, y1 - y0 - (r < rows.length - 1 ? 1 : 0));
    }
  });
  if (n > 0) {
    const x0 = Math.floor((current * w) / n);
    const x1 = Math.max(x0 + 2, Math.floor(((current + 1) * w) / n));
    ctx.strokeStyle = '#ffffff';
    ctx.lineWidth = 2 * devicePixelRatio;
    ctx.strokeRect(x0 + 1, 1, x1 - x0 - 2, h - 2);
  }
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
  const rows = useApp(frameRowsSel);
  const count = useApp((s) => s.dataset?.pairing.frames.length ?? 0);
  const canvas = useRef<HTMLCanvasElement>(null);
  const flickerRow = useRef<HTMLCanvasElement>(null);

  const colors = useMemo(
    () => stripColors(rows.map((r) => rowValue(r, key)), rows.map((r) => r.error !== null), higherIsBetter(key)),
    [rows, key],
  );

  const flicker = useMemo(() => {
    const of = (k: 'flipBack' | 'flipBackVoid') => {
      const v = rows.map((r) => r.extras?.[k] ?? null);
      const max = Math.max(0, ...v.filter((x): x is number => x !== null));
      return v.map((x) => flickerColor(x, max));
    };
    return [of('flipBack'), of('flipBackVoid')];
  }, [rows]);

  useEffect(() => {
    if (canvas.current) cellsDraw(canvas.current, [colors], current);
    if (flickerRow.current) cellsDraw(flickerRow.current, flicker, current);
  }, [colors, flicker, current]);

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
        {[canvas, flickerRow].map((ref, i) => (
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
      <span className="tl-pos">
        {count ? current + 1 : 0} / {count}
      </span>
    </div>
  );
}
