import type { FlagBox, FlagRegion } from '../review/flag.ts';
import type { FlagsFileDataset } from '../review/flagsFile.ts';
import type { TileMode } from './tileBoxes.ts';

/** A label crop written into the ZIP: its path and how the source stored ids vs how the crop stores them. */
export interface TileLabelFile {
  file: string;
  /** gray1..gray16, palette1..palette8 or rgb: the source file's encoding. */
  source: string;
  /** The crop's encoding (see labelCropToPng). */
  written: string;
  /** The crop in the class colours (void in the table's ignoreColor, else dark gray), for people to look at; null when not written. */
  preview: string | null;
}

/** One tile of the export, as manifest.json lists it (tiles.csv has the same rows, flattened). */
export interface TileRow {
  /** The tile's folder name inside the ZIP (`tiles/<tile>/`). */
  tile: string;
  frame: string;
  frameWidth: number;
  frameHeight: number;
  flagId: string;
  flagKind: string;
  reason: string;
  note: string;
  flagRun: string | null;
  flagBox: FlagBox | null;
  /** The tile in source pixels, end-exclusive. */
  box: FlagBox;
  /** 1-based number of this tile among its flag's tiles, and their count. */
  part: number;
  parts: number;
  /** Ids in the tile's ground truth or predictions, with names (null when not in the table) and truth pixel counts. */
  classes: { id: number; name: string | null; truthPixels: number }[];
  region: FlagRegion | null;
  photo: string | null;
  truth: TileLabelFile;
  /** Per run with a prediction on this frame: its crop and its wrong pixels (valid truth, other id) in the tile. */
  preds: (TileLabelFile & { run: string; wrongPixels: number })[];
  overlay: { file: string; run: string | null } | null;
  /** What is missing from the tile and why (a run without a prediction, no photo, …). */
  notes: string[];
}

/** A flag (or one of its tiles) that could not be exported, and why. */
export interface TileFailure {
  frame: string;
  flagId: string;
  reason: string;
}

/** manifest.json at the root of the ZIP. */
export interface TileManifest {
  format: 'hairline-tiles';
  version: 1;
  dataset: FlagsFileDataset;
  exportedAt: string;
  mode: TileMode;
  tiles: TileRow[];
  failed: TileFailure[];
}

/** Columns of tiles.csv, in order. */
export const TILE_CSV_COLUMNS = [
  'tile', 'frame', 'frame_width', 'frame_height', 'flag_id', 'flag_kind', 'reason', 'note', 'flag_run',
  'flag_x0', 'flag_y0', 'flag_x1', 'flag_y1', 'x0', 'y0', 'x1', 'y1', 'part', 'parts', 'classes',
  'region_kind', 'truth_class', 'pred_class', 'score', 'region_reasons', 'photo_file', 'truth_file',
  'truth_source_encoding', 'truth_encoding', 'pred_files', 'pred_wrong_pixels', 'overlay_file', 'overlay_run', 'notes',
  'truth_preview_file', 'pred_preview_files',
] as const;

/**
 * Returns `v` as a CSV field (RFC 4180 §2: quoted when it holds a comma, quote or line break; quotes
 * doubled). Text starting with `=`, `+`, `-`, `@`, a tab or a carriage return would run as a formula
 * in a spreadsheet, so it gets a leading `'` and quotes (the OWASP "CSV Injection" advice); numbers
 * stay as they are.
 */
export function csvField(v: string | number | null): string {
  if (v === null) return '';
  if (typeof v === 'string' && /^[=+\-@\t\r]/.test(v)) return `"'${v.replace(/"/g, '""')}"`;
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** Returns the CSV values of a row, in TILE_CSV_COLUMNS order (lists joined with "; "). */
export function tileCsvValues(r: TileRow): (string | number | null)[] {
  const fb = r.flagBox;
  return [
    r.tile, r.frame, r.frameWidth, r.frameHeight, r.flagId, r.flagKind, r.reason, r.note, r.flagRun,
    fb?.[0] ?? null, fb?.[1] ?? null, fb?.[2] ?? null, fb?.[3] ?? null, r.box[0], r.box[1], r.box[2], r.box[3], r.part, r.parts,
    r.classes.map((c) => (c.name === null ? String(c.id) : `${c.id}:${c.name}`)).join('; '),
    r.region?.kind ?? null, r.region?.truthClass ?? null, r.region?.predictedClass ?? null, r.region?.score ?? null,
    r.region ? r.region.reasons.join('; ') : null, r.photo, r.truth.file, r.truth.source, r.truth.written,
    r.preds.map((p) => `${p.run}=${p.file}`).join('; '), r.preds.map((p) => `${p.run}=${p.wrongPixels}`).join('; '),
    r.overlay?.file ?? null, r.overlay?.run ?? null, r.notes.join('; '),
    r.truth.preview, r.preds.map((p) => `${p.run}=${p.preview ?? ''}`).join('; '),
  ];
}

/** Returns the text of tiles.csv: a header and one line per tile, CRLF line ends (RFC 4180). */
export function tilesCsvText(rows: readonly TileRow[]): string {
  const lines = [TILE_CSV_COLUMNS.join(',')];
  for (const r of rows) lines.push(tileCsvValues(r).map(csvField).join(','));
  return lines.join('\r\n') + '\r\n';
}
