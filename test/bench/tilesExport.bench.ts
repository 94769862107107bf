// Tile export timings at 2048×1024 (run: npx tsx test/bench/tilesExport.bench.ts). Frames are harbour
// scenes (test/support/harbourScene.ts) with a photo and two runs (gray 8 and palette), decoded from PNG
// on each load as the CLI does; per frame 6 box flags and 1 whole-frame flag. The sink only counts bytes,
// so the figures are the export's own work (PNG zlib: fflate as in the browser, or Node's as the CLI uses). Peak RSS is sampled during the run at two dataset sizes:
// it should not grow with the number of frames (one frame and one tile held at a time).
import { deflateSync } from 'node:zlib';
import { classTableFromJson } from '../../src/core/classTable.ts';
import { tilesExport, type TileExportSource } from '../../src/core/export/tilesExport.ts';
import type { TileMode } from '../../src/core/export/tileBoxes.ts';
import { labelMapFromPng } from '../../src/core/png/decodeLabel.ts';
import { labelMapToPng, rgbaToPng } from '../../src/core/png/encode.ts';
import { photoFromPng } from '../../src/core/png/decodePhoto.ts';
import { ok } from '../../src/core/result.ts';
import type { Flag } from '../../src/core/review/flag.ts';
import { harbourPrediction, harbourTruth, HARBOUR_CLASSES } from '../support/harbourScene.ts';

const W = 2048, H = 1024;
const palette = Uint8Array.from({ length: 256 * 3 }, (_, i) => (i * 71) & 255);
const table = (() => {
  const r = classTableFromJson({ ignore: 255, classes: HARBOUR_CLASSES.map((name, id) => ({ id, name, color: `#${(id * 20 + 10).toString(16).padStart(2, '0')}80${(200 - id * 10).toString(16)}` })) });
  if (!r.ok) throw new Error(r.error);
  return r.value;
})();

// One set of PNG files, reused by every frame name (decoding still happens per load).
const truth = harbourTruth(W, H, 3);
const files = {
  truth: labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }),
  a: labelMapToPng(harbourPrediction(truth, 4), { kind: 'gray', bitDepth: 8 }),
  b: labelMapToPng(harbourPrediction(truth, 5, 1), { kind: 'palette', colors: palette }),
  photo: rgbaToPng(W, H, Uint8Array.from({ length: W * H * 4 }, (_, i) => (i % 4 === 3 ? 255 : (i * 2654435761) >>> 24))),
};

const source: TileExportSource = {
  async frameLoad() {
    const t = labelMapFromPng(files.truth, { file: 't', table });
    const a = labelMapFromPng(files.a, { file: 'a', table });
    const b = labelMapFromPng(files.b, { file: 'b', table });
    const p = photoFromPng(files.photo, { file: 'p' });
    if (!t.ok || !a.ok || !b.ok || !p.ok) throw new Error('fixture did not decode');
    return ok({ width: W, height: H, truth: t.value, preds: { 'run-a': a.value, 'run-b': b.value }, photo: p.value.rgba, bandBins: null, notes: [] });
  },
};

function flagsFor(frames: number): Flag[] {
  const out: Flag[] = [];
  for (let f = 0; f < frames; f++) {
    const frame = `kq-${String(f + 1).padStart(4, '0')}`;
    for (let k = 0; k < 6; k++) {
      const x = (k * 331 + f * 97) % (W - 200), y = (k * 157 + f * 53) % (H - 120);
      out.push({ id: `${frame}-${k}`, frame, kind: 'rect', bbox: [x, y, x + 40 + k * 30, y + 30 + k * 15], reason: 'label-mistake', note: '', run: 'run-a', createdAt: 0, updatedAt: 0 });
    }
    out.push({ id: `${frame}-whole`, frame, kind: 'frame', bbox: null, reason: 'unsure', note: '', run: null, createdAt: 0, updatedAt: 0 });
  }
  return out;
}

const nodeZlib = (d: Uint8Array) => new Uint8Array(deflateSync(d, { level: 6 }));

async function measure(frames: number, mode: TileMode, node = false): Promise<void> {
  let bytes = 0;
  let peak = process.memoryUsage().rss;
  const timer = setInterval(() => (peak = Math.max(peak, process.memoryUsage().rss)), 20);
  const t0 = performance.now();
  const r = await tilesExport({
    dataset: { key: 'bench', title: 'bench', frames }, flags: flagsFor(frames), runs: ['run-a', 'run-b'], table, mode, source,
    compress: node ? nodeZlib : undefined, sink: (c) => void (bytes += c.length), onProgress: () => (peak = Math.max(peak, process.memoryUsage().rss)),
  });
  const ms = performance.now() - t0;
  clearInterval(timer);
  if (!r.ok) throw new Error(r.error);
  const tiles = r.value.manifest.tiles.length;
  const what = (mode.kind === 'crop' ? `crop +${mode.padding}px` : `tiles ${mode.size}px`) + (node ? ' node-zlib' : ' fflate');
  console.log(`${String(frames).padStart(3)} frames  ${what.padEnd(22)} ${String(tiles).padStart(4)} tiles  ${(ms / 1000).toFixed(2).padStart(6)} s  ` +
    `${(ms / frames).toFixed(0).padStart(5)} ms/frame  ${(tiles / (ms / 1000)).toFixed(1).padStart(6)} tiles/s  ${(bytes / 1e6).toFixed(1).padStart(6)} MB  peak RSS ${(peak / 1e6).toFixed(0)} MB`);
}

console.log(`tile export at ${W}×${H}, 7 flags per frame (6 boxes + 1 whole frame), 2 runs + photo`);
// A plain decode of one frame's four PNGs, to read the figures against (it is part of every frame's cost).
const t0 = performance.now();
await source.frameLoad('x');
console.log(`decoding one frame's truth, two runs and photo: ${(performance.now() - t0).toFixed(0)} ms`);
await measure(4, { kind: 'crop', padding: 32 });
await measure(4, { kind: 'crop', padding: 32 }, true);
await measure(16, { kind: 'crop', padding: 32 }, true);
await measure(4, { kind: 'tile', size: 512 }, true);
