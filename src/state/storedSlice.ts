import type { StateCreator } from 'zustand/vanilla';
import type { StoredResults } from '../data/results/resultsRead.ts';
import type { AppState } from './store.ts';

/** A results folder opened with the dataset: its scores are shown instead of scoring every frame again. */
export interface StoredSlice {
  stored: StoredResults | null;
  /** Why the last results folder could not be opened, or null. */
  storedError: string | null;
  /** What is being read while a results folder opens (nothing is scored meanwhile), or null. */
  storedLoading: string | null;
  storedSet(stored: StoredResults | null): void;
  storedErrorSet(message: string | null): void;
  storedLoadingSet(message: string | null): void;
}

/** Returns the stored-results slice of the app store. */
export const storedSlice: StateCreator<AppState, [], [], StoredSlice> = (set) => ({
  stored: null,
  storedError: null,
  storedLoading: null,
  storedSet: (stored) => set({ stored, storedError: null }),
  storedErrorSet: (storedError) => set({ storedError, storedLoading: null }),
  storedLoadingSet: (storedLoading) => set({ storedLoading }),
});
