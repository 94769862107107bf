import { useEffect, useRef, useState } from 'react';
import type { Viewer } from '../view/viewer.ts';
import { viewerCreate } from '../view/viewer.ts';
import { viewerBind } from '../view/viewerBind.ts';
import type { ViewPool } from '../workers/scorePool.ts';
import { VIEW_COMMANDS } from '../workers/viewJobs.ts';
import { BoxDraw } from './BoxDraw.tsx';
import { Legend } from './Legend.tsx';
import { Readout } from './Readout.tsx';
import { useApp, useAppStore } from './storeContext.tsx';

const NO_NOTES: string[] = [];

/** The centre pane: the viewer, a readout under the cursor, and a note when a frame could not be shown. */
export function ViewerPane({ pool, onViewer }: { pool: ViewPool; onViewer: (v: Viewer | null) => void }) {
  const store = useAppStore();
  const host = useRef<HTMLDivElement>(null);
  const [viewer, setViewer] = useState<Viewer | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const [refused, setRefused] = useState<string | null>(null);
  const shownError = useApp((s) => s.shownError);
  const notes = useApp((s) => s.shown?.notes ?? NO_NOTES);
  const loading = useApp((s) => s.dataset !== null && s.shownIndex !== s.frameIndex && s.shownError === null);

  useEffect(() => {
    let made: Viewer | null = null;
    let unbind = () => {};
    let cancelled = false;
    viewerCreate(host.current!, { grid: true }).then(
      (v) => {
        if (cancelled) return v.destroy();
        made = v;
        unbind = viewerBind(store, v, {
          compose: (request) => pool.run(VIEW_COMMANDS.frameComposite, request),
          onRefused: setRefused,
          canvasSize: () => {
            const dpr = window.devicePixelRatio || 1;
            return { width: host.current!.clientWidth * dpr, height: host.current!.clientHeight * dpr };
          },
        });
        setViewer(v);
        onViewer(v);
        (window as unknown as { hairlineViewer?: Viewer }).hairlineViewer = v;
      },
      (e: Error) => setFailure(`The viewer could not start: ${e.message}`),
    );
    return () => {
      cancelled = true;
      unbind();
      made?.destroy();
      onViewer(null);
    };
  }, [store, pool, onViewer]);

  return (
    <div className="viewer-pane">
      <div className="viewer-host" ref={host} data-mode={viewer?.mode ?? 'starting'} />
      {failure && <div className="viewer-note bad">{failure}</div>}
      {refused && <div className="viewer-note bad" role="alert">{refused}</div>}
      {shownError && <div className="viewer-note bad" role="alert">{shownError}</div>}
      {!shownError && notes.length > 0 && <div className="viewer-note">{notes.join(' · ')}</div>}
      {loading && <div className="viewer-loading">decoding…</div>}
      <Legend />
      {viewer && <Readout viewer={viewer} />}
      {viewer && host.current && <BoxDraw host={host.current} viewer={viewer} />}
    </div>
  );
}
