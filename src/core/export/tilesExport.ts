import { CLASS_ID_MAX, classTableGenerated, type ClassTable } from '../classTable.ts';
import { previewLut } from '../colorize.ts';
import { compositePaletteFromTable } from '../composite/compositePalette.ts';
import type { ZlibCompress } from '../png/encode.ts';
import { fail, ok, type Result } from '../result.ts';
import type { Flag } from '../review/flag.ts';
import type { FlagsFileDataset } from '../review/flagsFile.ts';
import { tileBoxesOf, tileModeCheck, type TileMode } from './tileBoxes.ts';
import { tileRender, type ExportFrame } from './tileRender.ts';
import { tilesCsvText, type TileFailure, type TileManifest, type TileRow } from './tileRows.ts';
import { zipNamePart, zipNamesUnique } from './zipNames.ts';
import { zipStreamCreate, type ZipSink } from './zipStream.ts';

/** Where the export gets decoded frames: one frame at a time, by name. */
export interface TileExportSource {
  frameLoad(name: string): Promise<Result<ExportFrame>>;
}

/** Progress of an export: flags handled so far of all, tiles written and failed, the frame being cut. */
export interface TilesExportProgress {
  flagsDone: number;
  flagsTotal: number;
  tilesDone: number;
  failed: number;
  frame: string | null;
  /** ZIP bytes handed to the sink so far. */
  bytes: number;
}

export interface TilesExportOptions {
  dataset: FlagsFileDataset;
  flags: readonly Flag[];
  /** Runs whose predictions are cut (the dataset's runs, in its order). */
  runs: readonly string[];
  /** The class table the label maps were decoded with (names, colours for colour-coded maps, void id). */
  table: ClassTable;
  mode: TileMode;
  source: TileExportSource;
  sink: ZipSink;
  /** Frame names in the order to visit them (the dataset's); frames of flags not listed come last. */
  frameOrder?: readonly string[];
  onProgress?: (p: TilesExportProgress) => void;
  /** Cancels the export when `aborted` turns true (an AbortSignal will do). */
  signal?: { readonly aborted: boolean };
  /**
   * Awaited after each frame, so the caller's event loop can show progress and take a cancel (a
   * zero-delay timer in a browser tab); none by default. Core has no timers of its own.
   */
  pause?: () => Promise<void>;
  /** A faster zlib where there is one (Node's); the PNGs decode to the same pixels. */
  compress?: ZlibCompress;
  /** Export time, ms since the epoch (default now). */
  now?: number;
}

/** What an export wrote: the manifest (tiles and failures) and the ZIP's size in bytes. */
export interface TilesExportSummary {
  manifest: TileManifest;
  bytes: number;
}

/** Returns the flags grouped by frame, frames in `order` first, then the rest in first-seen order. */
function flagsByFrame(flags: readonly Flag[], order: readonly string[] | undefined): [string, Flag[]][] {
  const groups = new Map<string, Flag[]>();
  for (const name of order ?? []) groups.set(name, []);
  for (const f of flags) {
    let g = groups.get(f.frame);
    if (!g) groups.set(f.frame, (g = []));
    g.push(f);
  }
  return [...groups].filter(([, g]) => g.length > 0);
}

/** Limits of a ZIP without the ZIP64 extension (which fflate does not write): entries and bytes (APPNOTE.TXT §4.4.21, §4.4.8). */
const ZIP_ENTRIES_MAX = 0xffff;
/** Bytes kept free below 4 GiB for the manifest, the CSV and the central directory. */
const ZIP_BYTES_MAX = 0xffffffff - 256 * 1024 * 1024;

/**
 * Writes the chosen flags' tiles as one ZIP to `sink`, frame by frame (one decoded frame and one tile
 * in memory at a time): `tiles/<tile>/{photo,truth,pred-<run>,overlay}.png` and `tiles/<tile>/preview/{truth,pred-<run>}.png`
 * (the label crops in the class colours), then `manifest.json` and
 * `tiles.csv` (the same rows). A frame or tile that fails is listed in `manifest.failed` and the rest
 * goes on. Returns the summary, or an error when the export was cancelled or the sink failed.
 */
export async function tilesExport(o: TilesExportOptions): Promise<Result<TilesExportSummary>> {
  const mode = tileModeCheck(o.mode);
  if (!mode.ok) return mode;
  const now = o.now ?? Date.now();
  const zip = zipStreamCreate(o.sink, new Date(now));
  const table = o.table;
  // Without a class table every id gets its generated colour, so disagreement shows as "another class".
  const palette = compositePaletteFromTable(table.generated ? classTableGenerated(CLASS_ID_MAX, table.ignore) : table);
  const ctx = { table, palette, runs: o.runs, compress: o.compress, previewLut: previewLut(table) };
  const rows: TileRow[] = [];
  const failed: TileFailure[] = [];
  const uniqueTile = zipNamesUnique();
  let entries = 0;
  const progress: TilesExportProgress = { flagsDone: 0, flagsTotal: o.flags.length, tilesDone: 0, failed: 0, frame: null, bytes: 0 };
  const report = () => o.onProgress?.({ ...progress, failed: failed.length, bytes: zip.written() });
  const cancelled = () => {
    zip.abort();
    return fail<TilesExportSummary>('', 'export cancelled');
  };

  try {
    for (const [name, flags] of flagsByFrame(o.flags, o.frameOrder)) {
      if (o.signal?.aborted) return cancelled();
      progress.frame = name;
      const loaded = await o.source.frameLoad(name);
      if (!loaded.ok) {
        for (const f of flags) failed.push({ frame: name, flagId: f.id, reason: loaded.error });
        progress.flagsDone += flags.length;
        report();
        continue;
      }
      const frame = loaded.value;
      for (const flag of flags) {
        const boxes = tileBoxesOf(flag.bbox, frame.width, frame.height, mode.value);
        if (!boxes.ok) failed.push({ frame: name, flagId: flag.id, reason: boxes.error });
        else {
          for (let i = 0; i < boxes.value.length; i++) {
            if (o.signal?.aborted) return cancelled();
            const base = `${zipNamePart(name, 60)}_${zipNamePart(flag.id, 12)}${boxes.value.length > 1 ? `_${i + 1}` : ''}`;
            const tile = tileRender(name, frame, flag, boxes.value[i], i + 1, boxes.value.length, uniqueTile(base), ctx);
            if (!tile.ok) {
              failed.push({ frame: name, flagId: flag.id, reason: `tile ${i + 1} of ${boxes.value.length}: ${tile.error}` });
              continue;
            }
            const size = tile.value.files.reduce((n, f) => n + f.bytes.length, 0);
            if (entries + tile.value.files.length + 2 > ZIP_ENTRIES_MAX || zip.written() + size > ZIP_BYTES_MAX) {
              zip.abort();
              return fail('', `the export would exceed what one ZIP holds (65,535 files, 4 GiB) after ${rows.length} tiles; export fewer flags at a time (by reason or frame)`);
            }
            entries += tile.value.files.length;
            for (const f of tile.value.files) await zip.addStored(f.path, f.bytes);
            rows.push(tile.value.row);
            progress.tilesDone++;
          }
        }
        progress.flagsDone++;
        report();
      }
      await o.pause?.();
    }
    if (o.signal?.aborted) return cancelled();
    const manifest: TileManifest = { format: 'hairline-tiles', version: 1, dataset: o.dataset, exportedAt: new Date(now).toISOString(), mode: mode.value, tiles: rows, failed };
    await zip.addText('manifest.json', JSON.stringify(manifest, null, 2) + '\n');
    await zip.addText('tiles.csv', tilesCsvText(rows));
    await zip.end();
    progress.frame = null;
    report();
    return ok({ manifest, bytes: zip.written() });
  } catch (e) {
    zip.abort();
    return fail('', `the ZIP could not be written (${(e as Error)?.message ?? String(e)})`);
  }
}
