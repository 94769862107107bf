import { useState } from 'react';
import { classTableFromText } from '../core/classTable.ts';
import { boundaryFTolerance, boundaryIoUDilation } from '../core/metrics/settings.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

function NumberField({ label, value, step, min, max, onCommit, note }: { label: string; value: number; step: number; min: number; max: number; onCommit: (v: number) => string | null; note: string }) {
  const [text, setText] = useState(String(value));
  const [error, setError] = useState<string | null>(null);
  const commit = () => {
    const v = Number(text);
    if (text.trim() === '' || !Number.isFinite(v) || v < min || v > max) return setError(`enter a number ${min}..${max}`);
    setError(onCommit(v));
  };
  return (
    <label className="setting">
      <span>{label}</span>
      <input type="number" value={text} step={step} min={min} max={max} onChange={(e) => setText(e.currentTarget.value)} onBlur={commit} onKeyDown={(e) => e.key === 'Enter' && commit()} />
      <span className={error ? 'bad small' : 'dim small'}>{error ?? note}</span>
    </label>
  );
}

/** Score settings (src/docs/metrics.md) and the class table; any change rescores every frame in the workers. */
export function SettingsTab() {
  const run = useCommand();
  const settings = useApp((s) => s.settings);
  const dataset = useApp((s) => s.dataset);
  const w = useApp((s) => s.shown?.width ?? 0);
  const h = useApp((s) => s.shown?.height ?? 0);
  const [tableMsg, setTableMsg] = useState<string | null>(null);
  const size = w && h ? ` — ${boundaryIoUDilation(w, h, settings.biouDilationRatio)} px on this ${w}×${h} frame` : '';
  const tol = w && h ? ` — ${boundaryFTolerance(w, h, settings.bfTolerance).toFixed(2)} px on this frame` : '';
  return (
    <div className="settings" key={`${settings.ignore}-${settings.biouDilationRatio}-${settings.bfTolerance}`}>
      <NumberField
        label="void id"
        value={settings.ignore}
        step={1}
        min={0}
        max={65535}
        note="ground-truth pixels with this id are left out of every score"
        onCommit={(v) => run('settings.set', { ignore: v }) ?? null}
      />
      <NumberField label="Boundary IoU dilation ratio" value={settings.biouDilationRatio} step={0.005} min={0.0001} max={1} note={`of the image diagonal (0.02 is the published default)${size}`} onCommit={(v) => run('settings.set', { biouDilationRatio: v }) ?? null} />
      <NumberField label="Boundary F tolerance" value={settings.bfTolerance} step={0.0025} min={0.0001} max={1} note={`of the image diagonal (0.0075 is the usual default)${tol}`} onCommit={(v) => run('settings.set', { bfTolerance: v }) ?? null} />
      <label className="setting">
        <span>class table</span>
        <span className="file-pick" role="button" tabIndex={0} title="Load another classes.json" onKeyDown={(e) => (e.key === 'Enter' || e.key === ' ') && (e.currentTarget.nextElementSibling as HTMLInputElement | null)?.click()}>
          choose file…
        </span>
        <input
          className="file-hidden"
          type="file"
          accept=".json,application/json"
          onChange={async (e) => {
            const file = e.currentTarget.files?.[0];
            if (!file) return;
            const r = classTableFromText(await file.text(), file.name);
            if (!r.ok) return setTableMsg(r.error);
            setTableMsg(`using ${file.name}: ${r.value.classes.length} classes`);
            run('classes.use', r.value);
          }}
        />
        <span className={tableMsg && !tableMsg.startsWith('using') ? 'bad small' : 'dim small'}>
          {tableMsg ?? (dataset?.table ? `${dataset.table.classes.length} classes from the dataset's classes.json` : 'no classes.json: ids are named by number')}
        </span>
      </label>
      <p className="dim small">Every change cancels the scoring in progress and scores all frames again.</p>
    </div>
  );
}
