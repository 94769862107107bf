import { useMemo, useState } from 'react';
import { REGION_KINDS } from '../core/regions/regionTypes.ts';
import { REVIEW_JUDGEMENTS, suspectRefOf } from '../core/review/judgement.ts';
import { suspectKey } from '../core/review/verdict.ts';
import { classNameSel } from '../state/selectors.ts';
import { suspectsRankedSel } from '../state/suspectsRanked.ts';
import { KIND_NAMES, VERDICT_NAMES } from './regionWords.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';
import { Thumb } from './Thumb.tsx';

/** Key hints read from the registry: "Q / Shift+Q step through; L, E, U judge." */
const STEP_KEYS = `${commandKeys('queue.next')[0]} / ${commandKeys('queue.prev')[0]}`;
const JUDGE_KEYS = REVIEW_JUDGEMENTS.map((v) => commandKeys(`verdict.${v}`)[0]).join(', ');
const FLAG_KEY = commandKeys('flag.selected')[0];

/** The dataset-wide "likely label mistakes" queue: filter, thumbnails, reasons, verdicts; click to inspect. */
export function QueuePanel() {
  const run = useCommand();
  const dataset = useApp((s) => s.dataset);
  const verdicts = useApp((s) => s.reviewVerdicts);
  const selected = useApp((s) => s.queueSelected);
  const [kind, setKind] = useState('');
  const [pair, setPair] = useState('');
  const [runFilter, setRunFilter] = useState('');
  const [hideJudged, setHideJudged] = useState(false);
  const queue = useApp(suspectsRankedSel);
  const name = useApp(classNameSel);
  const pairs = useMemo(() => [...new Set(queue.map((q) => `${q.truthClass}>${q.predictedClass}`))], [queue]);
  const shown = queue.filter(
    (q) =>
      (!kind || q.kind === kind) &&
      (!pair || `${q.truthClass}>${q.predictedClass}` === pair) &&
      (!runFilter || q.run === runFilter || q.alsoRuns.includes(runFilter)) &&
      (!hideJudged || !verdicts[suspectKey(suspectRefOf(q))]),
  );
  const frames = dataset?.pairing.frames ?? [];
  if (!dataset) return null;
  return (
    <div className="queue">
      <div className="queue-filters">
        <select value={kind} onChange={(e) => setKind(e.currentTarget.value)} aria-label="filter by kind">
          <option value="">every kind</option>
          {REGION_KINDS.map((k) => (
            <option key={k} value={k}>
              {KIND_NAMES[k]}
            </option>
          ))}
        </select>
        <select value={pair} onChange={(e) => setPair(e.currentTarget.value)} aria-label="filter by class pair">
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
        <select value={runFilter} onChange={(e) => setRunFilter(e.currentTarget.value)} aria-label="filter by run">
          <option value="">every run</option>
          {dataset.pairing.runs.map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </select>
        <label className="mini">
          <input type="checkbox" checked={hideJudged} onChange={(e) => setHideJudged(e.currentTarget.checked)} /> hide judged
        </label>
      </div>
      <p className="dim small">
        {shown.length} of {queue.length} likely label mistakes, most likely first. {STEP_KEYS} step through; {JUDGE_KEYS} judge.
      </p>
      <ol className="queue-list">
        {shown.slice(0, 200).map((q) => {
          const key = suspectKey(suspectRefOf(q));
          const verdict = verdicts[key]?.verdict;
          return (
            <li
              key={key}
              className={`queue-item${selected === key ? ' selected' : ''}`}
              data-frame={q.frame}
              onClick={() => run('queue.select', q)}
            >
              <Thumb source={dataset.source} image={frames[q.frameIndex]?.image ?? null} bbox={q.bbox} />
              <div className="qi-body">
                <div className="qi-head">
                  <b>{q.frame}</b> <span className="qi-kind">{KIND_NAMES[q.kind]}</span> <span className="qi-score">{(q.score * 100).toFixed(0)}</span>
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
