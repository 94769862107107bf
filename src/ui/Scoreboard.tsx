import { useState } from 'react';

import { BandCurve } from './BandCurve.tsx';
import { CompareTab } from './CompareTab.tsx';
import { ConfusionMap } from './ConfusionMap.tsx';
import { ObjectsTab } from './ObjectsTab.tsx';
import { RegionsTab } from './RegionsTab.tsx';
import { SettingsTab } from './SettingsTab.tsx';
import { pct } from './format.ts';
import type { ScopeScores } from '../state/scopeScores.ts';
import { classInfoSel, scopesASel, scopesBSel, shownRunSel } from '../state/selectors.ts';
import { BAND_WIDTH_MAX } from '../core/metrics/bandHistogram.ts';
import { SMALL_OBJECT_AREA } from '../core/objects/objectsBySize.ts';
import { extrasASel } from '../state/extrasScores.ts';
import { useCommand } from './commands/useCommand.tsx';
import type { ClassMeasure } from '../state/classFrames.ts';
import { FramePlots } from './FramePlots.tsx';
import { useApp } from './storeContext.tsx';

const TABS = ['scores', 'regions', 'objects', 'confusion', 'band', 'compare', 'settings'] as const;
type Tab = (typeof TABS)[number];
const TAB_NAMES: Record<Tab, string> = {
  scores: 'Scores', regions: 'Regions', objects: 'Objects', confusion: 'Confusion', band: 'Band', compare: 'A / B', settings: 'Settings',
};

function Headline({ label, d, f, digits, title }: { label: string; d: number | null | undefined; f: number | null | undefined; digits?: number; title?: string }) {
  return (
    <tr title={title}>
      <th>{label}</th>
      <td data-scope="dataset">{pct(d, digits)}</td>
      <td data-scope="frame">{pct(f, digits)}</td>
    </tr>
  );
}

function ScoresTab({ dataset, frame, w }: { dataset: ScopeScores | null; frame: ScopeScores | null; w: number }) {
  const extras = useApp(extrasASel);
  const rows = dataset?.rows ?? frame?.rows ?? [];
  const frameRow = new Map((frame?.rows ?? []).map((r) => [r.id, r]));
  const command = useCommand();
  const sortedBy = useApp((s) => s.frameClass);
  const pickCls = (id: number, m: ClassMeasure) => `pickable${sortedBy?.classId === id && sortedBy.measure === m ? ' picked' : ''}`;
  return (
    <>
      <table className="headline" data-testid="headline">
        <thead>
          <tr>
            <th />
            <th>dataset</th>
            <th>this frame</th>
          </tr>
        </thead>
        <tbody>
          <Headline label="mean IoU" d={dataset?.meanIoU} f={frame?.meanIoU} />
          <Headline label="pixel accuracy" d={dataset?.pixelAccuracy} f={frame?.pixelAccuracy} />
          <Headline label="mean class accuracy" d={dataset?.meanAccuracy} f={frame?.meanAccuracy} />
          <Headline label="freq.-weighted IoU" d={dataset?.fwIoU} f={frame?.fwIoU} />
          <Headline label={`band IoU at ${w} px`} d={dataset?.bandIoU} f={frame?.bandIoU} />
          <Headline label="Boundary IoU" d={dataset?.boundaryIoU} f={frame?.boundaryIoU} />
          <Headline label="Boundary F" d={dataset?.boundaryF} f={frame?.boundaryF} />
          <Headline label="mean of frame mIoU" d={dataset?.frameMeanIoU} f={null} />
          <Headline
            label="flip-back"
            d={extras.dataset?.flipBack}
            f={extras.frame?.flipBack}
            digits={2}
            title="Share of non-void pixels whose prediction changes at a frame and changes back at the next (lower is steadier)"
          />
          <Headline label="flip-back, void" d={extras.dataset?.flipBackVoid} f={extras.frame?.flipBackVoid} digits={2} title="The same over void ground truth" />
          <Headline
            label="small-object recall"
            d={extras.dataset?.smallObjectRecall}
            f={extras.frame?.smallObjectRecall}
            title={`Mean recall of ground-truth objects under ${SMALL_OBJECT_AREA} pixels (Objects tab: by size)`}
          />
          {extras.dataset?.iIoU && <Headline label="iIoU" d={extras.dataset.iIoU.mean} f={null} title="Instance-weighted IoU over the thing classes with instance maps" />}
        </tbody>
      </table>
      <table className="classes" data-testid="class-table">
        <thead>
          <tr>
            <th>class</th>
            <th title="IoU, dataset / this frame (%)">IoU</th>
            <th title={`IoU inside the ${w}-pixel boundary band (%)`}>band {w}</th>
            <th title="Boundary IoU (%)">BIoU</th>
            <th title="Boundary F (%)">BF</th>
            <th title="Share of valid ground-truth pixels (%)">share</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const fr = frameRow.get(r.id);
            return (
              <tr key={r.id} data-class={r.id} className={sortedBy?.classId === r.id ? 'class-sorted' : undefined}>
                <td>
                  <button className="class-pick" title={`Sort frames by ${r.name}'s IoU and show its worst region (again or Shift+click: next measure; I / Shift+I)`} onClick={(e) => command('frames.byClass', e.shiftKey ? { classId: r.id } : sortedBy?.classId === r.id ? { classId: r.id } : { classId: r.id, measure: 'iou' })}>
                    <span className="swatch" style={{ background: r.color }} /> {r.name}
                  </button>
                </td>
                <td className={pickCls(r.id, 'iou')} title={`Sort frames by ${r.name}'s IoU`} onClick={() => command('frames.byClass', { classId: r.id, measure: 'iou' })}>
                  {pct(r.iou)} <span className="dim">{pct(fr?.iou)}</span>
                </td>
                <td className={pickCls(r.id, 'band')} title={`Sort frames by ${r.name}'s band IoU at ${w} px`} onClick={() => command('frames.byClass', { classId: r.id, measure: 'band' })}>
                  {pct(r.bandIoU)} <span className="dim">{pct(fr?.bandIoU)}</span>
                </td>
                <td className={pickCls(r.id, 'biou')} title={`Sort frames by ${r.name}'s Boundary IoU`} onClick={() => command('frames.byClass', { classId: r.id, measure: 'biou' })}>
                  {pct(r.boundaryIoU)} <span className="dim">{pct(fr?.boundaryIoU)}</span>
                </td>
                <td>
                  {pct(r.boundaryF)} <span className="dim">{pct(fr?.boundaryF)}</span>
                </td>
                <td>{pct(r.share)}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="dim small">Each cell: dataset, then this frame in gray. Dataset scores sum pixels over all frames; Boundary F is the mean over frames. Click a class (or its IoU, band or BIoU cell) to sort the frames by it.</p>
      <FramePlots />
    </>
  );
}

/** The scoreboard: dataset and current frame side by side, for run A (and run B on the band curve). */
export function Scoreboard() {
  const command = useCommand();
  const [tab, setTab] = useState<Tab>('scores');
  const run = useApp(shownRunSel);
  const runB = useApp((s) => s.runB);
  const w = useApp((s) => s.bandWidth);
  const { dataset, frame } = useApp(scopesASel);
  const classes = useApp(classInfoSel);
  const scopesB = useApp(scopesBSel);
  return (
    <div className="scoreboard">
      <div className="tabs" role="tablist">
        {TABS.map((t) => (
          <button key={t} role="tab" aria-selected={tab === t} className={tab === t ? 'tab on' : 'tab'} onClick={() => setTab(t)}>
            {TAB_NAMES[t]}
          </button>
        ))}
      </div>
      <div className="band-slider">
        <label>
          band width <b data-testid="band-width">{w}</b> px
          <input
            type="range"
            min={0}
            max={BAND_WIDTH_MAX}
            value={w}
            aria-label="band width"
            onChange={(e) => command('band.width', Number(e.currentTarget.value))}
          />
        </label>
        <button
          disabled={!run}
          title="Save the scores of run A as the same JSON report the headless scorer writes (Shift+D)"
          onClick={() => command('report.save')}
        >
          save report
        </button>
      </div>
      <div className="tab-body">
        {tab === 'scores' && <ScoresTab dataset={dataset} frame={frame} w={w} />}
        {tab === 'confusion' && <ConfusionMap dataset={dataset} frame={frame} classes={classes} run={run} />}
        {tab === 'band' && <BandCurve runA={run} runB={runB} a={dataset} aFrame={frame} b={scopesB.dataset} w={w} />}
        {tab === 'compare' && <CompareTab runA={run} runB={runB} />}
        {tab === 'settings' && <SettingsTab />}
        {tab === 'regions' && <RegionsTab />}
        {tab === 'objects' && <ObjectsTab />}
      </div>
    </div>
  );
}
