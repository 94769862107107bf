// The two prediction runs, described as the errors a segmentation model makes. run-a: coarse output
// grid, wobbly rounded boundaries, thin steel broken, small things kept (its class weights favour
// them). run-b: sharp boundaries, but it misses small and far objects. Both confuse look-alikes,
// hallucinate a few things, paint real classes over void and emit a few ids outside the table. Both
// share one habit, learnt from the same kind of data: the blue corrugated warehouse and the red brick
// store at the quay end read as containers (their walls look like container steel), in most frames.
// The label is right there; the queue must not take the runs' agreement for a label mistake.
import { DEMO_CLASS } from './classes.ts';
import type { GhostName } from './sceneGhosts.ts';

/** Names of the prediction runs, as their folder names. */
export const DEMO_RUNS = ['run-a', 'run-b'] as const;
export type DemoRunName = (typeof DEMO_RUNS)[number];

/** A stretch of the sequence as shares 0..1 of its length. */
export type Stretch = readonly [number, number];

/** One run's error model; pixel sizes are at 1024 px wide and scale with the frame. */
export interface RunStyle {
  stride: number;
  wobble: number;
  gain: Partial<Record<number, number>>;
  thinBreak: number;
  jitter: number;
  /** Small objects (person, bollard, truck, mast) with fewer visible pixels than this are missed. */
  missBelow: number;
  /** Class the run gives the vehicle's hood; null lets the scene below it show through. */
  hoodAs: number | null;
  /** Containers further than this (m) look like buildings to the run; null: never. */
  farContainerAsBuildingBeyond: number | null;
  confusions: readonly { pick: ObjectPick; as: number; during: Stretch }[];
  ghosts: readonly { name: GhostName; during: Stretch }[];
  /**
   * Frame-to-frame flicker: in the stretch, every odd frame draws void clutter as `voidAs` and takes
   * its output grid `timeStep` further along, so those pixels flip and come back a frame later.
   */
  flicker: { during: Stretch; voidAs: number; timeStep: number } | null;
  /** Blobs of an id outside the class table: centre and radius as shares of the width. */
  invalid: readonly { id: number; x: number; y: number; r: number; during: Stretch }[];
}

/** Which scene objects a confusion applies to: class and a box in world X, Z (metres). */
export interface ObjectPick {
  cls: number;
  x: readonly [number, number];
  z: readonly [number, number];
  /** Highest object centre (m) to include, to pick e.g. only the lowest tier of a stack. */
  maxY?: number;
}

/** The habit both runs share: the warehouse and the brick store read as containers. */
const SHARED_HABIT = [
  { pick: { cls: DEMO_CLASS.building, x: [20, 120], z: [295, 365] }, as: DEMO_CLASS.container, during: [0.15, 1] },
  { pick: { cls: DEMO_CLASS.building, x: [-13, -1], z: [344, 363] }, as: DEMO_CLASS.container, during: [0.1, 0.9] },
] as const;

/** The error models of the two runs. */
export const RUN_STYLES: Record<DemoRunName, RunStyle> = {
  'run-a': {
    stride: 8,
    wobble: 2.6,
    gain: { [DEMO_CLASS.person]: 2.4, [DEMO_CLASS.bollard]: 2.4, [DEMO_CLASS.truck]: 1.3, [DEMO_CLASS.lightMast]: 1.8, [DEMO_CLASS.rail]: 0.85 },
    thinBreak: 0.45,
    jitter: 0.5,
    missBelow: 30,
    hoodAs: DEMO_CLASS.truck,
    farContainerAsBuildingBeyond: 170,
    confusions: [
      { pick: { cls: DEMO_CLASS.truck, x: [5, 8], z: [80, 200] }, as: DEMO_CLASS.container, during: [0.25, 0.55] },
      ...SHARED_HABIT,
    ],
    ghosts: [
      { name: 'person', during: [0.15, 0.42] },
      { name: 'puddle', during: [0.62, 0.92] },
    ],
    invalid: [{ id: 12, x: 0.82, y: 0.1, r: 0.028, during: [0.6, 0.76] }],
    flicker: { during: [0.3, 0.8], voidAs: DEMO_CLASS.water, timeStep: 9 },
  },
  'run-b': {
    stride: 4,
    wobble: 0.9,
    gain: { [DEMO_CLASS.person]: 1.2, [DEMO_CLASS.bollard]: 1.2, [DEMO_CLASS.lightMast]: 1.2 },
    thinBreak: 0.2,
    jitter: 0.25,
    missBelow: 320,
    hoodAs: null,
    farContainerAsBuildingBeyond: null,
    confusions: [
      ...SHARED_HABIT,
      { pick: { cls: DEMO_CLASS.container, x: [21, 25], z: [30, 62], maxY: 2 }, as: DEMO_CLASS.truck, during: [0.08, 0.3] },
      { pick: { cls: DEMO_CLASS.vegetation, x: [-480, -400], z: [380, 1500] }, as: DEMO_CLASS.building, during: [0, 1] },
    ],
    ghosts: [
      { name: 'yardTruck', during: [0, 0.5] },
      { name: 'bollard', during: [0.3, 0.62] },
      { name: 'shrub', during: [0.5, 1] },
    ],
    invalid: [{ id: 13, x: 0.1, y: 0.64, r: 0.024, during: [0.2, 0.36] }],
    flicker: null,
  },
};

/** Classes a run can miss when they are small in the frame. */
export const MISSABLE: readonly number[] = [DEMO_CLASS.person, DEMO_CLASS.bollard, DEMO_CLASS.truck, DEMO_CLASS.lightMast];

/** Returns true when the run flickers at frame `index` of `frames` (an odd frame in its flicker stretch). */
export function flickersAt(style: RunStyle, index: number, frames: number): boolean {
  return style.flicker !== null && index % 2 === 1 && stretchHas(style.flicker.during, index, frames);
}

/** Returns true when frame `index` of `frames` lies in the stretch. */
export function stretchHas(s: Stretch, index: number, frames: number): boolean {
  const t = frames > 1 ? index / (frames - 1) : 0;
  return t >= s[0] && t <= s[1];
}
