import { useEffect, useMemo, useRef, useState } from 'react';
import type { TileMode } from '../core/export/tileBoxes.ts';
import type { TilesExportProgress } from '../core/export/tilesExport.ts';
import { flagReasonCounts, flagsSelect } from '../core/review/flagsFilter.ts';
import { reviewTilesExport } from '../state/reviewExport.ts';
import { downloadBlob } from './download.ts';
import { VERDICT_NAMES } from './regionWords.ts';
import { useApp, useAppStore, useViewPool } from './storeContext.tsx';

/** Choose flags and how to cut them, then build the tile ZIP (streamed, with progress and cancel) and download it. */
export function ExportDialog({ onClose, reasonOnly = null }: { onClose: () => void; reasonOnly?: string | null }) {
  const store = useAppStore();
  const pool = useViewPool();
  const flags = useApp((s) => s.reviewFlags);
  const frame = useApp((s) => s.dataset?.pairing.frames[s.frameIndex]?.name ?? '');
  const [which, setWhich] = useState<'all' | 'reason' | 'frame'>(reasonOnly ? 'reason' : 'all');
  const [reason, setReason] = useState(reasonOnly ?? 'label-mistake');
  const [kind, setKind] = useState<'crop' | 'tile'>('crop');
  const [padding, setPadding] = useState(32);
  const [size, setSize] = useState(512);
  const [progress, setProgress] = useState<TilesExportProgress | null>(null);
  const [result, setResult] = useState<string | null>(null);
  const abort = useRef<AbortController | null>(null);
  // Closing the dialog (Esc, or the workspace going away) cancels an export under way.
  useEffect(() => () => abort.current?.abort(), []);
  const counts = useMemo(() => flagReasonCounts(flags), [flags]);
  const chosen = which === 'all' ? flags : which === 'reason' ? flagsSelect(flags, { reasons: [reason] }) : flagsSelect(flags, { frames: [frame] });
  const running = abort.current !== null && progress !== null && result === null;

  const start = async () => {
    const mode: TileMode = kind === 'crop' ? { kind: 'crop', padding } : { kind: 'tile', size };
    const chunks: Uint8Array[] = [];
    const ctl = new AbortController();
    abort.current = ctl;
    setResult(null);
    setProgress({ flagsDone: 0, flagsTotal: chosen.length, tilesDone: 0, failed: 0, frame: null, bytes: 0 });
    const r = await reviewTilesExport(store, pool, {
      flags: chosen,
      mode,
      // Chunks are already compressed entries; the ZIP is assembled once, at the end.
      sink: (chunk, final) => {
        chunks.push(chunk);
        if (final) downloadBlob(`hairline-tiles-${new Date().toISOString().slice(0, 10)}.zip`, new Blob(chunks as BlobPart[], { type: 'application/zip' }));
      },
      onProgress: setProgress,
      signal: ctl.signal,
    });
    abort.current = null;
    if (!r.ok) setResult(r.error);
    else {
      const failed = r.value.manifest.failed.length;
      setResult(`Saved ${r.value.manifest.tiles.length} tiles (${(r.value.bytes / 1e6).toFixed(1)} MB)${failed ? `; ${failed} could not be made — see manifest.json` : ''}.`);
    }
  };

  return (
    <div className="help-backdrop" onClick={() => !running && onClose()}>
      <div className="flag-dialog" role="dialog" aria-label="Export tiles" onClick={(e) => e.stopPropagation()}>
        <h3>Export flagged tiles</h3>
        <div className="reasons">
          <label>
            <input type="radio" checked={which === 'all'} onChange={() => setWhich('all')} /> every flag ({flags.length})
          </label>
          <label>
            <input type="radio" checked={which === 'reason'} onChange={() => setWhich('reason')} /> flags with reason{' '}
            <select value={reason} onChange={(e) => setReason(e.currentTarget.value)}>
              {counts.map((c) => (
                <option key={c.reason} value={c.reason}>
                  {(VERDICT_NAMES as Record<string, string>)[c.reason] ?? c.reason} ({c.count})
                </option>
              ))}
            </select>
          </label>
          <label>
            <input type="radio" checked={which === 'frame'} onChange={() => setWhich('frame')} /> flags of this frame ({frame})
          </label>
        </div>
        <div className="reasons">
          <label>
            <input type="radio" checked={kind === 'crop'} onChange={() => setKind('crop')} /> a crop around each flag with{' '}
            <input type="number" min={0} max={8192} value={padding} onChange={(e) => setPadding(Math.max(0, Math.round(Number(e.currentTarget.value))))} /> px of context
          </label>
          <label>
            <input type="radio" checked={kind === 'tile'} onChange={() => setKind('tile')} /> fixed tiles of{' '}
            <input type="number" min={16} max={8192} value={size} onChange={(e) => setSize(Math.max(16, Math.round(Number(e.currentTarget.value))))} /> px covering each flag
          </label>
        </div>
        <p className="dim small">
          Per tile: the photo crop, the ground-truth and every run's crop as label PNGs with the exact ids (same encoding as the source), each
          also as a preview in the class colours, and an overlay picture; manifest.json and tiles.csv list every tile.
        </p>
        {progress && (
          <p className="small" role="status">
            {progress.flagsDone} / {progress.flagsTotal} flags, {progress.tilesDone} tiles, {(progress.bytes / 1e6).toFixed(1)} MB
            {progress.failed ? `, ${progress.failed} failed` : ''}
            {progress.frame ? ` · ${progress.frame}` : ''}
          </p>
        )}
        {result && <p className="small" data-testid="export-result">{result}</p>}
        <div className="dialog-buttons">
          {running ? (
            <button onClick={() => abort.current?.abort()}>cancel</button>
          ) : (
            <button onClick={onClose}>close</button>
          )}
          <button className="primary" disabled={running || chosen.length === 0} onClick={start}>
            export {chosen.length} flag{chosen.length === 1 ? '' : 's'}
          </button>
        </div>
      </div>
    </div>
  );
}
