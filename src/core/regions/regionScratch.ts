import { codeTableBuild, CODE_TABLE_SIZE } from '../metrics/codes.ts';
import { componentStatsCreate, type ComponentStats } from './componentStats.ts';
import { runTableCreate, type RunTable } from './runLabel.ts';
import { thicknessWorkCreate, type ThicknessWork } from './regionThickness.ts';

/**
 * Buffers frameRegionsCompute reuses from frame to frame (one per thread): code maps of the truth and
 * of each run, truth boundary reach, the photo's luma and gradient, run tables and component sums, and
 * the id → code tables of the last class list. They grow to the largest frame and are never shrunk.
 */
export interface RegionScratch {
  pixels: number;
  truthCodes: Uint16Array;
  predCodes: Uint16Array[];
  /** Per pixel, the distance along its row to the nearest ground-truth boundary pixel (truthEdgeReach). */
  edgeReach: Uint8Array;
  luma: Uint8Array;
  gradient: Uint8Array;
  /** The photo's colour bin per pixel (photoLabBins). */
  labBins: Uint8Array;
  truthRuns: RunTable;
  truthSegments: ComponentStats;
  predRuns: RunTable;
  predSegments: ComponentStats;
  pairRuns: RunTable;
  pairs: ComponentStats;
  thickness: ThicknessWork;
  cellCount: Int32Array;
  cellTouched: Int32Array;
  /** id → truth code (classes 0..k-1, void k, others k+1..) and id → prediction code (classes, else k). */
  truthTable: Uint16Array;
  predTable: Uint16Array;
  tableKey: string;
}

/** Returns an empty region scratch (buffers are sized by the first frame). */
export function regionScratchCreate(): RegionScratch {
  return {
    pixels: 0, truthCodes: new Uint16Array(0), predCodes: [], edgeReach: new Uint8Array(0), luma: new Uint8Array(0), gradient: new Uint8Array(0), labBins: new Uint8Array(0),
    truthRuns: runTableCreate(), truthSegments: componentStatsCreate(), predRuns: runTableCreate(), predSegments: componentStatsCreate(),
    pairRuns: runTableCreate(), pairs: componentStatsCreate(), thickness: thicknessWorkCreate(),
    cellCount: new Int32Array(0), cellTouched: new Int32Array(0),
    truthTable: new Uint16Array(CODE_TABLE_SIZE), predTable: new Uint16Array(CODE_TABLE_SIZE), tableKey: '',
  };
}

/** Grows the per-pixel buffers of `s` for a width × height frame with `runs` prediction maps and `cells` grid cells. */
export function regionScratchFit(s: RegionScratch, width: number, height: number, runs: number, cells: number): void {
  const n = width * height;
  if (s.pixels < n) {
    s.truthCodes = new Uint16Array(n);
    s.luma = new Uint8Array(0);
    s.gradient = new Uint8Array(0);
    s.labBins = new Uint8Array(0);
    s.predCodes = [];
    s.pixels = n;
  }
  while (s.predCodes.length < runs) s.predCodes.push(new Uint16Array(s.pixels));
  if (s.edgeReach.length < n) s.edgeReach = new Uint8Array(n);
  if (s.cellCount.length < cells) {
    s.cellCount = new Int32Array(cells);
    s.cellTouched = new Int32Array(cells);
  }
}

/** Returns the luma, gradient and colour-bin buffers of `s`, sized for the frame (allocated only when a photo is given). */
export function regionScratchPhoto(s: RegionScratch): { luma: Uint8Array; gradient: Uint8Array; bins: Uint8Array } {
  if (s.luma.length < s.pixels) {
    s.luma = new Uint8Array(s.pixels);
    s.gradient = new Uint8Array(s.pixels);
    s.labBins = new Uint8Array(s.pixels);
  }
  return { luma: s.luma, gradient: s.gradient, bins: s.labBins };
}

/** Builds the truth and prediction code tables for this class list and void id, only when they change. */
export function regionScratchTables(s: RegionScratch, classIds: readonly number[], ignore: number): void {
  const key = `${ignore}|${classIds.join(',')}`;
  if (s.tableKey === key) return;
  codeTableBuild(classIds, ignore, s.truthTable);
  const k = classIds.length;
  for (let id = 0; id < CODE_TABLE_SIZE; id++) s.predTable[id] = s.truthTable[id] < k ? s.truthTable[id] : k;
  s.tableKey = key;
}
