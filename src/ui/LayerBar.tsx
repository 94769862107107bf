import type { DisagreeMode, LayerKey } from '../core/composite/layerSettings.ts';
import { scoringTableSel } from '../state/selectors.ts';
import { APP_COMMANDS } from './commands/appCommands.ts';
import { useApp, useAppStore } from './storeContext.tsx';

const SHOWN: LayerKey[] = ['photo', 'truth', 'pred', 'disagree', 'void', 'band', 'compare'];
const NAMES: Record<LayerKey, string> = {
  photo: 'photo',
  truth: 'ground truth',
  pred: 'prediction',
  disagree: 'disagreement',
  void: 'void',
  band: 'band',
  compare: 'fixed / broke',
  highlight: 'outline',
};

function LayerChip({ k }: { k: LayerKey }) {
  const store = useAppStore();
  const layer = useApp((s) => s.layers[k]);
  const disabled = useApp((s) => k === 'compare' && s.runB === null);
  const key = APP_COMMANDS.find((c) => c.id === `layer.${k}`)?.keys[0];
  const set = (patch: object) => store.getState().layersSet({ [k]: { ...store.getState().layers[k], ...patch } });
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
  const store = useAppStore();
  const layers = useApp((s) => s.layers);
  const classes = useApp(scoringTableSel)?.classes ?? [];
  const width = useApp((s) => s.shown?.width ?? 0);
  const set = store.getState().layersSet;
  return (
    <div className="layer-bar">
      {SHOWN.map((k) => (
        <LayerChip key={k} k={k} />
      ))}
      <label className="mini">
        colour by
        <select value={layers.disagree.mode} onChange={(e) => set({ disagree: { ...layers.disagree, mode: e.currentTarget.value as DisagreeMode } })}>
          <option value="kind">kind of error</option>
          <option value="truth">true class</option>
          <option value="pred">predicted class</option>
        </select>
      </label>
      <label className="mini">
        only
        <select
          value={layers.solo.on ? String(layers.solo.classId) : ''}
          onChange={(e) => {
            const v = e.currentTarget.value;
            set({ solo: { ...layers.solo, on: v !== '', classId: v === '' ? layers.solo.classId : Number(v) } });
          }}
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
          onChange={(e) => {
            const on = e.currentTarget.checked;
            set({
              curtain: { on, x: layers.curtain.x || Math.round(width / 2) },
              truth: { ...layers.truth, on: on || layers.truth.on },
              pred: { ...layers.pred, on: on || layers.pred.on },
            });
          }}
        />
        curtain
        {layers.curtain.on && (
          <input
            type="range"
            min={0}
            max={width}
            value={layers.curtain.x}
            aria-label="curtain position"
            onChange={(e) => set({ curtain: { ...layers.curtain, x: Number(e.currentTarget.value) } })}
          />
        )}
      </label>
    </div>
  );
}
