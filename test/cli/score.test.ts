import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LabelMap } from '../../src/core/labelMap.ts';
import { labelMapToPng, rgbaToPng, type LabelPngEncoding } from '../../src/core/png/encode.ts';
import { pythonRefRequire, pythonRefRun, reportDifferences } from '../reference/pythonRef.ts';
import { harbourPrediction, harbourTruth } from '../support/harbourScene.ts';
import { randomPair } from '../support/randomMaps.ts';
import { scoreCli } from './scoreRun.ts';
import { SCENE_KEYS } from './sceneKeys.ts';

// The real CLI, end to end, against the independent numpy/scipy reference (test/reference/metrics_ref.py,
// scipy.ndimage.distance_transform_edt and binary_erosion): every number of the report within 1e-9.

const CLASSES = [0, 1, 2, 3, 5].map((id) => ({ id, name: `c${id}`, color: `#${(id * 40 + 15).toString(16).padStart(2, '0')}7f3${id}` }));
const IDS = CLASSES.map((c) => c.id);
const PALETTE = new Uint8Array(256 * 3).map((_, i) => (i * 37) & 255);
let dir = '';

function write(path: string, bytes: Uint8Array | string): void {
  mkdirSync(join(path, '..'), { recursive: true });
  writeFileSync(path, bytes);
}

/** Writes a seeded dataset (odd sizes, void, border-touching masks, one single-label frame, invalid ids, 8/16-bit and palette PNGs). */
function datasetWrite(root: string): void {
  const o = { classIds: IDS, ignore: 255, invalidIds: [4, 200, 255], voids: true };
  const frames: { name: string; truth: LabelMap; pred: LabelMap; pred2: LabelMap; png: LabelPngEncoding }[] = [];
  const sizes: [number, number][] = [[75, 100], [33, 17], [64, 64], [121, 41], [7, 90], [2, 3]];
  sizes.forEach(([w, h], i) => {
    const a = randomPair(w, h, 700 + i, { ...o, shapes: 5 + i * 3 });
    const b = randomPair(w, h, 900 + i, { ...o, shapes: 5 + i * 3 });
    const png: LabelPngEncoding = i % 3 === 1 ? { kind: 'palette', colors: PALETTE } : i % 3 === 2 ? { kind: 'gray', bitDepth: 16 } : { kind: 'gray', bitDepth: 8 };
    frames.push({ name: `frame${i + 1}`, truth: a.truth, pred: a.pred, pred2: { ...a.pred, ids: b.pred.ids.length === a.pred.ids.length ? b.pred.ids : a.pred.ids }, png });
  });
  const t = harbourTruth(320, 160, 5);
  const ids = new Uint8Array(t.ids.length).map((_, i) => (t.ids[i] === 255 ? 255 : IDS[t.ids[i] % IDS.length]));
  const truth = { width: 320, height: 160, ids };
  frames.push({ name: 'frame10', truth, pred: harbourPrediction(truth, 5), pred2: harbourPrediction(truth, 6, 1), png: { kind: 'gray', bitDepth: 8 } });
  const flat: LabelMap = { width: 30, height: 20, ids: new Uint8Array(600).fill(2) };
  frames.push({ name: 'frame11', truth: flat, pred: { ...flat, ids: flat.ids.map((v, i) => (i % 7 ? v : 1)) }, pred2: flat, png: { kind: 'gray', bitDepth: 8 } });
  for (const f of frames) {
    write(join(root, 'truth', `${f.name}.png`), labelMapToPng(f.truth, f.png));
    write(join(root, 'pred-a', `${f.name}.png`), labelMapToPng(f.pred, f.png));
    write(join(root, 'pred-b', `${f.name}.png`), labelMapToPng(f.pred2, f.png));
  }
  write(join(root, 'classes.json'), JSON.stringify({ ignore: 255, classes: CLASSES }));
}

beforeAll(() => {
  pythonRefRequire();
  dir = mkdtempSync(join(tmpdir(), 'hairline-cli-'));
  datasetWrite(join(dir, 'ok'));
});
afterAll(() => dir && rmSync(dir, { recursive: true, force: true }));

describe('npm run score (real CLI) against the numpy/scipy reference', () => {
  it('agrees with metrics_ref.py to 1e-9 on every number, with default and changed settings', () => {
    const d = join(dir, 'ok');
    for (const extra of [[], ['--biou-ratio', '0.05', '--bf-tolerance', '0.03']]) {
      const out = join(dir, `report${extra.length}.json`);
      const r = scoreCli(['--truth', join(d, 'truth'), '--pred', join(d, 'pred-a'), '--classes', join(d, 'classes.json'), '--out', out, '--workers', '2', ...extra]);
      expect(r.stderr).not.toMatch(/Error|failed/);
      expect(r.status).toBe(0);
      const ours = JSON.parse(readFileSync(out, 'utf8'));
      const refArgs = ['--truth', join(d, 'truth'), '--pred', join(d, 'pred-a'), '--classes', join(d, 'classes.json')];
      if (extra.length) refArgs.push('--biou-ratio', '0.05', '--bf-tolerance', '0.03');
      const ref = pythonRefRun(refArgs);
      // The reference knows no error regions: frames[].regions and suspects are checked in suspects.test.ts;
      // flicker, objects and iIoU against their own reference in sceneScores.test.ts.
      expect(reportDifferences(ours, ref, 1e-9, ['timing', 'unpaired', 'opened', 'runs', 'regions', 'voidSpill', 'suspects', ...SCENE_KEYS])).toEqual([]);
      expect(ours.dataset.band).toHaveLength(65);
      expect(r.stdout).toMatch(/mean IoU/);
    }
  });

  it('scores several runs: dataset/frames describe the first, runs holds each, JSON to stdout without --out, CSV rows', () => {
    const d = join(dir, 'ok');
    const csv = join(dir, 'frames.csv');
    const r = scoreCli(['--truth', join(d, 'truth'), '--pred', `a=${join(d, 'pred-a')}`, '--pred', join(d, 'pred-b'), '--classes', join(d, 'classes.json'), '--csv', csv]);
    expect(r.status).toBe(0);
    const report = JSON.parse(r.stdout);
    expect(Object.keys(report.runs)).toEqual(['a', 'pred-b']);
    expect(report.runs.a).toEqual(report.dataset);
    const refB = pythonRefRun(['--truth', join(d, 'truth'), '--pred', join(d, 'pred-b'), '--classes', join(d, 'classes.json')]);
    expect(reportDifferences(report.runs['pred-b'], refB.dataset, 1e-9, SCENE_KEYS)).toEqual([]);
    const lines = readFileSync(csv, 'utf8').trim().split('\r\n');
    expect(lines[0]).toBe('frame,run,meanIoU,pixelAccuracy,bandIoU3,boundaryIoU,boundaryF,errorPixels,error');
    expect(lines).toHaveLength(1 + 8 * 2);
    expect(r.stderr).toMatch(/scored 8 of 8 frames/);
  });
});

describe('npm run score: bad input', () => {
  it('a corrupt PNG among good ones: exit 3, that frame has its error, the others are scored', () => {
    const d = join(dir, 'bad');
    datasetWrite(d);
    writeFileSync(join(d, 'truth', 'frame3.png'), readFileSync(join(d, 'truth', 'frame3.png')).subarray(0, 60));
    writeFileSync(join(d, 'pred-a', 'frame5.png'), 'not a png at all');
    // Sizes that differ: a prediction one column wider than its ground truth.
    writeFileSync(join(d, 'pred-a', 'frame1.png'), labelMapToPng({ width: 76, height: 100, ids: new Uint8Array(7600) }, { kind: 'gray', bitDepth: 8 }));
    writeFileSync(join(d, 'truth', 'extra.png'), labelMapToPng({ width: 4, height: 4, ids: new Uint8Array(16) }, { kind: 'gray', bitDepth: 8 }));
    const out = join(dir, 'bad.json');
    const r = scoreCli(['--truth', join(d, 'truth'), '--pred', join(d, 'pred-a'), '--classes', join(d, 'classes.json'), '--out', out]);
    expect(r.status).toBe(3);
    const report = JSON.parse(readFileSync(out, 'utf8'));
    const byName = Object.fromEntries(report.frames.map((f: { name: string }) => [f.name, f]));
    expect(byName.frame3.error).toMatch(/^truth\/frame3\.png: /);
    expect(byName.frame3.meanIoU).toBeNull();
    expect(byName.frame5.error).toMatch(/^pred-a\/frame5\.png: .*not a PNG/);
    expect(byName.frame1.error).toMatch(/76×100.*75×100/);
    expect(byName.extra.error).toMatch(/no prediction/);
    expect(byName.frame2.error).toBeNull();
    expect(byName.frame2.meanIoU).not.toBeNull();
    expect(r.stderr).toMatch(/not paired: predictions\/pred-a\/extra/);
    expect(report.frames.filter((f: { error: string | null }) => f.error === null)).toHaveLength(5);
  });

  it('an unknown colour in a colour-coded map names the colour and its pixel count', () => {
    const d = join(dir, 'rgb');
    const rgba = new Uint8Array(6 * 4 * 4);
    for (let i = 0; i < 24; i++) rgba.set(i < 20 ? [0x0f, 0x7f, 0x30, 255] : [0x12, 0xab, 0x34, 255], i * 4);
    write(join(d, 'truth', 'a.png'), rgbaToPng(6, 4, rgba));
    write(join(d, 'pred', 'a.png'), rgbaToPng(6, 4, rgba));
    write(join(d, 'classes.json'), JSON.stringify({ ignore: 255, classes: CLASSES }));
    const r = scoreCli(['--truth', join(d, 'truth'), '--pred', join(d, 'pred'), '--classes', join(d, 'classes.json')]);
    expect(r.status).toBe(3);
    const report = JSON.parse(r.stdout);
    expect(report.frames[0].error).toMatch(/truth\/a\.png: 4 pixels have colour #12ab34, which is not in classes\.json/);
  });

  it('bad arguments and unreadable folders exit 1 with a one-line reason', () => {
    const cases: [string[], RegExp][] = [
      [[], /--truth DIR is required/],
      [['--truth', dir], /--pred DIR is required/],
      [['--truth', join(dir, 'nope'), '--pred', dir], /--truth .*nope: cannot read this folder \(ENOENT\)/],
      [['--truth', dir, '--pred', dir, '--workers', 'many'], /--workers must be a number/],
      [['--truth', dir, '--pred', dir, '--frobnicate'], /unknown option --frobnicate/],
      [['--truth', join(dir, 'ok', 'truth'), '--pred', join(dir, 'ok', 'pred-a'), '--classes', join(dir, 'missing.json')], /--classes .*missing\.json: cannot read/],
      // the void-id rule of src/core/scoringTable.ts, the same in the app (test/state/scoringRun.test.ts)
      [['--truth', join(dir, 'ok', 'truth'), '--pred', join(dir, 'ok', 'pred-a'), '--classes', join(dir, 'ok', 'classes.json'), '--ignore', '3'], /--ignore 3: void id 3 is the id of class "c3" in .*classes\.json; choose another void id/],
    ];
    for (const [args, re] of cases) {
      const r = scoreCli(args);
      expect(r.status, args.join(' ')).toBe(1);
      expect(r.stderr.split('\n')[0]).toMatch(re);
    }
  });
});
