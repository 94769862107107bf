import type { StateCreator } from 'zustand/vanilla';
import { layerLooksDefault, type LayerLooks } from '../core/composite/layerSettings.ts';
import type { AppState } from './store.ts';
import type { FrameClassSort } from './classFrames.ts';
import type { FlagInput } from './reviewSlice.ts';
import { QUEUE_VIEW_DEFAULT, type QueueView } from './queueView.ts';

/** Per-frame scores the frame list and timeline can sort and colour by. */
export const FRAME_SCORE_KEYS = ['meanIoU', 'bandIoU', 'boundaryIoU', 'boundaryF', 'errorPixels', 'flipBack', 'smallObjectRecall'] as const;
export type FrameScoreKey = (typeof FRAME_SCORE_KEYS)[number];

/** Dialogs and panels that open over the workspace (the flag form and help have their own state). */
export type WorkspaceDialog = 'export' | 'exportMistakes' | 'opened';

/** Widths of the side panes, CSS pixels. */
export interface PaneWidths {
  left: number;
  right: number;
}

/** Pane widths of a first visit, and the range a pane can be dragged to (CSS pixels). */
export const PANE_WIDTHS_DEFAULT: PaneWidths = { left: 320, right: 420 };
export const PANE_WIDTH_MIN = 180;
export const PANE_WIDTH_MAX = 900;

/** Where the viewer looks: image point at the centre of the canvas and screen pixels per image pixel. */
export interface ViewPlace {
  cx: number;
  cy: number;
  scale: number;
}

export interface ViewSlice {
  /** Index of the frame on screen, in the dataset's natural order. */
  frameIndex: number;
  /** How each layer looks (switch, opacity, modes); the compositor's settings are `layerSettingsSel` of the state. */
  layers: LayerLooks;
  /** The run the scores, frame list and layers describe ("run A"); null when the dataset has none. */
  runA: string | null;
  /** The run compared with A (fixed / broke, A / B tab); null for none. */
  runB: string | null;
  /** Boundary-band width every band number and the band layer use, pixels (0..BAND_WIDTH_MAX). */
  bandWidth: number;
  /** null = fit the frame to the canvas. */
  place: ViewPlace | null;
  /** Score the frame list sorts by and the timeline colours by. */
  frameScore: FrameScoreKey;
  /** When set, the frame list is sorted by this class's per-frame measure instead of `frameScore`. */
  frameClass: FrameClassSort | null;
  /** Sort direction of the frame list: worst first by default. */
  sortWorstFirst: boolean;
  pixelGrid: boolean;
  helpOpen: boolean;
  /** Stepping through frames by itself at `playRate` frames per second. */
  playing: boolean;
  playRate: number;
  /** A box to centre the viewer on (image pixels, end-exclusive) and outline; bumped `focusSeq` each time. Cleared on a frame change. */
  focusBox: readonly [number, number, number, number] | null;
  focusSeq: number;
  /** Key (suspectKey) of the queue item being inspected, or null. */
  queueSelected: string | null;
  /** Which list the left pane shows. */
  leftTab: 'frames' | 'queue' | 'flags';
  /** A flag being written (the dialog is open while this is set). */
  flagDraft: FlagInput | null;
  /** Drawing a box on the viewer to flag (also with Shift held while dragging). */
  boxDrawing: boolean;
  /** The truth and prediction switches as they were before the curtain opened (put back when it closes), or null. */
  curtainRestore: { truth: boolean; pred: boolean } | null;
  /** The dialog or panel open over the workspace (the tile export, what was opened), or null. */
  dialog: WorkspaceDialog | null;
  /** Widths of the left and right panes, CSS pixels (the viewer takes the rest). */
  paneWidths: PaneWidths;
  /** The queue list's filter and order (Q steps through the queue as shown). */
  queueView: QueueView;
  frameIndexSet(index: number): void;
  layersSet(patch: Partial<LayerLooks>): void;
  runsSet(patch: { runA?: string | null; runB?: string | null }): void;
  bandWidthSet(width: number): void;
  placeSet(place: ViewPlace | null): void;
  frameScoreSet(key: FrameScoreKey): void;
  frameClassSet(v: FrameClassSort | null): void;
  sortWorstFirstSet(v: boolean): void;
  pixelGridSet(v: boolean): void;
  helpOpenSet(v: boolean): void;
  playingSet(v: boolean): void;
  playRateSet(fps: number): void;
  /** Goes to frame `index`, outlines `bbox` and centres and zooms the viewer on it. */
  focusOn(index: number, bbox: readonly [number, number, number, number]): void;
  focusClear(): void;
  /** Selects a queue item: goes to its frame and focuses its box. */
  queueSelect(key: string, frameIndex: number, bbox: readonly [number, number, number, number]): void;
  leftTabSet(tab: 'frames' | 'queue' | 'flags'): void;
  flagDraftSet(draft: FlagInput | null): void;
  boxDrawingSet(on: boolean): void;
  paneWidthsSet(patch: Partial<PaneWidths>): void;
  dialogSet(dialog: WorkspaceDialog | null): void;
  curtainRestoreSet(v: { truth: boolean; pred: boolean } | null): void;
  queueViewSet(patch: Partial<QueueView>): void;
}

/** Returns the view slice of the app store (what is on screen and how). */
export const viewSlice: StateCreator<AppState, [], [], ViewSlice> = (set, get) => ({
  frameIndex: 0,
  layers: layerLooksDefault(),
  runA: null,
  runB: null,
  bandWidth: 3,
  place: null,
  frameScore: 'meanIoU',
  frameClass: null,
  sortWorstFirst: true,
  pixelGrid: false,
  helpOpen: false,
  playing: false,
  playRate: 4,
  focusBox: null,
  focusSeq: 0,
  queueSelected: null,
  leftTab: 'frames',
  flagDraft: null,
  boxDrawing: false,
  paneWidths: PANE_WIDTHS_DEFAULT,
  dialog: null,
  curtainRestore: null,
  queueView: QUEUE_VIEW_DEFAULT,
  frameIndexSet: (index) => {
    const count = get().dataset?.pairing.frames.length ?? 0;
    const clamped = count === 0 ? 0 : Math.max(0, Math.min(count - 1, Math.round(index)));
    if (clamped === get().frameIndex) return;
    // An outline belongs to the frame it was drawn for.
    set({ frameIndex: clamped, focusBox: null });
  },
  layersSet: (patch) => set({ layers: { ...get().layers, ...patch } }),
  runsSet: (patch) => set(patch),
  bandWidthSet: (bandWidth) => set({ bandWidth }),
  placeSet: (place) => set({ place }),
  frameScoreSet: (frameScore) => set({ frameScore }),
  frameClassSet: (frameClass) => set({ frameClass }),
  sortWorstFirstSet: (sortWorstFirst) => set({ sortWorstFirst }),
  pixelGridSet: (pixelGrid) => set({ pixelGrid }),
  helpOpenSet: (helpOpen) => set({ helpOpen }),
  playingSet: (playing) => set({ playing }),
  playRateSet: (fps) => set({ playRate: Math.max(0.5, Math.min(30, fps)) }),
  focusOn: (index, bbox) => {
    get().frameIndexSet(index);
    const { highlight } = get().layers;
    set({ focusBox: bbox, focusSeq: get().focusSeq + 1, layers: highlight.on ? get().layers : { ...get().layers, highlight: { ...highlight, on: true } } });
  },
  queueSelect: (key, frameIndex, bbox) => {
    get().focusOn(frameIndex, bbox);
    set({ queueSelected: key });
  },
  leftTabSet: (leftTab) => set({ leftTab }),
  flagDraftSet: (flagDraft) => set({ flagDraft }),
  boxDrawingSet: (boxDrawing) => set({ boxDrawing }),
  dialogSet: (dialog) => set({ dialog }),
  curtainRestoreSet: (curtainRestore) => set({ curtainRestore }),
  paneWidthsSet: (patch) => set({ paneWidths: { ...get().paneWidths, ...patch } }),
  queueViewSet: (patch) => set({ queueView: { ...get().queueView, ...patch } }),
  focusClear: () => set({ focusBox: null }),
});
