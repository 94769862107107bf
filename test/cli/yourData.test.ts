import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { labelMapToPng } from '../../src/core/png/encode.ts';
import { pythonRefRequire } from '../reference/pythonRef.ts';
import jpeg from 'jpeg-js';
import { fileWrite, suffixedWrite, yardFrames, yardPhoto, type YardFrame } from '../support/diskDatasets.ts';
import { randomPair } from '../support/randomMaps.ts';
import { scoreCli } from './scoreRun.ts';

// Datasets as practitioners keep them (README "Your data"), scored through the real CLI; every number
// is checked against test/reference/dataset_ref.py (numpy), which applies the id maps by hand.

const REF = join(import.meta.dirname, '..', 'reference', 'dataset_ref.py');
let dir = '';
let frames: YardFrame[] = [];

function reference(spec: object): { dataset: { meanIoU: number; pixelAccuracy: number; perClass: { id: number; iou: number | null }[] }; frames: { name: string; meanIoU: number; pixelAccuracy: number }[] } {
  const path = join(dir, `ref-${Math.random().toString(36).slice(2)}.json`);
  writeFileSync(path, JSON.stringify(spec));
  const r = spawnSync('python3', [REF, path], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`dataset_ref.py failed: ${r.stderr}`);
  return JSON.parse(r.stdout);
}

beforeAll(() => {
  pythonRefRequire();
  dir = mkdtempSync(join(tmpdir(), 'hairline-yours-'));
  frames = yardFrames(5, 48, 36, 31);
  suffixedWrite(join(dir, 'suffixed'), frames);
});
afterAll(() => dir && rmSync(dir, { recursive: true, force: true }));

describe('npm run score on datasets as they lie on disk', () => {
  it('suffixes, nested truth against flat predictions, several encodings, id maps: every number as dataset_ref.py', () => {
    const root = join(dir, 'suffixed');
    const out = join(dir, 'suffixed.json');
    const r = scoreCli(['--truth', join(root, 'gt'), '--pred', `model=${join(root, 'preds')}`, '--images', join(root, 'photos'), '--classes', join(root, 'classes.json'), '--out', out]);
    expect(r.stderr).not.toMatch(/not paired/);
    expect(r.status).toBe(0);
    // The truth folder holds four encodings per frame: the 8-bit stored ids are chosen, the rest passed over with a reason.
    expect(r.stderr).toMatch(/note: truth: several encodings.*using "_gt_class" \(8-bit ids up to 255, all in the class table\)/);
    expect(r.stderr).toMatch(/"_gt_inst": stored ids 1\d\d\d .*not listed in "truthIds"/);
    expect(r.stderr).toMatch(/"_gt_shapes": a JSON of shapes, not a label map/);
    expect(r.stderr).toMatch(/berth001_pred\.png: stored id 200 \(9 pixels\) not listed in "predictionIds" of classes\.json; counted as wrong/);
    const report = JSON.parse(readFileSync(out, 'utf8'));
    expect(report.frames.map((f: { name: string }) => f.name)).toEqual(['north/berth002', 'north/berth004', 'south/berth001', 'south/berth003', 'south/berth005']);
    expect(report.opened.photos).toBe(5);
    expect(report.opened.idMaps).toEqual(['truthIds: 9 stored ids → 5 classes, 3 to void', 'predictionIds: 5 stored ids → 5 classes']);
    const ref = reference({
      classes: join(root, 'classes.json'),
      frames: frames.map((f) => ({ name: `${f.site}/${f.key}`, truth: join(root, 'gt', f.site, `${f.key}_gt_class.png`), pred: join(root, 'preds', `${f.key}_pred.png`) })),
    });
    expect(report.dataset.meanIoU).toBeCloseTo(ref.dataset.meanIoU, 9);
    expect(report.dataset.pixelAccuracy).toBeCloseTo(ref.dataset.pixelAccuracy, 9);
    for (const c of ref.dataset.perClass) expect(report.dataset.perClass.find((p: { id: number }) => p.id === c.id).iou).toBeCloseTo(c.iou!, 9);
    for (const f of ref.frames) expect(report.frames.find((x: { name: string }) => x.name === f.name).meanIoU).toBeCloseTo(f.meanIoU, 9);
  });

  it('predictions written 0..N-1 against truth 1..N without a map: scored, and the shift is named on stderr and in the report', () => {
    const root = join(dir, 'shifted');
    for (const f of frames) {
      fileWrite(join(root, 'truth', `${f.key}.png`), labelMapToPng({ ...f.truth, ids: f.truth.ids.map((v) => (v === 255 ? 0 : v)) }, { kind: 'gray', bitDepth: 8 }));
      fileWrite(join(root, 'pred', `${f.key}.png`), labelMapToPng({ ...f.pred, ids: f.pred.ids.map((v) => v - 1) }, { kind: 'gray', bitDepth: 8 }));
    }
    const r = scoreCli(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--ignore', '0', '--out', join(dir, 'shifted.json')]);
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/warning: run "pred": predicted ids look shifted by one against the truth \(prediction = truth − 1 on \d+% of pixels/);
    const report = JSON.parse(readFileSync(join(dir, 'shifted.json'), 'utf8'));
    expect(report.opened.warnings.join('\n')).toMatch(/shifted by one/);
  });

  it('truth and prediction ids from different id spaces: the overlap warning instead of a silent mean IoU near 0', () => {
    const root = join(dir, 'apart');
    for (let i = 0; i < 3; i++) {
      const { truth, pred } = randomPair(30, 20, 90 + i, { classIds: [40, 41, 42], ignore: 255, shapes: 6 });
      fileWrite(join(root, 'truth', `f${i}.png`), labelMapToPng(truth, { kind: 'gray', bitDepth: 8 }));
      fileWrite(join(root, 'pred', `f${i}.png`), labelMapToPng({ ...pred, ids: pred.ids.map((v) => v - 37) }, { kind: 'gray', bitDepth: 8 }));
    }
    const r = scoreCli(['--truth', join(root, 'truth'), '--pred', join(root, 'pred')]);
    expect(r.status).toBe(0);
    expect(r.stderr).toMatch(/warning: run "pred": predicted ids and truth ids barely overlap \(only 0% of 1,800 pixels .*truth ids 40, 41, 42, predicted ids 3, 4, 5\)/);
  });

  it('a flat prediction that matches two nested truth files is an error listing both, not a guess', () => {
    const root = join(dir, 'ambiguous');
    const m = labelMapToPng(randomPair(8, 8, 5, { classIds: [0, 1], ignore: 255 }).truth, { kind: 'gray', bitDepth: 8 });
    for (const p of ['truth/east/dock7.png', 'truth/west/dock7.png', 'truth/west/dock8.png', 'pred/dock7.png', 'pred/dock8.png']) fileWrite(join(root, p), m);
    const r = scoreCli(['--truth', join(root, 'truth'), '--pred', join(root, 'pred')]);
    expect(r.status).toBe(1);
    expect(r.stderr).toContain('1 file could pair with more than one frame, so nothing was guessed:');
    expect(r.stderr).toContain('predictions/pred/dock7.png could pair with truth/east/dock7.png or truth/west/dock7.png');
  });

  it('unpaired files: the first 20 on stderr and a count of the rest, all of them in the report', () => {
    const root = join(dir, 'strays');
    const m = labelMapToPng(randomPair(8, 8, 6, { classIds: [0, 1], ignore: 255 }).truth, { kind: 'gray', bitDepth: 8 });
    fileWrite(join(root, 'truth', 'a.png'), m);
    fileWrite(join(root, 'pred', 'a.png'), m);
    for (let i = 0; i < 33; i++) fileWrite(join(root, 'pred', `stray${i}.png`), m);
    const r = scoreCli(['--truth', join(root, 'truth'), '--pred', join(root, 'pred'), '--out', join(dir, 'strays.json')]);
    expect(r.status).toBe(0);
    expect(r.stderr.split('\n').filter((l) => l.startsWith('not paired: ')).length).toBe(20);
    expect(r.stderr).toContain('… and 13 more files not paired');
    const report = JSON.parse(readFileSync(join(dir, 'strays.json'), 'utf8'));
    expect(report.unpaired.length).toBe(33);
  });

  it('--dataset DIR with hairline.json (folders, suffix, list file): the listed frames, scored as dataset_ref.py', () => {
    const root = join(dir, 'suffixed');
    writeFileSync(join(root, 'val.txt'), '# frames to score\nberth001\n\nnorth/berth004\n');
    writeFileSync(join(root, 'hairline.json'), JSON.stringify({ truth: { folder: 'gt', suffix: '_gt_class' }, images: 'photos', predictions: { model: 'preds' }, list: 'val.txt' }));
    try {
      const out = join(dir, 'described.json');
      const r = scoreCli(['--dataset', root, '--out', out]);
      expect(r.status).toBe(0);
      expect(r.stderr).toMatch(/note: truth: several encodings .*; chosen in the description file/);
      const report = JSON.parse(readFileSync(out, 'utf8'));
      expect(report.frames.map((f: { name: string }) => f.name)).toEqual(['north/berth004', 'south/berth001']);
      const ref = reference({
        classes: join(root, 'classes.json'),
        frames: frames.filter((f) => ['berth001', 'berth004'].includes(f.key)).map((f) => ({ name: `${f.site}/${f.key}`, truth: join(root, 'gt', f.site, `${f.key}_gt_class.png`), pred: join(root, 'preds', `${f.key}_pred.png`) })),
      });
      expect(report.dataset.meanIoU).toBeCloseTo(ref.dataset.meanIoU, 9);
      writeFileSync(join(root, 'hairline.json'), '{"truth": {"folder": "gt", "sufix": "_gt_class"}}');
      const bad = scoreCli(['--dataset', root]);
      expect(bad.status).toBe(1);
      expect(bad.stderr.split('\n')[0]).toBe(`hairline score: ${join(root, 'hairline.json')}: "truth": Unrecognized key: "sufix"`);
    } finally {
      rmSync(join(root, 'hairline.json'));
      rmSync(join(root, 'val.txt'));
    }
  });

  it('--dataset DIR without a description: folders recognised by name, symlinked folders followed; --list names a missing frame: exit 1', () => {
    const root = join(dir, 'linked');
    const src = join(dir, 'suffixed');
    fileWrite(join(root, 'README.txt'), 'invented');
    symlinkSync(join(src, 'gt'), join(root, 'labels'));
    symlinkSync(join(src, 'preds'), join(root, 'preds'));
    symlinkSync(join(src, 'photos'), join(root, 'photos'));
    writeFileSync(join(root, 'classes.json'), readFileSync(join(src, 'classes.json')));
    const out = join(dir, 'linked.json');
    const r = scoreCli(['--dataset', root, '--out', out]);
    expect(r.status).toBe(0);
    const report = JSON.parse(readFileSync(out, 'utf8'));
    expect(report.frames).toHaveLength(5);
    expect(report.opened.runs).toEqual(['preds']);
    expect(report.dataset.meanIoU).toBeCloseTo(JSON.parse(readFileSync(join(dir, 'suffixed.json'), 'utf8')).dataset.meanIoU, 12);
    writeFileSync(join(dir, 'missing.txt'), 'berth001\nberth077\n');
    const missing = scoreCli(['--dataset', root, '--list', join(dir, 'missing.txt')]);
    expect(missing.status).toBe(1);
    expect(missing.stderr).toContain(`${join(dir, 'missing.txt')}: lists a frame that the dataset does not have: berth077`);
    const empty = join(dir, 'empty');
    fileWrite(join(empty, 'scans', 'a.png'), 'x');
    const none = scoreCli(['--dataset', empty]);
    expect(none.status).toBe(1);
    expect(none.stderr).toMatch(/no ground-truth folder found: expected truth\/ .*Found: scans\/ \(1 file\)/);
  });

  it('predictions at half the label size and JPEG photos: scaled up by nearest neighbour with a warning, scored as dataset_ref.py, photos used', () => {
    const root = join(dir, 'half');
    const src = join(dir, 'suffixed');
    for (const f of frames) {
      const { width, height } = f.storedPred;
      const half = new Uint8Array((width / 2) * (height / 2)).map((_, i) => f.storedPred.ids[Math.floor(i / (width / 2)) * 2 * width + (i % (width / 2)) * 2]);
      fileWrite(join(root, 'preds', `${f.key}.png`), labelMapToPng({ width: width / 2, height: height / 2, ids: half }, { kind: 'gray', bitDepth: 8 }));
      fileWrite(join(root, 'photos', `${f.key}.jpg`), new Uint8Array(jpeg.encode({ width, height, data: yardPhoto(f) }, 90).data));
    }
    const out = join(dir, 'half.json');
    const r = scoreCli(['--truth', join(src, 'gt'), '--pred', `model=${join(root, 'preds')}`, '--images', join(root, 'photos'), '--classes', join(src, 'classes.json'), '--out', out]);
    expect(r.status).toBe(0);
    expect(r.stderr).toContain(`warning: run "model": predictions scaled up ×2 to the label's size by nearest neighbour on 5 of 5 frames`);
    expect(r.stderr).not.toMatch(/photos\/|\.jpg/);
    const report = JSON.parse(readFileSync(out, 'utf8'));
    expect(report.opened.photos).toBe(5);
    const ref = reference({
      classes: join(src, 'classes.json'),
      frames: frames.map((f) => ({ name: `${f.site}/${f.key}`, truth: join(src, 'gt', f.site, `${f.key}_gt_class.png`), pred: join(root, 'preds', `${f.key}.png`) })),
    });
    expect(report.dataset.meanIoU).toBeCloseTo(ref.dataset.meanIoU, 9);
    for (const f of ref.frames) expect(report.frames.find((x: { name: string }) => x.name === f.name).pixelAccuracy).toBeCloseTo(f.pixelAccuracy, 9);
    // 20×12 is no whole fraction of 48×36 in both directions: the per-frame size error stays.
    fileWrite(join(root, 'odd', `${frames[0].key}.png`), labelMapToPng({ width: 20, height: 12, ids: new Uint8Array(240) }, { kind: 'gray', bitDepth: 8 }));
    const odd = scoreCli(['--truth', join(src, 'gt'), '--pred', `odd=${join(root, 'odd')}`, '--classes', join(src, 'classes.json')]);
    expect(odd.stderr).toContain("is 20×12 pixels but truth/south/berth001_gt_class.png is 48×36; a prediction must have the label's size or a whole fraction of it");
  });
});
