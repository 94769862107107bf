// The export is checked from outside: the ZIP is opened with fflate's unzipSync and with Python's
// zipfile (CRC-32 of every entry, APPNOTE.TXT), label crops are decoded with our decoder and with
// pngjs (PNG.sync.read, a second decoder) and compared pixel for pixel with the ids the fixture
// generated, the PNG header bytes (ISO/IEC 15948 §11.2.2) say which encoding was written, and
// tiles.csv is parsed with Python's csv module (RFC 4180) and compared field by field with manifest.json.
import { MARK_COLORS } from '../../../src/core/composite/compositePalette.ts';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { unzipSync } from 'fflate';
import { PNG } from 'pngjs';
import { afterAll, describe, expect, it } from 'vitest';
import { compositePaletteFromTable } from '../../../src/core/composite/compositePalette.ts';
import { frameComposite } from '../../../src/core/composite/frameComposite.ts';
import { layerSettingsDefault } from '../../../src/core/composite/layerSettings.ts';
import { tilesExport, type TilesExportOptions, type TilesExportProgress } from '../../../src/core/export/tilesExport.ts';
import type { TileManifest, TileRow } from '../../../src/core/export/tileRows.ts';
import { zipPathIsSafe } from '../../../src/core/export/zipNames.ts';
import { labelMapFromPng } from '../../../src/core/png/decodeLabel.ts';
import type { Flag } from '../../../src/core/review/flag.ts';
import { zipTilesRef } from '../../reference/zipTilesRef.ts';
import { fixtureFrames, fixtureSource, H, NASTY_FRAME, PALETTE16, RUNS, TABLE, W, type FixtureFrame } from './exportFixture.ts';

const tmp = mkdtempSync(join(tmpdir(), 'hairline-tiles-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const FRAMES = fixtureFrames();
const NOTE = 'mast "cut off", see\nthe second line; and a comma, too';
function flag(id: string, frame: string, over: Partial<Flag> = {}): Flag {
  return { id, frame, kind: 'rect', bbox: [10, 12, 30, 20], reason: 'label-mistake', note: '', run: null, createdAt: 1, updatedAt: 2, ...over };
}
const FLAGS: Flag[] = [
  flag('edge', 'f-gray8', { bbox: [90, 55, 97, 61], note: NOTE, run: 'run-b' }),
  flag('region-1', 'f-gray8', { kind: 'region', bbox: [40, 20, 52, 33], reason: 'model-error', region: { kind: 'suspect', truthClass: 2, predictedClass: 300, score: 0.75, reasons: ['compact', 'one class'] } }),
  flag('whole', NASTY_FRAME, { kind: 'frame', bbox: null, reason: 'crane tags', note: '../../x\\y' }),
  flag('rgb-1', 'f-rgb', { bbox: [0, 0, 8, 8], run: 'run-a' }),
  flag('lost', 'not-here'),
  flag('outside', 'f-rgb', { bbox: [200, 0, 210, 5] }),
];

async function exportZip(over: Partial<TilesExportOptions> = {}): Promise<{ zip: Uint8Array; result: Awaited<ReturnType<typeof tilesExport>>; chunks: number; finals: number }> {
  const parts: Uint8Array[] = [];
  let finals = 0;
  const result = await tilesExport({
    dataset: { key: '3-abc', title: 'fixture', frames: 3 }, flags: FLAGS, runs: RUNS, table: TABLE, mode: { kind: 'crop', padding: 5 },
    source: fixtureSource(FRAMES), frameOrder: FRAMES.map((f) => f.name), now: Date.UTC(2024, 0, 2),
    sink: (chunk, final) => {
      parts.push(chunk.slice());
      if (final) finals++;
    },
    ...over,
  });
  const zip = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let o = 0;
  for (const p of parts) zip.set(p, (o += p.length) - p.length);
  return { zip, result, chunks: parts.length, finals };
}

function crop(ids: number[], box: readonly number[]): number[] {
  const out: number[] = [];
  for (let y = box[1]; y < box[3]; y++) for (let x = box[0]; x < box[2]; x++) out.push(ids[y * W + x]);
  return out;
}

/** pngjs with exact samples (skipRescale); palette files come back as RGBA colours. */
function pngjs(bytes: Uint8Array): { width: number; height: number; data: ArrayLike<number> } {
  return PNG.sync.read(Buffer.from(bytes), { skipRescale: true } as never) as never;
}

/** Returns the colour type and bit depth from the IHDR bytes (ISO/IEC 15948 §11.2.2). */
function ihdr(bytes: Uint8Array): string {
  const depth = bytes[24], type = bytes[25];
  return type === 0 ? `gray${depth}` : type === 3 ? `palette${depth}` : type === 2 ? `rgb${depth}` : `type${type}/${depth}`;
}

function colourOf(id: number): number {
  if (id === TABLE.ignore) return 0x000000;
  return parseInt(TABLE.classes.find((c) => c.id === id)!.color.slice(1), 16);
}

/** Checks a label crop against the generated ids with both decoders and against its expected encoding. */
function labelCheck(bytes: Uint8Array, ids: number[], box: readonly number[], encoding: string, what: string): void {
  const want = crop(ids, box);
  const w = box[2] - box[0], h = box[3] - box[1];
  const ours = labelMapFromPng(bytes, { file: what, table: TABLE });
  if (!ours.ok) throw new Error(ours.error);
  expect([ours.value.width, ours.value.height], what).toEqual([w, h]);
  expect(Array.from(ours.value.ids), what).toEqual(want);
  const ref = pngjs(bytes);
  expect([ref.width, ref.height], what).toEqual([w, h]);
  const written = ihdr(bytes);
  for (let i = 0; i < want.length; i++) {
    const r = ref.data[i * 4], g = ref.data[i * 4 + 1], b = ref.data[i * 4 + 2];
    if (encoding.startsWith('gray')) {
      if (r !== want[i]) throw new Error(`${what}: pixel ${i}: pngjs ${r}, source ${want[i]}`);
    } else if (encoding === 'palette8') {
      const c = [PALETTE16[want[i] * 3], PALETTE16[want[i] * 3 + 1], PALETTE16[want[i] * 3 + 2]];
      if (r !== c[0] || g !== c[1] || b !== c[2]) throw new Error(`${what}: pixel ${i}: pngjs colour ${[r, g, b]}, palette colour of id ${want[i]} ${c}`);
    } else {
      const c = colourOf(want[i]);
      if (((r << 16) | (g << 8) | b) !== c) throw new Error(`${what}: pixel ${i}: pngjs colour ${[r, g, b]}, class colour ${c.toString(16)}`);
    }
  }
  expect(written, what).toBe(encoding === 'rgb' ? 'rgb8' : encoding);
  if (encoding === 'palette8' && ours.value.encoding.kind === 'palette') {
    expect(Array.from(ours.value.encoding.colors), `${what} palette`).toEqual(Array.from(PALETTE16));
  }
}

describe('tilesExport: crops around each flag, label crops exact in the source encoding', () => {
  it('writes every tile with exact ids (both decoders), the photo crop, the overlay, and lists failures', async () => {
    const { zip, result, finals } = await exportZip();
    if (!result.ok) throw new Error(result.error);
    expect(finals).toBe(1);
    const files = unzipSync(zip);
    const manifest = JSON.parse(new TextDecoder().decode(files['manifest.json'])) as TileManifest;
    expect(manifest).toEqual(result.value.manifest);
    for (const name of Object.keys(files)) expect(zipPathIsSafe(name), name).toBe(true);
    expect(manifest.tiles.map((t) => [t.flagId, t.box])).toEqual([
      ['edge', [85, 50, 97, 61]],
      ['region-1', [35, 15, 57, 38]],
      ['whole', [0, 0, W, H]],
      ['rgb-1', [0, 0, 13, 13]],
    ]);
    expect(manifest.failed).toEqual([
      { frame: 'f-rgb', flagId: 'outside', reason: 'flag box [200, 0, 210, 5] lies outside the 97×61 frame' },
      { frame: 'not-here', flagId: 'lost', reason: 'truth/not-here.png: no such file' },
    ]);
    for (const row of manifest.tiles) {
      const src = FRAMES.find((f) => f.name === row.frame)!;
      expect([row.truth.source, row.truth.written], row.tile).toEqual(src.encodings.truth);
      labelCheck(files[row.truth.file], src.truth, row.box, row.truth.written, row.truth.file);
      expect(row.preds.map((p) => p.run)).toEqual(Object.keys(src.preds));
      for (const p of row.preds) {
        expect([p.source, p.written], p.file).toEqual(src.encodings[p.run]);
        labelCheck(files[p.file], src.preds[p.run], row.box, p.written, p.file);
        const wrong = crop(src.truth, row.box).filter((t, i) => t !== 255 && crop(src.preds[p.run], row.box)[i] !== t).length;
        expect(p.wrongPixels, p.file).toBe(wrong);
      }
      photoCheck(files, row, src);
      overlayCheck(files, row, src);
    }
    const whole = manifest.tiles.find((t) => t.flagId === 'whole')!;
    expect(whole.notes).toEqual(['run "run-b" has no prediction for this frame', 'no photo for this frame']);
    expect(whole.tile).toBe('weird_名前,_x_whole');
    const region = manifest.tiles.find((t) => t.flagId === 'region-1')!;
    expect(region.region).toEqual(FLAGS[1].region);
    expect(region.classes.map((c) => c.id)).toEqual([...new Set([...crop(FRAMES[0].truth, region.box), ...crop(FRAMES[0].preds['run-a'], region.box), ...crop(FRAMES[0].preds['run-b'], region.box)])].sort((a, b) => a - b));
    expect(region.classes.find((c) => c.id === 255)?.name).toBe('void');
    expect(region.classes.find((c) => c.id === 300)?.name).toBeNull();
  });

  it('manifest.json and tiles.csv agree row for row (Python csv and zipfile as readers)', async () => {
    const { zip, result } = await exportZip();
    if (!result.ok) throw new Error(result.error);
    const path = join(tmp, 'tiles.zip');
    writeFileSync(path, zip);
    const ref = zipTilesRef(path);
    expect(ref.bad).toBeNull();
    const m = result.value.manifest;
    expect(ref.manifest).toEqual(JSON.parse(JSON.stringify(m)));
    // Non-ASCII names are marked UTF-8 so every unzip tool reads them back as written.
    const nasty = ref.names.find((n) => n.includes('名前'))!;
    expect(ref.utf8[nasty]).toBe(true);
    expect(ref.rows.length).toBe(m.tiles.length);
    ref.rows.forEach((c, i) => {
      const t: TileRow = m.tiles[i];
      const s = (v: number | string | null | undefined) => (v === null || v === undefined ? '' : String(v));
      expect([c.tile, c.frame, c.flag_id, c.flag_kind, c.reason, c.note, c.flag_run]).toEqual([t.tile, t.frame, t.flagId, t.flagKind, t.reason, t.note, s(t.flagRun)]);
      expect([c.x0, c.y0, c.x1, c.y1].map(Number)).toEqual([...t.box]);
      expect([c.flag_x0, c.flag_y0, c.flag_x1, c.flag_y1]).toEqual(t.flagBox ? t.flagBox.map(String) : ['', '', '', '']);
      expect([c.frame_width, c.frame_height, c.part, c.parts].map(Number)).toEqual([t.frameWidth, t.frameHeight, t.part, t.parts]);
      expect([c.truth_file, c.truth_source_encoding, c.truth_encoding, c.photo_file, c.overlay_file]).toEqual([t.truth.file, t.truth.source, t.truth.written, s(t.photo), s(t.overlay?.file)]);
      expect(c.pred_files).toBe(t.preds.map((p) => `${p.run}=${p.file}`).join('; '));
      expect([c.truth_preview_file, c.pred_preview_files]).toEqual([t.truth.preview, t.preds.map((p) => `${p.run}=${p.preview}`).join('; ')]);
      expect([c.region_kind, c.score, c.truth_class, c.pred_class]).toEqual([s(t.region?.kind), s(t.region?.score), s(t.region?.truthClass), s(t.region?.predictedClass)]);
    });
    expect(ref.rows[0].note).toBe(NOTE);
  });

  it('fixed-size tiles cover the flagged area inside the frame', async () => {
    const { result } = await exportZip({ mode: { kind: 'tile', size: 32 }, flags: [flag('big', 'f-gray8', { bbox: [5, 5, 70, 40] })] });
    if (!result.ok) throw new Error(result.error);
    const tiles = result.value.manifest.tiles;
    expect(tiles.map((t) => t.box)).toEqual([
      // x: 3 tiles (96 px) centred on 5..70 start at -10, shifted into the frame to 0; y: 2 tiles (64 px)
      // exceed the 61-px frame, so they are spread to 0 and 61 - 32 = 29.
      [0, 0, 32, 32], [32, 0, 64, 32], [64, 0, 96, 32],
      [0, 29, 32, 61], [32, 29, 64, 61], [64, 29, 96, 61],
    ]);
    expect(tiles.map((t) => t.tile)).toEqual(['f-gray8_big_1', 'f-gray8_big_2', 'f-gray8_big_3', 'f-gray8_big_4', 'f-gray8_big_5', 'f-gray8_big_6']);
    expect(tiles.every((t) => t.parts === 6)).toBe(true);
  });
});

function photoCheck(files: Record<string, Uint8Array>, row: TileRow, src: FixtureFrame): void {
  if (!src.photo) return void expect(row.photo).toBeNull();
  const p = PNG.sync.read(Buffer.from(files[row.photo!]));
  const [x0, y0, x1, y1] = row.box;
  for (let y = y0; y < y1; y++) {
    for (let x = x0; x < x1; x++) {
      const o = ((y - y0) * (x1 - x0) + (x - x0)) * 4, s = (y * W + x) * 4;
      for (let c = 0; c < 3; c++) if (p.data[o + c] !== src.photo[s + c]) throw new Error(`${row.photo} pixel ${x},${y} differs from the photo`);
    }
  }
}

/** The overlay is the viewer's compositor over the tile; the flag's outline shows in the highlight colour. */
function overlayCheck(files: Record<string, Uint8Array>, row: TileRow, src: FixtureFrame): void {
  const png = PNG.sync.read(Buffer.from(files[row.overlay!.file]));
  const [x0, y0, x1, y1] = row.box;
  expect([png.width, png.height]).toEqual([x1 - x0, y1 - y0]);
  const layers = layerSettingsDefault();
  layers.runA = row.overlay!.run;
  if (!src.photo) layers.truth = { ...layers.truth, on: true, side: 'both' };
  const fb = row.flagBox;
  if (fb) layers.highlight = { ...layers.highlight, boxes: [{ x: fb[0], y: fb[1], width: fb[2] - fb[0], height: fb[3] - fb[1] }] };
  const decode = (b: Uint8Array) => {
    const r = labelMapFromPng(b, { file: 'x', table: TABLE });
    if (!r.ok) throw new Error(r.error);
    return r.value;
  };
  const preds = Object.fromEntries(Object.entries(src.predPngs).map(([k, v]) => [k, decode(v)]));
  const want = frameComposite({ photo: src.photo, truth: decode(src.truthPng), preds, bandBins: null }, layers, compositePaletteFromTable(TABLE), { rect: { x: x0, y: y0, width: x1 - x0, height: y1 - y0 } });
  if (!want.ok) throw new Error(want.error);
  expect(Buffer.compare(Buffer.from(png.data), Buffer.from(want.value)), row.overlay!.file).toBe(0);
  if (fb && fb[0] - 1 >= x0 && fb[1] >= y0) {
    // One pixel left of the flag box, inside the tile: the outline colour (MARK_COLORS.highlight at full opacity).
    const o = ((fb[1] - y0) * (x1 - x0) + (fb[0] - 1 - x0)) * 4;
    const h = MARK_COLORS.highlight;
    expect([png.data[o], png.data[o + 1], png.data[o + 2]]).toEqual([(h >> 16) & 255, (h >> 8) & 255, h & 255]);
  }
}

describe('tilesExport: streaming, progress, cancellation, a failing sink', () => {
  it('hands bytes to the sink while it runs (before the next frame is decoded) and reports progress per flag', async () => {
    const frames = fixtureFrames();
    let received = 0;
    const atLoad: number[] = [];
    const events: TilesExportProgress[] = [];
    const result = await tilesExport({
      dataset: { key: 'k', title: 't', frames: 3 }, flags: FLAGS.slice(0, 4), runs: RUNS, table: TABLE, mode: { kind: 'crop', padding: 2 },
      source: fixtureSource(frames, () => atLoad.push(received)), frameOrder: frames.map((f) => f.name),
      sink: async (chunk) => {
        await new Promise((r) => setTimeout(r, 1)); // a slow disk: the export waits for it
        received += chunk.length;
      },
      onProgress: (p) => events.push(p),
    });
    if (!result.ok) throw new Error(result.error);
    expect(atLoad[0]).toBe(0);
    expect(atLoad[1]).toBeGreaterThan(0);
    expect(atLoad[2]).toBeGreaterThan(atLoad[1]);
    expect(received).toBe(result.value.bytes);
    expect(events.map((e) => e.flagsDone)).toEqual([1, 2, 3, 4, 4]);
    expect(events.every((e) => e.flagsTotal === 4)).toBe(true);
    expect(events[events.length - 1].tilesDone).toBe(4);
  });

  it('stops when cancelled and sends no final chunk', async () => {
    const ac = new AbortController();
    let finals = 0;
    const result = await tilesExport({
      dataset: { key: 'k', title: 't', frames: 3 }, flags: FLAGS, runs: RUNS, table: TABLE, mode: { kind: 'crop', padding: 2 },
      source: fixtureSource(FRAMES), sink: (_c, final) => void (final && finals++), signal: ac.signal,
      onProgress: (p) => p.flagsDone === 1 && ac.abort(),
    });
    expect(result).toEqual({ ok: false, error: 'export cancelled' });
    expect(finals).toBe(0);
  });

  it('a sink that fails stops the export with its reason', async () => {
    let n = 0;
    const result = await tilesExport({
      dataset: { key: 'k', title: 't', frames: 3 }, flags: FLAGS, runs: RUNS, table: TABLE, mode: { kind: 'crop', padding: 2 },
      source: fixtureSource(FRAMES),
      sink: () => {
        if (++n === 3) throw new Error('ENOSPC: no space left on device');
      },
    });
    expect(result).toEqual({ ok: false, error: 'the ZIP could not be written (ENOSPC: no space left on device)' });
  });

  it('refuses a bad mode before writing anything', async () => {
    let n = 0;
    const result = await tilesExport({
      dataset: { key: 'k', title: 't', frames: 3 }, flags: FLAGS, runs: RUNS, table: TABLE, mode: { kind: 'tile', size: 3 },
      source: fixtureSource(FRAMES), sink: () => void n++,
    });
    expect(!result.ok && result.error).toMatch(/tile size must be/);
    expect(n).toBe(0);
  });
});
void H;
