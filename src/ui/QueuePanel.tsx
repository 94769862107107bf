import { useEffect, useMemo, useRef } from 'react';
import { REGION_KINDS } from '../core/regions/regionTypes.ts';
import { REVIEW_JUDGEMENTS, suspectRefOf } from '../core/review/judgement.ts';
import { suspectKey } from '../core/review/verdict.ts';
import { classNameSel } from '../state/selectors.ts';
import { queueShownSel, reviewProgressSel, suspectPairOf } from '../state/queueShown.ts';
import { QUEUE_SORTS, QUEUE_VERDICT_FILTERS, type QueueSort, type QueueVerdictFilter } from '../state/queueView.ts';
import { suspectsRankedSel } from '../state/suspectsRanked.ts';
import { KIND_NAMES, VERDICT_NAMES } from './regionWords.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';
import { Thumb } from './Thumb.tsx';
import { SignalLegend, SignalStrip } from './SignalStrip.tsx';

/** Key hints read from the registry: "Q / Shift+Q step through; L, E, U judge." */
const STEP_KEYS = `${commandKeys('queue.next')[0]} / ${commandKeys('queue.prev')[0]}`;
const JUDGE_KEYS = REVIEW_JUDGEMENTS.map((v) => commandKeys(`verdict.${v}`)[0]).join(', ');
const FLAG_KEY = commandKeys('flag.selected')[0];

const LIST_MAX = 200;

const VERDICT_FILTER_NAMES: Record<QueueVerdictFilter, string> = {
  all: 'every verdict', unjudged: 'not judged yet', ...VERDICT_NAMES,
};
const SORT_NAMES: Record<QueueSort, string> = { rank: 'most likely first', 'score-high': 'score, high first', 'score-low': 'score, low first' };

/** The dataset-wide "likely label mistakes" queue: filter, thumbnails, reasons, verdicts; click to inspect. */
export function QueuePanel() {
  const run = useCommand();
  const dataset = useApp((s) => s.dataset);
  const verdicts = useApp((s) => s.reviewVerdicts);
  const selected = useApp((s) => s.queueSelected);
  const view = useApp((s) => s.queueView);
  const queue = useApp(suspectsRankedSel);
  const shown = useApp(queueShownSel);
  const progress = useApp(reviewProgressSel);
  const name = useApp(classNameSel);
  const pairs = useMemo(() => [...new Set(queue.map(suspectPairOf))], [queue]);
  const list = useRef<HTMLOListElement>(null);
  // At most LIST_MAX items are drawn: a window of the list that holds the selected item.
  const at = selected ? shown.findIndex((q) => suspectKey(suspectRefOf(q)) === selected) : -1;
  const windowStart = at < LIST_MAX ? 0 : Math.min(at - LIST_MAX / 2, shown.length - LIST_MAX);
  // The selected item (Q, Shift+Q, a click) is always scrolled into view.
  useEffect(() => {
    if (!selected || !list.current) return;
    const el = [...list.current.children].find((c) => (c as HTMLElement).dataset.key === selected);
    el?.scrollIntoView({ block: 'nearest' });
  }, [selected, shown]);
  const frames = dataset?.pairing.frames ?? [];
  if (!dataset) return null;
  return (
    <div className="queue">
      <p className="queue-progress" data-testid="review-progress">
        judged <b>{progress.judged}</b> of {progress.total}
        {REVIEW_JUDGEMENTS.map((v) => (
          <span key={v} className={`qp-verdict v-${v}`}>
            {VERDICT_NAMES[v]} {progress.byVerdict[v]}
          </span>
        ))}
        <button className="qp-export" disabled={progress.byVerdict['label-mistake'] === 0} title={`Flag every item judged a label mistake (region, reasons, score) and export their tiles (${commandKeys('verdicts.export')[0]})`} onClick={() => run('verdicts.export')}>
          export label mistakes…
        </button>
      </p>
      <div className="queue-filters">
        <select value={view.verdict} onChange={(e) => run('queue.view', { verdict: e.currentTarget.value as QueueVerdictFilter })} aria-label="filter by verdict">
          {QUEUE_VERDICT_FILTERS.map((v) => (
            <option key={v} value={v}>
              {VERDICT_FILTER_NAMES[v]}
            </option>
          ))}
        </select>
        <select value={view.sort} onChange={(e) => run('queue.view', { sort: e.currentTarget.value as QueueSort })} aria-label="order">
          {QUEUE_SORTS.map((v) => (
            <option key={v} value={v}>
              {SORT_NAMES[v]}
            </option>
          ))}
        </select>
        <select value={view.kind} onChange={(e) => run('queue.view', { kind: e.currentTarget.value })} aria-label="filter by kind">
          <option value="">every kind</option>
          {REGION_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_NAMES[k]}
            </option>
          ))}
        </select>
        <select value={view.pair} onChange={(e) => run('queue.view', { pair: e.currentTarget.value })} aria-label="filter by class pair">
          <option value="">every class pair</option>
          {pairs.map((p) => {
            const [g, q] = p.split('>');
            return (
              <option key={p} value={p}>
                {name(Number(g))} → {q === 'null' ? 'not a class' : name(Number(q))}
              </option>
            );
          })}
        </select>
        <select value={view.run} onChange={(e) => run('queue.view', { run: e.currentTarget.value })} aria-label="filter by run">
          <option value="">every run</option>
          {dataset.pairing.runs.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
      </div>
      <p className="dim small">
        {shown.length} of {queue.length} shown{shown.length > LIST_MAX ? ` (${windowStart + 1}–${Math.min(shown.length, windowStart + LIST_MAX)} listed)` : ''}. {STEP_KEYS} step through; {JUDGE_KEYS} judge.
      </p>
      <SignalLegend />
      <ol className="queue-list" ref={list}>
        {shown.slice(windowStart, windowStart + LIST_MAX).map((q) => {
          const key = suspectKey(suspectRefOf(q));
          const verdict = verdicts[key]?.verdict;
          return (
            <li
              key={key}
              className={`queue-item${selected === key ? ' selected' : ''}`}
              data-frame={q.frame}
              data-key={key}
              onClick={() => run('queue.select', q)}
            >
              <Thumb source={dataset.source} image={frames[q.frameIndex]?.image ?? null} bbox={q.bbox} />
              <div className="qi-body">
                <div className="qi-head">
                  <b className="qi-frame">{q.frame}</b> <span className="qi-kind">{KIND_NAMES[q.kind]}</span>
                  <span className="qi-score" title="How likely a label mistake, 0..100">{(q.score * 100).toFixed(0)}</span>
                </div>
                <div className="qi-pair">
                  label <b>{name(q.truthClass)}</b>, {q.run}
                  {q.alsoRuns.length ? ` and ${q.alsoRuns.join(', ')}` : ''} say <b>{name(q.predictedClass)}</b>
                </div>
                {q.learnedReason && <div className="qi-learned">{q.learnedReason}</div>}
                <ul className="qi-reasons">
                  {q.reasons.slice(0, 3).map((r, i) => (
                    <li key={i}>{r}</li>
                  ))}
                </ul>
                <SignalStrip signals={q.signals} parts={q.contributions} />
                <div className="qi-parts" title="What each signal added to the score (score = 0.5 + these)">
                  {q.contributionsText}
                </div>
                <div className="qi-verdicts" onClick={(e) => e.stopPropagation()}>
                  {REVIEW_JUDGEMENTS.map((v) => (
                    <button key={v} className={verdict === v ? `on v-${v}` : ''} title={`${VERDICT_NAMES[v]} (${commandKeys(`verdict.${v}`)[0]} on the selected item)`} onClick={() => run('verdict.toggle', { item: q, verdict: v })}>
                      {VERDICT_NAMES[v]}
                    </button>
                  ))}
                  <button
                    title={`Flag this region for relabelling (${FLAG_KEY})`}
                    onClick={() => run('flag.item', q)}
                  >
                    flag…
                  </button>
                </div>
              </div>
            </li>
          );
        })}
      </ol>
    </div>
  );
}
