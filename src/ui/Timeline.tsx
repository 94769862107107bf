import { useEffect, useMemo, useRef } from 'react';
import { rowValue } from '../state/frameRows.ts';
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

/** A strip of every frame coloured by the chosen score; click or drag to jump, with play controls. */
export function Timeline() {
  const run = useCommand();
  const key = useApp((s) => s.frameScore);
  const current = useApp((s) => s.frameIndex);
  const playing = useApp((s) => s.playing);
  const rate = useApp((s) => s.playRate);
  const rows = useApp(frameRowsSel);
  const count = useApp((s) => s.dataset?.pairing.frames.length ?? 0);
  const canvas = useRef<HTMLCanvasElement>(null);

  const colors = useMemo(
    () => stripColors(rows.map((r) => rowValue(r, key)), rows.map((r) => r.error !== null), key !== 'errorPixels'),
    [rows, key],
  );

  useEffect(() => {
    const c = canvas.current;
    if (!c) return;
    const w = c.clientWidth * devicePixelRatio;
    const h = c.clientHeight * devicePixelRatio;
    c.width = w;
    c.height = h;
    const ctx = c.getContext('2d')!;
    ctx.clearRect(0, 0, w, h);
    const n = colors.length;
    for (let i = 0; i < n; i++) {
      const x0 = Math.floor((i * w) / n);
      const x1 = Math.max(x0 + 1, Math.floor(((i + 1) * w) / n) - (w / n > 4 ? 1 : 0));
      ctx.fillStyle = colors[i];
      ctx.fillRect(x0, 0, x1 - x0, h);
    }
    if (n > 0) {
      const x0 = Math.floor((current * w) / n);
      const x1 = Math.max(x0 + 2, Math.floor(((current + 1) * w) / n));
      ctx.strokeStyle = '#ffffff';
      ctx.lineWidth = 2 * devicePixelRatio;
      ctx.strokeRect(x0 + 1, 1, x1 - x0 - 2, h - 2);
    }
  }, [colors, current]);

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
      <canvas
        ref={canvas}
        className="tl-strip"
        onPointerDown={(e) => {
          e.currentTarget.setPointerCapture(e.pointerId);
          jump(e);
        }}
        onPointerMove={(e) => e.buttons & 1 && jump(e)}
      />
      <span className="tl-pos">
        {count ? current + 1 : 0} / {count}
      </span>
    </div>
  );
}
