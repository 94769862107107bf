import { demoSourceOpen } from '../data/sources/demoSource.ts';
import { servedSourceOpen } from '../data/sources/servedSource.ts';
import { datasetFromSource, datasetInstall } from '../state/datasetLoad.ts';
import { scoringKeep } from '../state/scoringRun.ts';
import { shownKeep } from '../state/shownKeep.ts';
import { appStoreCreate, type AppStore } from '../state/store.ts';
import { urlViewApply, urlViewDecode, urlViewKeep, type UrlView } from '../state/urlState.ts';
import type { WorkerPool } from '../workers/pool.ts';
import { scorePoolCreate, viewPoolCreate } from '../workers/scorePool.ts';

/** The running app: its store, worker pools, and the function that stops everything. */
export interface AppRuntime {
  store: AppStore;
  scorePool: WorkerPool;
  viewPool: WorkerPool;
  stop(): void;
}

/** Creates the store and pools and starts scoring and frame decoding; opens the served dataset, else the demo. */
export function appStart(): AppRuntime {
  const store = appStoreCreate();
  const scorePool = scorePoolCreate();
  const viewPool = viewPoolCreate();
  const fromUrl = urlViewDecode(location.hash);
  const stops = [scoringKeep(store, scorePool), shownKeep(store, viewPool), urlViewKeep(store)];
  void datasetOpenInitial(store, fromUrl);
  return {
    store,
    scorePool,
    viewPool,
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
      datasetInstall(store, datasetFromSource(served));
      if (fromUrl.dataset === 'served') urlViewApply(store, fromUrl);
      return;
    }
    datasetInstall(store, datasetFromSource(demoSourceOpen()));
    if (fromUrl.dataset === 'demo' || fromUrl.dataset === null) urlViewApply(store, fromUrl);
  } catch (e) {
    s.datasetErrorSet(`Could not open the served dataset: ${(e as Error).message}`);
  }
}
