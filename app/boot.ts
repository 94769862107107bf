import { demoOptionsCheck, type DemoOptions } from '../src/demo/options.ts';
import { demoSourceOpen } from '../src/data/sources/demoSource.ts';
import type { Result } from '../src/core/result.ts';
import type { LayerSettings } from '../src/core/composite/layerSettings.ts';
import { layerSettingsSel } from '../src/state/selectors.ts';
import type { ScoreReport } from '../src/core/metrics/report.ts';
import { stateReport } from '../src/state/stateReport.ts';
import { suspectsRankedSel } from '../src/state/suspectsRanked.ts';
import type { Suspect } from '../src/core/suspects/suspectQueue.ts';
import { servedResultsFiles } from '../src/data/results/resultsRead.ts';
import { servedSourceOpen } from '../src/data/sources/servedSource.ts';
import { scoringKeep } from '../src/state/scoringRun.ts';
import { paneKeep } from '../src/state/paneKeep.ts';
import { shownKeep } from '../src/state/shownKeep.ts';
import { appStoreCreate, type AppStore } from '../src/state/store.ts';
import { reviewBackendIdb } from '../src/state/reviewBackendIdb.ts';
import { reviewChannelOpen } from '../src/state/reviewChannel.ts';
import { reviewKeep } from '../src/state/reviewKeep.ts';
import { urlViewApply, urlViewDecode, urlViewKeep, type UrlView } from '../src/state/urlState.ts';
import { APP_COMMANDS } from '../src/ui/commands/appCommands.ts';
import { commandRun } from '../src/ui/commands/registry.ts';
import { scorePoolCreate, viewPoolCreate, type ScorePool, type ViewPool } from '../src/workers/scorePool.ts';

/** The running app: its store, worker pools, and the function that stops everything. */
export interface AppRuntime {
  store: AppStore;
  scorePool: ScorePool;
  viewPool: ViewPool;
  /** The JSON report of `run` over the frames scored so far, as the headless scorer writes it. */
  report(run: string): ScoreReport | null;
  /** The Doubts list as ranked now (the queue re-ranked by the verdicts given), with each item's signals. */
  queue(): Suspect[];
  /** What the viewer composes now (the layer looks with the runs, band width and outline put in). */
  layers(): LayerSettings;
  stop(): void;
}

/** Creates the store and pools and starts scoring and frame decoding; opens the served dataset, else the demo. */
export function appStart(): AppRuntime {
  const store = appStoreCreate();
  const scorePool = scorePoolCreate();
  const viewPool = viewPoolCreate();
  const fromUrl = urlViewDecode(location.hash);
  // Flags and verdicts are saved in IndexedDB per dataset as they change, and shared with other tabs.
  const keeper = reviewKeep(store, { backend: reviewBackendIdb(), channel: reviewChannelOpen(), page: window });
  const stops = [scoringKeep(store, scorePool), shownKeep(store, viewPool), urlViewKeep(store), paneKeep(store, localStorage), () => keeper.stop()];
  void datasetOpenInitial(store, fromUrl);
  return {
    store,
    scorePool,
    viewPool,
    report: (run) => stateReport(store.getState(), run),
    queue: () => suspectsRankedSel(store.getState()),
    layers: () => layerSettingsSel(store.getState()),
    stop() {
      for (const s of stops) s();
      scorePool.destroy();
      viewPool.destroy();
    },
  };
}

async function datasetOpenInitial(store: AppStore, fromUrl: UrlView): Promise<void> {
  const s = store.getState();
  s.datasetLoadingSet('Looking for a dataset…');
  try {
    const served = await servedSourceOpen();
    if (served) {
      // npm start -- DATASET --results DIR: its tables are shown at once instead of scoring again.
      const results = await servedResultsFiles();
      if (results) s.storedLoadingSet(`Reading results ${results.title}…`);
      commandRun({ store, viewer: null }, APP_COMMANDS['dataset.open'], served);
      if (fromUrl.dataset === 'served') urlViewApply(store, fromUrl);
      if (results) await commandRun({ store, viewer: null }, APP_COMMANDS['results.open'], results);
      return;
    }
    const demo = demoOptionsFromQuery(new URLSearchParams(location.search));
    if (!demo.ok) {
      s.datasetErrorSet(demo.error);
      return;
    }
    commandRun({ store, viewer: null }, APP_COMMANDS['dataset.open'], demoSourceOpen(demo.value));
    if (fromUrl.dataset === 'demo' || fromUrl.dataset === null) urlViewApply(store, fromUrl);
  } catch (e) {
    s.datasetErrorSet(`Could not open the served dataset: ${(e as Error).message}`);
  }
}

/** Returns the demo's options from `?demo-size=WxH&demo-frames=N&demo-seed=S` (defaults otherwise). */
export function demoOptionsFromQuery(q: URLSearchParams): Result<DemoOptions> {
  const partial: Partial<DemoOptions> = {};
  const size = q.get('demo-size');
  if (size !== null) {
    const m = /^(\d+)x(\d+)$/.exec(size);
    if (!m) return { ok: false, error: `demo-size in the address: expected WIDTHxHEIGHT such as 2048x1024, got "${size}"` };
    partial.width = Number(m[1]);
    partial.height = Number(m[2]);
  }
  if (q.has('demo-frames')) partial.frames = Number(q.get('demo-frames'));
  if (q.has('demo-seed')) partial.seed = Number(q.get('demo-seed'));
  return demoOptionsCheck(partial, 'demo options in the address');
}
