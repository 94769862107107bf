import { useCallback, useRef, useState } from 'react';
import type { Viewer } from '../view/viewer.ts';
import type { ViewPool } from '../workers/scorePool.ts';
import type { CommandContext } from './commands/registry.ts';
import { LeftPane } from './LeftPane.tsx';
import { ExportDialog } from './ExportDialog.tsx';
import { FlagDialog } from './FlagDialog.tsx';
import { HelpOverlay } from './HelpOverlay.tsx';
import { LayerBar } from './LayerBar.tsx';
import { OpenedNotice } from './OpenedPanel.tsx';
import { ResultsBar } from './ResultsBar.tsx';
import { droppedFiles } from './pickedFiles.ts';
import { Scoreboard } from './Scoreboard.tsx';
import { useApp, useAppStore } from './storeContext.tsx';
import { Timeline } from './Timeline.tsx';
import { TopBar } from './TopBar.tsx';
import { CommandProvider, useCommand, useCommandKeys } from './commands/useCommand.tsx';
import { ViewerPane } from './ViewerPane.tsx';
import { PaneSplitter } from './PaneSplitter.tsx';

function EmptyState() {
  const loading = useApp((s) => s.datasetLoading);
  return (
    <div className="empty">
      <h2>{loading ?? 'No dataset open'}</h2>
      {!loading && (
        <p>
          Drop a dataset folder here (<code>images/</code>, <code>truth/</code>, <code>predictions/&lt;run&gt;/</code>, optional{' '}
          <code>classes.json</code>; other layouts are recognised or described by a <code>hairline.json</code>, see the README
          &ldquo;Your data&rdquo;) or use <b>Open folder…</b>. Nothing leaves this machine.
        </p>
      )}
    </div>
  );
}

/** The inspection workspace: frames on the left, the viewer in the middle, the scoreboard on the right. */
export function Workspace({ viewPool }: { viewPool: ViewPool }) {
  const store = useAppStore();
  const viewer = useRef<Viewer | null>(null);
  const onViewer = useCallback((v: Viewer | null) => (viewer.current = v), []);
  const context = useCallback(
    (): CommandContext => ({
      store,
      viewer: viewer.current && {
        zoomBy: (f: number) => viewer.current!.zoomBy(f),
        fit: () => store.getState().placeSet(null),
        oneToOne: () => viewer.current!.viewOneToOne(),
      },
    }),
    [store],
  );
  return (
    <CommandProvider context={context}>
      <Panes viewPool={viewPool} onViewer={onViewer} />
    </CommandProvider>
  );
}

function Panes({ viewPool, onViewer }: { viewPool: ViewPool; onViewer: (v: Viewer | null) => void }) {
  const run = useCommand();
  const hasDataset = useApp((s) => s.dataset !== null);
  const datasetError = useApp((s) => s.datasetError);
  const [dropping, setDropping] = useState(false);
  const widths = useApp((s) => s.paneWidths);
  const exporting = useApp((s) => (s.dialog === 'export' || s.dialog === 'exportMistakes') && s.dataset !== null);
  const mistakesOnly = useApp((s) => s.dialog === 'exportMistakes');
  useCommandKeys();
  return (
    <div
      className={dropping ? 'workspace dropping' : 'workspace'}
      onDragOver={(e) => {
        if (![...e.dataTransfer.types].includes('Files')) return;
        e.preventDefault();
        setDropping(true);
      }}
      onDragLeave={(e) => e.currentTarget === e.target && setDropping(false)}
      onDrop={async (e) => {
        e.preventDefault();
        setDropping(false);
        const items = e.dataTransfer;
        await run('dataset.openFiles', () => droppedFiles(items));
      }}
    >
      <TopBar />
      {datasetError && (
        <div className="banner bad" role="alert">
          {datasetError}
          <button onClick={() => run('dataset.dismissError')}>dismiss</button>
        </div>
      )}
      <OpenedNotice />
      <ResultsBar />
      {hasDataset ? (
        <div className="panes" style={{ gridTemplateColumns: `min(${widths.left}px, max(180px, calc(100vw - min(${widths.right}px, 40vw) - 280px))) 0 minmax(0, 1fr) 0 min(${widths.right}px, 40vw)` }}>
          <aside className="left">
            <LeftPane />
          </aside>
          <PaneSplitter pane="left" />
          <section className="center">
            <LayerBar />
            <ViewerPane pool={viewPool} onViewer={onViewer} />
          </section>
          <PaneSplitter pane="right" />
          <aside className="right">
            <Scoreboard />
          </aside>
        </div>
      ) : (
        <EmptyState />
      )}
      {hasDataset && <Timeline />}
      <HelpOverlay />
      <FlagDialog />
      {exporting && <ExportDialog key={String(mistakesOnly)} reasonOnly={mistakesOnly ? 'label-mistake' : null} onClose={() => run('dialog.close')} />}
    </div>
  );
}
