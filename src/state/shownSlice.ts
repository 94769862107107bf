import type { StateCreator } from 'zustand/vanilla';
import type { DecodedFrame } from '../core/decodedFrame.ts';
import type { AppState } from './store.ts';

export interface ShownSlice {
  /** The decoded frame on screen (held by reference: large typed arrays), or null while none is ready. */
  shown: DecodedFrame | null;
  /** Index of `shown` in the dataset. */
  shownIndex: number;
  /** Why the wanted frame could not be decoded, or null. */
  shownError: string | null;
  shownSet(index: number, frame: DecodedFrame | null, error: string | null): void;
}

/** Returns the slice holding the decoded frame on screen. */
export const shownSlice: StateCreator<AppState, [], [], ShownSlice> = (set) => ({
  shown: null,
  shownIndex: -1,
  shownError: null,
  shownSet: (shownIndex, shown, shownError) => set({ shownIndex, shown, shownError }),
});
