import { REGION_KINDS } from '../core/regions/regionTypes.ts';
import { classNameSel, shownRunSel } from '../state/selectors.ts';
import { count } from './format.ts';
import { KIND_NAMES } from './regionWords.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/** The current frame's error regions for run A: counts by kind, then the listed regions, worst first. */
export function RegionsTab() {
  const command = useCommand();
  const run = useApp(shownRunSel);
  const frameIndex = useApp((s) => s.frameIndex);
  const result = useApp((s) => s.results[s.frameIndex]);
  const focus = useApp((s) => s.focusBox);
  const name = useApp(classNameSel);
  const regions = run ? result?.runs.find((r) => r.run === run)?.regions ?? null : null;
  if (!result) return <p className="dim">This frame has not been scored yet.</p>;
  if (!regions) return <p className="dim">No error regions for this frame{result.error ? `: ${result.error}` : ''}.</p>;
  const c = regions.counts;
  return (
    <div className="regions">
      <table className="classes" data-testid="region-counts">
        <thead>
          <tr>
            <th>kind</th>
            <th>regions</th>
            <th>pixels</th>
          </tr>
        </thead>
        <tbody>
          {REGION_KINDS.map((k) => (
            <tr key={k}>
              <td>{KIND_NAMES[k]}</td>
              <td>{count(c.byKind[k].regions)}</td>
              <td>{count(c.byKind[k].pixels)}</td>
            </tr>
          ))}
          <tr>
            <td>tiny (counted, not listed)</td>
            <td>{count(c.tiny.regions)}</td>
            <td>{count(c.tiny.pixels)}</td>
          </tr>
          <tr>
            <td>
              <b>all disagreement</b>
            </td>
            <td>{count(c.all.regions)}</td>
            <td>{count(c.all.pixels)}</td>
          </tr>
        </tbody>
      </table>
      <p className="dim small">
        Prediction over void is not an error: {count(regions.voidSpill.pixels)} void pixels got a class from {run}
        {regions.voidSpill.regions.length ? ` (${regions.voidSpill.regions.length} areas)` : ''}.
      </p>
      <ol className="region-list">
        {regions.regions.slice(0, 100).map((r) => {
          const on = focus && focus.every((v, i) => v === r.bbox[i]);
          return (
            <li key={r.id} className={on ? 'selected' : ''}>
              <button className="link" onClick={() => command('region.focus', { frameIndex, bbox: r.bbox })}>
                {KIND_NAMES[r.kind]}
              </button>{' '}
              {name(r.truthClass)} → {name(r.predictedClass)} <span className="dim">
                {count(r.area)} px · {(r.bandShare * 100).toFixed(0)}% in band · {r.thickness.toFixed(1)} px thick
              </span>
            </li>
          );
        })}
      </ol>
      {c.unlisted > 0 && <p className="dim small">{c.unlisted} more regions are counted but not listed.</p>}
    </div>
  );
}
