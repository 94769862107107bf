import { classTableFromText } from '../core/classTable.ts';
import { frameListParse, pairingListed } from '../data/frameList.ts';
import { LAYOUT_EXPECTED } from '../data/layout.ts';
import { openedOf } from '../data/opened.ts';
import { datasetPair } from '../data/pairing.ts';
import type { DatasetSource } from '../data/sources/source.ts';
import { datasetKey, type LoadedDataset } from './datasetSlice.ts';
import type { AppStore } from './store.ts';

/**
 * Returns the source paired into frames (hairline.json's groups, patterns and list applied), with its
 * class table parsed (or the reason it is unusable) and what was opened. Throws an Error saying what
 * was expected and what was found when no frame pairs, so a folder that is no dataset never opens blank.
 */
export function datasetFromSource(source: DatasetSource): LoadedDataset {
  let pairing = source.paired ?? datasetPair(source.listing, source.pair);
  if (pairing.frames.length === 0) {
    const truth = source.listing.truth.length;
    throw new Error(
      truth === 0
        ? `"${source.title}" has no ground-truth label PNGs: ${LAYOUT_EXPECTED}`
        : `none of the ${truth} ground-truth files of "${source.title}" is a label PNG (${source.listing.truth.slice(0, 3).join(', ')}…)`,
    );
  }
  if (source.listText) {
    const listed = pairingListed(pairing, frameListParse(source.listText), 'list file');
    if (!listed.ok) throw new Error(listed.error);
    pairing = listed.value;
  }
  let table = null;
  let tableError = null;
  if (source.classesText !== null) {
    const r = classTableFromText(source.classesText, 'classes.json');
    if (r.ok) table = r.value;
    else tableError = `${r.error} — ids are shown by number until it is fixed`;
  }
  const warnings: string[] = [];
  if (source.kind !== 'demo' && source.listing.images.length === 0) warnings.push('no photo folder (images/ or photos/): the photo layer and the image evidence are off');
  if (tableError) warnings.push(tableError);
  const opened = { ...openedOf(pairing, table, warnings), how: source.how ?? null };
  return { key: datasetKey(source.title, pairing.frames.map((f) => f.name)), title: source.title, source, pairing, table, tableError, opened };
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
  s.storedSet(null);
  s.datasetSet(dataset);
  store.getState().frameIndexSet(frameIndex);
}
