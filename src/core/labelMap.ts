/** Class ids of a label map, one per pixel, row-major. */
export type LabelIds = Uint8Array | Uint16Array;

/** A W×H map of integer class ids (row-major, `ids[y * width + x]`). */
export interface LabelMap {
  width: number;
  height: number;
  ids: LabelIds;
}

/** Returns the largest id in the map (0 for an empty map). */
export function labelMapMaxId(map: LabelMap): number {
  const ids = map.ids;
  let max = 0;
  for (let i = 0; i < ids.length; i++) if (ids[i] > max) max = ids[i];
  return max;
}

/** Returns the distinct ids present in the map, ascending, with their pixel counts. */
export function labelMapIdCounts(map: LabelMap): { id: number; count: number }[] {
  const counts = new Map<number, number>();
  const ids = map.ids;
  // A dense histogram is faster than a Map for 8-bit maps; 16-bit maps fall back to a sized array too.
  const hist = new Uint32Array(ids instanceof Uint8Array ? 256 : 65536);
  for (let i = 0; i < ids.length; i++) hist[ids[i]]++;
  for (let id = 0; id < hist.length; id++) if (hist[id] > 0) counts.set(id, hist[id]);
  return [...counts].map(([id, count]) => ({ id, count }));
}
