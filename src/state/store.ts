import { subscribeWithSelector } from 'zustand/middleware';
import { createStore, type Mutate, type StoreApi } from 'zustand/vanilla';
import { datasetSlice, type DatasetSlice } from './datasetSlice.ts';
import { reviewSlice, type ReviewSlice } from './reviewSlice.ts';
import { scoresSlice, type ScoresSlice } from './scoresSlice.ts';
import { settingsSlice, type SettingsSlice } from './settingsSlice.ts';
import { shownSlice, type ShownSlice } from './shownSlice.ts';
import { storedSlice, type StoredSlice } from './storedSlice.ts';
import { viewSlice, type ViewSlice } from './viewSlice.ts';

/** Everything the app holds: the dataset, score settings, per-frame scores, the view and the review (flags). */
export type AppState = DatasetSlice & SettingsSlice & ScoresSlice & ViewSlice & ShownSlice & ReviewSlice & StoredSlice;
/**
 * The app store: `subscribe(listener)`, and `subscribe(selector, listener, { equalityFn })` to hear
 * only when a selected value changes (zustand's subscribeWithSelector).
 */
export type AppStore = Mutate<StoreApi<AppState>, [['zustand/subscribeWithSelector', never]]>;

/** Returns a new app store combining every slice (usable without React: getState/subscribe). */
export function appStoreCreate(): AppStore {
  return createStore<AppState>()(
    subscribeWithSelector((...a) => ({
      ...datasetSlice(...a),
      ...settingsSlice(...a),
      ...scoresSlice(...a),
      ...viewSlice(...a),
      ...shownSlice(...a),
      ...reviewSlice(...a),
      ...storedSlice(...a),
    })),
  );
}
