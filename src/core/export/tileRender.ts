import { classTableFind, type ClassTable } from '../classTable.ts';
import type { CompositePalette } from '../composite/compositePalette.ts';
import { frameComposite } from '../composite/frameComposite.ts';
import { layerSettingsDefault } from '../composite/layerSettings.ts';
import type { DecodedFrame } from '../decodedFrame.ts';
import { labelMapColorize } from '../colorize.ts';
import { labelMapIdCounts, type LabelMap } from '../labelMap.ts';
import type { ZlibCompress } from '../png/encode.ts';
import { fail, ok, type Result } from '../result.ts';
import type { Flag, FlagBox } from '../review/flag.ts';
import { labelMapCrop, rgbaCrop } from './crop.ts';
import { labelCropToPng, labelEncodingName } from './labelCropPng.ts';
import { rgbaToPngFast } from './rgbPng.ts';
import type { TileRow } from './tileRows.ts';
import { zipNamePart, zipNamesUnique } from './zipNames.ts';

/** One decoded frame as the export needs it (band bins are not drawn: null is enough). */
export type ExportFrame = Pick<DecodedFrame, 'width' | 'height' | 'truth' | 'preds' | 'photo' | 'bandBins' | 'notes'>;

/** A file of a tile: its path inside the ZIP and its bytes. */
export interface TileFile {
  path: string;
  bytes: Uint8Array;
}

/** What one tile render needs beyond the frame: the table, the overlay palette, the runs to write. */
export interface TileContext {
  table: ClassTable;
  palette: CompositePalette;
  runs: readonly string[];
  /** A faster zlib where there is one (Node's); the bytes decode the same. */
  compress?: ZlibCompress;
  /** Colours of the label previews (previewLut of the table). */
  previewLut: Uint32Array;
}

/** Returns the count of valid pixels (truth not void) where the prediction differs. Hot loop: flat arrays. */
function wrongPixels(truth: LabelMap, pred: LabelMap, ignore: number): number {
  const t = truth.ids, p = pred.ids;
  let n = 0;
  for (let i = 0; i < t.length; i++) if (t[i] !== ignore && p[i] !== t[i]) n++;
  return n;
}

/** Returns the map with the ids its file stored (before an id map of the class table), which label crops write back exactly. */
function storedOf(map: ExportFrame['truth']): ExportFrame['truth'] {
  return map.stored ? { ...map, ids: map.stored } : map;
}

/** Returns a label crop (class ids) as a PNG in the class colours. */
function previewPng(crop: LabelMap, ctx: TileContext): Uint8Array {
  return rgbaToPngFast(crop.width, crop.height, labelMapColorize(crop, ctx.previewLut), ctx.compress);
}

/** Returns the overlay's run: the flag's run when the frame has it, else the first run the frame has. */
function overlayRunOf(flag: Flag, frame: ExportFrame, runs: readonly string[]): string | null {
  if (flag.run !== null && Object.hasOwn(frame.preds, flag.run)) return flag.run;
  return runs.find((r) => Object.hasOwn(frame.preds, r)) ?? null;
}

/**
 * Returns the files of one tile (photo, truth, each run's prediction, overlay) under `tiles/<tile>/` and
 * its manifest row, or why the ground-truth crop could not be written (a missing run or photo is a note).
 */
export function tileRender(frameName: string, frame: ExportFrame, flag: Flag, box: FlagBox, part: number, parts: number, tile: string, ctx: TileContext): Result<{ files: TileFile[]; row: TileRow }> {
  const dir = `tiles/${tile}/`;
  const files: TileFile[] = [];
  const notes = [...frame.notes];
  const truthCrop = labelMapCrop(frame.truth, box);
  const truthPng = labelCropToPng(labelMapCrop(storedOf(frame.truth), box), frame.truth.encoding, ctx.table, ctx.compress);
  if (!truthPng.ok) return fail('', `ground truth ${truthPng.error}`);
  files.push({ path: `${dir}truth.png`, bytes: truthPng.value.png });
  files.push({ path: `${dir}preview/truth.png`, bytes: previewPng(truthCrop, ctx) });
  const truthCounts = new Map(labelMapIdCounts(truthCrop).map((c) => [c.id, c.count]));
  const ids = new Set(truthCounts.keys());

  const preds: TileRow['preds'] = [];
  const unique = zipNamesUnique();
  ['truth', 'photo', 'overlay'].forEach(unique);
  for (const run of ctx.runs) {
    const map = frame.preds[run];
    if (!map) continue;
    const crop = labelMapCrop(map, box);
    const png = labelCropToPng(labelMapCrop(storedOf(map), box), map.encoding, ctx.table, ctx.compress);
    if (!png.ok) {
      notes.push(`run "${run}": prediction ${png.error}`);
      continue;
    }
    const stem = `pred-${unique(zipNamePart(run, 40))}.png`;
    const file = `${dir}${stem}`;
    files.push({ path: file, bytes: png.value.png });
    files.push({ path: `${dir}preview/${stem}`, bytes: previewPng(crop, ctx) });
    for (const c of labelMapIdCounts(crop)) ids.add(c.id);
    preds.push({ run, file, source: labelEncodingName(map.encoding), written: png.value.written, preview: `${dir}preview/${stem}`, wrongPixels: wrongPixels(truthCrop, crop, ctx.table.ignore) });
  }

  let photo: string | null = null;
  if (frame.photo) {
    photo = `${dir}photo.png`;
    files.push({ path: photo, bytes: rgbaToPngFast(truthCrop.width, truthCrop.height, rgbaCrop(frame.photo, frame.width, box), ctx.compress) });
  } else notes.push('no photo for this frame');

  const run = overlayRunOf(flag, frame, ctx.runs);
  const layers = layerSettingsDefault();
  layers.runA = run;
  if (!frame.photo) layers.truth = { ...layers.truth, on: true, side: 'both' };
  if (flag.bbox) layers.highlight = { ...layers.highlight, boxes: [{ x: flag.bbox[0], y: flag.bbox[1], width: flag.bbox[2] - flag.bbox[0], height: flag.bbox[3] - flag.bbox[1] }] };
  const rect = { x: box[0], y: box[1], width: box[2] - box[0], height: box[3] - box[1] };
  const rgba = frameComposite(frame, layers, ctx.palette, { rect });
  let overlay: TileRow['overlay'] = null;
  if (rgba.ok) {
    overlay = { file: `${dir}overlay.png`, run };
    files.push({ path: overlay.file, bytes: rgbaToPngFast(rect.width, rect.height, rgba.value, ctx.compress) });
  } else notes.push(`overlay not drawn: ${rgba.error}`);

  const classes = [...ids].sort((a, b) => a - b).map((id) => ({
    id,
    name: id === ctx.table.ignore ? 'void' : (classTableFind(ctx.table, id)?.name ?? null),
    truthPixels: truthCounts.get(id) ?? 0,
  }));
  const row: TileRow = {
    tile, frame: frameName, frameWidth: frame.width, frameHeight: frame.height,
    flagId: flag.id, flagKind: flag.kind, reason: flag.reason, note: flag.note, flagRun: flag.run, flagBox: flag.bbox,
    box, part, parts, classes, region: flag.region ?? null, photo,
    truth: { file: `${dir}truth.png`, source: labelEncodingName(frame.truth.encoding), written: truthPng.value.written, preview: `${dir}preview/truth.png` },
    preds, overlay, notes,
  };
  return ok({ files, row });
}
