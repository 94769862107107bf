import type { DisagreeMode, LayerKey } from '../core/composite/layerSettings.ts';
import { scoringTableSel } from '../state/selectors.ts';
import { commandKeys } from './commands/appCommands.ts';
import { useCommand } from './commands/useCommand.tsx';
import { useApp } from './storeContext.tsx';

type ShownLayer = Exclude<LayerKey, 'highlight'>;
const SHOWN: ShownLayer[] = ['photo', 'truth', 'pred', 'disagree', 'void', 'band', 'compare', 'flicker'];
const NAMES: Record<LayerKey, string> = {
  photo: 'photo',
  truth: 'ground truth',
  pred: 'prediction',
  disagree: 'disagreement',
  void: 'void',
  band: 'band',
  compare: 'fixed / broke',
  flicker: 'flicker',
  highlight: 'outline',
};

function LayerChip({ k }: { k: ShownLayer }) {
  const run = useCommand();
  const layer = useApp((s) => s.layers[k]);
  const disabled = useApp((s) => k === 'compare' && s.runB === null);
  const key = commandKeys(`layer.${k}`)[0];
  const set = (patch: { on?: boolean; opacity?: number }) => run('layer.set', { layer: k, ...patch });
  return (
    <div className={`chip${layer.on ? ' on' : ''}${disabled ? ' disabled' : ''}`} data-layer={k}>
      <label title={disabled ? 'choose a run to compare with first' : `toggle (${key})`}>
        <input type="checkbox" checked={layer.on} disabled={disabled} onChange={(e) => set({ on: e.currentTarget.checked })} />
        {NAMES[k]}
        {key && <kbd>{key}</kbd>}
      </label>
      <input
        type="range"
        min={0}
        max={255}
        value={layer.opacity}
        aria-label={`${NAMES[k]} opacity`}
        title="opacity"
        onChange={(e) => set({ opacity: Number(e.currentTarget.value) })}
      />
    </div>
  );
}

/** The layer switches above the viewer, with per-layer opacity and the cross-layer modes. */
export function LayerBar() {
  const run = useCommand();
  const layers = useApp((s) => s.layers);
  const classes = useApp(scoringTableSel)?.classes ?? [];
  const width = useApp((s) => s.shown?.width ?? 0);
  return (
    <div className="layer-bar">
      {SHOWN.map((k) => (
        <LayerChip key={k} k={k} />
      ))}
      <label className="mini">
        colour by
        <select value={layers.disagree.mode} onChange={(e) => run('layer.colourBy', e.currentTarget.value as DisagreeMode)}>
          <option value="kind">kind of error</option>
          <option value="truth">true class</option>
          <option value="pred">predicted class</option>
        </select>
      </label>
      <label className="mini">
        only
        <select
          value={layers.solo.on ? String(layers.solo.classId) : ''}
          onChange={(e) => run('layer.only', e.currentTarget.value === '' ? null : Number(e.currentTarget.value))}
        >
          <option value="">all classes</option>
          {classes.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </select>
      </label>
      <label className="mini" title="Curtain: ground truth left of it, prediction right (C)">
        <input
          type="checkbox"
          checked={layers.curtain.on}
          onChange={(e) => run('curtain.set', { on: e.currentTarget.checked })}
        />
        curtain
        {layers.curtain.on && (
          <input
            type="range"
            min={0}
            max={width}
            value={layers.curtain.x}
            aria-label="curtain position"
            onChange={(e) => run('curtain.set', { x: Number(e.currentTarget.value) })}
          />
        )}
      </label>
    </div>
  );
}
