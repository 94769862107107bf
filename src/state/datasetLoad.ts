import { classTableFromText } from '../core/classTable.ts';
import { datasetPair } from '../data/pairing.ts';
import type { DatasetSource } from '../data/sources/source.ts';
import { datasetKey, type LoadedDataset } from './datasetSlice.ts';
import type { AppStore } from './store.ts';

/** Returns the source paired into frames, with its class table parsed (or the reason it is unusable). */
export function datasetFromSource(source: DatasetSource): LoadedDataset {
  const pairing = datasetPair(source.listing);
  let table = null;
  let tableError = null;
  if (source.classesText !== null) {
    const r = classTableFromText(source.classesText, 'classes.json');
    if (r.ok) table = r.value;
    else tableError = `${r.error} — ids are shown by number until it is fixed`;
  }
  return { key: datasetKey(source.title, pairing.frames.map((f) => f.name)), title: source.title, source, pairing, table, tableError };
}

/** Puts a dataset in the store: frame 0, the void id of its table, fit view. Scoring restarts by itself. */
export function datasetInstall(store: AppStore, dataset: LoadedDataset, frameIndex = 0): void {
  const s = store.getState();
  if (s.dataset && s.dataset.source !== dataset.source) s.dataset.source.close?.();
  if (dataset.table) s.settingsSet({ ignore: dataset.table.ignore });
  const runs = dataset.pairing.runs;
  store.setState({ frameIndex: 0, place: null });
  s.runsSet({ runA: runs[0] ?? null, runB: null });
  s.layersSet({ curtain: { on: false, x: 0 } });
  s.datasetSet(dataset);
  store.getState().frameIndexSet(frameIndex);
}
