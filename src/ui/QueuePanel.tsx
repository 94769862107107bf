import { useMemo, useState } from 'react';
import { REGION_KINDS } from '../core/regions/regionTypes.ts';
import { suspectKey, type SuspectVerdictKind } from '../core/review/verdict.ts';
import type { Suspect } from '../core/suspects/suspectQueue.ts';
import { classNameSel } from '../state/selectors.ts';
import { suspectsRankedSel } from '../state/suspectsRanked.ts';
import { KIND_NAMES, VERDICT_NAMES } from './regionWords.ts';
import { useApp, useAppStore } from './storeContext.tsx';
import { Thumb } from './Thumb.tsx';

/** Returns the verdict identity of a queue item (the same item keeps its key when the queue is rebuilt). */
function suspectRefOf(s: Suspect) {
  return { frame: s.frame, run: s.run, bbox: s.bbox, truthClass: s.truthClass, predictedClass: s.predictedClass };
}

/** The dataset-wide "likely label mistakes" queue: filter, thumbnails, reasons, verdicts; click to inspect. */
export function QueuePanel() {
  const store = useAppStore();
  const dataset = useApp((s) => s.dataset);
  const verdicts = useApp((s) => s.reviewVerdicts);
  const selected = useApp((s) => s.queueSelected);
  const [kind, setKind] = useState('');
  const [pair, setPair] = useState('');
  const [run, setRun] = useState('');
  const [hideJudged, setHideJudged] = useState(false);
  const queue = useApp(suspectsRankedSel);
  const name = useApp(classNameSel);
  const pairs = useMemo(() => [...new Set(queue.map((q) => `${q.truthClass}>${q.predictedClass}`))], [queue]);
  const shown = queue.filter(
    (q) =>
      (!kind || q.kind === kind) &&
      (!pair || `${q.truthClass}>${q.predictedClass}` === pair) &&
      (!run || q.run === run || q.alsoRuns.includes(run)) &&
      (!hideJudged || !verdicts[suspectKey(suspectRefOf(q))]),
  );
  const frames = dataset?.pairing.frames ?? [];
  const setVerdict = (q: Suspect, v: SuspectVerdictKind) => {
    const key = suspectKey(suspectRefOf(q));
    const cur = store.getState().reviewVerdicts[key]?.verdict;
    store.getState().verdictSet(suspectRefOf(q), cur === v ? null : v);
  };
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
        <select value={run} onChange={(e) => setRun(e.currentTarget.value)} aria-label="filter by run">
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
        {shown.length} of {queue.length} likely label mistakes, most likely first. Q / Shift+Q step through; L, E, U judge.
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
              onClick={() => store.getState().queueSelect(key, q.frameIndex, q.bbox)}
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
                  {(['label-mistake', 'model-error', 'unsure'] as const).map((v) => (
                    <button key={v} className={verdict === v ? `on v-${v}` : ''} onClick={() => setVerdict(q, v)}>
                      {VERDICT_NAMES[v]}
                    </button>
                  ))}
                  <button
                    title="Flag this region for relabelling (Shift+M)"
                    onClick={() =>
                      store.getState().flagDraftSet({
                        frame: q.frame, kind: 'region', bbox: q.bbox, reason: verdict ?? 'label-mistake', run: q.run,
                        region: { kind: q.kind, truthClass: q.truthClass, predictedClass: q.predictedClass, score: q.score, reasons: q.reasons },
                      })
                    }
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
