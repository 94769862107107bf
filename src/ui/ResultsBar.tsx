import type { FrameSummary } from '../core/metrics/frameSummary.ts';
import { liveCheckSel, storedStaleSel } from '../state/selectors.ts';
import { RESCORE_IN_PAGE_MAX, storedRescoreCommand } from '../state/storedResults.ts';
import { countShort, pct } from './format.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

const WORDS: Record<keyof FrameSummary, string> = {
  meanIoU: 'mIoU', pixelAccuracy: 'pixel acc.', bandIoU: 'band 3', boundaryIoU: 'BIoU', boundaryF: 'BF', errorPixels: 'wrong px', validPixels: 'valid px',
};
const shown = (k: keyof FrameSummary, v: number | null) => (v === null ? '—' : k === 'errorPixels' || k === 'validPixels' ? countShort(v) : pct(v));

/** The line under the top bar while a results folder is open: what it holds, the live check of the frame on screen, stale scores. */
export function ResultsBar() {
  const run = useCommand();
  const stored = useApp((s) => s.stored);
  const error = useApp((s) => s.storedError);
  const stale = useApp(storedStaleSel);
  const check = useApp(liveCheckSel);
  const settings = useApp((s) => s.settings);
  const title = useApp((s) => s.dataset?.title ?? '');
  if (error) {
    return (
      <div className="banner bad" role="alert">
        {error}
        <button onClick={() => run('results.dismissError')}>dismiss</button>
      </div>
    );
  }
  if (!stored) return null;
  return (
    <div className={`results-bar${stale.length ? ' stale' : ''}`} data-results-frames={stored.frames}>
      <span>
        Scores of <b>{stored.frames.toLocaleString('en')}</b> frames from results <b>{stored.title}</b> (not scored again; the frame on screen is scored live
        {check?.state === 'pending' ? ', checking…' : ''}
        {check?.state === 'match' ? ' and matches its stored row' : ''}
        {check?.state === 'failed' ? `, but failed now: ${check.error}` : ''}).
      </span>
      {check?.state === 'mismatch' && (
        <span className="rb-mismatch" role="alert" data-mismatch="">
          This frame differs from its stored row{stale.length ? ' (the settings changed)' : ' (its files changed since the results were written?)'}:{' '}
          {check.diffs.map((d) => `${WORDS[d.key]} stored ${shown(d.key, d.stored)}, now ${shown(d.key, d.live)}`).join('; ')}
        </span>
      )}
      {stale.length > 0 && (
        <span className="rb-stale" data-stale="">
          Stored scores are stale: {stale.join(', ')}.{' '}
          {stored.frames <= RESCORE_IN_PAGE_MAX ? (
            <button onClick={() => run('results.rescore')}>re-score {stored.frames} frames here</button>
          ) : (
            <>
              Too many frames to score in the page; score them headless: <code className="rb-command">{storedRescoreCommand(title, stored, settings)}</code>{' '}
              <button onClick={() => run('results.rescore')} title="Score every frame in this page anyway (slow for this many frames)">score here anyway</button>
            </>
          )}
        </span>
      )}
    </div>
  );
}
