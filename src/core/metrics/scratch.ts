import { bandBinOffsets } from './bandHistogram.ts';
import { innerBandWorkCreate, type InnerBandWork } from './boundaryIoU.ts';
import { boundaryFWorkCreate, type BoundaryFWork } from './boundaryF.ts';
import { codeTableBuild, CODE_TABLE_SIZE } from './codes.ts';
import { distanceWorkCreate, type DistanceWork } from './distanceCapped.ts';
import { edgeScanCreate, type EdgeScan } from './edgeRows.ts';
import { labelReadCacheCreate, type LabelReadCache } from '../labelReadCache.ts';

/**
 * Buffers frameScore reuses from frame to frame (one per thread): per-pixel code, column-distance
 * and distance maps, edge lists, work rows, and the id → code and distance → bin tables of the last
 * class list. They grow to the largest frame seen and are never shrunk, so a run over many frames
 * allocates once.
 */
export interface ScoreScratch {
  pixels: number;
  width: number;
  truthCodes: Uint16Array;
  predCodes: Uint16Array;
  edges: EdgeScan;
  dist2: Uint16Array;
  distance: DistanceWork;
  innerBand: InnerBandWork;
  boundaryF: BoundaryFWork;
  codeTable: Uint16Array;
  codeKey: string;
  binOffsets: Int32Array;
  binKey: string;
  /**
   * Whose truth-boundary distances `dist2` holds: the truth's ids array and the code table, limit and
   * size they were made with. Every run of a frame is scored against the same truth, so the distance
   * transform is made once per frame, not once per run (the ids must not change in between).
   */
  distanceIds: unknown;
  distanceKey: string;
  /** The last label maps this thread decoded (a frame's neighbours' predictions are read again by the next frames). */
  reads: LabelReadCache;
}

/** Returns an empty scratch (buffers are sized by the first frame). */
export function scoreScratchCreate(): ScoreScratch {
  return {
    pixels: 0,
    width: 0,
    truthCodes: new Uint16Array(0),
    predCodes: new Uint16Array(0),
    edges: edgeScanCreate(0, 0),
    dist2: new Uint16Array(0),
    distance: distanceWorkCreate(0),
    innerBand: innerBandWorkCreate(0),
    boundaryF: boundaryFWorkCreate(),
    codeTable: new Uint16Array(CODE_TABLE_SIZE),
    codeKey: '',
    binOffsets: new Int32Array(0),
    binKey: '',
    distanceIds: null,
    distanceKey: '',
    reads: labelReadCacheCreate(0),
  };
}

/** Grows the per-pixel maps and work rows of `s` to hold a width × height frame. */
export function scoreScratchFit(s: ScoreScratch, width: number, height: number): void {
  const n = width * height;
  if (s.pixels < n || s.edges.rowT.length < height + 1) {
    const size = Math.max(n, s.pixels);
    s.truthCodes = new Uint16Array(size);
    s.predCodes = new Uint16Array(size);
    s.edges = edgeScanCreate(size, Math.max(height, s.edges.rowT.length - 1));
    s.dist2 = new Uint16Array(size);
    s.distanceIds = null;
    s.pixels = size;
  }
  if (s.width < width) {
    s.distance = distanceWorkCreate(width);
    s.innerBand = innerBandWorkCreate(width);
    s.width = width;
  }
}

/** Returns the id → code table for this class list and void id, rebuilt only when they change. */
export function scoreScratchCodeTable(s: ScoreScratch, classIds: readonly number[], ignore: number): Uint16Array {
  const key = `${ignore}|${classIds.join(',')}`;
  if (s.codeKey !== key) {
    codeTableBuild(classIds, ignore, s.codeTable);
    s.codeKey = key;
  }
  return s.codeTable;
}

/** Returns the squared distance → band bin offset table for `limit` (pixels) and `k` classes. */
export function scoreScratchBinOffsets(s: ScoreScratch, limit: number, k: number): Int32Array {
  const key = `${limit}|${k}`;
  if (s.binKey !== key) {
    s.binOffsets = bandBinOffsets(limit, k);
    s.binKey = key;
  }
  return s.binOffsets;
}
