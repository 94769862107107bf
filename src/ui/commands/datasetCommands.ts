import type { ClassTable } from '../../core/classTable.ts';
import type { ScoreSettings } from '../../core/metrics/settings.ts';
import { scoringTableBuild } from '../../core/scoringTable.ts';
import { demoSourceOpen } from '../../data/sources/demoSource.ts';
import { folderSourceOpen, type PickedFile } from '../../data/sources/folderSource.ts';
import type { DatasetSource } from '../../data/sources/source.ts';
import { pickedResultsFiles, resultsRead, type ResultsFiles } from '../../data/results/resultsRead.ts';
import { datasetFromSource, datasetInstall } from '../../state/datasetLoad.ts';
import { storedInstall } from '../../state/storedResults.ts';
import { cmd, commandTable, type CommandContext } from './registry.ts';

/** Opens `source` as the dataset (frame 0, its void id, a fitted view); scoring starts by itself. */
function datasetOpen({ store }: CommandContext, source: DatasetSource): void {
  datasetInstall(store, datasetFromSource(source));
}

/**
 * Opens picked or dropped files as the dataset (`read` gives null when the user cancelled); a folder
 * that cannot be read or used leaves the current one in place and says why.
 */
async function filesOpen(ctx: CommandContext, read: () => Promise<PickedFile[] | null>): Promise<void> {
  const s = ctx.store.getState();
  let files: PickedFile[] | null;
  try {
    files = await read();
  } catch (e) {
    return s.datasetErrorSet(`Could not read the folder: ${(e as Error).message}`);
  }
  if (files === null) return;
  if (files.length === 0) return s.datasetErrorSet('The folder is empty.');
  // A results folder (summary.json at its top) opens as the results of the dataset on screen.
  const results = s.dataset ? pickedResultsFiles(files) : null;
  if (results) return resultsOpen(ctx, results);
  s.datasetLoadingSet(`Reading ${files.length} files…`);
  try {
    const source = await folderSourceOpen(files);
    const dataset = datasetFromSource(source);
    if (dataset.pairing.frames.length === 0) {
      const why = source.listing.truth.length === 0 ? 'it has no truth/ folder with label PNGs' : 'no ground-truth file could be paired';
      return s.datasetErrorSet(`Could not open "${source.title}": ${why}. Expected images/, truth/, predictions/<run>/ (see the README).`);
    }
    datasetInstall(ctx.store, dataset);
  } catch (e) {
    s.datasetErrorSet(`Could not open the folder: ${(e as Error).message}`);
  }
}

/**
 * Opens a results folder of the dataset on screen: the frame list, timeline, scoreboard, band curve
 * and queue show its tables, nothing is scored again but the frame on screen. A folder of another
 * dataset, or one that cannot be read, leaves everything as it was and says why.
 */
async function resultsOpen({ store }: CommandContext, files: ResultsFiles): Promise<void> {
  const s = store.getState();
  const dataset = s.dataset;
  if (!dataset) return s.storedErrorSet('Open the dataset first, then its results folder.');
  s.storedLoadingSet(`Reading results ${files.title}…`);
  try {
    const stored = await resultsRead(files, { runs: dataset.pairing.runs, frameNames: dataset.pairing.frames.map((f) => f.name) });
    if (store.getState().dataset !== dataset) return;
    storedInstall(store, stored);
  } catch (e) {
    store.getState().storedErrorSet(`Could not open the results: ${(e as Error).message}`);
  } finally {
    store.getState().storedLoadingSet(null);
  }
}

/**
 * Changes score settings; every frame is then scored again. Returns why a change is refused, or null:
 * the void id must be a whole number that is not a class of the dataset's table (scoringTableBuild's rule).
 */
function settingsSet({ store }: CommandContext, patch: Partial<ScoreSettings>): string | null {
  const s = store.getState();
  if (patch.ignore !== undefined) {
    if (!Number.isInteger(patch.ignore)) return 'the void id is a whole number';
    const table = scoringTableBuild(s.dataset?.table ?? null, patch.ignore);
    if (!table.ok) return table.error;
  }
  s.settingsSet(patch);
  return null;
}

const hasDataset = ({ store }: CommandContext) => store.getState().dataset !== null;

/** Opening datasets, the score settings and the class table. */
export const DATASET_COMMANDS = commandTable({
  'dataset.open': cmd<DatasetSource>({ label: 'Open a dataset', group: 'Dataset', keys: [], enabled: () => true, run: datasetOpen }),
  'dataset.openDemo': cmd({ label: 'Open the built-in demo', group: 'Dataset', keys: [], enabled: () => true, run: (ctx) => datasetOpen(ctx, demoSourceOpen()) }),
  'dataset.openFiles': cmd<() => Promise<PickedFile[] | null>, Promise<void>>({ label: 'Open a dataset folder', group: 'Dataset', keys: [], enabled: () => true, run: filesOpen }),
  'dataset.dismissError': cmd({ label: 'Dismiss the message', group: 'Dataset', keys: [], enabled: () => true, run: ({ store }) => store.getState().datasetErrorSet(null) }),
  'results.open': cmd<ResultsFiles, Promise<void>>({ label: 'Open a results folder of the dataset', group: 'Dataset', keys: [], enabled: hasDataset, run: resultsOpen }),
  'results.openFiles': cmd<() => Promise<PickedFile[] | null>, Promise<void>>({
    label: 'Open a results folder of the dataset', group: 'Dataset', keys: [], enabled: hasDataset,
    run: async (ctx, read) => {
      const files = await read().catch((e: Error) => (ctx.store.getState().storedErrorSet(`Could not read the folder: ${e.message}`), null));
      if (files === null) return;
      const results = pickedResultsFiles(files);
      if (!results) return ctx.store.getState().storedErrorSet('That folder is no results folder: it has no summary.json (write one with npm run score -- --results DIR).');
      await resultsOpen(ctx, results);
    },
  }),
  /** Leaves the results folder: every frame is scored in the page with the settings on screen. */
  'results.rescore': cmd({ label: 'Score every frame in the page instead of the results folder', group: 'Dataset', keys: [], enabled: ({ store }) => store.getState().stored !== null, run: ({ store }) => store.getState().storedSet(null) }),
  'results.dismissError': cmd({ label: 'Dismiss the message', group: 'Dataset', keys: [], enabled: () => true, run: ({ store }) => store.getState().storedErrorSet(null) }),
  'settings.set': cmd<Partial<ScoreSettings>, string | null>({ label: 'Change score settings', group: 'Dataset', keys: [], enabled: () => true, run: settingsSet }),
  /** Uses `table` as the dataset's class table (its void id too). */
  'classes.use': cmd<ClassTable>({
    label: 'Use a class table', group: 'Dataset', keys: [], enabled: hasDataset,
    run: ({ store }, table) => {
      const s = store.getState();
      s.settingsSet({ ignore: table.ignore });
      s.datasetSet({ ...s.dataset!, table, tableError: null });
    },
  }),
});
