import { useMemo, useState } from 'react';
import type { ClassInfo } from '../core/classTable.ts';
import { confusionFramesOf } from '../state/confusionFrames.ts';
import { count, countShort } from './format.ts';
import type { ScopeScores } from '../state/scopeScores.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

/** Confusion matrix as a row-normalised heat map; hover for counts, click a cell for the frames behind it. */
export function ConfusionMap({ dataset, frame, classes, run }: { dataset: ScopeScores | null; frame: ScopeScores | null; classes: Map<number, ClassInfo>; run: string | null }) {
  const command = useCommand();
  const [scope, setScope] = useState<'dataset' | 'frame'>('dataset');
  const [hover, setHover] = useState<string>('');
  const [picked, setPicked] = useState<{ g: number; p: number } | null>(null);
  const confusionFrames = useApp((s) => s.confusionFrames);
  const version = useApp((s) => s.resultsVersion);
  const sortedBy = useApp((s) => s.frameClass?.classId ?? null);
  const frames = useApp((s) => s.dataset?.pairing.frames);
  const names = useMemo(() => (frames ?? []).map((f) => f.name), [frames]);
  const sc = scope === 'dataset' ? dataset : frame;
  const name = (id: number) => (id === -1 ? 'not a class' : (classes.get(id)?.name ?? String(id)));
  const worst = useMemo(() => {
    if (!dataset) return [];
    const k = dataset.classIds.length;
    const cells: { g: number; p: number; v: number }[] = [];
    for (let g = 0; g < k; g++) for (let p = 0; p <= k; p++) if (p !== g && dataset.confusion[g * (k + 1) + p] > 0) cells.push({ g: dataset.classIds[g], p: p === k ? -1 : dataset.classIds[p], v: dataset.confusion[g * (k + 1) + p] });
    return cells.sort((a, b) => b.v - a.v).slice(0, 6);
  }, [dataset]);
  // Frames land in place; the version says when the lists changed.
  const list = useMemo(
    () => (picked && run ? confusionFramesOf(confusionFrames, run, picked.g, picked.p).map((f) => ({ ...f, name: names[f.index] })) : []),
    [picked, run, confusionFrames, version, names],
  );
  if (!sc) return <p className="dim">{scope === 'frame' ? 'This frame has no scores yet.' : 'No frames scored yet.'}</p>;
  const k = sc.classIds.length;
  const cols = [...sc.classIds, -1];
  return (
    <div className="confusion">
      <div className="seg">
        {(['dataset', 'frame'] as const).map((s) => (
          <button key={s} className={s === scope ? 'on' : ''} onClick={() => setScope(s)}>
            {s === 'dataset' ? 'dataset' : 'this frame'}
          </button>
        ))}
      </div>
      <div className="cm-grid" style={{ gridTemplateColumns: `auto repeat(${k + 1}, 1fr)` }} onMouseLeave={() => setHover('')}>
        <span className="cm-corner">truth ↓ / predicted →</span>
        {cols.map((id, p) => {
          let col = 0;
          for (let g = 0; g < k; g++) col += sc.confusion[g * (k + 1) + p];
          const label = `${name(id)} ${countShort(col)}`;
          const title = `${name(id)}: ${count(col)} px predicted${id === -1 ? '' : ` — click to sort frames by ${name(id)}'s IoU (again: band IoU, Boundary IoU)`}`;
          return id === -1 ? (
            <span key={id} className="cm-col" title={title} style={{ borderTopColor: '#666' }}>
              <span className="cm-vert">{label}</span>
            </span>
          ) : (
            <button key={id} className={`cm-col${sortedBy === id ? ' cm-sorted' : ''}`} title={title} style={{ borderTopColor: classes.get(id)?.color ?? '#666' }} onClick={() => command('frames.byClass', { classId: id })}>
              <span className="cm-vert">{label}</span>
            </button>
          );
        })}
        {sc.classIds.map((gId, g) => {
          let row = 0;
          for (let p = 0; p <= k; p++) row += sc.confusion[g * (k + 1) + p];
          return [
            <button
              key={`r${gId}`}
              className={`cm-row${sortedBy === gId ? ' cm-sorted' : ''}`}
              title={`${name(gId)}: ${count(row)} px of ground truth — click to sort frames by its IoU (again: band IoU, Boundary IoU)`}
              style={{ borderLeftColor: classes.get(gId)?.color ?? '#666' }}
              onClick={() => command('frames.byClass', { classId: gId })}
            >
              {name(gId)} <span className="dim">{countShort(row)}</span>
            </button>,
            ...cols.map((pId, p) => {
              const v = sc.confusion[g * (k + 1) + p];
              const share = row > 0 ? v / row : 0;
              const diag = p === g;
              const text = `${name(gId)} → ${name(pId)}: ${count(v)} px (${(share * 100).toFixed(1)}% of ${name(gId)})`;
              return (
                <button
                  key={`${gId}-${pId}`}
                  className={`cm-cell${diag ? ' diag' : ''}${picked?.g === gId && picked?.p === pId ? ' picked' : ''}`}
                  style={{ background: diag ? `rgba(63,170,140,${share})` : `rgba(255,31,180,${Math.sqrt(share)})` }}
                  title={text}
                  onMouseEnter={() => setHover(text)}
                  onClick={() => !diag && v > 0 && setPicked({ g: gId, p: pId })}
                  aria-label={text}
                />
              );
            }),
          ];
        })}
      </div>
      <p className="cm-hover">{hover || 'Rows are normalised: each row shows where that true class went.'}</p>
      {picked && (
        <div className="cm-frames">
          <h4>
            {name(picked.g)} predicted as {name(picked.p)}: frames with most pixels
          </h4>
          <ol>
            {list.map((f) => (
              <li key={f.index}>
                <button className="link" onClick={() => command('frame.go', f.index)}>
                  {f.name}
                </button>{' '}
                <span className="dim">{count(f.pixels)} px</span>
              </li>
            ))}
          </ol>
        </div>
      )}
      <h4>Worst class pairs (dataset)</h4>
      <ol className="pairs">
        {worst.map((c) => (
          <li key={`${c.g}-${c.p}`}>
            <button className="link" onClick={() => setPicked({ g: c.g, p: c.p })}>
              {name(c.g)} → {name(c.p)}
            </button>{' '}
            <span className="dim">{count(c.v)} px</span>
          </li>
        ))}
      </ol>
    </div>
  );
}
