import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { OpenFolderButton, OpenResultsButton } from './OpenFolder.tsx';
import { useApp, useAppShallow } from './storeContext.tsx';

const NO_RUNS: string[] = [];

function ScoringProgress() {
  const { done, total, failed, finishedAt } = useAppShallow((s) => ({
    done: s.scoring.done,
    total: s.scoring.total,
    failed: s.scoring.failed,
    finishedAt: s.scoring.finishedAt,
  }));
  const stored = useApp((s) => s.stored?.frames ?? null);
  const reading = useApp((s) => s.storedLoading);
  if (reading) {
    return (
      <div className="progress running" role="status" aria-live="polite">
        <span>{reading}</span>
      </div>
    );
  }
  if (stored !== null) {
    return (
      <div className="progress" role="status" aria-live="polite" data-done={stored} data-total={stored} data-results="">
        <span>{stored.toLocaleString('en')} frames from results</span>
      </div>
    );
  }
  if (total === 0) return null;
  const running = finishedAt === null;
  return (
    <div className={running ? 'progress running' : 'progress'} role="status" aria-live="polite" data-done={done} data-total={total}>
      <div className="progress-bar">
        <div className="progress-fill" style={{ width: `${(done / total) * 100}%` }} />
      </div>
      <span>
        {running ? `scoring ${done} / ${total}` : `scored ${total} frames`}
        {failed ? ` · ${failed} failed` : ''}
      </span>
    </div>
  );
}

function RunPicker({ which }: { which: 'runA' | 'runB' }) {
  const run = useCommand();
  const runs = useApp((s) => s.dataset?.pairing.runs ?? NO_RUNS);
  const value = useApp((s) => s[which]);
  if (runs.length === 0) return null;
  return (
    <label className="run-picker">
      {which === 'runA' ? 'run A' : 'compare with'}
      <select
        value={value ?? ''}
        onChange={(e) => run(which === 'runA' ? 'run.a' : 'run.b', e.currentTarget.value || null)}
      >
        {which === 'runB' && <option value="">(none)</option>}
        {runs.map((r) => (
          <option key={r} value={r}>
            {r}
          </option>
        ))}
      </select>
    </label>
  );
}

/** Goes back to the built-in demo from a folder the user opened. */
function DemoButton() {
  const run = useCommand();
  const isDemo = useApp((s) => s.dataset?.source.kind === 'demo');
  if (isDemo) return null;
  return (
    <button title="Open the built-in Kestrel Quay demo" onClick={() => run('dataset.openDemo')}>
      Demo
    </button>
  );
}

/** The bar across the top: dataset, runs, scoring progress, open and help. */
export function TopBar() {
  const run = useCommand();
  const title = useApp((s) => s.dataset?.title ?? 'no dataset');
  const tableError = useApp((s) => s.dataset?.tableError ?? null);
  const hasDataset = useApp((s) => s.dataset !== null);
  return (
    <header className="top">
      <h1>Hairline</h1>
      <span className="ds-title" title={tableError ?? undefined}>
        {title}
        {tableError && <span className="warn"> · classes.json problem</span>}
      </span>
      <RunPicker which="runA" />
      <RunPicker which="runB" />
      <div className="spacer" />
      <ScoringProgress />
      <DemoButton />
      <OpenFolderButton />
      {hasDataset && <OpenResultsButton />}
      <button onClick={() => run('help')} title={`Keys (${commandKeys('help')[0]})`}>
        ?
      </button>
    </header>
  );
}
