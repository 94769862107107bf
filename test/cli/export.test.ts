// `npm run export` end to end on the demo written by the real demo CLI: the flags file comes from the
// app's own store (flagAdd, flagsExportText), the ZIP is read back with fflate's unzipSync and Python's
// zipfile/csv (test/reference/zip_tiles_ref.py), label crops are compared with the demo's own PNGs
// decoded by pngjs (PNG.sync.read, a second decoder); colour previews are checked pixel by pixel
// against the colours classes.json gives each source id.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { unzipSync } from 'fflate';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TileManifest } from '../../src/core/export/tileRows.ts';
import { zipPathIsSafe } from '../../src/core/export/zipNames.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import type { DatasetSource } from '../../src/data/sources/source.ts';
import { datasetFromSource, datasetInstall } from '../../src/state/datasetLoad.ts';
import { appStoreCreate } from '../../src/state/store.ts';
import { zipTilesRef } from '../reference/zipTilesRef.ts';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'hairline-export-cli-'));
const demo = join(dir, 'kq');
const flagsPath = join(dir, 'flags.json');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function cli(script: string, args: string[]): { status: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', script, ...args], { cwd: ROOT, encoding: 'utf8', timeout: 300_000, maxBuffer: 1 << 28 });
  if (r.error) throw r.error;
  return { status: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}
const exportCli = (args: string[]) => cli('src/cli/export.ts', args);
const base = () => ['--flags', flagsPath, '--truth', join(demo, 'truth'), '--pred', join(demo, 'predictions', 'run-a'), '--pred', join(demo, 'predictions', 'run-b'), '--images', join(demo, 'images'), '--classes', join(demo, 'classes.json')];

beforeAll(() => {
  const d = cli('src/cli/demo.ts', ['--out', demo, '--frames', '3', '--size', '320x160']);
  if (d.status !== 0) throw new Error(`demo failed: ${d.stderr}`);
  // The flags file as the app saves it: flags made in the store, exported as text.
  const frames = readdirSync(join(demo, 'truth'));
  const source: DatasetSource = {
    kind: 'folder', title: 'kq', classesText: readFileSync(join(demo, 'classes.json'), 'utf8'), read: async () => new Blob([]),
    listing: { images: frames, truth: frames, predictions: { 'run-a': frames, 'run-b': frames } },
  };
  const store = appStoreCreate();
  datasetInstall(store, datasetFromSource(source));
  const s = store.getState();
  const add = (x: Parameters<typeof s.flagAdd>[0]) => {
    const r = s.flagAdd(x);
    if (!r.ok) throw new Error(r.error);
  };
  add({ frame: 'kq-0001', kind: 'rect', bbox: [300, 140, 320, 160], reason: 'label-mistake', note: 'corner, "edge"', run: 'run-b' });
  add({ frame: 'kq-0002', kind: 'region', bbox: [60, 40, 120, 90], reason: 'model-error', run: 'run-a', region: { kind: 'suspect', truthClass: 5, predictedClass: 2, score: 0.9, reasons: ['compact'] } });
  add({ frame: 'kq-0003', kind: 'frame', bbox: null, reason: 'yard tags', note: '' });
  const text = s.flagsExportText();
  const json = JSON.parse(text);
  // A flag on a frame this folder does not have (it was removed since the flags were saved).
  json.flags.push({ ...json.flags[2], id: 'gone-frame', frame: 'kq-0099' });
  writeFileSync(flagsPath, JSON.stringify(json, null, 2));
}, 300_000);

/** pngjs's reading of a source file: gray samples exact (skipRescale); palette files as RGBA colours. */
function pngjsSource(path: string): { width: number; data: ArrayLike<number> } {
  return PNG.sync.read(readFileSync(path), { skipRescale: true } as never);
}

describe('npm run export', () => {
  it('writes the tiles of every flag it can (exit 3 naming the one it cannot), label crops exact, CSV = manifest', () => {
    const out = join(dir, 'tiles.zip');
    const r = exportCli([...base(), '--out', out, '--padding', '16']);
    expect(r.status, r.stderr).toBe(3);
    expect(r.stdout).toMatch(/^wrote 3 tiles of 4 flags to .*tiles\.zip/);
    expect(r.stderr).toMatch(/1 failed .*\n {2}kq-0099 · flag gone-frame: frame "kq-0099" has no ground-truth file in --truth/);
    expect(existsSync(`${out}.partial`)).toBe(false);
    const files = unzipSync(new Uint8Array(readFileSync(out)));
    const classesJson = JSON.parse(readFileSync(join(demo, 'classes.json'), 'utf8')) as { ignore: number; classes: { id: number; color: string }[] };
    for (const name of Object.keys(files)) expect(zipPathIsSafe(name), name).toBe(true);
    const m = JSON.parse(new TextDecoder().decode(files['manifest.json'])) as TileManifest;
    expect(m.tiles.map((t) => [t.frame, t.box])).toEqual([
      ['kq-0001', [284, 124, 320, 160]],
      ['kq-0002', [44, 24, 136, 106]],
      ['kq-0003', [0, 0, 320, 160]],
    ]);
    expect(m.mode).toEqual({ kind: 'crop', padding: 16 });
    expect(m.dataset.frames).toBe(3);
    for (const t of m.tiles) {
      const sources: [string, string][] = [[t.truth.file, join(demo, 'truth', `${t.frame}.png`)], ...t.preds.map((p): [string, string] => [p.file, join(demo, 'predictions', p.run, `${t.frame}.png`)])];
      for (const [inZip, src] of sources) {
        const want = pngjsSource(src);
        const ours = labelMapFromPng(files[inZip], { file: inZip });
        if (!ours.ok) throw new Error(ours.error);
        const srcMap = labelMapFromPng(readFileSync(src), { file: src });
        const plte = srcMap.ok && srcMap.value.encoding.kind === 'palette' ? srcMap.value.encoding.colors : null;
        const [x0, y0, x1, y1] = t.box;
        let k = 0;
        for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++, k++) {
          const o = (y * want.width + x) * 4, id = ours.value.ids[k];
          // Gray: pngjs's sample is the id. Palette: pngjs gives the colour, which must be the palette entry of our id.
          const same = (plte ? [0, 1, 2].every((c) => want.data[o + c] === plte[id * 3 + c]) : want.data[o] === id) && srcMap.ok && srcMap.value.ids[y * want.width + x] === id;
          if (!same) throw new Error(`${inZip}: pixel ${x},${y} is id ${id}, pngjs reads the source as ${want.data[o]},${want.data[o + 1]},${want.data[o + 2]}`);
        }
        // Its colour preview (decoded by pngjs) shows each source id in its class colour from classes.json, void dark gray.
        const previewFile = inZip === t.truth.file ? t.truth.preview : t.preds.find((p) => p.file === inZip)!.preview;
        expect(previewFile, inZip).toBe(inZip.replace(/[^/]+$/, (f) => `preview/${f}`));
        const preview = PNG.sync.read(Buffer.from(files[previewFile!]));
        expect([preview.width, preview.height]).toEqual([x1 - x0, y1 - y0]);
        k = 0;
        for (let y = y0; y < y1; y++) for (let x = x0; x < x1; x++, k++) {
          const id = srcMap.ok ? srcMap.value.ids[y * want.width + x] : -1;
          const hex = id === classesJson.ignore ? '#202020' : classesJson.classes.find((c) => c.id === id)?.color;
          const got = `#${[0, 1, 2].map((c) => preview.data[k * 4 + c].toString(16).padStart(2, '0')).join('')}`;
          if (got !== hex) throw new Error(`${previewFile}: pixel ${x},${y} is ${got}, id ${id}'s class colour is ${hex}`);
        }
        // run-b is a palette PNG in the demo: the crop keeps the palette, colour for colour.
        if (srcMap.ok && srcMap.value.encoding.kind === 'palette') {
          expect(ours.value.encoding.kind, inZip).toBe('palette');
          if (ours.value.encoding.kind === 'palette') expect(Buffer.from(ours.value.encoding.colors).equals(Buffer.from(srcMap.value.encoding.colors))).toBe(true);
        } else expect(ours.value.encoding.kind, inZip).toBe('gray');
      }
      expect(t.photo).not.toBeNull();
      expect(t.overlay?.run).toBe(t.flagRun ?? 'run-a');
    }
    expect(m.tiles[1].region).toEqual({ kind: 'suspect', truthClass: 5, predictedClass: 2, score: 0.9, reasons: ['compact'] });
    const ref = zipTilesRef(out);
    expect(ref.bad).toBeNull();
    expect(ref.rows.map((c) => [c.tile, c.frame, c.reason, c.note, c.x0, c.y0, c.x1, c.y1, c.truth_file])).toEqual(
      m.tiles.map((t) => [t.tile, t.frame, t.reason, t.note, ...t.box.map(String), t.truth.file]),
    );
  });

  it('--tile with --frame and --reason exports only those flags, in tiles of that size (exit 0)', () => {
    const out = join(dir, 'tiles64.zip');
    const r = exportCli([...base(), '--out', out, '--tile', '64', '--frame', 'kq-0003', '--reason', 'yard tags']);
    expect(r.status, r.stderr).toBe(0);
    const m = JSON.parse(new TextDecoder().decode(unzipSync(new Uint8Array(readFileSync(out)))['manifest.json'])) as TileManifest;
    // A whole 320×160 frame in 64-pixel tiles: 5 across, 3 down (the last row spread to end at 160).
    expect(m.tiles.length).toBe(15);
    expect(m.tiles.every((t) => t.box[2] - t.box[0] === 64 && t.box[3] - t.box[1] === 64 && t.frame === 'kq-0003')).toBe(true);
    expect(m.tiles.map((t) => t.box[1]).filter((v, i, a) => a.indexOf(v) === i)).toEqual([0, 48, 96]);
  });

  it('bad arguments and bad input exit 1 with a one-line reason, and write nothing', () => {
    const out = join(dir, 'never.zip');
    const cases: [string[], RegExp][] = [
      [[...base(), '--out', out, '--padding', '4', '--tile', '64'], /give --padding N \(crops\) or --tile N \(fixed tiles\), not both/],
      [[...base(), '--out', out, '--tile', '3'], /--tile: tile size must be a whole number of pixels 8\.\.8192, got 3/],
      [['--truth', join(demo, 'truth'), '--out', out], /--flags FILE is required/],
      [[...base(), '--out', out, '--reason', 'nothing-like-this'], /nothing to export \(no flag matches --reason\/--frame\)/],
      [[...base(), '--out', join(dir, 'no-such-folder', 'x.zip')], /--out .*x\.zip: cannot write \(the folder .*no-such-folder does not exist \(ENOENT\)\); nothing was written/],
      // the void-id rule of src/core/scoringTable.ts, the same in the app (test/state/scoringRun.test.ts)
      [[...base(), '--out', out, '--ignore', '2'], /--ignore 2: void id 2 is the id of class "quay" in .*classes\.json; choose another void id/],
    ];
    for (const [args, msg] of cases) {
      const r = exportCli(args);
      expect(r.status, args.join(' ')).toBe(1);
      expect(r.stderr, args.join(' ')).toMatch(msg);
    }
    const broken = join(dir, 'broken.json');
    writeFileSync(broken, '{"format": "hairline-flags", "version": 2, "dataset": {"key": "k", "title": "t", "frames": 1}, "flags": [{"id": "x"}]}');
    const r = exportCli([...base().map((a) => (a === flagsPath ? broken : a)), '--out', out]);
    expect(r.status).toBe(1);
    expect(r.stderr).toMatch(/broken\.json: 1 problem, nothing imported: flags\[0\] \(id "x"\): "frame" must be a non-empty string/);
    expect(existsSync(out)).toBe(false);
    expect(existsSync(`${out}.partial`)).toBe(false);
  });
});
