import { LAYER_KEYS } from '../core/composite/layerSettings.ts';
import { LEGEND_SOLO, MARK_LEGEND, type LegendEntry } from '../core/composite/markLegend.ts';
import { markCss } from './markCss.ts';
import { scoringTableSel } from '../state/selectors.ts';
import { useApp } from './storeContext.tsx';

function Swatch({ entry, classColors }: { entry: LegendEntry; classColors: string[] }) {
  const [a, b] = entry.marks.map(markCss);
  const style =
    entry.look === 'stripes' ? { background: `repeating-linear-gradient(135deg, ${a} 0 3px, ${b} 3px 6px)` }
    : entry.look === 'bands' ? { background: `repeating-linear-gradient(180deg, ${a} 0 2px, color-mix(in srgb, ${a} 50%, transparent) 2px 4px)` }
    : entry.look === 'slashes' ? { background: `repeating-linear-gradient(45deg, ${a} 0 3px, color-mix(in srgb, ${a} 50%, transparent) 3px 6px)` }
    : entry.look === 'checks' ? { background: `repeating-conic-gradient(${a} 0 25%, ${b} 0 50%) 0 0 / 6px 6px` }
    : entry.look === 'outline' ? { border: `2px solid ${a}`, background: 'transparent' }
    : entry.look === 'shade' ? { background: a, opacity: 0.6 }
    : entry.look === 'classes' ? { background: `conic-gradient(${classColors.map((c, i) => `${c} 0 ${((i + 1) * 100) / classColors.length}%`).join(', ')})` }
    : { background: a };
  return <span className={`lg-swatch lg-${entry.look}`} style={style} />;
}

/**
 * The legend under the viewer: what each colour of the layers now on means, read from MARK_LEGEND
 * and MARK_COLORS, the compositor's own tables (a layer added there shows here).
 */
export function Legend() {
  const layers = useApp((s) => s.layers);
  const table = useApp(scoringTableSel);
  // A few of the dataset's own class colours stand for "in class colours".
  const classColors = (table?.classes ?? []).slice(0, 4).map((c) => c.color);
  const entries = LAYER_KEYS.filter((k) => layers[k].on && k !== 'photo').flatMap((k) =>
    MARK_LEGEND[k].filter((e) => !e.mode || e.mode === layers.disagree.mode).map((e) => ({ layer: k, e })),
  );
  if (layers.solo.on) entries.push({ layer: 'highlight', e: LEGEND_SOLO });
  if (entries.length === 0) return null;
  return (
    <ul className="legend-strip" aria-label="legend">
      {entries.map(({ layer, e }) => (
        <li key={`${layer}:${e.words}`} data-marks={e.marks.join(' ')}>
          <Swatch entry={e} classColors={classColors.length ? classColors : ['#888']} />
          {e.words}
        </li>
      ))}
    </ul>
  );
}
