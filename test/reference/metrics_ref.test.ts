import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { frameScore } from '../../src/core/metrics/frameScore.ts';
import { scoreReportOfFrames, type ReportFrameInput } from '../../src/core/metrics/report.ts';
import { scoreScratchCreate } from '../../src/core/metrics/scratch.ts';
import type { ScoreSettings } from '../../src/core/metrics/settings.ts';
import { labelMapToPng, type LabelPngEncoding } from '../../src/core/png/encode.ts';
import { harbourPrediction, harbourTruth } from '../support/harbourScene.ts';
import { randomPair } from '../support/randomMaps.ts';
import { pythonRefRequire, pythonRefRun, reportDifferences } from './pythonRef.ts';

// Every number of the report must agree to 1e-9 with test/reference/metrics_ref.py, an independent
// numpy/scipy implementation of src/docs/metrics.md (scipy.ndimage.distance_transform_edt for distances and
// the Boundary F tolerance, scipy.ndimage.binary_erosion with a 3×3 square for Boundary IoU).

interface Frame { name: string; truth: LabelMap | null; pred: LabelMap | null; error?: string; png?: LabelPngEncoding }

const CLASSES = [0, 1, 2, 3, 5].map((id) => ({ id, name: `class ${id}`, color: `#${(id * 40 + 15).toString(16).padStart(2, '0')}7f3${id}` }));
const IDS = CLASSES.map((c) => c.id);
const PALETTE = new Uint8Array(256 * 3).map((_, i) => (i * 37) & 255);

function framesMake(): Frame[] {
  const o = { classIds: IDS, ignore: 255, invalidIds: [4, 200, 255], voids: true };
  const frames: Frame[] = [];
  const sizes: [number, number][] = [[1, 1], [2, 3], [75, 100], [33, 17], [64, 64], [120, 41], [7, 90]];
  sizes.forEach(([w, h], i) => {
    const { truth, pred } = randomPair(w, h, 100 + i, { ...o, shapes: 6 + i * 3 });
    frames.push({ name: `f${String(frames.length).padStart(2, '0')}`, truth, pred, png: i % 2 ? { kind: 'palette', colors: PALETTE } : { kind: 'gray', bitDepth: 8 } });
  });
  const t = harbourTruth(320, 160, 3);
  const harbourIds = new Uint8Array(t.ids.length).map((_, i) => (t.ids[i] === 255 ? 255 : IDS[t.ids[i] % IDS.length]));
  const truth = { width: 320, height: 160, ids: harbourIds };
  frames.push({ name: `f${frames.length}`, truth, pred: harbourPrediction(truth, 3), png: { kind: 'gray', bitDepth: 16 } });
  const flat: LabelMap = { width: 30, height: 20, ids: new Uint8Array(600).fill(2) };
  frames.push({ name: `f${frames.length}`, truth: flat, pred: { ...flat, ids: flat.ids.map((v, i) => (i % 7 ? v : 1)) }, png: { kind: 'gray', bitDepth: 8 } });
  frames.push({ name: `f${frames.length}`, truth: null, pred: null, error: 'truth/f.png: not a PNG file' });
  return frames;
}

function tsReport(frames: Frame[], settings: ScoreSettings, classIds = IDS) {
  const scratch = scoreScratchCreate();
  const inputs: ReportFrameInput[] = frames.map((f) => {
    if (!f.truth || !f.pred) return { name: f.name, stats: null, error: f.error ?? 'missing' };
    const r = frameScore(f.truth, f.pred, classIds, settings, scratch);
    return r.ok ? { name: f.name, stats: r.value, error: null } : { name: f.name, stats: null, error: r.error };
  });
  return scoreReportOfFrames(CLASSES, classIds, settings, inputs);
}

let dir = '';
beforeAll(() => {
  pythonRefRequire();
  dir = mkdtempSync(join(tmpdir(), 'hairline-metrics-ref-'));
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

function manifestWrite(frames: Frame[], settings: ScoreSettings, file: string): string {
  const entries = frames.map((f, i) => {
    if (!f.truth || !f.pred) return { name: f.name, error: f.error };
    const tf = `${file}-${i}-t.u16`, pf = `${file}-${i}-p.u16`;
    writeFileSync(join(dir, tf), Buffer.from(Uint16Array.from(f.truth.ids).buffer));
    writeFileSync(join(dir, pf), Buffer.from(Uint16Array.from(f.pred.ids).buffer));
    return { name: f.name, width: f.truth.width, height: f.truth.height, truthFile: tf, predFile: pf };
  });
  const path = join(dir, `${file}.json`);
  writeFileSync(path, JSON.stringify({ classes: CLASSES, ...settings, frames: entries }));
  return path;
}

describe('report against the numpy/scipy reference (metrics_ref.py)', () => {
  const frames = framesMake();
  const settingsList: ScoreSettings[] = [
    { ignore: 255, biouDilationRatio: 0.02, bfTolerance: 0.0075 },
    { ignore: 255, biouDilationRatio: 0.06, bfTolerance: 0.04 },
    // θ far past the 64 px band cap (≈ 178 px on the 320×160 frame) and a dilation wider than most frames.
    { ignore: 255, biouDilationRatio: 0.3, bfTolerance: 0.5 },
  ];
  settingsList.forEach((settings, n) => {
    it(`raw frames agree to 1e-9 (ratio ${settings.biouDilationRatio}, tolerance ${settings.bfTolerance})`, () => {
      const py = pythonRefRun(['--frames', manifestWrite(frames, settings, `raw${n}`)]);
      const ts = tsReport(frames, settings);
      expect(reportDifferences(ts, py)).toEqual([]);
      expect((ts.dataset.band as unknown[]).length).toBe(65);
    });
  });

  it('16-bit ids agree to 1e-9', () => {
    const ids = [3, 700, 40000, 65534];
    const settings = { ignore: 1000, biouDilationRatio: 0.03, bfTolerance: 0.02 };
    const f16: Frame[] = [0, 1, 2].map((i) => {
      const { truth, pred } = randomPair(40 + i * 9, 31 - i * 5, 500 + i, { classIds: ids, ignore: 1000, invalidIds: [65535, 9], voids: true, sixteenBit: true });
      return { name: `g${i}`, truth, pred };
    });
    const classes = ids.map((id) => ({ id, name: `c${id}` }));
    const path = join(dir, 'f16.json');
    const entries = f16.map((f) => ({ name: f.name, width: f.truth!.width, height: f.truth!.height, truth: Array.from(f.truth!.ids), pred: Array.from(f.pred!.ids) }));
    writeFileSync(path, JSON.stringify({ classes, ...settings, frames: entries }));
    const py = pythonRefRun(['--frames', path]);
    const scratch = scoreScratchCreate();
    const inputs = f16.map((f) => {
      const r = frameScore(f.truth!, f.pred!, ids, settings, scratch);
      if (!r.ok) throw new Error(r.error);
      return { name: f.name, stats: r.value, error: null };
    });
    expect(reportDifferences(scoreReportOfFrames(classes, ids, settings, inputs), py)).toEqual([]);
  });

  it('PNG folders (gray 8/16-bit, palette) read by the reference give the same report', () => {
    const settings = { ignore: 255, biouDilationRatio: 0.02, bfTolerance: 0.0075 };
    const truthDir = join(dir, 'truth'), predDir = join(dir, 'pred');
    mkdirSync(truthDir);
    mkdirSync(predDir);
    const pngFrames = frames.filter((f) => f.truth);
    for (const f of pngFrames) {
      writeFileSync(join(truthDir, `${f.name}.png`), labelMapToPng(f.truth!, f.png!));
      writeFileSync(join(predDir, `${f.name}.png`), labelMapToPng(f.pred!, f.png!));
    }
    writeFileSync(join(dir, 'classes.json'), JSON.stringify({ ignore: 255, classes: CLASSES }));
    const py = pythonRefRun(['--truth', truthDir, '--pred', predDir, '--classes', join(dir, 'classes.json')]);
    expect(reportDifferences(tsReport(pngFrames, settings), py)).toEqual([]);
  });
});
