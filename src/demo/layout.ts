// Where the big pieces of Kestrel Quay lie, in world metres (X right, Z along the quay, Y up).
// Shared by the ground pass and the object builders so rails, lanes and crane legs line up.

/** The quay edge: water for X below this. */
export const QUAY_EDGE_X = -14;
/** The quay ends here; beyond it the basin opens to the far shore. */
export const QUAY_END_Z = 380;
/** Far shore on the left (land for X below) and straight ahead (land for Z above). */
export const SHORE_LEFT_X = -430;
export const SHORE_FAR_Z = 1450;

/** Crane rails (waterside and landside legs run on them) and the yard railway, X of each rail centre. */
export const CRANE_RAIL_X = [-11, 13] as const;
export const CRANE_RAIL_HALF = 0.16;
export const TRACK_RAIL_X = [17, 18.435] as const;
export const TRACK_RAIL_HALF = 0.07;
/** Rails stop short of the quay end. */
export const RAIL_END_Z = 372;
export const RAIL_START_Z = -80;

/** Lanes (X of the lane centre) that trucks drive along. */
export const LANE_X = { underCrane: -7, ours: 0, oncoming: 6.5 } as const;

/** First X of the container yard (the stacks the camera drives past). */
export const YARD_X = 22;
