import type { StateCreator } from 'zustand/vanilla';
import type { FrameAround } from '../core/composite/compositeFrame.ts';
import type { DecodedFrame } from '../core/decodedFrame.ts';
import type { AppState } from './store.ts';

export interface ShownSlice {
  /** The decoded frame on screen (held by reference: large typed arrays), or null while none is ready. */
  shown: DecodedFrame | null;
  /** Index of `shown` in the dataset. */
  shownIndex: number;
  /** Why the wanted frame could not be decoded, or null. */
  shownError: string | null;
  /**
   * Every run's predictions at the previous and next frame of `shown`'s sequence (for the flicker
   * layer), once both are decoded; null at a sequence end or until then.
   */
  shownAround: FrameAround | null;
  /** The frames next to `shown` (after, before), once decoded: the viewer uploads their textures ahead of the key press. */
  shownNearby: DecodedFrame[];
  shownSet(index: number, frame: DecodedFrame | null, error: string | null): void;
  /** Sets the neighbours of the frame at `index`; ignored when another frame is shown by then. */
  shownAroundSet(index: number, around: FrameAround | null): void;
  /** Sets the decoded frames next to the frame at `index`; ignored when another frame is shown by then. */
  shownNearbySet(index: number, frames: DecodedFrame[]): void;
}

/** Returns the slice holding the decoded frame on screen. */
export const shownSlice: StateCreator<AppState, [], [], ShownSlice> = (set, get) => ({
  shown: null,
  shownIndex: -1,
  shownError: null,
  shownAround: null,
  shownNearby: [],
  shownSet: (shownIndex, shown, shownError) => set({ shownIndex, shown, shownError, shownAround: null }),
  shownAroundSet: (index, shownAround) => {
    if (get().shownIndex === index && get().shown) set({ shownAround });
  },
  shownNearbySet: (index, shownNearby) => {
    if (get().shownIndex === index) set({ shownNearby });
  },
});
