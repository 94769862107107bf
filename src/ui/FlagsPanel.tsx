import { useLayoutEffect, useMemo, useRef, useState, type CSSProperties } from 'react';
import { flagReasonCounts } from '../core/review/flagsFilter.ts';
import type { Flag } from '../core/review/flag.ts';
import { downloadBlob } from './download.ts';
import { VERDICT_NAMES, regionKindName } from './regionWords.ts';
import { useApp, useAppStore } from './storeContext.tsx';
import { useCommand } from './commands/useCommand.tsx';

function reasonName(r: string): string {
  return (VERDICT_NAMES as Record<string, string>)[r] ?? r;
}

/** Height of one row of the list, pixels: rows are all this tall, so only those in view are rendered. */
const ROW_HEIGHT = 78;
/** Rows rendered above and below the visible ones, so a fast scroll shows no gap. */
const ROWS_AROUND = 8;

function FlagRow({ flag, frameIndex, style }: { flag: Flag; frameIndex: number; style: CSSProperties }) {
  const store = useAppStore();
  const [editing, setEditing] = useState(false);
  const [note, setNote] = useState(flag.note);
  const go = () => {
    const s = store.getState();
    if (frameIndex < 0) return;
    if (flag.bbox) s.focusOn(frameIndex, flag.bbox as [number, number, number, number]);
    else s.frameIndexSet(frameIndex);
  };
  return (
    <li className="flag-row" data-flag={flag.id} data-frame={flag.frame} style={style}>
      <div className="fr-head" onClick={go}>
        <b>{flag.frame}</b> <span className={`fr-reason r-${flag.reason}`}>{reasonName(flag.reason)}</span>
        <span className="dim"> {flag.kind === 'frame' ? 'whole frame' : flag.kind === 'rect' ? 'box' : regionKindName(flag.region?.kind)}</span>
        {flag.run && <span className="dim"> · {flag.run}</span>}
      </div>
      {editing ? (
        <div className="fr-edit">
          <textarea value={note} rows={1} onChange={(e) => setNote(e.currentTarget.value)} />
          <button
            onClick={() => {
              store.getState().flagEdit(flag.id, { note });
              setEditing(false);
            }}
          >
            save
          </button>
        </div>
      ) : (
        <p className="fr-note" title={flag.note}>
          {flag.note}
        </p>
      )}
      <div className="fr-actions">
        <select value={flag.reason} aria-label="reason" onChange={(e) => store.getState().flagEdit(flag.id, { reason: e.currentTarget.value })}>
          {['label-mistake', 'model-error', 'unsure', ...(['label-mistake', 'model-error', 'unsure'].includes(flag.reason) ? [] : [flag.reason])].map((r) => (
            <option key={r} value={r}>
              {reasonName(r)}
            </option>
          ))}
        </select>
        <button onClick={() => setEditing(!editing)}>note</button>
        <button onClick={() => store.getState().flagsDelete([flag.id])}>delete</button>
      </div>
    </li>
  );
}

/** Every flag of the dataset: filter by reason, edit, delete, undo/redo, hand over as JSON, export tiles. */
export function FlagsPanel() {
  const store = useAppStore();
  const run = useCommand();
  const flags = useApp((s) => s.reviewFlags);
  const status = useApp((s) => s.reviewStatus);
  const error = useApp((s) => s.reviewError);
  const frames = useApp((s) => s.dataset?.pairing.frames);
  const canUndo = useApp((s) => s.reviewUndoStack.length > 0);
  const canRedo = useApp((s) => s.reviewRedoStack.length > 0);
  const [reason, setReason] = useState('');
  const [message, setMessage] = useState<string | null>(null);
  const file = useRef<HTMLInputElement>(null);
  const indexOf = useMemo(() => new Map((frames ?? []).map((f, i) => [f.name, i])), [frames]);
  const counts = useMemo(() => flagReasonCounts(flags), [flags]);
  const shown = useMemo(() => flags.filter((f) => !reason || f.reason === reason).reverse(), [flags, reason]);
  // Only the rows in view are rendered (a list of 50,000 flags is 50,000 × 78 px of scroll, a few dozen rows of DOM).
  const panel = useRef<HTMLDivElement>(null);
  const list = useRef<HTMLOListElement>(null);
  const [view, setView] = useState({ top: 0, height: 1000 });
  const measure = () => {
    const p = panel.current, l = list.current;
    if (p && l) setView({ top: p.scrollTop - l.offsetTop, height: p.clientHeight });
  };
  useLayoutEffect(measure, [shown.length]);
  const first = Math.max(0, Math.floor(view.top / ROW_HEIGHT) - ROWS_AROUND);
  const last = Math.min(shown.length, Math.ceil((view.top + view.height) / ROW_HEIGHT) + ROWS_AROUND);
  return (
    <div className="flags" ref={panel} onScroll={measure}>
      <div className="flags-bar">
        <select value={reason} onChange={(e) => setReason(e.currentTarget.value)} aria-label="filter flags by reason">
          <option value="">every reason ({flags.length})</option>
          {counts.map((c) => (
            <option key={c.reason} value={c.reason}>
              {reasonName(c.reason)} ({c.count})
            </option>
          ))}
        </select>
        <button disabled={!canUndo} onClick={() => store.getState().reviewUndo()} title="Undo (Ctrl+Z)">
          undo
        </button>
        <button disabled={!canRedo} onClick={() => store.getState().reviewRedo()} title="Redo (Ctrl+Shift+Z)">
          redo
        </button>
      </div>
      <div className="flags-bar">
        <button disabled={flags.length === 0} title="Shift+T" onClick={() => run('dialog.export')}>
          export tiles…
        </button>
        <button
          disabled={flags.length === 0}
          title="Save the flags and verdicts as a JSON file to hand to a colleague"
          onClick={() => downloadBlob('hairline-flags.json', new Blob([store.getState().flagsExportText()], { type: 'application/json' }))}
        >
          save JSON
        </button>
        <button onClick={() => file.current?.click()} title="Merge a flags JSON file (the newer edit of each flag wins)">
          load JSON
        </button>
        <input
          ref={file}
          type="file"
          accept=".json,application/json"
          className="folder-input"
          onChange={async (e) => {
            const input = e.currentTarget;
            const f = input.files?.[0];
            // Cleared at once, so choosing the same file again is a change and loads it again.
            input.value = '';
            if (!f) return;
            const r = store.getState().flagsImport(await f.text(), f.name);
            setMessage(r.ok ? `${f.name}: ${r.value.added.length} added, ${r.value.updated.length} updated, ${r.value.skipped.length} skipped` : r.error);
          }}
        />
      </div>
      {status === 'loading' && <p className="dim small">reading saved flags…</p>}
      {error && <p className="bad small">{error}</p>}
      {message && <p className="small">{message}</p>}
      <p className="dim small">M flags the frame, Shift+M the selected region or queue item; hold Shift and drag on the picture (or press B) to flag a box.</p>
      <ol className="flag-list" ref={list} style={{ height: shown.length * ROW_HEIGHT }} data-count={shown.length}>
        {shown.slice(first, last).map((f, i) => (
          <FlagRow
            key={`${f.id}-${f.updatedAt}`}
            flag={f}
            frameIndex={indexOf.get(f.frame) ?? -1}
            style={{ top: (first + i) * ROW_HEIGHT, height: ROW_HEIGHT }}
          />
        ))}
      </ol>
    </div>
  );
}
