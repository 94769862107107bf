import { pct } from './format.ts';
import type { ScopeScores } from '../state/scopeScores.ts';
import { BAND_WIDTH_MAX } from '../core/metrics/bandHistogram.ts';
import { useCommand } from './commands/useCommand.tsx';

const W = 320;
const H = 200;
const PAD = { l: 34, r: 8, t: 10, b: 24 };

type Curve = ScopeScores['curve'];

function path(curve: Curve, key: 'meanIoU' | 'pixelAccuracy', lo: number): string {
  const x = (w: number) => PAD.l + (w / BAND_WIDTH_MAX) * (W - PAD.l - PAD.r);
  const y = (v: number) => PAD.t + (1 - (v - lo) / (1 - lo)) * (H - PAD.t - PAD.b);
  let d = '';
  let pen = false;
  for (const p of curve) {
    const v = p[key];
    if (v === null) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${x(p.width).toFixed(1)},${y(v).toFixed(1)}`;
    pen = true;
  }
  return d;
}

/** IoU and pixel accuracy against boundary-band width 0..BAND_WIDTH_MAX px; click to set the width everything uses. */
export function BandCurve({ runA, runB, a, aFrame, b, w }: { runA: string | null; runB: string | null; a: ScopeScores | null; aFrame: ScopeScores | null; b: ScopeScores | null; w: number }) {
  const run = useCommand();
  const curves: { curve: Curve; key: 'meanIoU' | 'pixelAccuracy'; cls: string; label: string }[] = [];
  if (a) curves.push({ curve: a.curve, key: 'meanIoU', cls: 'c-a', label: `${runA} dataset mIoU` }, { curve: a.curve, key: 'pixelAccuracy', cls: 'c-a dashed', label: `${runA} dataset pixel acc.` });
  if (aFrame) curves.push({ curve: aFrame.curve, key: 'meanIoU', cls: 'c-frame', label: `${runA} this frame mIoU` });
  if (b && runB) curves.push({ curve: b.curve, key: 'meanIoU', cls: 'c-b', label: `${runB} dataset mIoU` });
  const values = curves.flatMap((c) => c.curve.map((p) => p[c.key]).filter((v): v is number => v !== null));
  const lo = values.length ? Math.max(0, Math.floor(Math.min(...values) * 10) / 10) : 0;
  const xw = PAD.l + (w / BAND_WIDTH_MAX) * (W - PAD.l - PAD.r);
  const at = (c: Curve, k: 'meanIoU' | 'pixelAccuracy') => c[w]?.[k] ?? null;
  return (
    <div className="band-curve">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        width="100%"
        onClick={(e) => {
          const r = e.currentTarget.getBoundingClientRect();
          const x = ((e.clientX - r.left) / r.width) * W;
          const width = Math.round(((x - PAD.l) / (W - PAD.l - PAD.r)) * BAND_WIDTH_MAX);
          run('band.width', width);
        }}
      >
        {[0, 0.25, 0.5, 0.75, 1].map((t) => {
          const v = lo + t * (1 - lo);
          const y = PAD.t + (1 - t) * (H - PAD.t - PAD.b);
          return (
            <g key={t}>
              <line x1={PAD.l} x2={W - PAD.r} y1={y} y2={y} className="grid" />
              <text x={PAD.l - 4} y={y + 3} className="axis" textAnchor="end">
                {Math.round(v * 100)}
              </text>
            </g>
          );
        })}
        {[0, 0.25, 0.5, 0.75, 1].map((f) => f * BAND_WIDTH_MAX).map((t) => (
          <text key={t} x={PAD.l + (t / BAND_WIDTH_MAX) * (W - PAD.l - PAD.r)} y={H - 8} className="axis" textAnchor="middle">
            {t}
          </text>
        ))}
        {curves.map((c, i) => (
          <path key={i} d={path(c.curve, c.key, lo)} className={`curve ${c.cls}`} />
        ))}
        <line x1={xw} x2={xw} y1={PAD.t} y2={H - PAD.b} className="marker" />
      </svg>
      <ul className="legend">
        {curves.map((c, i) => (
          <li key={i}>
            <svg className="key" width={24} height={8} aria-hidden="true">
              <line x1={0} y1={4} x2={24} y2={4} className={`curve ${c.cls}`} />
            </svg>{' '}
            {c.label}: <b>{pct(at(c.curve, c.key))}</b> at {w} px
          </li>
        ))}
      </ul>
      <p className="dim small">Band width (px) across; score (%) up. A pixel is in the band when it lies within that distance of a ground-truth boundary.</p>
    </div>
  );
}
