import { SMALL_OBJECT_AREA, type ObjectSizeBin } from '../core/objects/objectsBySize.ts';
import { MISSED_OBJECTS_MAX } from '../core/objects/runObjects.ts';
import { extrasASel, extrasBSel } from '../state/extrasScores.ts';
import { classNameSel } from '../state/selectors.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { count, pct } from './format.ts';
import { useApp } from './storeContext.tsx';

/** Bars of the recall-by-size chart: run A over the dataset, run A on this frame, run B over the dataset. */
const SERIES = [
  { key: 'a', label: 'A dataset', color: '#e0a040' },
  { key: 'frame', label: 'A this frame', color: '#f3e3b0' },
  { key: 'b', label: 'B dataset', color: '#4fb3ff' },
] as const;

function binLabel(b: ObjectSizeBin): string {
  return b.maxArea === null ? `≥${count(b.minArea)}` : `${count(b.minArea)}–${count(b.maxArea - 1)}`;
}

/** Mean recall of ground-truth objects by area, as bars per size bin (empty bins leave a gap). */
function RecallChart({ series }: { series: Record<(typeof SERIES)[number]['key'], ObjectSizeBin[] | null> }) {
  const bins = series.a ?? series.frame ?? series.b ?? [];
  const W = 380, H = 150, left = 30, bottom = 30, top = 8;
  const plotH = H - bottom - top;
  const groupW = (W - left) / Math.max(1, bins.length);
  const barW = (groupW - 8) / SERIES.length;
  return (
    <svg className="recall-chart" data-testid="recall-chart" viewBox={`0 0 ${W} ${H}`} width="100%" role="img" aria-label="mean recall by object size">
      {[0, 0.5, 1].map((v) => (
        <g key={v}>
          <line x1={left} x2={W} y1={top + plotH * (1 - v)} y2={top + plotH * (1 - v)} stroke="#333a42" />
          <text x={left - 4} y={top + plotH * (1 - v) + 4} textAnchor="end" fontSize="10" fill="#8b949e">
            {v * 100}
          </text>
        </g>
      ))}
      {bins.map((b, i) => (
        <g key={i}>
          {SERIES.map((s, j) => {
            const bin = series[s.key]?.[i];
            if (!bin || bin.meanRecall === null) return null;
            const h = plotH * bin.meanRecall;
            return (
              <rect
                key={s.key}
                data-series={s.key}
                data-bin={i}
                data-recall={bin.meanRecall}
                x={left + i * groupW + 4 + j * barW}
                y={top + plotH - h}
                width={barW - 1}
                height={h}
                fill={s.color}
              >
                <title>{`${s.label}, objects of ${binLabel(bin)} px: recall ${pct(bin.meanRecall)}% over ${count(bin.objects)} objects, ${pct(bin.detected)}% found (recall ≥ 50%)`}</title>
              </rect>
            );
          })}
          <text x={left + i * groupW + groupW / 2} y={H - bottom + 12} textAnchor="middle" fontSize="9.5" fill="#8b949e">
            {binLabel(b)}
          </text>
          <text x={left + i * groupW + groupW / 2} y={H - bottom + 24} textAnchor="middle" fontSize="9" fill="#6b737c">
            n={count(series.a?.[i]?.objects ?? 0)}
          </text>
        </g>
      ))}
    </svg>
  );
}

/** The Objects tab: recall by object size (dataset, this frame, run B) and the missed small objects of this frame. */
export function ObjectsTab() {
  const run = useCommand();
  const a = useApp(extrasASel);
  const b = useApp(extrasBSel);
  const frameIndex = useApp((s) => s.frameIndex);
  const focus = useApp((s) => s.focusBox);
  const name = useApp(classNameSel);
  const missed = a.frame?.missed ?? [];
  const [next, prev] = [commandKeys('object.next')[0], commandKeys('object.prev')[0]];
  return (
    <div className="objects-tab">
      <p className="dim small">
        Mean recall of ground-truth objects (8-connected areas of one class, or instances) by area in pixels, run A
        {a.run ? ` (${a.run})` : ''}{b.run ? ` against run B (${b.run})` : ''}.
      </p>
      <RecallChart series={{ a: a.dataset?.objectsBySize ?? null, frame: a.frame?.objectsBySize ?? null, b: b.dataset?.objectsBySize ?? null }} />
      <div className="chart-legend">
        {SERIES.map((s) => (
          <span key={s.key}>
            <span className="swatch" style={{ background: s.color }} /> {s.label}
          </span>
        ))}
      </div>
      <h4>
        Missed small objects on this frame <span className="dim">({missed.length}{missed.length === MISSED_OBJECTS_MAX ? `, the ${MISSED_OBJECTS_MAX} largest` : ''}; {next} / {prev} to step)</span>
      </h4>
      {missed.length === 0 ? (
        <p className="dim small">{a.frame ? `None: every object under ${count(SMALL_OBJECT_AREA)} px has recall of at least 50%.` : 'Not scored yet.'}</p>
      ) : (
        <table className="missed" data-testid="missed-objects">
          <thead>
            <tr>
              <th>class</th>
              <th>area</th>
              <th>recall</th>
              <th>where</th>
            </tr>
          </thead>
          <tbody>
            {missed.map((m, i) => {
              const box = [m.box[0], m.box[1], m.box[2] + 1, m.box[3] + 1] as const;
              const on = focus !== null && focus.every((v, k) => v === box[k]);
              return (
                <tr key={i} className={on ? 'on' : undefined} data-missed={i} onClick={() => run('region.focus', { frameIndex, bbox: box })}>
                  <td>{name(m.classId)}</td>
                  <td>{count(m.area)} px</td>
                  <td>{pct(m.recall)}%</td>
                  <td className="dim">
                    {m.box[0]},{m.box[1]}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </div>
  );
}
