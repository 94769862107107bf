import type { StateCreator } from 'zustand/vanilla';
import { layerSettingsDefault, type LayerSettings } from '../core/composite/layerSettings.ts';
import type { AppState } from './store.ts';

/** Per-frame scores the frame list and timeline can sort and colour by. */
export const FRAME_SCORE_KEYS = ['meanIoU', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels'] as const;
export type FrameScoreKey = (typeof FRAME_SCORE_KEYS)[number];

/** Where the viewer looks: image point at the centre of the canvas and screen pixels per image pixel. */
export interface ViewPlace {
  cx: number;
  cy: number;
  scale: number;
}

export interface ViewSlice {
  /** Index of the frame on screen, in the dataset's natural order. */
  frameIndex: number;
  layers: LayerSettings;
  /** null = fit the frame to the canvas. */
  place: ViewPlace | null;
  /** Score the frame list sorts by and the timeline colours by. */
  frameScore: FrameScoreKey;
  /** Sort direction of the frame list: worst first by default. */
  sortWorstFirst: boolean;
  pixelGrid: boolean;
  helpOpen: boolean;
  /** Stepping through frames by itself at `playRate` frames per second. */
  playing: boolean;
  playRate: number;
  frameIndexSet(index: number): void;
  layersSet(patch: Partial<LayerSettings>): void;
  placeSet(place: ViewPlace | null): void;
  frameScoreSet(key: FrameScoreKey): void;
  sortWorstFirstSet(v: boolean): void;
  pixelGridSet(v: boolean): void;
  helpOpenSet(v: boolean): void;
  playingSet(v: boolean): void;
  playRateSet(fps: number): void;
}

/** Returns the view slice of the app store (what is on screen and how). */
export const viewSlice: StateCreator<AppState, [], [], ViewSlice> = (set, get) => ({
  frameIndex: 0,
  layers: layerSettingsDefault(),
  place: null,
  frameScore: 'meanIoU',
  sortWorstFirst: true,
  pixelGrid: false,
  helpOpen: false,
  playing: false,
  playRate: 4,
  frameIndexSet: (index) => {
    const count = get().dataset?.pairing.frames.length ?? 0;
    const clamped = count === 0 ? 0 : Math.max(0, Math.min(count - 1, Math.round(index)));
    if (clamped !== get().frameIndex) set({ frameIndex: clamped });
  },
  layersSet: (patch) => set({ layers: { ...get().layers, ...patch } }),
  placeSet: (place) => set({ place }),
  frameScoreSet: (frameScore) => set({ frameScore }),
  sortWorstFirstSet: (sortWorstFirst) => set({ sortWorstFirst }),
  pixelGridSet: (pixelGrid) => set({ pixelGrid }),
  helpOpenSet: (helpOpen) => set({ helpOpen }),
  playingSet: (playing) => set({ playing }),
  playRateSet: (fps) => set({ playRate: Math.max(0.5, Math.min(30, fps)) }),
});
